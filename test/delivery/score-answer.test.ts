import { beforeAll, describe, expect, it } from 'vitest';
import type { BankItem, ItemBank } from '../../server/bank/load-bank.js';
import { sameAnswer } from '../../server/delivery/answer.js';
import { checkAnswer } from '../../server/delivery/check-answer.js';
import { scoreAnswer } from '../../server/delivery/score-answer.js';
import { loadTestBank } from '../helpers/test-bank.js';

let bank: ItemBank;
const item = (id: string): BankItem => bank.byId.get(id)!;
beforeAll(async () => {
  bank = await loadTestBank();
});

describe('scoreAnswer (keys resolved from the chart data)', () => {
  it('single choice: 1 only for the keyed option', () => {
    const busiest = item('isle-ferry-busiest-day');
    expect(busiest.resolvedKey.optionIds).toEqual(['b']); // Tuesday has 340, the most
    expect(scoreAnswer(busiest, busiest.resolvedKey, { kind: 'choice', optionIds: ['b'] })).toBe(1);
    expect(scoreAnswer(busiest, busiest.resolvedKey, { kind: 'choice', optionIds: ['c'] })).toBe(0);
  });

  it('multiple choice: exactly the keyed set, in any order', () => {
    const quiet = item('isle-ferry-quiet-days');
    const score = (optionIds: string[]) =>
      scoreAnswer(quiet, quiet.resolvedKey, { kind: 'choice', optionIds });
    expect(score(['thu', 'mon'])).toBe(1);
    expect(score(['mon'])).toBe(0);
    expect(score(['mon', 'thu', 'wed'])).toBe(0);
  });

  it('numeric: within the tolerance (key 120, tolerance 5), edges included', () => {
    const count = item('isle-ferry-monday-count');
    const score = (value: number) => scoreAnswer(count, count.resolvedKey, { kind: 'number', value });
    expect([score(120), score(115), score(125), score(114.9), score(125.1)]).toEqual([1, 1, 1, 0, 0]);
  });

  it("short text waits for rubric scoring (null); I don't know is 0 everywhere", () => {
    const why = item('isle-ferry-why-tuesday');
    expect(scoreAnswer(why, why.resolvedKey, { kind: 'text', text: 'market day' })).toBeNull();
    for (const entry of bank.items)
      expect(scoreAnswer(entry, entry.resolvedKey, { kind: 'dont-know' })).toBe(0);
  });
});

describe('checkAnswer', () => {
  it('accepts fitting answers and "I don\'t know" for every item', () => {
    expect(checkAnswer(item('isle-ferry-busiest-day'), { kind: 'choice', optionIds: ['a'] })).toBeUndefined();
    expect(checkAnswer(item('isle-ferry-monday-count'), { kind: 'number', value: 400 })).toBeUndefined();
    for (const entry of bank.items) expect(checkAnswer(entry, { kind: 'dont-know' })).toBeUndefined();
  });

  it.each([
    [
      'isle-ferry-busiest-day',
      { kind: 'number', value: 5 },
      'body.answer.kind',
      'this question needs a choice answer',
    ],
    [
      'isle-ferry-busiest-day',
      { kind: 'choice', optionIds: ['e'] },
      'body.answer.optionIds',
      '"e" is not one of this question\'s options',
    ],
    [
      'isle-ferry-busiest-day',
      { kind: 'choice', optionIds: ['a', 'b'] },
      'body.answer.optionIds',
      'choose exactly one option',
    ],
    [
      'isle-ferry-quiet-days',
      { kind: 'choice', optionIds: ['mon', 'mon'] },
      'body.answer.optionIds',
      'an option is chosen twice',
    ],
    ['isle-ferry-monday-count', { kind: 'number', value: 400.5 }, 'body.answer.value', 'must be at most 400'],
    [
      'isle-ferry-monday-count',
      { kind: 'text', text: '120' },
      'body.answer.kind',
      'this question needs a number answer',
    ],
    [
      'isle-ferry-why-tuesday',
      { kind: 'text', text: 'x'.repeat(201) },
      'body.answer.text',
      'must be at most 200 characters',
    ],
  ] as const)('%s %j → %s: %s', (id, answer, field, problem) => {
    expect(checkAnswer(item(id), answer as never)).toEqual({ field, problem });
  });
});

describe('sameAnswer (idempotency)', () => {
  it('treats option order and repeats as the same choice, and nothing else', () => {
    expect(
      sameAnswer({ kind: 'choice', optionIds: ['b', 'a'] }, { kind: 'choice', optionIds: ['a', 'b'] }),
    ).toBe(true);
    expect(sameAnswer({ kind: 'choice', optionIds: ['a'] }, { kind: 'choice', optionIds: ['a', 'b'] })).toBe(
      false,
    );
    expect(sameAnswer({ kind: 'number', value: 1 }, { kind: 'number', value: 1.0 })).toBe(true);
    expect(sameAnswer({ kind: 'text', text: 'rain' }, { kind: 'text', text: 'rain ' })).toBe(false);
    expect(sameAnswer({ kind: 'dont-know' }, { kind: 'dont-know' })).toBe(true);
    expect(sameAnswer({ kind: 'dont-know' }, { kind: 'number', value: 0 })).toBe(false);
  });
});
