import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { z } from 'zod';
import type { StoredMap } from '../charts/chart-spec.js';
import { itemSchema, type Scenario, scenariosFileSchema } from './item-schema.js';
import { type BankProblem, error, type ItemEntry } from './lint/lint-types.js';

/** The raw contents of a bank folder, each item file parsed as far as it goes. */
export interface BankFiles {
  readonly entries: readonly ItemEntry[];
  readonly scenarios: readonly Scenario[];
  readonly maps: ReadonlyMap<string, StoredMap>;
  /** Problems with scenarios.json, map files or the folder itself. */
  readonly problems: readonly BankProblem[];
}

const storedMapSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z
    .array(
      z.object({
        type: z.literal('Feature'),
        properties: z.object({ id: z.string().min(1), name: z.string().min(1) }),
        geometry: z.object({ type: z.enum(['Polygon', 'MultiPolygon']), coordinates: z.array(z.unknown()) }),
      }),
    )
    .min(1),
});

/** The folder of stored maps inside the bank; every other folder holds one scenario's items. */
export const MAPS_FOLDER = 'maps';
export const SCENARIOS_FILE = 'scenarios.json';

/**
 * Reads a bank folder: `scenarios.json`, `maps/*.geojson` and `<scenario>/<id>.json` item files
 * (files are read in sorted order, so the result is deterministic). Nothing is thrown for bad
 * content: every problem is returned with its file and field.
 *
 * @param itemsDir - the bank folder (usually `items/`)
 */
export async function readBankFiles(itemsDir: string): Promise<BankFiles> {
  const base = path.basename(itemsDir);
  const label = (...parts: string[]): string => [base, ...parts].join('/');
  const problems: BankProblem[] = [];
  let top: string[];
  try {
    top = (await readdir(itemsDir)).sort();
  } catch (cause) {
    return {
      entries: [],
      scenarios: [],
      maps: new Map(),
      problems: [error(base, '-', `cannot read the bank folder: ${reason(cause)}`)],
    };
  }

  let scenarios: Scenario[] = [];
  const scenariosJson = await readJson(path.join(itemsDir, SCENARIOS_FILE));
  if ('error' in scenariosJson) {
    problems.push(error(label(SCENARIOS_FILE), '-', scenariosJson.error));
  } else {
    const parsed = scenariosFileSchema.safeParse(scenariosJson.value);
    if (parsed.success) scenarios = parsed.data;
    else
      for (const issue of parsed.error.issues)
        problems.push(error(label(SCENARIOS_FILE), pathOf(issue.path), issue.message));
  }

  const maps = new Map<string, StoredMap>();
  if (top.includes(MAPS_FOLDER)) {
    for (const name of (await readdir(path.join(itemsDir, MAPS_FOLDER))).sort()) {
      if (!name.endsWith('.geojson')) continue;
      const file = label(MAPS_FOLDER, name);
      const json = await readJson(path.join(itemsDir, MAPS_FOLDER, name));
      if ('error' in json) {
        problems.push(error(file, '-', json.error));
        continue;
      }
      const parsed = storedMapSchema.safeParse(json.value);
      if (parsed.success) maps.set(name.replace(/\.geojson$/, ''), parsed.data as StoredMap);
      else
        for (const issue of parsed.error.issues)
          problems.push(error(file, pathOf(issue.path), issue.message));
    }
  }

  const entries: ItemEntry[] = [];
  for (const folder of top) {
    if (folder === MAPS_FOLDER || folder === SCENARIOS_FILE) continue;
    const folderPath = path.join(itemsDir, folder);
    let names: string[];
    try {
      names = (await readdir(folderPath, { withFileTypes: true }))
        .filter((d) => d.isFile())
        .map((d) => d.name)
        .sort();
    } catch {
      continue; // a file at the top level other than scenarios.json: not part of the bank
    }
    for (const name of names) {
      if (!name.endsWith('.json')) continue;
      const file = label(folder, name);
      const json = await readJson(path.join(folderPath, name));
      if ('error' in json) {
        entries.push({ file, raw: undefined, jsonError: json.error });
        continue;
      }
      const parsed = itemSchema.safeParse(json.value);
      entries.push(parsed.success ? { file, raw: json.value, item: parsed.data } : { file, raw: json.value });
    }
  }
  return { entries, scenarios, maps, problems };
}

async function readJson(file: string): Promise<{ value: unknown } | { error: string }> {
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (cause) {
    return { error: `cannot read: ${reason(cause)}` };
  }
  try {
    return { value: JSON.parse(text) as unknown };
  } catch (cause) {
    return { error: `not valid JSON: ${reason(cause)}` };
  }
}

function reason(cause: unknown): string {
  return cause instanceof Error ? cause.message : String(cause);
}

function pathOf(parts: readonly PropertyKey[]): string {
  return parts.length === 0 ? '-' : parts.map(String).join('.');
}
