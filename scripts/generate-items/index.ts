/**
 * Writes the item bank: items/<scenario>/<id>.json, one file per item, from the drafts in this
 * folder (one module per chart type). Deterministic: no clock, no unseeded randomness, stable key
 * order in every file, so re-running it on unchanged drafts changes no bytes.
 *
 * Before writing, every item is parsed with the bank's schema, every read key's expected answer is
 * checked against the option values (exactly one option must carry it) and against the bank's
 * own key resolution, and the key position of
 * shuffle-able options is balanced across the bank (the key goes to positions 1, 2, 3, ... in turn).
 *
 * Usage: npx tsx scripts/generate-items/index.ts
 */
import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { areaDrafts } from './area.js';
import { barDrafts } from './bar.js';
import { boxPlotDrafts } from './box-plot.js';
import { bubbleDrafts } from './bubble.js';
import { buildItems } from './build-items.js';
import { choroplethMapDrafts } from './choropleth-map.js';
import type { Draft } from './draft.js';
import { groupedBarDrafts } from './grouped-bar.js';
import { heatmapDrafts } from './heatmap.js';
import { histogramDrafts } from './histogram.js';
import { lineDrafts } from './line.js';
import { networkDrafts } from './network.js';
import { pieDrafts } from './pie.js';
import { scatterDrafts } from './scatter.js';
import { shortTextDrafts } from './short-text.js';
import { stackedBarDrafts } from './stacked-bar.js';
import { symbolMapDrafts } from './symbol-map.js';
import { tableDrafts } from './table.js';
import { treemapDrafts } from './treemap.js';

export const allDrafts: readonly Draft[] = [
  ...tableDrafts,
  ...barDrafts,
  ...groupedBarDrafts,
  ...stackedBarDrafts,
  ...lineDrafts,
  ...areaDrafts,
  ...pieDrafts,
  ...scatterDrafts,
  ...bubbleDrafts,
  ...histogramDrafts,
  ...boxPlotDrafts,
  ...heatmapDrafts,
  ...choroplethMapDrafts,
  ...symbolMapDrafts,
  ...networkDrafts,
  ...treemapDrafts,
  ...shortTextDrafts,
];

function main(): void {
  const ids = new Set<string>();
  for (const draft of allDrafts) {
    if (ids.has(draft.id)) throw new Error(`duplicate item id ${draft.id}`);
    ids.add(draft.id);
  }
  const items = buildItems(allDrafts);
  const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'items');
  for (const item of items) {
    const dir = join(root, item.scenario);
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, `${item.id}.json`), `${JSON.stringify(item, null, 2)}\n`);
  }
  // Files the generator did not write (hand-written or from removed drafts) are reported, not deleted.
  for (const scenario of new Set(items.map((i) => i.scenario))) {
    for (const file of readdirSync(join(root, scenario))) {
      if (file.endsWith('.json') && !ids.has(file.slice(0, -5)))
        console.warn(`not generated: items/${scenario}/${file}`);
    }
  }
  console.log(`wrote ${items.length} items`);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) main();
