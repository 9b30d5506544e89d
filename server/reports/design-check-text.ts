import type { DesignCheck } from './design-check.js';
import { designFeatures } from './design-features.js';

const signed = (x: number) => (x >= 0 ? `+${x.toFixed(3)}` : x.toFixed(3));
const percent = (x: number) => `${Math.round(x * 100)}%`;

/** The planned chart in words: "scatter, interpret; marks 40, legend yes". */
function plannedInWords(check: DesignCheck): string {
  const parts = designFeatures.flatMap((feature) => {
    const value = check.planned.features[feature.key];
    if (value === undefined) return [];
    const name = feature.label.replace(/ \(.*\)$/, '');
    return [`${name} ${typeof value === 'boolean' ? (value ? 'yes' : 'no') : value}`];
  });
  return `${check.planned.chartType}, ${check.planned.level}${parts.length > 0 ? `; ${parts.join(', ')}` : ''}`;
}

/**
 * The design check as the terminal prints it (`plotgauge predict`): the weights table, the LR test,
 * the prediction with its interval, the cohort shares, and the model-based caveat first and last.
 */
export function designCheckToText(check: DesignCheck): string {
  const width = Math.max(7, ...check.model.weights.map((w) => w.feature.length));
  const lr = check.model.likelihoodRatio;
  const p =
    lr.pValue === null ? 'not testable' : lr.pValue < 0.001 ? 'p < 0.001' : `p = ${lr.pValue.toFixed(3)}`;
  const [lo, hi] = check.prediction.predictionInterval;
  const labelWidth = Math.max(...check.shares.map((s) => s.label.length));
  const lines = [
    `Design check (MODEL-BASED PREDICTION, not a measurement), calibration ${check.calibrationId}`,
    `Planned chart: ${plannedInWords(check)}`,
    '',
    `Feature weights, logits of difficulty (+ makes a chart harder); ${check.model.items} items, ${check.model.persons} respondents:`,
    `  ${'feature'.padEnd(width)}   weight      SE`,
    ...check.model.weights.map(
      (w) =>
        `  ${w.feature.padEnd(width)}  ${signed(w.weight).padStart(7)}  ${w.standardError.toFixed(3).padStart(6)}`,
    ),
    '',
    `Likelihood-ratio test against the Rasch model: LR = ${lr.statistic.toFixed(1)} on ${lr.degreesOfFreedom} df, ${p}.`,
    `  ${lr.reading}`,
    '',
    `Predicted difficulty: ${signed(check.prediction.difficulty)} logits (SE of the line ${check.prediction.standardError.toFixed(3)}, ` +
      `of one new chart ${check.prediction.predictionStandardError.toFixed(3)}); ` +
      `${Math.round(check.prediction.level * 100)}% prediction interval ${signed(lo)} to ${signed(hi)}.`,
    'Share likely to read it (at least a 0.67 chance of a right answer):',
    ...check.shares.map(
      (s) =>
        `  ${s.label.padEnd(labelWidth)}  ${percent(s.share).padStart(4)}  (${percent(s.interval[0])} to ${percent(s.interval[1])})`,
    ),
    '',
    check.statement,
    check.scale.note,
    check.shareMethod,
    check.model.method,
  ];
  return `${lines.join('\n')}\n`;
}
