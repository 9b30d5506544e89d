import { describe, expect, it } from 'vitest';
import { buildBank } from '../../server/bank/load-bank.js';
import { toRespondentView } from '../../server/bank/respondent-view.js';
import { entryOf, scenarios } from './lint/lint-helpers.js';
import { validItem } from './valid-item.js';

const trivialRender = (_spec: unknown, options: { alt: string; idPrefix: string }) =>
  `<svg role="img" id="${options.idPrefix}svg"></svg>`;

function bankItem(raw: unknown) {
  return buildBank({ entries: [entryOf(raw)], scenarios, maps: new Map(), problems: [] }).items[0]!;
}

describe('toRespondentView', () => {
  it("shows the chart, prompt and options in the requested order, and offers I don't know", () => {
    const view = toRespondentView(bankItem(validItem()), {
      render: trivialRender,
      optionOrder: ['d', 'c', 'b', 'a'],
    });
    expect(view.options.map((o) => o.id)).toEqual(['d', 'c', 'b', 'a']);
    expect(view.options[0]).toEqual({ id: 'd', text: 'Thursday' });
    expect(view.allowsDontKnow).toBe(true);
    expect(view.chartSvg).toBe('<svg role="img" id="item-isle-ferry-busiest-day-svg"></svg>');
    expect(view.responseKind).toBe('single-choice');
  });

  it('keeps a fixed order and rejects an order that is not a permutation', () => {
    const fixed = validItem();
    if (fixed.response.kind === 'single-choice') fixed.response.optionOrder = 'fixed';
    expect(
      toRespondentView(bankItem(fixed), {
        render: trivialRender,
        optionOrder: ['d', 'c', 'b', 'a'],
      }).options.map((o) => o.id),
    ).toEqual(['a', 'b', 'c', 'd']);
    expect(() =>
      toRespondentView(bankItem(validItem()), { render: trivialRender, optionOrder: ['a', 'a', 'b', 'c'] }),
    ).toThrow('toRespondentView optionOrder must list each option id once');
  });

  it('leaks no key, rationale, feature, option value, tolerance or rubric', () => {
    const item = bankItem(validItem());
    const text = JSON.stringify(toRespondentView(item, { render: trivialRender }));
    for (const secret of [
      item.rationale,
      'largest',
      '"value"',
      'resolvedKey',
      'distractorKinds',
      'neighbour',
      'markCount',
      '"key"',
      '"Tue"',
      '"Mon"',
    ]) {
      expect(text).not.toContain(secret);
    }
    const numeric = bankItem({
      ...validItem(),
      id: 'isle-ferry-tuesday',
      prompt: 'How many people took the ferry on Tuesday?',
      response: { kind: 'numeric', unit: 'people', tolerance: 15, min: 0, max: 400 },
      key: { by: 'query', query: { op: 'value-at', field: 'passengers', where: { day: 'Tue' } } },
    });
    const numericView = toRespondentView(numeric, { render: trivialRender });
    expect(numericView).toMatchObject({ unit: 'people', min: 0, max: 400, options: [] });
    const numericText = JSON.stringify(numericView);
    expect(numericText).not.toContain('340');
    expect(numericText).not.toContain('tolerance');
    const rubric = [
      { score: 0, description: 'SECRET-RUBRIC-0' },
      { score: 1, description: 'SECRET-RUBRIC-1' },
      { score: 2, description: 'SECRET-RUBRIC-2' },
    ];
    const short = bankItem({
      ...validItem(),
      id: 'isle-ferry-why',
      level: 'envision',
      prompt: 'What else would you like to know about these ferries?',
      response: { kind: 'short-text', rubric },
      key: { by: 'rubric' },
    });
    expect(JSON.stringify(toRespondentView(short, { render: trivialRender }))).not.toContain('SECRET-RUBRIC');
  });
});
