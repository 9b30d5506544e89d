/**
 * Benchmark of adaptive item selection on a 1,000-item bank against a baseline measured in the same
 * run: a plain argmax of Rasch information P(1 − P) over the same Float64Array of difficulties.
 *
 * Run by hand, never in tests:
 *   npx tsx scripts/bench/adaptive-select.ts [--items 1000] [--repeats 200000]
 *
 * Bank: INVENTED difficulties evenly spaced on [−3, 3], three content areas (task levels) in turn.
 * Each timed call selects for a fresh ability in [−2, 2] with 20 items already given, randomesque
 * k = 5 and content balancing; a second row adds Sympson–Hetter parameters (K_i = 0.5 for every
 * item, so about half the picks are passed over and the scan repeats). Times are medians of 5
 * batches after a warm-up batch (JIT).
 */
import { buildAdaptiveBank } from '../../server/delivery/adaptive/adaptive-bank.js';
import { selectNextItem } from '../../server/delivery/adaptive/select-next-item.js';
import { seededRandom } from '../../server/scoring/seeded-random.js';

const argument = (name: string, fallback: number) => {
  const at = process.argv.indexOf(`--${name}`);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
};
const itemCount = argument('items', 1000);
const repeats = argument('repeats', 200000);
const levels = ['read', 'interpret', 'envision'];
const { bank } = buildAdaptiveBank(
  Array.from({ length: itemCount }, (_, i) => ({
    id: `item-${i}`,
    difficulty: -3 + (6 * i) / (itemCount - 1),
    area: levels[i % 3]!,
  })),
);
const random = seededRandom(1);
const unavailable = new Uint8Array(itemCount);
for (let g = 0; g < 20; g++) unavailable[random.integer(itemCount)] = 1;
const areaCounts = Int32Array.of(7, 7, 6);
const abilities = Float64Array.from({ length: 4096 }, () => -2 + 4 * random.uniform());
const halfControl = new Float64Array(itemCount).fill(0.5);

let sink = 0;
function baseline(n: number): void {
  const b = bank.difficulty;
  for (let r = 0; r < n; r++) {
    const theta = abilities[r & 4095]!;
    let best = -1;
    let bestInformation = -1;
    for (let i = 0; i < b.length; i++) {
      if (unavailable[i] !== 0) continue;
      const p = 1 / (1 + Math.exp(b[i]! - theta));
      const information = p * (1 - p);
      if (information > bestInformation) {
        bestInformation = information;
        best = i;
      }
    }
    sink += best;
  }
}
function select(n: number, exposureControl?: Float64Array): void {
  for (let r = 0; r < n; r++) {
    const selection = selectNextItem(bank, {
      ability: abilities[r & 4095]!,
      unavailable,
      areaCounts,
      randomesque: 5,
      exposureControl,
      random,
    });
    sink += selection!.index;
  }
}
function median(run: (n: number) => void): number {
  const batch = Math.max(1, Math.floor(repeats / 5));
  run(batch);
  const times: number[] = [];
  for (let k = 0; k < 5; k++) {
    const start = performance.now();
    run(batch);
    times.push(((performance.now() - start) * 1000) / batch);
  }
  return times.sort((a, b) => a - b)[2]!;
}
const base = median(baseline);
const rows = [
  ['baseline: argmax P(1-P) over all items', base],
  ['selectNextItem, k = 5, content balancing', median((n) => select(n))],
  ['selectNextItem + Sympson-Hetter (K = 0.5)', median((n) => select(n, halfControl))],
] as const;
console.log(
  `adaptive selection, ${itemCount}-item bank, median of 5 batches of ${Math.floor(repeats / 5)} calls`,
);
console.log(`${'method'.padEnd(44)}${'µs per call'.padStart(12)}${'ratio'.padStart(8)}`);
for (const [name, micros] of rows) {
  console.log(`${name.padEnd(44)}${micros.toFixed(2).padStart(12)}${(micros / base).toFixed(2).padStart(8)}`);
}
if (sink === 0.5) console.log('');
