/**
 * The report's "Pilot charts" section (pure: no database). For each pilot of the study: answers so
 * far and how many more it needs; once it has enough, its difficulty on the bank's scale (MML with
 * every calibrated bank item anchored at the calibration's difficulty, see pilot-results.ts), its
 * place on the complexity ladder, and each cohort's share likely to read it with an interval.
 *
 * Pilot answers enter nothing else: the calibration, the audiences and the items of the report are
 * computed without them (they live in their own table).
 */
import { buildResponseMatrix } from '../scoring/build-response-matrix.js';
import type { ScoredResponse } from '../storage/calibration-repository.js';
import type { ScoredPilotResponse } from '../storage/pilot-response-repository.js';
import type { StudyCalibration } from './calibrate-study.js';
import { chartTypePluralNames, taskLevelPhrases } from './chart-type-names.js';
import { calibratePilot, pilotCohortShares, pilotResponsesNeeded } from './pilot-results.js';
import type { Interval, ReportLadder } from './report-types.js';

/** A rung of the ladder as the pilot section names it. */
export interface PilotRung {
  readonly chartType: ReportLadder['rungs'][number]['chartType'];
  readonly level: ReportLadder['rungs'][number]['level'];
  readonly rpLocation: number;
}

export interface PilotResult {
  readonly pilotId: string;
  readonly prompt: string;
  readonly status: 'active' | 'retired';
  /** Answers stored so far, and those the section used (up to the calibration's watermark). */
  readonly answers: number;
  readonly answersUsed: number;
  readonly minResponses: number;
  /** How many more answers before the pilot is calibrated (0 once it has enough). */
  readonly responsesNeeded: number;
  /** Share of the used answers that were right (raw, not model-based). */
  readonly shareRight: number | null;
  readonly state: 'collecting' | 'calibrated' | 'not-estimable';
  /** Why a pilot with enough answers has no difficulty. */
  readonly reason: string | null;
  readonly difficulty: number | null;
  readonly standardError: number | null;
  /** Ability at which the pilot is read with probability RP (logits). */
  readonly rpLocation: number | null;
  /** The ladder's rungs just below and above the pilot at RP, and the sentence. */
  readonly ladder: {
    readonly below: PilotRung | null;
    readonly above: PilotRung | null;
    readonly sentence: string;
  } | null;
  readonly cohorts: readonly {
    readonly cohortId: string;
    readonly label: string;
    readonly share: number;
    readonly interval: Interval;
  }[];
}

export interface PilotSection {
  readonly responseProbability: number;
  readonly pilots: readonly PilotResult[];
  /** Method in words. */
  readonly method: string;
}

export interface PilotSectionInput {
  readonly pilots: readonly {
    readonly id: string;
    readonly prompt: string;
    readonly status: 'active' | 'retired';
    readonly minResponses: number;
  }[];
  /** Every stored answer count per pilot (for "answers so far"). */
  readonly answerCounts: ReadonlyMap<string, number>;
  /** Pilot answers up to the calibration's watermark. */
  readonly pilotAnswers: readonly ScoredPilotResponse[];
  /** Bank answers the calibration used. */
  readonly bankResponses: readonly ScoredResponse[];
  readonly calibration: StudyCalibration;
  /** The ladder's rungs (the same RP locations for every audience). */
  readonly rungs: readonly PilotRung[];
  /** Cohorts whose shares are shown (the report's audiences), with their labels. */
  readonly cohorts: readonly { readonly id: string; readonly label: string }[];
  readonly responseProbability: number;
}

const round = (value: number, digits = 3) => {
  const f = 10 ** digits;
  const r = Math.round(value * f) / f;
  return Object.is(r, -0) ? 0 : r;
};

const rungWords = (rung: PilotRung) =>
  `${taskLevelPhrases[rung.level]} ${chartTypePluralNames[rung.chartType]}`;

/** Where a location sits among the rungs (sorted by RP location), in words. */
export function ladderPlace(
  rpLocation: number,
  rungs: readonly PilotRung[],
): { below: PilotRung | null; above: PilotRung | null; sentence: string } {
  const sorted = rungs
    .map((r) => ({ chartType: r.chartType, level: r.level, rpLocation: r.rpLocation }))
    .sort((a, b) => a.rpLocation - b.rpLocation);
  const below = [...sorted].reverse().find((r) => r.rpLocation <= rpLocation) ?? null;
  const above = sorted.find((r) => r.rpLocation > rpLocation) ?? null;
  const at = (r: PilotRung) => `${rungWords(r)} (${round(r.rpLocation, 2).toFixed(2)} logits)`;
  const sentence =
    below && above
      ? `On the complexity ladder it sits between "${at(below)}" and "${at(above)}".`
      : below
        ? `It is harder than every rung of the complexity ladder; the hardest is "${at(below)}".`
        : above
          ? `It is easier than every rung of the complexity ladder; the easiest is "${at(above)}".`
          : 'The complexity ladder has no rungs to compare with.';
  return { below, above, sentence };
}

/**
 * Builds the section. Calibrates each pilot that has at least its `minResponses` answers (used
 * answers, up to the calibration's watermark) with every calibrated right/wrong bank item anchored;
 * cohorts are the MML groups. A pilot answered all right or all wrong, or whose fit does not
 * converge, is `not-estimable` with the reason.
 */
export function pilotSection(input: PilotSectionInput): PilotSection {
  const rp = input.responseProbability;
  const { calibration } = input;
  const rubricItems = new Set((calibration.settings.partialCredit?.items ?? []).map((i) => i.itemId));
  const anchors = new Map(
    calibration.items
      .filter((i) => !rubricItems.has(i.itemId) && Number.isFinite(i.difficulty))
      .map((i) => [i.itemId, i.difficulty]),
  );
  const bankCells = input.bankResponses
    .filter((r) => anchors.has(r.itemId) && (r.score === 0 || r.score === 1))
    .map((r) => ({ person: r.attemptId, item: r.itemId, score: r.score }));
  const cohortOfAttempt = new Map<string, string>();
  for (const r of input.bankResponses) cohortOfAttempt.set(r.attemptId, r.cohortId);
  for (const r of input.pilotAnswers) cohortOfAttempt.set(r.attemptId, r.cohortId);
  const labelOf = new Map(input.cohorts.map((c) => [c.id, c.label]));
  const shown = new Set(input.cohorts.map((c) => c.id));
  const groups = calibration.settings.groups;
  const draws = calibration.settings.bootstrap.draws;

  const pilots = input.pilots.map((pilot): PilotResult => {
    const answers = input.pilotAnswers.filter((a) => a.pilotId === pilot.id);
    const used = answers.length;
    const right = answers.filter((a) => a.score === 1).length;
    const needed = pilotResponsesNeeded(used, pilot.minResponses);
    const base = {
      pilotId: pilot.id,
      prompt: pilot.prompt,
      status: pilot.status,
      answers: input.answerCounts.get(pilot.id) ?? 0,
      answersUsed: used,
      minResponses: pilot.minResponses,
      responsesNeeded: needed,
      shareRight: used > 0 ? round(right / used) : null,
    };
    const none = { difficulty: null, standardError: null, rpLocation: null, ladder: null, cohorts: [] };
    if (needed > 0) return { ...base, state: 'collecting', reason: null, ...none };
    if (right === 0 || right === used) {
      const reason = right === 0 ? 'every answer was wrong' : 'every answer was right';
      return {
        ...base,
        state: 'not-estimable',
        reason: `${reason}, so its difficulty is outside the scale`,
        ...none,
      };
    }
    const column = `pilot:${pilot.id}`;
    const matrix = buildResponseMatrix([
      ...bankCells,
      ...answers.map((a) => ({ person: a.attemptId, item: column, score: a.score })),
    ]);
    const cohortIds = [...new Set(matrix.personIds.map((id) => cohortOfAttempt.get(id)!))].sort();
    const groupOf = new Map(cohortIds.map((id, g) => [id, g]));
    let fit: ReturnType<typeof calibratePilot>;
    try {
      fit = calibratePilot(matrix, column, anchors, {
        groups: {
          index: Int32Array.from(matrix.personIds, (id) => groupOf.get(cohortOfAttempt.get(id)!)!),
          labels: cohortIds,
        },
      });
    } catch (error) {
      const why = error instanceof Error ? error.message : String(error);
      return { ...base, state: 'not-estimable', reason: `the fit failed (${why})`, ...none };
    }
    if (!fit.converged || !Number.isFinite(fit.difficulty) || !Number.isFinite(fit.standardError)) {
      return { ...base, state: 'not-estimable', reason: 'the fit did not converge', ...none };
    }
    const rpLocation = fit.difficulty + Math.log(rp / (1 - rp));
    const shares = pilotCohortShares(fit, groups, draws);
    return {
      ...base,
      state: 'calibrated',
      reason: null,
      difficulty: round(fit.difficulty),
      standardError: round(fit.standardError),
      rpLocation: round(rpLocation),
      ladder: ladderPlace(rpLocation, input.rungs),
      cohorts: shares
        .filter((s) => shown.has(s.cohortId))
        .map((s) => ({
          cohortId: s.cohortId,
          label: labelOf.get(s.cohortId) ?? s.cohortId,
          share: round(s.share),
          interval: s.interval === null ? null : { lower: round(s.interval[0]), upper: round(s.interval[1]) },
        })),
    };
  });
  const pct = Math.round(rp * 100);
  return {
    responseProbability: rp,
    pilots,
    method:
      'Pilot answers are kept apart: they enter no respondent’s estimate and no part of the report above. ' +
      'Once a pilot has its minimum number of answers, its difficulty is estimated by marginal maximum likelihood ' +
      '(Bock & Aitkin 1981) with every calibrated bank item held at its difficulty in this calibration, so the pilot ' +
      `lands on the bank's scale without moving it. "Likely to read" means a chance of ${pct}% or more (RP${pct}); ` +
      "a cohort's share is 1 − Φ((b + ln(RP/(1 − RP)) − mean)/SD) under the cohort's ability distribution, " +
      "with a 95% percentile interval over the calibration's bootstrap replicates and the pilot's difficulty drawn within its SE.",
  };
}

/** The section in plain text lines for a terminal (the report's text summary). */
export function pilotSectionText(section: PilotSection): string[] {
  const lines = ['', 'Pilot charts:'];
  for (const p of section.pilots) {
    if (p.state === 'collecting') {
      lines.push(`  "${p.prompt}": ${p.answers} answers so far, ${p.responsesNeeded} more needed.`);
    } else if (p.state === 'not-estimable') {
      lines.push(`  "${p.prompt}": ${p.answers} answers; not calibrated: ${p.reason}.`);
    } else {
      lines.push(
        `  "${p.prompt}": difficulty ${p.difficulty!.toFixed(2)} ± ${p.standardError!.toFixed(2)} logits (SE), ${p.answers} answers. ${p.ladder?.sentence ?? ''}`,
      );
      const shares = p.cohorts.map(
        (c) =>
          `${c.label} ${Math.round(c.share * 100)}%${c.interval ? ` (${Math.round(c.interval.lower * 100)}–${Math.round(c.interval.upper * 100)}%)` : ''}`,
      );
      lines.push(`    Likely to read it: ${shares.join(', ')}.`);
    }
  }
  return lines;
}
