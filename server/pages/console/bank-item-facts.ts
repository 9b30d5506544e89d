import type { BankItem } from '../../bank/load-bank.js';
import type { EffectiveItemStatus } from '../../delivery/item-status-service.js';
import type { ItemDifClass } from '../../reports/bank-dif-service.js';
import { fitRange } from '../../reports/compose-report.js';
import type { LatestItemCalibration } from '../../storage/item-statistics-repository.js';

/** What the bank browser says about one item: the item, its status now and its statistics. */
export interface BankItemFacts {
  item: BankItem;
  status: EffectiveItemStatus;
  calibration: LatestItemCalibration | undefined;
  /** Stored responses to the item over every study. */
  responses: number;
  /** Attempts with at least one response over every study (exposure's denominator). */
  attempts: number;
  dif: ItemDifClass | undefined;
}

/** Difficulty in logits with its standard error, e.g. "0.42 ± 0.18 logits", or "not calibrated yet". */
export function difficultyText(calibration: LatestItemCalibration | undefined): string {
  if (calibration === undefined) return 'not calibrated yet';
  const se = calibration.standardError === null ? '' : ` ± ${calibration.standardError.toFixed(2)}`;
  return `${calibration.difficulty.toFixed(2)}${se} logits`;
}

/** True when a mean-square fit value lies outside the usual range (see `fitRange`). */
export function fitIsUnusual(value: number | null): boolean {
  return value !== null && (value < fitRange.low || value > fitRange.high);
}

/** Infit and outfit mean squares in words, and whether either is outside the usual range. */
export function fitText(calibration: LatestItemCalibration | undefined): { text: string; flagged: boolean } {
  if (calibration === undefined) return { text: 'not calibrated yet', flagged: false };
  const show = (value: number | null) => (value === null ? 'none' : value.toFixed(2));
  const flagged = fitIsUnusual(calibration.infit) || fitIsUnusual(calibration.outfit);
  return { text: `infit ${show(calibration.infit)}, outfit ${show(calibration.outfit)}`, flagged };
}

/** The usual fit range in words, for the flag's explanation. */
export const fitRangeText = `${fitRange.low.toFixed(1)} to ${fitRange.high.toFixed(1)}`;

/**
 * Exposure = responses / attempts with any answer, in words, e.g. "12 answers in 40 attempts (30%)";
 * "no attempts yet" when nobody has answered anything.
 */
export function exposureText(responses: number, attempts: number): string {
  if (attempts === 0) return 'no attempts yet';
  const share = Math.round((100 * responses) / attempts);
  return `${responses} ${responses === 1 ? 'answer' : 'answers'} in ${attempts} ${attempts === 1 ? 'attempt' : 'attempts'} (${share}%)`;
}

/** The DIF class in words, or "not checked" when no fairness check covers the item. */
export function difText(dif: ItemDifClass | undefined): string {
  if (dif === undefined) return 'not checked';
  return dif.etsClass === null ? `not classed (${dif.groups})` : `class ${dif.etsClass} (${dif.groups})`;
}
