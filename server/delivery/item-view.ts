import { createHash } from 'node:crypto';
import type { ChartRenderer } from '../bank/chart-renderer.js';
import type { BankItem, ItemBank } from '../bank/load-bank.js';
import { toRespondentView } from '../bank/respondent-view.js';
import { renderChart } from '../charts/render-chart.js';
import type { ItemViewRenderer } from './bank-adapter.js';
import type { RespondentItemView } from './delivery-bank.js';

/** The chart layer's renderer with the bank's stored maps bound (the bank's ChartRenderer). */
export function bankChartRenderer(bank: Pick<ItemBank, 'maps'>): ChartRenderer {
  return (chart, { alt, idPrefix }) => renderChart(chart, { description: alt, idPrefix, maps: bank.maps });
}

/**
 * A permutation of 0..n-1 fixed by a seed (Fisher–Yates driven by SHA-256 of seed and block), so
 * one attempt sees the same option order on every reload and different attempts see different
 * orders. One digest gives eight 32-bit words, so an item of up to nine options costs one hash
 * (the modulo bias is below n / 2^32).
 * @example seededOrder(4, 'abc') // the same permutation of [0, 1, 2, 3] on every call
 */
export function seededOrder(n: number, seed: string): number[] {
  const order = Array.from({ length: n }, (_, i) => i);
  let words: Buffer | undefined;
  for (let i = n - 1, step = 0; i > 0; i--, step++) {
    if (step % 8 === 0)
      words = createHash('sha256')
        .update(`${seed}:${step / 8}`)
        .digest();
    const j = (words as Buffer).readUInt32BE((step % 8) * 4) % (i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

/** How many drawn charts `respondentItemViews` keeps by default (the whole bank holds about 110). */
export const chartCacheSize = 512;

/**
 * What a respondent sees of one item: the bank's respondent view (chart SVG with the item's alt
 * text, prompt, public parts of the response; never option values, key, rationale or features),
 * with choice options shuffled per attempt by `seed` where the item allows it.
 *
 * The renderer is deterministic, so each chart is drawn once per item id and version and reused
 * (a bounded Map, oldest entry dropped first). Its element ids carry a prefix derived from the item
 * id and version, so they are the same on every request; a respondent page shows one chart at a time.
 *
 * @param cacheSize charts kept (default `chartCacheSize`; 0 draws every time)
 */
export function respondentItemViews(render: ChartRenderer, cacheSize = chartCacheSize): ItemViewRenderer {
  const drawn = new Map<string, string>();
  const chartSvg = (item: BankItem): string => {
    const key = `${item.id}@${item.version}`;
    const cached = drawn.get(key);
    if (cached !== undefined) return cached;
    const svg = render(item.chart, {
      alt: item.alt,
      idPrefix: `c${createHash('sha256').update(key).digest('hex').slice(0, 8)}-`,
    });
    if (cacheSize > 0) {
      if (drawn.size >= cacheSize) drawn.delete(drawn.keys().next().value as string);
      drawn.set(key, svg);
    }
    return svg;
  };
  return (item: BankItem, seed: string): RespondentItemView => {
    const response = item.response;
    const order =
      response.kind === 'single-choice' || response.kind === 'multiple-choice'
        ? seededOrder(response.options.length, seed).map((i) => response.options[i]!.id)
        : undefined;
    const svg = chartSvg(item);
    const view = toRespondentView(item, {
      render: () => svg,
      ...(order === undefined ? {} : { optionOrder: order }),
    });
    return {
      itemId: view.itemId,
      chartSvg: view.chartSvg,
      prompt: view.prompt,
      responseKind: view.responseKind,
      ...(view.options.length > 0 ? { options: view.options.map((o) => ({ id: o.id, text: o.text })) } : {}),
      ...(view.unit === undefined ? {} : { unit: view.unit }),
      ...(view.min === undefined ? {} : { min: view.min }),
      ...(view.max === undefined ? {} : { max: view.max }),
      ...(view.maxLength === undefined ? {} : { maxLength: view.maxLength }),
    };
  };
}
