import type { ChartRenderer } from '../bank/chart-renderer.js';
import type { ItemBank } from '../bank/load-bank.js';
import type { ChartSpec } from '../charts/chart-spec.js';
import type { ItemViewRenderer } from '../delivery/bank-adapter.js';
import { bankChartRenderer, respondentItemViews } from '../delivery/item-view.js';

/**
 * The bank's respondent views with each chart drawn once and reused (the demo serves the same 107
 * charts about 8,000 times). Option order is still shuffled per attempt by the delivery code; only the
 * SVG is shared, so its element ids carry the prefix of the first attempt that drew it, which is fine
 * because a respondent page shows one chart at a time.
 */
export function cachedItemViews(bank: Pick<ItemBank, 'maps'>): ItemViewRenderer {
  const render = bankChartRenderer(bank);
  const drawn = new WeakMap<ChartSpec, string>();
  const cached: ChartRenderer = (spec, options) => {
    let svg = drawn.get(spec);
    if (svg === undefined) {
      svg = render(spec, options);
      drawn.set(spec, svg);
    }
    return svg;
  };
  return respondentItemViews(cached);
}
