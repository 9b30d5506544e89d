/**
 * The Fairness section's database side: forms the two groups from a background question's answers
 * or from two cohorts, then calls the pure {@link fairnessSection}.
 */
import { studySettingsSchema } from '../delivery/study-settings.js';
import { AppError } from '../errors.js';
import type { ScoredResponse } from '../storage/calibration-repository.js';
import type { DbHandle } from '../storage/db-handle.js';
import { type StudyCalibration, storedRubricSteps } from './calibrate-study.js';
import { type FairnessGrouping, type FairnessSection, fairnessSection } from './fairness-section.js';
import { studyResponseMatrix } from './study-response-matrix.js';

/** Background answers of every attempt of a study, by attempt id. */
async function backgroundAnswers(
  db: DbHandle,
  studyId: string,
): Promise<Map<string, Record<string, string>>> {
  const rows = await db
    .selectFrom('attempts')
    .innerJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select(['attempts.id', 'attempts.background'])
    .where('cohorts.study_id', '=', studyId)
    .execute();
  return new Map(rows.map((row) => [row.id, JSON.parse(row.background) as Record<string, string>]));
}

/**
 * The Fairness section of a study's report.
 *
 * @param settings the study's stored settings (background questions are read from them)
 * @param cohorts the study's cohorts (labels)
 * @param calibration the calibration the report uses (difficulties held fixed)
 * @param responses the scored responses of that calibration
 * @throws AppError VALIDATION_FAILED for an unknown question or answer, or the same answer twice;
 *   COHORT_NOT_FOUND for a cohort of another study; TOO_FEW_RESPONSES when a group has no respondent
 */
export async function buildFairnessSection(
  db: DbHandle,
  studyId: string,
  settings: unknown,
  cohorts: readonly { id: string; label: string }[],
  calibration: StudyCalibration,
  responses: readonly ScoredResponse[],
  grouping: FairnessGrouping,
): Promise<FairnessSection> {
  if (grouping.reference === grouping.focal) {
    throw new AppError('VALIDATION_FAILED', 'The fairness check needs two different groups.', {
      field: 'query.fairness',
    });
  }
  // Right/wrong items only: the Mantel-Haenszel screen and the Rasch contrast are dichotomous.
  const rubricSteps = storedRubricSteps(calibration.settings);
  const difficultyOf = new Map(
    calibration.items.filter((i) => !rubricSteps.has(i.itemId)).map((i) => [i.itemId, i.difficulty]),
  );
  const { matrix, cohortOfPerson } = studyResponseMatrix(responses, (id) => difficultyOf.has(id));
  let referenceLabel: string;
  let focalLabel: string;
  let groupOf: (person: number) => number;
  if (grouping.kind === 'cohorts') {
    const labelOf = new Map(cohorts.map((c) => [c.id, c.label]));
    for (const id of [grouping.reference, grouping.focal]) {
      if (!labelOf.has(id))
        throw new AppError('COHORT_NOT_FOUND', `Cohort ${id} is not a cohort of this study.`, {
          cohortId: id,
          studyId,
        });
    }
    referenceLabel = labelOf.get(grouping.reference)!;
    focalLabel = labelOf.get(grouping.focal)!;
    groupOf = (p) =>
      cohortOfPerson[p] === grouping.reference ? 0 : cohortOfPerson[p] === grouping.focal ? 1 : -1;
  } else {
    const parsed = studySettingsSchema.safeParse(settings);
    const questions = parsed.success ? parsed.data.background : [];
    const question = questions.find((q) => q.id === grouping.questionId);
    if (!question) {
      throw new AppError(
        'VALIDATION_FAILED',
        `The study has no background question "${grouping.questionId}". Its questions: ${questions.map((q) => q.id).join(', ') || 'none'}.`,
        { field: 'query.fairness' },
      );
    }
    const textOf = new Map(question.options.map((o) => [o.id, o.text]));
    textOf.set('prefer-not-to-say', 'Prefer not to say');
    for (const id of [grouping.reference, grouping.focal]) {
      if (!textOf.has(id)) {
        throw new AppError(
          'VALIDATION_FAILED',
          `Question "${question.id}" has no answer "${id}". Its answers: ${[...textOf.keys()].join(', ')}.`,
          { field: 'query.fairness' },
        );
      }
    }
    referenceLabel = `"${textOf.get(grouping.reference)}" (${question.prompt})`;
    focalLabel = `"${textOf.get(grouping.focal)}"`;
    const answers = await backgroundAnswers(db, studyId);
    groupOf = (p) => {
      const answer = answers.get(matrix.personIds[p]!)?.[question.id];
      return answer === grouping.reference ? 0 : answer === grouping.focal ? 1 : -1;
    };
  }
  const groups = Int8Array.from(matrix.personIds, (_, p) => groupOf(p));
  const count = (g: number) => groups.reduce((s, x) => s + (x === g ? 1 : 0), 0);
  for (const [g, label] of [
    [0, referenceLabel],
    [1, focalLabel],
  ] as const) {
    if (count(g) === 0) {
      throw new AppError(
        'TOO_FEW_RESPONSES',
        `No respondent in calibration ${calibration.record.id} belongs to ${label}; a fairness check needs people in both groups.`,
        { field: 'query.fairness', group: g === 0 ? 'reference' : 'focal' },
      );
    }
  }
  return fairnessSection({
    grouping,
    referenceLabel,
    focalLabel,
    matrix,
    groups,
    difficulties: Float64Array.from(matrix.itemIds, (id) => difficultyOf.get(id)!),
  });
}

/**
 * Parses the report's `fairness` query: `cohorts:<reference>,<focal>` or
 * `<questionId>:<referenceAnswer>,<focalAnswer>`.
 *
 * @throws AppError VALIDATION_FAILED for any other shape
 */
export function parseFairnessQuery(value: string): FairnessGrouping {
  const match = /^([^:,]+):([^:,]+),([^:,]+)$/.exec(value.trim());
  if (!match) {
    throw new AppError(
      'VALIDATION_FAILED',
      'fairness must be "<question>:<reference answer>,<focal answer>" or "cohorts:<reference cohort>,<focal cohort>".',
      { field: 'query.fairness' },
    );
  }
  const [, head, reference, focal] = match as unknown as [string, string, string, string];
  return head === 'cohorts'
    ? { kind: 'cohorts', reference, focal }
    : { kind: 'background', questionId: head, reference, focal };
}
