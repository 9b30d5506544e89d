import type { ChartType } from '../charts/chart-spec.js';
import { personSeparation } from '../scoring/rasch/person-separation.js';
import type { CohortAttemptCounts, ScoredResponse } from '../storage/calibration-repository.js';
import { type StoredGroup, type StudyCalibration, storedRubricSteps } from './calibrate-study.js';
import { chartTypePluralNames, taskLevelPhrases } from './chart-type-names.js';
import { complexityLadder } from './complexity-ladder.js';
import { percentileInterval } from './percentile-interval.js';
import { personEstimates } from './person-estimates.js';
import {
  type ProfileCell,
  type ProfileItem,
  readabilityProfile,
  type TaskLevel,
} from './readability-profile.js';
import type {
  Interval,
  Report,
  ReportAudience,
  ReportCell,
  ReportComparison,
  ReportItem,
  ReportLadder,
} from './report-types.js';
import { studyResponseMatrix } from './study-response-matrix.js';

/** What the report needs to know about an item from the bank. */
export interface ReportItemInfo {
  readonly chartType: ChartType;
  readonly level: TaskLevel;
}

export interface ReportOptions {
  /** One cohort's report. */
  readonly cohortId?: string;
  /** Two cohorts compared: [from, to]; differences are to − from. */
  readonly compare?: readonly [string, string];
  /** RP convention (default 0.67). */
  readonly responseProbability?: number;
  /** Share of the audience that defines the reading ceiling (default 0.8). */
  readonly ceilingShare?: number;
  /** Confidence level of the intervals (default 0.95). */
  readonly confidenceLevel?: number;
}

/**
 * Item mean-square range outside which an item is flagged: 0.7–1.3, the range for "run of the mill"
 * multiple-choice tests in Wright, Linacre, Gustafson & Martin-Löf (1994), "Reasonable mean-square
 * fit values", Rasch Measurement Transactions 8:3, p. 370 (the table itself from memory).
 */
export const fitRange = { low: 0.7, high: 1.3 } as const;

export const caution =
  'This report describes an audience, not a person. It is not for high-stakes decisions about anyone. ' +
  "Consent and the handling of the answers follow local law and the institution's ethics review.";

export interface ComposeInput {
  readonly study: { id: string; title: string };
  readonly cohorts: readonly { id: string; label: string }[];
  readonly calibration: StudyCalibration;
  /** Scored responses up to the calibration's watermark. */
  readonly responses: readonly ScoredResponse[];
  readonly attempts: readonly CohortAttemptCounts[];
  readonly newerResponses: number;
  readonly itemInfo: (itemId: string) => ReportItemInfo | undefined;
  readonly options: ReportOptions;
}

const round = (value: number, digits = 3) => {
  const f = 10 ** digits;
  const r = Math.round(value * f) / f;
  return Object.is(r, -0) ? 0 : r;
};

/** A group's weight within an audience and its point and replicate distributions. */
interface Member {
  readonly index: number;
  readonly group: StoredGroup;
}

/** Mixture moments of normal groups weighted by persons (exact for a mixture of normals). */
function mixtureMoments(members: readonly Member[], dist: (m: Member) => { mean: number; sd: number }) {
  const total = members.reduce((s, m) => s + m.group.persons, 0);
  let mean = 0;
  let second = 0;
  for (const m of members) {
    const w = m.group.persons / total;
    const d = dist(m);
    mean += w * d.mean;
    second += w * (d.sd * d.sd + d.mean * d.mean);
  }
  return { mean, sd: Math.sqrt(Math.max(second - mean * mean, 0)) };
}

/** Profile of a mixture: person-weighted average of each group's cells (exact for a mixture). */
function mixtureProfile(
  items: readonly ProfileItem[],
  members: readonly Member[],
  dist: (m: Member) => { mean: number; sd: number },
  rp: number,
): ProfileCell[] {
  const total = members.reduce((s, m) => s + m.group.persons, 0);
  const per = members.map((m) => ({
    w: m.group.persons / total,
    cells: readabilityProfile(items, dist(m), { responseProbability: rp }),
  }));
  return per[0]!.cells.map((cell, c) => ({
    ...cell,
    expectedShareCorrect: per.reduce((s, p) => s + p.w * p.cells[c]!.expectedShareCorrect, 0),
    shareAtRp: per.reduce((s, p) => s + p.w * p.cells[c]!.shareAtRp, 0),
  }));
}

function interval(values: readonly number[], level: number, digits = 3): Interval {
  if (values.length < 2) return null;
  const [lower, upper] = percentileInterval(values, level);
  return { lower: round(lower, digits), upper: round(upper, digits) };
}

function ladderOf(cells: readonly ProfileCell[], ceilingShare: number, rp: number): ReportLadder {
  const ladder = complexityLadder(cells, { ceilingShare });
  const pct = Math.round(ceilingShare * 100);
  const rpPct = Math.round(rp * 100);
  const ceiling = ladder.readingCeiling;
  const ceilingSentence = ceiling
    ? `Reading ceiling: the hardest task that at least ${pct}% of this audience handles (a ${rpPct}% chance of success or better) is to ${taskLevelPhrases[ceiling.level]} ${chartTypePluralNames[ceiling.chartType]}.`
    : `Reading ceiling: no chart type and task reaches ${pct}% of this audience at a ${rpPct}% chance of success; start with the easiest rungs of the ladder.`;
  return {
    rungs: ladder.rungs.map((r) => ({
      chartType: r.chartType,
      level: r.level,
      rpLocation: round(r.rpLocation),
      shareAtRp: round(r.shareAtRp),
    })),
    readingCeiling: ceiling
      ? { chartType: ceiling.chartType, level: ceiling.level, rpLocation: round(ceiling.rpLocation) }
      : null,
    ceilingSentence,
    sentences: ladder.sentences,
  };
}

/**
 * Composes the report from a stored calibration and the responses it used. Pure: no database, no
 * randomness (the bootstrap replicates were drawn and stored by the calibration).
 *
 * Audience of a whole study: the cohorts' normal distributions as a mixture weighted by respondents,
 * so shares are the person-weighted averages of the cohorts' shares (exact for a mixture).
 *
 * @throws Error when a requested cohort is not among the calibration's groups (callers check first)
 */
export function composeReport(input: ComposeInput): Report {
  const { calibration, options } = input;
  const rp = options.responseProbability ?? 0.67;
  const ceilingShare = options.ceilingShare ?? 0.8;
  const level = options.confidenceLevel ?? 0.95;
  const groups = calibration.settings.groups;
  const draws = calibration.settings.bootstrap.draws;
  const labelOf = new Map(input.cohorts.map((c) => [c.id, c.label]));

  const profileItems: ProfileItem[] = [];
  for (const item of calibration.items) {
    const info = input.itemInfo(item.itemId);
    if (info) profileItems.push({ itemId: item.itemId, ...info, difficulty: item.difficulty });
  }
  if (profileItems.length === 0) throw new Error('composeReport requires calibrated items found in the bank');

  const difficultyOf = new Map(calibration.items.map((i) => [i.itemId, i.difficulty]));
  const { matrix, cohortOfPerson } = studyResponseMatrix(input.responses, (id) => difficultyOf.has(id));
  const rubricSteps = storedRubricSteps(calibration.settings);
  const persons = personEstimates(
    matrix,
    Float64Array.from(matrix.itemIds, (id) => difficultyOf.get(id)!),
    rubricSteps.size > 0 ? matrix.itemIds.map((id) => rubricSteps.get(id)) : undefined,
  );
  const cohortOfAttempt = new Map(matrix.personIds.map((id, p) => [id, cohortOfPerson[p]!]));

  const membersOf = (cohortIds: readonly string[]): Member[] =>
    groups.map((group, index) => ({ index, group })).filter((m) => cohortIds.includes(m.group.cohortId));

  const audience = (key: string, label: string, cohortIds: readonly string[]) => {
    const members = membersOf(cohortIds);
    const point = (m: Member) => m.group;
    const replicate = (r: number) => (m: Member) => {
      const [mean, sd] = draws[r]![m.index]!;
      return { mean, sd };
    };
    const moments = mixtureMoments(members, point);
    const replicateMoments = draws.map((_, r) => mixtureMoments(members, replicate(r)));
    const cells = mixtureProfile(profileItems, members, point, rp);
    const replicateCells = draws.map((_, r) => mixtureProfile(profileItems, members, replicate(r), rp));
    const inAudience = persons.filter((p) => cohortIds.includes(cohortOfAttempt.get(p.personId)!));
    const separation =
      inAudience.length >= 2
        ? personSeparation(
            Float64Array.from(inAudience, (p) => p.ability),
            Float64Array.from(inAudience, (p) => p.standardError),
          ).reliability
        : null;
    const counts = input.attempts.filter((a) => cohortIds.includes(a.cohortId));
    const consented = counts.reduce((s, a) => s + a.consented, 0);
    const finished = counts.reduce((s, a) => s + a.finished, 0);
    const profile: ReportCell[] = cells.map((cell, c) => ({
      chartType: cell.chartType,
      level: cell.level,
      itemCount: cell.itemCount,
      typicalDifficulty: round(cell.typicalDifficulty),
      rpLocation: round(cell.rpLocation),
      expectedShareCorrect: round(cell.expectedShareCorrect),
      expectedShareInterval: interval(
        replicateCells.map((cs) => cs[c]!.expectedShareCorrect),
        level,
      ),
      shareAtRp: round(cell.shareAtRp),
      shareAtRpInterval: interval(
        replicateCells.map((cs) => cs[c]!.shareAtRp),
        level,
      ),
    }));
    const result: ReportAudience = {
      key,
      label,
      cohorts: members.map((m) => ({
        id: m.group.cohortId,
        label: labelOf.get(m.group.cohortId) ?? m.group.label,
      })),
      respondents: inAudience.length,
      consented,
      finished,
      completionRate: consented > 0 ? round(finished / consented) : null,
      ability: {
        mean: round(moments.mean),
        meanInterval: interval(
          replicateMoments.map((m) => m.mean),
          level,
        ),
        sd: round(moments.sd),
        sdInterval: interval(
          replicateMoments.map((m) => m.sd),
          level,
        ),
      },
      reliability: separation === null ? null : round(separation),
      profile,
      ladder: ladderOf(cells, ceilingShare, rp),
      personAbilities: inAudience.map((p) => round(p.ability, 2)).sort((a, b) => a - b),
    };
    return { result, members, moments, replicateMoments, cells, replicateCells };
  };

  const calibrated = new Set(groups.map((g) => g.cohortId));
  const requireCohort = (id: string) => {
    if (!calibrated.has(id)) throw new Error(`composeReport cohort ${id} is not in the calibration`);
  };
  let scope: Report['scope'] = 'study';
  let built: ReturnType<typeof audience>[];
  if (options.compare) {
    scope = 'comparison';
    options.compare.forEach(requireCohort);
    built = options.compare.map((id) => audience(id, labelOf.get(id) ?? id, [id]));
  } else if (options.cohortId !== undefined) {
    scope = 'cohort';
    requireCohort(options.cohortId);
    built = [
      audience(options.cohortId, labelOf.get(options.cohortId) ?? options.cohortId, [options.cohortId]),
    ];
  } else {
    built = [audience('all', 'Everyone in the study', [...calibrated])];
  }

  const comparison = scope === 'comparison' ? compareAudiences(built[0]!, built[1]!, level) : null;

  const answers = new Map<string, { n: number; dontKnow: number }>();
  for (const r of input.responses) {
    const a = answers.get(r.itemId) ?? { n: 0, dontKnow: 0 };
    a.n++;
    if (r.answerKind === 'dont-know') a.dontKnow++;
    answers.set(r.itemId, a);
  }
  const flag = (value: number | null) =>
    value === null ? null : value < fitRange.low ? 'low' : value > fitRange.high ? 'high' : null;
  const items: ReportItem[] = calibration.items.map((item) => {
    const info = input.itemInfo(item.itemId);
    const a = answers.get(item.itemId) ?? { n: 0, dontKnow: 0 };
    const infit = item.infit === null ? null : round(item.infit, 2);
    const outfit = item.outfit === null ? null : round(item.outfit, 2);
    return {
      itemId: item.itemId,
      chartType: info?.chartType ?? null,
      level: info?.level ?? null,
      difficulty: round(item.difficulty),
      standardError: item.standardError === null ? null : round(item.standardError),
      infit,
      outfit,
      infitFlag: flag(infit),
      outfitFlag: flag(outfit),
      responses: a.n,
      dontKnowShare: a.n > 0 ? round(a.dontKnow / a.n) : 0,
      anchored: item.anchored,
    };
  });

  const record = calibration.record;
  const s = calibration.settings;
  const replicates = draws.length;
  const pct = (x: number) => `${Math.round(x * 100)}%`;
  return {
    kind: 'plotgauge-readability-report',
    study: input.study,
    scope,
    calibration: {
      id: record.id,
      createdAt: record.createdAt,
      method: record.method,
      iterations: record.iterations,
      responseCount: record.responseCount,
      responsesUntil: record.responsesUntil,
      newerResponses: input.newerResponses,
      identification: s.identification,
      anchoredFrom: s.anchoredFrom,
      itemsCalibrated: calibration.items.length,
      uncalibrated: s.uncalibrated,
    },
    settings: {
      responseProbability: rp,
      ceilingShare,
      confidenceLevel: level,
      replicates,
      seed: s.bootstrap.seed,
      fitRange: { ...fitRange },
      minRespondents: s.minRespondents,
      minAnswersPerItem: s.minAnswersPerItem,
    },
    audiences: built.map((b) => b.result),
    comparison,
    items,
    foot: {
      method:
        (s.identification === 'mean-item-location'
          ? 'Partial credit model (Masters 1982; right/wrong items are its one-step case): item parameters by conditional maximum likelihood, ' +
            'rubric items placed at the mean of their two steps; then one normal ability distribution per cohort by marginal maximum likelihood ' +
            `with the right/wrong items held at their values (Bock & Aitkin 1981; ${s.quadraturePoints} Gauss–Hermite points). Shares`
          : 'Rasch model, item difficulties and one normal ability distribution per cohort estimated together by marginal maximum likelihood ' +
            `(Bock & Aitkin 1981; ${s.quadraturePoints} Gauss–Hermite points). Shares`) +
        ' are expected values over the estimated distribution, ' +
        'not raw percent correct, so cohorts that saw different items compare fairly. Person measures are Warm (1989) WLEs. ' +
        `Intervals: ${pct(level)} percentile bootstrap over respondents within cohorts, items held fixed (${replicates} replicates, seed ${s.bootstrap.seed}).`,
      thresholds:
        `"Can handle" means a chance of success of ${pct(rp)} or more on the typical (median) item of a chart type and task (the RP${Math.round(rp * 100)} convention; ` +
        'two-thirds in bookmark standard setting, 0.65 in NAEP item maps). ' +
        `Reading ceiling: the hardest such cell that ${pct(ceilingShare)} of the audience can handle. ` +
        `Item fit flagged outside ${fitRange.low}–${fitRange.high} (Wright, Linacre, Gustafson & Martin-Löf 1994, RMT 8:3 p. 370, "run of the mill" multiple choice). ` +
        `Items need ${s.minAnswersPerItem} answers to be calibrated; a calibration needs ${s.minRespondents} respondents who finished.`,
      calibration:
        `Calibration ${record.id} of ${record.createdAt}, from ${record.responseCount} scored responses up to ${record.responsesUntil ?? 'none'}; ` +
        `${calibration.items.length} items calibrated, ${s.uncalibrated.length} not yet; ` +
        (s.identification === 'anchored'
          ? `items anchored to calibration ${s.anchoredFrom}.`
          : s.identification === 'mean-item-location'
            ? 'scale fixed by the mean item location at 0 logits.'
            : `scale fixed by the first cohort's mean ability at 0 logits (${groups[0]?.label ?? ''}).`) +
        (input.newerResponses > 0
          ? ` ${input.newerResponses} newer responses are not included; calibrate again to include them.`
          : ''),
      caution,
    },
  };
}

function compareAudiences(
  from: {
    result: ReportAudience;
    moments: { mean: number; sd: number };
    replicateMoments: { mean: number; sd: number }[];
    cells: ProfileCell[];
    replicateCells: ProfileCell[][];
  },
  to: typeof from,
  level: number,
): ReportComparison {
  const d = (a: { mean: number; sd: number }, b: { mean: number; sd: number }) =>
    (b.mean - a.mean) / Math.sqrt((a.sd * a.sd + b.sd * b.sd) / 2);
  const differences = from.replicateMoments.map((m, r) => to.replicateMoments[r]!.mean - m.mean);
  const sdOf = (values: readonly number[]) => {
    if (values.length < 2) return null;
    const mean = values.reduce((s, v) => s + v, 0) / values.length;
    return Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1));
  };
  const se = sdOf(differences);
  return {
    from: { id: from.result.key, label: from.result.label },
    to: { id: to.result.key, label: to.result.label },
    meanDifference: round(to.moments.mean - from.moments.mean),
    standardError: se === null ? null : round(se),
    meanDifferenceInterval: interval(differences, level),
    effectSize: round(d(from.moments, to.moments)),
    effectSizeInterval: interval(
      from.replicateMoments.map((m, r) => d(m, to.replicateMoments[r]!)),
      level,
    ),
    effectSizeFormula: 'd = (mean_to − mean_from) / √((SD_from² + SD_to²) / 2), on the logit scale',
    effectSizeSource:
      'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., ch. 2 (d with the root mean square of the two SDs; from memory)',
    cells: from.cells.map((cell, c) => ({
      chartType: cell.chartType,
      level: cell.level,
      expectedShareDifference: round(to.cells[c]!.expectedShareCorrect - cell.expectedShareCorrect),
      expectedShareDifferenceInterval: interval(
        from.replicateCells.map(
          (cs, r) => to.replicateCells[r]![c]!.expectedShareCorrect - cs[c]!.expectedShareCorrect,
        ),
        level,
      ),
      shareAtRpDifference: round(to.cells[c]!.shareAtRp - cell.shareAtRp),
      shareAtRpDifferenceInterval: interval(
        from.replicateCells.map((cs, r) => to.replicateCells[r]![c]!.shareAtRp - cs[c]!.shareAtRp),
        level,
      ),
    })),
  };
}
