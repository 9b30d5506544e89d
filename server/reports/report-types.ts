/**
 * The report object: the one source of every number the JSON API, the HTML page, the CSV file and
 * the command line's text summary show. Numbers are rounded once, when the report is built
 * (logits and shares to 3 decimals, fit mean-squares to 2), and printed as they are.
 */
import type { ChartType } from '../charts/chart-spec.js';
import type { UncalibratedItem } from './calibrate-study.js';
import type { FairnessSection } from './fairness-section.js';
import type { PilotSection } from './pilot-section.js';
import type { TaskLevel } from './readability-profile.js';
import type { RubricAgreementSection } from './rubric-agreement-section.js';

/** A confidence interval (percentile bootstrap); null when the calibration has no replicates. */
export type Interval = { readonly lower: number; readonly upper: number } | null;

export interface ReportCell {
  readonly chartType: ChartType;
  readonly level: TaskLevel;
  readonly itemCount: number;
  /** Median difficulty of the cell's items, logits. */
  readonly typicalDifficulty: number;
  /** Ability at which the typical item is answered right with probability RP, logits. */
  readonly rpLocation: number;
  /** Expected share of this audience answering the cell's items right. */
  readonly expectedShareCorrect: number;
  readonly expectedShareInterval: Interval;
  /** Share of this audience whose chance on the typical item is at least RP. */
  readonly shareAtRp: number;
  readonly shareAtRpInterval: Interval;
}

export interface ReportLadder {
  /** Cells easiest to hardest at RP. */
  readonly rungs: readonly {
    chartType: ChartType;
    level: TaskLevel;
    rpLocation: number;
    shareAtRp: number;
  }[];
  readonly readingCeiling: { chartType: ChartType; level: TaskLevel; rpLocation: number } | null;
  /** "The reading ceiling ..." in one sentence. */
  readonly ceilingSentence: string;
  /** The ladder in plain sentences, most capable band first. */
  readonly sentences: readonly string[];
}

export interface ReportAudience {
  /** 'all' for the whole study, or a cohort id. */
  readonly key: string;
  readonly label: string;
  readonly cohorts: readonly { id: string; label: string }[];
  /** Attempts with at least one scored answer to a calibrated item. */
  readonly respondents: number;
  /** Attempts that agreed to take part, and those that finished. */
  readonly consented: number;
  readonly finished: number;
  /** finished / consented; null when nobody consented. */
  readonly completionRate: number | null;
  readonly ability: {
    readonly mean: number;
    readonly meanInterval: Interval;
    readonly sd: number;
    readonly sdInterval: Interval;
  };
  /** Person separation reliability of the WLEs (null with fewer than 2 persons). */
  readonly reliability: number | null;
  readonly profile: readonly ReportCell[];
  readonly ladder: ReportLadder;
  /** Every respondent's WLE, sorted (logits), for the person-item map. */
  readonly personAbilities: readonly number[];
}

export interface ReportItem {
  readonly itemId: string;
  readonly chartType: ChartType | null;
  readonly level: TaskLevel | null;
  readonly difficulty: number;
  readonly standardError: number | null;
  readonly infit: number | null;
  readonly outfit: number | null;
  /** 'low' (below the range: too predictable), 'high' (above: noisy) or null (inside, or unknown). */
  readonly infitFlag: 'low' | 'high' | null;
  readonly outfitFlag: 'low' | 'high' | null;
  readonly responses: number;
  readonly dontKnowShare: number;
  readonly anchored: boolean;
}

export interface ReportComparisonCell {
  readonly chartType: ChartType;
  readonly level: TaskLevel;
  readonly expectedShareDifference: number;
  readonly expectedShareDifferenceInterval: Interval;
  readonly shareAtRpDifference: number;
  readonly shareAtRpDifferenceInterval: Interval;
}

export interface ReportComparison {
  /** Differences are `to − from` (for example after − before). */
  readonly from: { id: string; label: string };
  readonly to: { id: string; label: string };
  readonly meanDifference: number;
  /** Bootstrap SE of the difference in means (SD of the replicate differences). */
  readonly standardError: number | null;
  readonly meanDifferenceInterval: Interval;
  readonly effectSize: number;
  readonly effectSizeInterval: Interval;
  readonly effectSizeFormula: string;
  readonly effectSizeSource: string;
  readonly cells: readonly ReportComparisonCell[];
}

export interface Report {
  readonly kind: 'plotgauge-readability-report';
  readonly study: { id: string; title: string };
  readonly scope: 'study' | 'cohort' | 'comparison';
  readonly calibration: {
    readonly id: string;
    readonly createdAt: string;
    readonly method: 'mml' | 'cml';
    readonly iterations: number;
    readonly responseCount: number;
    readonly responsesUntil: string | null;
    /** Scored responses that arrived after the calibration (not in this report). */
    readonly newerResponses: number;
    readonly identification: 'first-cohort-mean' | 'anchored' | 'mean-item-location';
    readonly anchoredFrom: string | null;
    readonly itemsCalibrated: number;
    readonly uncalibrated: readonly UncalibratedItem[];
  };
  readonly settings: {
    readonly responseProbability: number;
    readonly ceilingShare: number;
    readonly confidenceLevel: number;
    readonly replicates: number;
    readonly seed: number;
    readonly fitRange: { low: number; high: number };
    readonly minRespondents: number;
    readonly minAnswersPerItem: number;
  };
  readonly audiences: readonly ReportAudience[];
  readonly comparison: ReportComparison | null;
  readonly items: readonly ReportItem[];
  /** DIF between two groups, when the report was asked for it (see fairness-section.ts). */
  readonly fairness?: FairnessSection;
  /** Pilot charts of the study and their results (see pilot-section.ts); absent without pilots. */
  readonly pilots?: PilotSection;
  /** Rater agreement and partial credit steps of rubric items, when the study has rubric scores. */
  readonly rubric?: RubricAgreementSection;
  /** Method, thresholds, calibration and caution, in words. */
  readonly foot: { method: string; thresholds: string; calibration: string; caution: string };
}
