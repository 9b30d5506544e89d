import { median } from 'd3-array';
import type {
  CohortAttemptCounts,
  ItemAnswerCount,
  ItemAnswerTime,
  PilotAnswerCount,
} from '../storage/progress-repository.js';

/**
 * Exposure rate an adaptive study should keep each item under: 0.3, the usual target of
 * Sympson–Hetter exposure control (Sympson & Hetter 1985; the value is common practice, no source
 * fixes it). Rotated and fixed designs set exposure by design (every attempt, or 2 of N booklets).
 */
export const exposureLimit = 0.3;
/** An item is "nearing" the limit at this share of it. */
export const exposureWarningShare = 0.8;
/** Below this many attempts with answers, exposure rates are too noisy to warn on. */
export const exposureMinAttempts = 20;

export interface ProgressInput {
  study: { id: string; title: string; design: 'fixed' | 'rotated' | 'adaptive'; status: 'open' | 'closed' };
  /** The study's pool now (items nobody answered yet still get a row). */
  poolItemIds: readonly string[];
  cohorts: readonly CohortAttemptCounts[];
  attemptsWithAnswers: number;
  answersByItem: readonly ItemAnswerCount[];
  answerTimes: readonly ItemAnswerTime[];
  pilots: readonly PilotAnswerCount[];
  /** When the numbers were read (ISO-8601). */
  at: string;
  /**
   * The largest exposure the study's exposure control in use was tuned for, when it has one (else
   * `exposureLimit` applies).
   */
  tunedExposureLimit?: number | undefined;
}

export interface AttemptCounts {
  /** Every attempt that joined: in progress + finished + abandoned. */
  started: number;
  inProgress: number;
  finished: number;
  abandoned: number;
}

export interface CohortProgress extends AttemptCounts {
  cohortId: string;
  label: string;
  lastActivityAt: string | null;
}

export interface ItemProgress {
  itemId: string;
  /** Attempts that answered it. */
  answers: number;
  /** Median server-measured time from showing to answer, seconds (1 decimal); null without times. */
  medianSeconds: number | null;
  /** answers / attempts with any answer (3 decimals); null before the first answer. */
  exposure: number | null;
  /** Whether the pool still holds it (an item may have left the pool after it was answered). */
  inPool: boolean;
}

export interface PilotProgress {
  pilotId: string;
  prompt: string;
  status: 'active' | 'retired';
  responses: number;
  minResponses: number;
  /** Answers still needed before the pilot is calibrated (0 once reached). */
  remaining: number;
}

/** The live progress of a study, as the console's progress page and its JSON show it. */
export interface StudyProgress {
  study: ProgressInput['study'];
  at: string;
  totals: AttemptCounts;
  cohorts: CohortProgress[];
  attemptsWithAnswers: number;
  items: ItemProgress[];
  exposure: {
    /** Whether a limit applies (adaptive designs only). */
    applies: boolean;
    limit: number;
    /** Where the limit comes from: the study's tuned exposure control, or the default. */
    limitFrom: 'exposure-control' | 'default';
    warnAt: number;
    minAttempts: number;
    /** Whether there are enough attempts to warn. */
    enoughAttempts: boolean;
    /** Items at or above `warnAt`, highest exposure first. */
    nearing: { itemId: string; exposure: number }[];
  };
  pilots: PilotProgress[];
}

const round = (value: number, decimals: number) => {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
};

/**
 * Composes the progress view from stored counts (pure; the numbers come from
 * server/storage/progress-repository.ts). Median times use d3-array's `median` (the mean of the two
 * middle values for an even count).
 * @example composeStudyProgress({ ...input, answersByItem: [{ itemId: 'a', attempts: 3 }], attemptsWithAnswers: 4 })
 * // items[0].exposure === 0.75
 */
export function composeStudyProgress(input: ProgressInput): StudyProgress {
  const cohorts: CohortProgress[] = input.cohorts.map((c) => ({
    cohortId: c.cohortId,
    label: c.label,
    started: c.inProgress + c.finished + c.abandoned,
    inProgress: c.inProgress,
    finished: c.finished,
    abandoned: c.abandoned,
    lastActivityAt: c.lastActivityAt,
  }));
  const totals = cohorts.reduce<AttemptCounts>(
    (sum, c) => ({
      started: sum.started + c.started,
      inProgress: sum.inProgress + c.inProgress,
      finished: sum.finished + c.finished,
      abandoned: sum.abandoned + c.abandoned,
    }),
    { started: 0, inProgress: 0, finished: 0, abandoned: 0 },
  );

  const times = new Map<string, number[]>();
  for (const t of input.answerTimes) {
    const list = times.get(t.itemId) ?? [];
    list.push(t.serverMs);
    times.set(t.itemId, list);
  }
  const answers = new Map(input.answersByItem.map((a) => [a.itemId, a.attempts]));
  const pool = new Set(input.poolItemIds);
  const ids = [...new Set([...input.poolItemIds, ...answers.keys()])].sort((a, b) =>
    a < b ? -1 : a > b ? 1 : 0,
  );
  const denominator = input.attemptsWithAnswers;
  const items: ItemProgress[] = ids.map((itemId) => {
    const count = answers.get(itemId) ?? 0;
    const ms = median(times.get(itemId) ?? []);
    return {
      itemId,
      answers: count,
      medianSeconds: ms === undefined ? null : round(ms / 1000, 1),
      exposure: denominator > 0 && count > 0 ? round(count / denominator, 3) : null,
      inPool: pool.has(itemId),
    };
  });

  const applies = input.study.design === 'adaptive';
  const limit = input.tunedExposureLimit ?? exposureLimit;
  const warnAt = round(limit * exposureWarningShare, 3);
  const enoughAttempts = denominator >= exposureMinAttempts;
  const nearing =
    applies && enoughAttempts
      ? items
          .filter((i) => i.exposure !== null && i.exposure >= warnAt)
          .map((i) => ({ itemId: i.itemId, exposure: i.exposure as number }))
          .sort((a, b) => b.exposure - a.exposure || (a.itemId < b.itemId ? -1 : 1))
      : [];

  return {
    study: input.study,
    at: input.at,
    totals,
    cohorts,
    attemptsWithAnswers: denominator,
    items,
    exposure: {
      applies,
      limit,
      limitFrom: input.tunedExposureLimit === undefined ? 'default' : 'exposure-control',
      warnAt,
      minAttempts: exposureMinAttempts,
      enoughAttempts,
      nearing,
    },
    pilots: input.pilots.map((p) => ({
      pilotId: p.pilotId,
      prompt: p.prompt,
      status: p.status,
      responses: p.responses,
      minResponses: p.minResponses,
      remaining: Math.max(0, p.minResponses - p.responses),
    })),
  };
}
