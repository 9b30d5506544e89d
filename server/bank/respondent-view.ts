import type { ChartRenderer } from './chart-renderer.js';
import type { ResponseKind } from './item-schema.js';
import type { BankItem } from './load-bank.js';

/**
 * What a respondent may see of an item, and nothing more: no key, rationale, features, option
 * values, tolerance or rubric. Routes that face respondents use only this.
 */
export interface RespondentView {
  readonly itemId: string;
  readonly version: string;
  readonly chartSvg: string;
  readonly prompt: string;
  readonly responseKind: ResponseKind;
  /** Choice options in display order (empty for numeric and short-text items). */
  readonly options: readonly { readonly id: string; readonly text: string }[];
  /** Numeric items: the unit shown beside the input, and the range the input accepts. */
  readonly unit?: string;
  readonly min?: number;
  readonly max?: number;
  /** Short-text items: the longest answer accepted. */
  readonly maxLength?: number;
  /** Every item offers "I don't know". */
  readonly allowsDontKnow: true;
}

export interface RespondentViewOptions {
  /**
   * Display order as option ids (a permutation of the item's options), chosen by the delivery.
   * Ignored for items whose options have a fixed order; the authored order when absent.
   */
  readonly optionOrder?: readonly string[];
  /** Draws the chart (receives the item's alt text for the SVG's <desc>). */
  readonly render: ChartRenderer;
  /** Prefix for the SVG's element ids; default `item-<id>-`. */
  readonly idPrefix?: string;
}

/**
 * Turns a bank item into its respondent view.
 *
 * @param item - a loaded bank item
 * @param options - option order and the chart renderer
 * @returns the view: chart SVG, prompt, options in display order, response kind
 * @throws `toRespondentView optionOrder must list each option id once` for a bad permutation
 */
export function toRespondentView(item: BankItem, options: RespondentViewOptions): RespondentView {
  const response = item.response;
  const base = {
    itemId: item.id,
    version: item.version,
    chartSvg: options.render(item.chart, { alt: item.alt, idPrefix: options.idPrefix ?? `item-${item.id}-` }),
    prompt: item.prompt,
    responseKind: response.kind,
    allowsDontKnow: true as const,
  };
  switch (response.kind) {
    case 'single-choice':
    case 'multiple-choice': {
      const authored = response.options.map((o) => ({ id: o.id, text: o.text }));
      const order = options.optionOrder;
      if (order === undefined || response.optionOrder === 'fixed') return { ...base, options: authored };
      const byId = new Map(authored.map((o) => [o.id, o]));
      if (
        order.length !== authored.length ||
        new Set(order).size !== order.length ||
        !order.every((id) => byId.has(id))
      ) {
        throw new Error('toRespondentView optionOrder must list each option id once');
      }
      return { ...base, options: order.map((id) => byId.get(id)!) };
    }
    case 'numeric':
      return {
        ...base,
        options: [],
        unit: response.unit,
        ...(response.min === undefined ? {} : { min: response.min }),
        ...(response.max === undefined ? {} : { max: response.max }),
      };
    case 'short-text':
      return { ...base, options: [], maxLength: response.maxLength };
  }
}
