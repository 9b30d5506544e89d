import type { BankItem, ItemBank } from '../bank/load-bank.js';
import type { DeliveryBank, RespondentItemView } from './delivery-bank.js';

/** Renders what a respondent sees of one bank item (the bank's respondent view). */
export type ItemViewRenderer = (item: BankItem, seed: string) => RespondentItemView;

/**
 * The delivery view of a loaded bank: items by id with their content hash and resolved key, and the
 * respondent view of each.
 */
export function deliveryBankFrom(bank: ItemBank, render: ItemViewRenderer): DeliveryBank {
  const entries = bank.items.map((item) => ({
    item,
    contentHash: item.version,
    key: item.resolvedKey,
    source: item,
  }));
  const byId = new Map(entries.map((entry) => [entry.item.id, entry]));
  return {
    items: entries,
    get: (itemId) => byId.get(itemId),
    view(itemId, seed) {
      const entry = byId.get(itemId);
      if (!entry) throw new Error(`deliveryBankFrom: no item ${itemId} in the bank`);
      return render(entry.source, seed);
    },
  };
}
