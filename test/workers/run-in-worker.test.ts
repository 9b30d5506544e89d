import { describe, expect, it } from 'vitest';
import { runInWorker } from '../../server/workers/run-in-worker.js';

const fixtures = new URL('./fixtures/busy-work.ts', import.meta.url).href;

describe('runInWorker', () => {
  it('returns what the exported function returns, typed arrays and Maps included', async () => {
    const result = await runInWorker<Map<string, Float64Array>>(fixtures, 'scaled', [
      new Map([['a', Float64Array.from([1, 2.5])]]),
      2,
    ]);
    expect(result.get('a')).toBeInstanceOf(Float64Array);
    expect([...(result.get('a') ?? [])]).toEqual([2, 5]);
  });

  it('rejects with the thrown message', async () => {
    await expect(runInWorker(fixtures, 'fail', ['no such calibration'])).rejects.toThrow(
      'no such calibration',
    );
  });

  it('rejects when the export is missing', async () => {
    await expect(runInWorker(fixtures, 'absent', [])).rejects.toThrow();
  });

  it('leaves the event loop free while the work runs', async () => {
    // 600 ms of busy work off the thread: a 10 ms interval keeps ticking meanwhile. Run in-thread,
    // the interval could not tick at all until the work ended.
    const ticks: number[] = [];
    const timer = setInterval(() => ticks.push(performance.now()), 10);
    const started = performance.now();
    const turns = await runInWorker<number>(fixtures, 'spin', [600]);
    clearInterval(timer);
    expect(turns).toBeGreaterThan(0);
    const during = ticks.filter((t) => t > started + 100 && t < started + 600);
    expect(during.length).toBeGreaterThan(5);
  });
});
