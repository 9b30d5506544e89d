// Retry timing for saving answers over a shaky network. Plain browser JavaScript (an ES module),
// also imported by the unit tests; keep it free of DOM access.

/** First wait after a failed save, in milliseconds. */
export const retryBaseMs = 1000;
/** Longest wait between two tries, in milliseconds. */
export const retryCapMs = 30000;

/**
 * How long to wait before try number `attempt + 1` (attempt counts failures so far, from 0):
 * exponential backoff, capped, with "equal jitter" so a room of kiosks that lost Wi-Fi together
 * does not retry in lockstep. The wait lies in [half, whole] of min(cap, base * 2^attempt).
 *
 * @param {number} attempt failures so far (0, 1, 2, ...)
 * @param {number} random a number in [0, 1), normally Math.random()
 * @returns {number} milliseconds to wait
 */
export function retryDelay(attempt, random) {
  const step = Math.max(0, Math.floor(attempt));
  const ceiling = Math.min(retryCapMs, retryBaseMs * 2 ** Math.min(step, 30));
  const share = Math.min(Math.max(random, 0), 1);
  return Math.round(ceiling / 2 + (ceiling / 2) * share);
}

/**
 * Whether an answer with this HTTP status is worth sending again unchanged: server faults (5xx)
 * and "too many requests" (429). Everything else is a final answer from the server.
 *
 * @param {number} status HTTP status code
 * @returns {boolean}
 */
export function isRetryableStatus(status) {
  return status === 429 || status >= 500;
}
