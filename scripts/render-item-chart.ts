/**
 * Renders one item's chart to an .svg file for eyeballing.
 *
 * Usage: tsx scripts/render-item-chart.ts <item-id> [out.svg] [--items items]
 * Writes `<item-id>.svg` in the current folder when no output path is given.
 */
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { bankChartRenderer } from '../server/bank/bank-chart-renderer.js';
import { BankLoadError, loadBank } from '../server/bank/load-bank.js';

const args = process.argv.slice(2);
const itemsAt = args.indexOf('--items');
const itemsDir = path.resolve(itemsAt >= 0 ? (args[itemsAt + 1] ?? 'items') : 'items');
const positional = args.filter((_, index) => itemsAt < 0 || (index !== itemsAt && index !== itemsAt + 1));
const [id, out] = positional;
if (id === undefined) {
  console.error('usage: tsx scripts/render-item-chart.ts <item-id> [out.svg] [--items items]');
  process.exit(2);
}

try {
  const bank = await loadBank(itemsDir);
  const item = bank.byId.get(id);
  if (item === undefined) {
    console.error(`no item "${id}" in ${itemsDir}`);
    process.exit(1);
  }
  const svg = bankChartRenderer(bank.maps)(item.chart, { alt: item.alt, idPrefix: `${item.id}-` });
  const file = path.resolve(out ?? `${id}.svg`);
  await writeFile(file, svg, 'utf8');
  console.log(`${file}: ${item.chart.type} chart, ${svg.length} bytes`);
} catch (cause) {
  if (cause instanceof BankLoadError) {
    console.error(cause.message);
    process.exit(1);
  }
  throw cause;
}
