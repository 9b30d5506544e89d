/**
 * `npm run bank:check`: lints every item in items/ and prints `file: field: problem` lines.
 * Exits 1 when any error is found; otherwise prints warnings (if any) and a table of item counts
 * per chart type and task level, and exits 0.
 *
 * Usage: tsx scripts/check-bank.ts [items-folder]
 */
import path from 'node:path';
import { bankLabelBoxes } from '../server/bank/bank-chart-renderer.js';
import { taskLevels } from '../server/bank/item-schema.js';
import { formatProblem, lintBank } from '../server/bank/lint-bank.js';
import { readBankFiles } from '../server/bank/read-bank-files.js';
import { chartTypes } from '../server/charts/chart-spec.js';
import { defaultTheme } from '../server/charts/theme.js';

const itemsDir = path.resolve(process.argv[2] ?? 'items');
const files = await readBankFiles(itemsDir);
const problems = [
  ...files.problems,
  ...lintBank({ ...files, theme: defaultTheme, labelBoxes: bankLabelBoxes(files.maps) }),
];
const errors = problems.filter((p) => p.severity === 'error');
for (const problem of problems) console.log(formatProblem(problem));

if (errors.length > 0) {
  console.log(
    `\n${errors.length} error${errors.length === 1 ? '' : 's'} in ${new Set(errors.map((e) => e.file)).size} file(s)`,
  );
  process.exit(1);
}

const items = files.entries.map((e) => e.item!).filter((item) => item.status !== 'retired');
const width = Math.max(...chartTypes.map((t) => t.length), 'chart type'.length);
const row = (cells: readonly string[]): string =>
  cells.map((cell, index) => (index === 0 ? cell.padEnd(width) : cell.padStart(10))).join(' ');
console.log(row(['chart type', ...taskLevels, 'total']));
for (const type of chartTypes) {
  const ofType = items.filter((item) => item.chart.type === type);
  if (ofType.length === 0) continue;
  console.log(
    row([
      type,
      ...taskLevels.map((level) => String(ofType.filter((i) => i.level === level).length)),
      String(ofType.length),
    ]),
  );
}
console.log(
  row([
    'total',
    ...taskLevels.map((level) => String(items.filter((i) => i.level === level).length)),
    String(items.length),
  ]),
);
console.log(
  `\n${items.length} items (not retired), ${new Set(items.map((i) => i.chart.type)).size} chart types, ${files.scenarios.length} scenarios: no errors`,
);
