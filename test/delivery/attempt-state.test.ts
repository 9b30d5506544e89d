import { beforeAll, describe, expect, it } from 'vitest';
import type { ItemBank } from '../../server/bank/load-bank.js';
import type { AttemptForm } from '../../server/delivery/attempt-form.js';
import { attemptStep, buildAttemptState } from '../../server/delivery/attempt-state.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { bankChartRenderer, respondentItemViews, seededOrder } from '../../server/delivery/item-view.js';
import { publicBaseUrl } from '../../server/delivery/public-url.js';
import { studySettingsSchema } from '../../server/delivery/study-settings.js';
import { ageBand } from '../helpers/delivery-fixture.js';
import { loadTestBank } from '../helpers/test-bank.js';

let bank: ItemBank;
beforeAll(async () => {
  bank = await loadTestBank();
});

const form = (over: Partial<AttemptForm> = {}): AttemptForm => ({
  design: 'fixed',
  booklet: 0,
  items: [
    { itemId: 'isle-ferry-busiest-day', version: 1 },
    { itemId: 'isle-ferry-monday-count', version: 1 },
  ],
  presentedAt: [null, null],
  backgroundDone: false,
  ended: null,
  seed: 'seed',
  ...over,
});
const withBackground = studySettingsSchema.parse({ title: 'T', background: [ageBand] });
const without = studySettingsSchema.parse({ title: 'T' });
const started = { status: 'started' as const, consentedAt: '2031-05-04T10:00:00.000Z' };

describe('attemptStep', () => {
  it('walks consent → background → item → finished, and reports ended attempts', () => {
    expect(attemptStep({ status: 'started', consentedAt: null }, form(), withBackground, 0)).toBe('consent');
    expect(attemptStep(started, form(), withBackground, 0)).toBe('background');
    expect(attemptStep(started, form(), without, 0)).toBe('item');
    expect(attemptStep(started, form({ backgroundDone: true }), withBackground, 1)).toBe('item');
    expect(attemptStep(started, form({ backgroundDone: true }), withBackground, 2)).toBe('finished');
    expect(attemptStep({ ...started, status: 'finished' }, form(), without, 1)).toBe('finished');
    expect(attemptStep({ ...started, status: 'abandoned' }, form({ ended: 'declined' }), without, 0)).toBe(
      'declined',
    );
    expect(attemptStep({ ...started, status: 'finished' }, form({ ended: 'left' }), without, 2)).toBe('left');
  });
});

describe('buildAttemptState', () => {
  it('shows the item at the next position with its version; the summary only when the study asks', () => {
    const delivery = deliveryBankFrom(bank, respondentItemViews(bankChartRenderer(bank)));
    const state = buildAttemptState({
      attempt: started,
      form: form(),
      settings: without,
      answered: 1,
      correct: 1,
      bank: delivery,
    });
    expect(state.step).toBe('item');
    expect(state.item).toMatchObject({
      itemId: 'isle-ferry-monday-count',
      version: 1,
      position: 1,
      unit: 'people',
      min: 0,
      max: 400,
    });
    expect(state.item?.options).toBeUndefined();
    expect(state.summary).toBeUndefined();
    const done = buildAttemptState({
      attempt: started,
      form: form(),
      settings: studySettingsSchema.parse({ title: 'T', endSummary: true }),
      answered: 2,
      correct: 1,
      bank: delivery,
    });
    expect(done.summary).toEqual({ answered: 2, chartsRead: 1 });
  });
});

describe('respondent item view', () => {
  it('shuffles options per seed, stably, and carries no option values', () => {
    const view = respondentItemViews(bankChartRenderer(bank));
    const item = bank.byId.get('isle-ferry-busiest-day')!;
    const a = view(item, 'attempt-1:x');
    expect(view(item, 'attempt-1:x').options).toEqual(a.options);
    const orders = new Set(
      Array.from({ length: 20 }, (_, i) =>
        view(item, `s${i}`)
          .options!.map((o) => o.id)
          .join(),
      ),
    );
    expect(orders.size).toBeGreaterThan(1);
    expect(a.options!.map((o) => o.id).sort()).toEqual(['a', 'b', 'c', 'd']);
    expect(Object.keys(a.options![0]!).sort()).toEqual(['id', 'text']);
    expect(a.chartSvg).toContain(item.alt);
  });

  it('seededOrder is a permutation', () => {
    const order = seededOrder(6, 'abc');
    expect([...order].sort()).toEqual([0, 1, 2, 3, 4, 5]);
    expect(seededOrder(6, 'abc')).toEqual(order);
    // past eight steps a second digest takes over: still a permutation
    const long = seededOrder(20, 'abc');
    expect([...long].sort((a, b) => a - b)).toEqual(Array.from({ length: 20 }, (_, i) => i));
  });

  it('seededOrder gives every order of three options about equally often across seeds', () => {
    // Pearson chi-square over the 3! = 6 orders of 6000 seeds; the 0.001 critical value of
    // chi-square with 5 df is 20.515 (standard chi-square tables, from memory). The classic
    // off-by-one (j drawn from 0..i-1: only cyclic orders) leaves four orders empty.
    const counts = new Map<string, number>();
    for (let s = 0; s < 6000; s++) {
      const key = seededOrder(3, `seed-${s}`).join('');
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    expect(counts.size).toBe(6);
    const chiSquare = [...counts.values()].reduce((sum, n) => sum + (n - 1000) ** 2 / 1000, 0);
    expect(chiSquare).toBeLessThan(20.515);
  });
});

describe('publicBaseUrl', () => {
  it('prefers PUBLIC_URL, else http://HOST:PORT', () => {
    expect(publicBaseUrl({ publicUrl: 'https://charts.example.org/', host: '0.0.0.0', port: 80 })).toBe(
      'https://charts.example.org',
    );
    expect(publicBaseUrl({ publicUrl: undefined, host: '192.168.1.20', port: 8080 })).toBe(
      'http://192.168.1.20:8080',
    );
    expect(publicBaseUrl({ publicUrl: undefined, host: '0.0.0.0', port: 8080 })).toBe(
      'http://127.0.0.1:8080',
    );
  });
});
