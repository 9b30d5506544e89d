import { beforeAll, describe, expect, it } from 'vitest';
import type { ChartRenderer } from '../../server/bank/chart-renderer.js';
import type { BankItem, ItemBank } from '../../server/bank/load-bank.js';
import { bankChartRenderer, respondentItemViews } from '../../server/delivery/item-view.js';
import { loadTestBank } from '../helpers/test-bank.js';

let bank: ItemBank;
beforeAll(async () => {
  bank = await loadTestBank();
});

/** The bank's renderer, counting how often it draws. */
function countingRenderer(): { render: ChartRenderer; calls: () => number } {
  const real = bankChartRenderer(bank);
  let calls = 0;
  return {
    render: (spec, options) => {
      calls++;
      return real(spec, options);
    },
    calls: () => calls,
  };
}

describe('respondentItemViews chart cache', () => {
  it('draws each item version once and serves the same SVG to every attempt', () => {
    const counting = countingRenderer();
    const view = respondentItemViews(counting.render);
    const item = bank.byId.get('isle-ferry-busiest-day')!;
    const first = view(item, 'attempt-1:0');
    const second = view(item, 'attempt-2:0');
    expect(counting.calls()).toBe(1);
    expect(second.chartSvg).toBe(first.chartSvg);
    // Uncached drawing gives the same picture: the cache changes nothing a respondent sees.
    expect(respondentItemViews(bankChartRenderer(bank), 0)(item, 'attempt-3:0').chartSvg).toBe(
      first.chartSvg,
    );
    // A new version of the item is drawn again.
    const edited: BankItem = { ...item, version: `${item.version}-edited` };
    view(edited, 'attempt-1:0');
    expect(counting.calls()).toBe(2);
  });

  it('keeps at most cacheSize charts, dropping the oldest first', () => {
    const counting = countingRenderer();
    const view = respondentItemViews(counting.render, 2);
    const [a, b, c] = bank.items;
    view(a!, 's');
    view(b!, 's');
    view(c!, 's'); // drops a
    view(b!, 's');
    expect(counting.calls()).toBe(3);
    view(a!, 's');
    expect(counting.calls()).toBe(4);
  });

  it('draws every time with cacheSize 0', () => {
    const counting = countingRenderer();
    const view = respondentItemViews(counting.render, 0);
    const item = bank.items[0]!;
    view(item, 'x');
    view(item, 'y');
    expect(counting.calls()).toBe(2);
  });
});
