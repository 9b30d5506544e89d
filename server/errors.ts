/**
 * Every error the HTTP API answers with has a stable code listed here. DEVELOPERS.md mirrors this
 * table and test/docs.test.ts keeps the two in step.
 */
export const errorCodes = {
  VALIDATION_FAILED: { status: 400, meaning: 'a body, query or path parameter does not match its schema' },
  INVALID_JSON: { status: 400, meaning: 'the body is not valid JSON' },
  EMPTY_BODY: { status: 400, meaning: 'the content type says JSON but the body is empty' },
  UNAUTHORIZED: { status: 401, meaning: 'no valid token was sent' },
  FORBIDDEN: { status: 403, meaning: 'the token may not do this' },
  NOT_FOUND: { status: 404, meaning: 'no such route' },
  ITEM_NOT_FOUND: { status: 404, meaning: 'no item with this id in the bank' },
  STUDY_NOT_FOUND: { status: 404, meaning: 'no study with this id' },
  COHORT_NOT_FOUND: { status: 404, meaning: 'no cohort with this id in the study' },
  PILOT_NOT_FOUND: { status: 404, meaning: 'no pilot with this id in the study' },
  JOIN_CODE_NOT_FOUND: { status: 404, meaning: 'no cohort has this join code' },
  ATTEMPT_NOT_FOUND: { status: 404, meaning: 'no attempt with this id (or it was erased)' },
  SCORING_ENTRY_NOT_FOUND: { status: 404, meaning: 'no short-text answer with this scoring queue entry id' },
  CONFLICT: { status: 409, meaning: 'the request contradicts what is already stored' },
  ANSWER_ALREADY_STORED: {
    status: 409,
    meaning: 'a different answer to this question was already stored; the first one stands',
  },
  ITEM_NOT_IN_ATTEMPT: { status: 409, meaning: 'the question is not part of this attempt' },
  ITEM_NOT_CURRENT: { status: 409, meaning: 'the question has not been shown yet; answer the current one' },
  STEP_NOT_CURRENT: {
    status: 409,
    meaning: 'the attempt is not at this step (consent, background, questions)',
  },
  ATTEMPT_FINISHED: { status: 409, meaning: 'the attempt is finished or was left; no more answers' },
  TOO_FEW_RESPONSES: {
    status: 409,
    meaning: 'the study has too few scored responses to calibrate; the message says how many more are needed',
  },
  CALIBRATION_NOT_CONVERGED: {
    status: 409,
    meaning: 'the latest calibration did not converge; no report is drawn from it',
  },
  ADAPTIVE_NEEDS_CALIBRATION: {
    status: 409,
    meaning:
      'an adaptive study needs a converged calibration of its items; run it fixed or rotated and calibrate first',
  },
  RUBRIC_ALREADY_SCORED: {
    status: 409,
    meaning: 'this rater has already scored this answer; the first score stands',
  },
  RUBRIC_SCORES_COMPLETE: {
    status: 409,
    meaning: 'this answer already has all the rubric scores its study asks for',
  },
  CALIBRATION_NEEDED: {
    status: 409,
    meaning: 'the study has no calibration yet; calibrate it first (plotgauge calibrate --study <id>)',
  },
  DESIGN_NOT_ESTIMABLE: {
    status: 422,
    meaning:
      "the chosen design features cannot all be estimated from the study's calibrated items; details name them",
  },
  STUDY_CLOSED: { status: 410, meaning: 'the study is closed; its join codes no longer work' },
  BODY_TOO_LARGE: { status: 413, meaning: 'the body is larger than the route accepts' },
  UNSUPPORTED_MEDIA_TYPE: { status: 415, meaning: 'the content type is not accepted' },
  RATE_LIMITED: { status: 429, meaning: 'too many requests from this client; retry later' },
  INTERNAL_ERROR: { status: 500, meaning: 'a fault in the server; logged, details withheld' },
  DATABASE_UNAVAILABLE: { status: 503, meaning: 'the database cannot be reached' },
  MIGRATIONS_PENDING: {
    status: 503,
    meaning: 'the database schema is older than this server; run plotgauge migrate',
  },
} as const satisfies Record<string, { status: number; meaning: string }>;

export type ErrorCode = keyof typeof errorCodes;

/** An error with a stable code, a message a person understands, and optional details (e.g. the field). */
export class AppError extends Error {
  override readonly name = 'AppError';
  readonly statusCode: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.statusCode = errorCodes[code].status;
  }
}

/** The body of every error answer. */
export interface ErrorBody {
  error: { code: ErrorCode; message: string; details: Record<string, unknown> };
}
