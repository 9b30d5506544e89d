import type { Item } from '../bank/item-schema.js';
import type { ResolvedKey } from '../bank/resolve-key.js';

/** The fields of an item that delivery reads (a loaded BankItem has them all). */
export type DeliverableItem = Pick<Item, 'id' | 'scenario' | 'status' | 'level' | 'chart' | 'response'>;

/** One loaded, validated item as delivery uses it. */
export interface DeliveryItem {
  readonly item: DeliverableItem;
  /** The bank's content hash: a new hash is a new item version. */
  readonly contentHash: string;
  /** The resolved key (server-side only; never sent to respondents). */
  readonly key: ResolvedKey;
}

/** What a respondent's screen gets for one item: no key, rationale, features or option values. */
export interface RespondentItemView {
  itemId: string;
  chartSvg: string;
  /**
   * A chart served as an image instead of inline SVG (pilot charts): fetch `src` with the attempt
   * token and show it with `alt`. `chartSvg` is then empty.
   */
  chartImage?: { src: string; alt: string };
  prompt: string;
  responseKind: Item['response']['kind'];
  options?: { id: string; text: string }[];
  unit?: string;
  min?: number;
  max?: number;
  maxLength?: number;
}

/**
 * The narrow view of the item bank that delivery needs: look items up, list them, and render
 * the respondent's view of one. `server/delivery/bank-adapter.ts` builds it from the loaded bank;
 * tests may build one from a few items.
 */
export interface DeliveryBank {
  readonly items: readonly DeliveryItem[];
  get(itemId: string): DeliveryItem | undefined;
  /** The respondent's view; `seed` fixes the option order of items whose options may be shuffled. */
  view(itemId: string, seed: string): RespondentItemView;
}
