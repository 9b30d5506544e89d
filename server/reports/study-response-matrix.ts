import { buildResponseMatrix } from '../scoring/build-response-matrix.js';
import type { ResponseMatrix } from '../scoring/response-matrix.js';
import type { ScoredResponse } from '../storage/calibration-repository.js';

/** A study's scored responses as a person × item matrix, with each person's cohort. */
export interface StudyResponseMatrix {
  readonly matrix: ResponseMatrix;
  /** Cohort id of each matrix row (person = attempt). */
  readonly cohortOfPerson: readonly string[];
  /** Status of each person's attempt. */
  readonly finishedPerson: readonly boolean[];
}

/**
 * Builds the matrix the calibration and the report read: one row per attempt with a scored answer to
 * a kept item, one column per kept item (by item id; a new item version keeps its id's column, and the
 * calibration records the newest version seen). "I don't know" is 0 (stored so); an item never shown is
 * missing, never wrong. A short-text answer enters with its rubric score (0, 1, 2) once scored; until
 * then it is missing.
 *
 * @param responses scored responses of the study
 * @param keepItem which item ids enter (e.g. those with enough answers, or those a calibration holds)
 */
export function studyResponseMatrix(
  responses: readonly ScoredResponse[],
  keepItem: (itemId: string) => boolean,
): StudyResponseMatrix {
  const kept = responses.filter((r) => keepItem(r.itemId));
  // 0/1 from a key, 0/1/2 from a rubric (the final score of its raters).
  const matrix = buildResponseMatrix(
    kept.map((r) => ({ person: r.attemptId, item: r.itemId, score: r.score })),
    { allowedScores: [0, 1, 2] },
  );
  const cohortOf = new Map<string, string>();
  const finished = new Map<string, boolean>();
  for (const r of kept) {
    cohortOf.set(r.attemptId, r.cohortId);
    finished.set(r.attemptId, r.attemptStatus === 'finished');
  }
  return {
    matrix,
    cohortOfPerson: matrix.personIds.map((id) => cohortOf.get(id)!),
    finishedPerson: matrix.personIds.map((id) => finished.get(id)!),
  };
}
