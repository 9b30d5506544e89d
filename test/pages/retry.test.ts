import { describe, expect, it } from 'vitest';
import { isRetryableStatus, retryBaseMs, retryCapMs, retryDelay } from '../../server/pages/assets/retry.js';

/**
 * Capped exponential backoff with "equal jitter": wait in [c/2, c] with c = min(cap, base * 2^n).
 * The scheme and its name: M. Brooker, "Exponential Backoff And Jitter", AWS Architecture Blog,
 * 2015 (from memory).
 */
describe('retryDelay', () => {
  it('doubles the ceiling per failure: 1 s, 2 s, 4 s, 8 s at the top of the jitter range', () => {
    expect([0, 1, 2, 3].map((n) => retryDelay(n, 1))).toEqual([1000, 2000, 4000, 8000]);
  });

  it('never waits less than half the ceiling (no thundering retry at 0 ms)', () => {
    expect([0, 1, 2, 3].map((n) => retryDelay(n, 0))).toEqual([500, 1000, 2000, 4000]);
  });

  it('is capped at 30 s however many failures', () => {
    expect(retryDelay(5, 1)).toBe(retryCapMs);
    expect(retryDelay(1000, 1)).toBe(retryCapMs);
    expect(retryDelay(1000, 0)).toBe(retryCapMs / 2);
  });

  it('spreads kiosks that failed together over the jitter range', () => {
    const waits = [0.1, 0.4, 0.7, 0.95].map((random) => retryDelay(4, random));
    expect(new Set(waits).size).toBe(4);
    for (const waitMs of waits) {
      expect(waitMs).toBeGreaterThanOrEqual(8 * retryBaseMs);
      expect(waitMs).toBeLessThanOrEqual(16 * retryBaseMs);
    }
  });

  it('treats odd inputs as the nearest sensible ones', () => {
    expect(retryDelay(-3, 0.5)).toBe(750);
    expect(retryDelay(0, 7)).toBe(1000);
  });
});

describe('isRetryableStatus', () => {
  it('retries server faults and 429, nothing else', () => {
    // RFC 9110 section 15.6 (5xx: the server failed) and RFC 6585 section 4 (429 Too Many Requests).
    expect([429, 500, 502, 503, 504].every(isRetryableStatus)).toBe(true);
    expect([200, 201, 400, 401, 404, 409, 410, 413].some(isRetryableStatus)).toBe(false);
  });
});
