import type { StoredMap } from '../charts/chart-spec.js';
import { defaultTheme } from '../charts/theme.js';
import { contentHash } from './content-hash.js';
import { deriveFeatures, type ItemFeatures } from './derive-features.js';
import type { Item, Scenario } from './item-schema.js';
import type { BankProblem } from './lint/lint-types.js';
import { formatProblem, lintBank, structuralRules } from './lint-bank.js';
import { type BankFiles, readBankFiles } from './read-bank-files.js';
import { type ResolvedKey, resolveKey } from './resolve-key.js';

/** An item as the server uses it: the file's content plus its version, resolved key and features. */
export type BankItem = Readonly<Omit<Item, 'features'>> & {
  /** sha256 of the item's canonical JSON (see content-hash.ts). */
  readonly version: string;
  /** Path of the item file, e.g. `items/isle/isle-ferry-busiest-day.json`. */
  readonly file: string;
  readonly resolvedKey: ResolvedKey;
  /** Derived complexity features merged with the authored extras. */
  readonly features: ItemFeatures;
};

/** The loaded bank: immutable, every item valid and keyed. */
export interface ItemBank {
  readonly items: readonly BankItem[];
  readonly byId: ReadonlyMap<string, BankItem>;
  readonly scenarios: readonly Scenario[];
  readonly maps: ReadonlyMap<string, StoredMap>;
}

/** The bank could not be loaded; `problems` lists every reason as `file: field: problem`. */
export class BankLoadError extends Error {
  override readonly name = 'BankLoadError';
  readonly problems: readonly BankProblem[];
  constructor(problems: readonly BankProblem[]) {
    const lines = problems.map(formatProblem);
    super(
      `the item bank has ${problems.length} problem${problems.length === 1 ? '' : 's'}:\n${lines.join('\n')}`,
    );
    this.problems = problems;
  }
}

/**
 * Loads the item bank from a folder: reads and validates every file, resolves keys, computes
 * features and versions. All or nothing: any structural problem (schema, location, duplicate id,
 * unknown scenario, encoding, key) throws a {@link BankLoadError} listing all of them.
 *
 * @param itemsDir - the bank folder (usually `items/`)
 * @throws BankLoadError listing `file: field: problem` lines
 */
export async function loadBank(itemsDir: string): Promise<ItemBank> {
  return buildBank(await readBankFiles(itemsDir));
}

/** Builds the bank from files already read (see {@link loadBank}). */
export function buildBank(files: BankFiles): ItemBank {
  const problems = [
    ...files.problems,
    ...lintBank({ ...files, theme: defaultTheme }, structuralRules).filter((p) => p.severity === 'error'),
  ];
  if (problems.length > 0) throw new BankLoadError(problems);
  const items = files.entries.map((entry): BankItem => {
    const item = entry.item!;
    const resolved = resolveKey(item);
    if (!resolved.ok)
      throw new BankLoadError([
        { file: entry.file, field: resolved.field, message: resolved.message, severity: 'error' },
      ]);
    return deepFreeze({
      ...item,
      version: contentHash(entry.raw as Record<string, unknown>),
      file: entry.file,
      resolvedKey: resolved.key,
      features: deriveFeatures(item),
    });
  });
  return Object.freeze({
    items: Object.freeze(items),
    byId: new ReadonlyMapView(new Map(items.map((item) => [item.id, item]))),
    scenarios: deepFreeze([...files.scenarios]),
    maps: new ReadonlyMapView(new Map([...files.maps].map(([name, map]) => [name, deepFreeze(map)]))),
  });
}

/** A Map wrapper with no mutating methods, so a loaded bank cannot be changed through `byId`. */
class ReadonlyMapView<K, V> implements ReadonlyMap<K, V> {
  readonly #map: Map<K, V>;
  constructor(map: Map<K, V>) {
    this.#map = map;
    Object.freeze(this);
  }
  get size(): number {
    return this.#map.size;
  }
  get(key: K): V | undefined {
    return this.#map.get(key);
  }
  has(key: K): boolean {
    return this.#map.has(key);
  }
  forEach(callback: (value: V, key: K, map: ReadonlyMap<K, V>) => void): void {
    for (const [key, value] of this.#map) callback(value, key, this);
  }
  entries(): MapIterator<[K, V]> {
    return this.#map.entries();
  }
  keys(): MapIterator<K> {
    return this.#map.keys();
  }
  values(): MapIterator<V> {
    return this.#map.values();
  }
  [Symbol.iterator](): MapIterator<[K, V]> {
    return this.#map[Symbol.iterator]();
  }
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value)) deepFreeze(child);
  }
  return value;
}
