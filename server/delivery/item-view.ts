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
 * A permutation of 0..n-1 fixed by a seed (Fisher–Yates driven by SHA-256 of seed and step), so one
 * attempt sees the same option order on every reload and different attempts see different orders.
 * @example seededOrder(4, 'abc') // the same permutation of [0, 1, 2, 3] on every call
 */
export function seededOrder(n: number, seed: string): number[] {
  const order = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const word = createHash('sha256').update(`${seed}:${i}`).digest().readUInt32BE(0);
    const j = word % (i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

/**
 * What a respondent sees of one item: the bank's respondent view (chart SVG with the item's alt
 * text, prompt, public parts of the response; never option values, key, rationale or features),
 * with choice options shuffled per attempt by `seed` where the item allows it.
 */
export function respondentItemViews(render: ChartRenderer): ItemViewRenderer {
  return (item: BankItem, seed: string): RespondentItemView => {
    const response = item.response;
    const order =
      response.kind === 'single-choice' || response.kind === 'multiple-choice'
        ? seededOrder(response.options.length, seed).map((i) => response.options[i]!.id)
        : undefined;
    const view = toRespondentView(item, {
      render,
      idPrefix: `c${createHash('sha256').update(seed).digest('hex').slice(0, 8)}-`,
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
