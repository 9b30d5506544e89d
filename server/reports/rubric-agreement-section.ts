import { agreementTable } from '../scoring/agreement/agreement-table.js';
import { weightedKappa } from '../scoring/agreement/weighted-kappa.js';
import type { DoubleScore } from '../storage/rubric-score-repository.js';
import type { StoredRubricItem } from './calibrate-study.js';

/** Agreement of two raters on one rubric item, and its partial credit steps when calibrated. */
export interface RubricAgreementItem {
  readonly itemId: string;
  /** Answers scored by two raters. */
  readonly doubleScored: number;
  /** Quadratic-weighted kappa, or null with fewer than two double-scored answers or no spread. */
  readonly kappa: number | null;
  /** 95% interval (Fleiss, Cohen & Everitt 1969 SE). */
  readonly kappaInterval: { readonly lower: number; readonly upper: number } | null;
  /** Share of double-scored answers given the same score by both raters. */
  readonly exactAgreement: number | null;
  /** Counts [first rater's score · 3 + second's], row-major 3 × 3. */
  readonly table: readonly number[];
  /** Steps δ_1, δ_2 of the calibration (logits), or null when the item is not calibrated. */
  readonly steps: readonly number[] | null;
}

/** The report's rubric section. */
export interface RubricAgreementSection {
  readonly weights: 'quadratic';
  readonly items: readonly RubricAgreementItem[];
  readonly method: string;
}

const round3 = (x: number) => Math.round(x * 1000) / 1000;

/**
 * Rater agreement per rubric item: the 3 × 3 table of the first two scores of each double-scored
 * answer (first = whoever scored first) and Cohen's quadratic-weighted kappa with its 95% interval.
 * Pure; the scores come from rubric-score-repository.ts.
 *
 * @see Cohen, J. (1968). Weighted kappa. Psychological Bulletin 70(4), 213-220.
 * @see Fleiss, J. L., Cohen, J., & Everitt, B. S. (1969). Large sample standard errors of kappa and
 *   weighted kappa. Psychological Bulletin 72(5), 323-327.
 * @param itemIds every rubric item of the study (also those with no double-scored answer)
 * @param doubles the double-scored answers
 * @param calibrated the calibration's stored partial credit steps
 */
export function rubricAgreementSection(
  itemIds: readonly string[],
  doubles: readonly DoubleScore[],
  calibrated: readonly StoredRubricItem[],
): RubricAgreementSection {
  const stepsOf = new Map(calibrated.map((item) => [item.itemId, item.steps]));
  const ids = [...new Set([...itemIds, ...doubles.map((d) => d.itemId)])].sort();
  const items = ids.map((itemId): RubricAgreementItem => {
    const pairs = doubles.filter((d) => d.itemId === itemId);
    const steps = stepsOf.get(itemId)?.map(round3) ?? null;
    if (pairs.length === 0)
      return {
        itemId,
        doubleScored: 0,
        kappa: null,
        kappaInterval: null,
        exactAgreement: null,
        table: new Array(9).fill(0),
        steps,
      };
    const table = agreementTable(
      pairs.map((p) => p.first),
      pairs.map((p) => p.second),
      3,
    );
    const exact = (table[0]! + table[4]! + table[8]!) / pairs.length;
    let kappa: number | null = null;
    let kappaInterval: RubricAgreementItem['kappaInterval'] = null;
    if (pairs.length >= 2) {
      try {
        const k = weightedKappa(table, 'quadratic');
        if (Number.isFinite(k.kappa)) {
          kappa = round3(k.kappa);
          kappaInterval = { lower: round3(k.confidenceInterval[0]), upper: round3(k.confidenceInterval[1]) };
        }
      } catch {
        // chance agreement 1 (both raters gave one score to every answer): kappa is undefined
      }
    }
    return {
      itemId,
      doubleScored: pairs.length,
      kappa,
      kappaInterval,
      exactAgreement: round3(exact),
      table: Array.from(table),
      steps,
    };
  });
  return {
    weights: 'quadratic',
    items,
    method:
      "Short-text answers are scored 0, 1 or 2 against each item's rubric. Where the study asks for two raters, agreement is Cohen's " +
      'quadratic-weighted kappa (Cohen 1968) over the answers both scored, with a 95% interval from the large-sample SE of Fleiss, Cohen & Everitt (1969); ' +
      'kappa is not given for fewer than two double-scored answers or when every answer got the same score. An answer counts with the mean of its ' +
      'two scores rounded down; when they were 0 and 2, a third rater decides (the median of the three), and kappa uses the first two. Rubric items are calibrated with the partial credit model (Masters 1982); their steps are shown in logits.',
  };
}
