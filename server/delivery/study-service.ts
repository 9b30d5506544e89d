import { randomUUID } from 'node:crypto';
import { AppError } from '../errors.js';
import { insertAuditEntry } from '../storage/audit-repository.js';
import {
  type CohortRecord,
  findCohortById,
  insertCohort,
  joinCodeExists,
  listCohorts,
} from '../storage/cohort-repository.js';
import { type DbHandle, isUniqueViolation, nowIso } from '../storage/db-handle.js';
import {
  findStudyById,
  insertStudy,
  listStudies,
  type StudyRecord,
  type StudyStatus,
  updateStudy,
} from '../storage/study-repository.js';
import { requireAdaptiveReady } from './adaptive-delivery.js';
import { parseStudySettings } from './attempt-service.js';
import type { DeliveryBank } from './delivery-bank.js';
import { generateJoinCode } from './join-code.js';
import { resolvePendingRubricAnswers } from './resolve-pending-rubric-answers.js';
import { selectItemPool } from './select-item-pool.js';
import { type StudySettings, type StudySettingsInput, studySettingsSchema } from './study-settings.js';

/** Who made an admin change, as the audit log records it. */
export type Actor = string;

export interface Study {
  id: string;
  title: string;
  status: StudyStatus;
  settings: StudySettings;
  /** Items the pool selects from the loaded bank now. */
  poolSize: number;
  createdAt: string;
  updatedAt: string;
}

export interface Cohort {
  id: string;
  studyId: string;
  label: string;
  joinCode: string;
  joinUrl: string;
  createdAt: string;
}

/** The link a respondent opens: `<base>/join/<code>`. */
export function joinUrl(baseUrl: string, joinCode: string): string {
  return `${baseUrl.replace(/\/+$/, '')}/join/${encodeURIComponent(joinCode)}`;
}

export function cohortRecordToCohort(record: CohortRecord, baseUrl: string): Cohort {
  return { ...record, joinUrl: joinUrl(baseUrl, record.joinCode) };
}

function toStudy(record: StudyRecord, bank: DeliveryBank): Study {
  const settings = parseStudySettings(record);
  return {
    id: record.id,
    title: record.title,
    status: record.status,
    settings,
    poolSize: poolOf(bank, settings).itemIds.length,
    createdAt: record.createdAt,
    updatedAt: record.updatedAt,
  };
}

function poolOf(bank: DeliveryBank, settings: StudySettings) {
  return selectItemPool(
    bank.items.map((entry) => entry.item),
    settings.pool,
  );
}

/**
 * Validates settings against the schema and the loaded bank: the pool must select at least one item,
 * and every explicitly listed id must be an active item of the bank.
 * @throws AppError VALIDATION_FAILED naming the field
 */
export function validateStudySettings(input: unknown, bank: DeliveryBank): StudySettings {
  const parsed = studySettingsSchema.safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => ({
      field: ['body', ...issue.path.map(String)].join('.'),
      problem: issue.message,
    }));
    throw new AppError('VALIDATION_FAILED', `${problems[0]!.field}: ${problems[0]!.problem}`, { problems });
  }
  const settings = parsed.data;
  const { itemIds, unavailable } = poolOf(bank, settings);
  if (unavailable.length > 0) {
    const problem = {
      field: 'body.pool.itemIds',
      problem: `not active items of the bank: ${unavailable.join(', ')}`,
    };
    throw new AppError('VALIDATION_FAILED', `${problem.field}: ${problem.problem}`, { problems: [problem] });
  }
  if (itemIds.length === 0) {
    const problem = { field: 'body.pool', problem: 'selects no active item of the bank' };
    throw new AppError('VALIDATION_FAILED', `${problem.field}: ${problem.problem}`, { problems: [problem] });
  }
  const outside = (settings.commonItems ?? []).filter((id) => !itemIds.includes(id));
  if (outside.length > 0) {
    const problem = {
      field: 'body.commonItems',
      problem: `not items of the study's pool: ${outside.join(', ')}`,
    };
    throw new AppError('VALIDATION_FAILED', `${problem.field}: ${problem.problem}`, { problems: [problem] });
  }
  return settings;
}

/** Creates a study (open) and records who did it. */
export async function createStudy(
  db: DbHandle,
  bank: DeliveryBank,
  input: StudySettingsInput | unknown,
  actor: Actor,
): Promise<Study> {
  const settings = validateStudySettings(input, bank);
  await requireAdaptiveReady(db, bank, undefined, settings);
  const at = nowIso();
  const record = await insertStudy(db, {
    id: randomUUID(),
    title: settings.title,
    settings,
    status: 'open',
    at,
  });
  await insertAuditEntry(db, {
    id: randomUUID(),
    at,
    actor,
    action: 'study.create',
    subject: record.id,
    details: { title: settings.title, design: settings.design, maxItems: settings.maxItems },
  });
  return toStudy(record, bank);
}

export async function getStudy(db: DbHandle, bank: DeliveryBank, studyId: string): Promise<Study> {
  return toStudy(await requireStudy(db, studyId), bank);
}

export async function getStudies(db: DbHandle, bank: DeliveryBank): Promise<Study[]> {
  return (await listStudies(db)).map((record) => toStudy(record, bank));
}

export async function requireStudy(db: DbHandle, studyId: string): Promise<StudyRecord> {
  const record = await findStudyById(db, studyId);
  if (!record)
    throw new AppError('STUDY_NOT_FOUND', `No study with id ${studyId}.`, { field: 'params.studyId' });
  return record;
}

/**
 * Changes a study's title, status (open/closed) and/or settings (replaced whole, validated as on
 * creation). Attempts already started keep the items they were given.
 */
export async function changeStudy(
  db: DbHandle,
  bank: DeliveryBank,
  studyId: string,
  change: { title?: string | undefined; status?: StudyStatus | undefined; settings?: unknown },
  actor: Actor,
): Promise<Study> {
  const record = await requireStudy(db, studyId);
  const before = parseStudySettings(record);
  let settings = before;
  let rubricAnswersResolved = 0;
  if (change.settings !== undefined) {
    settings = validateStudySettings(change.settings, bank);
    await requireAdaptiveReady(db, bank, studyId, settings);
    if (settings.rubricRaters < before.rubricRaters)
      rubricAnswersResolved = await resolvePendingRubricAnswers(db, studyId, settings.rubricRaters);
  }
  if (change.title !== undefined) settings = { ...settings, title: change.title };
  const status = change.status ?? record.status;
  const at = nowIso();
  await updateStudy(db, studyId, { title: settings.title, settings, status, at });
  await insertAuditEntry(db, {
    id: randomUUID(),
    at,
    actor,
    action: 'study.update',
    subject: studyId,
    details: {
      changed: Object.keys(change).filter((k) => change[k as keyof typeof change] !== undefined),
      status,
      ...(rubricAnswersResolved > 0 ? { rubricAnswersResolved } : {}),
    },
  });
  return toStudy((await findStudyById(db, studyId))!, bank);
}

/**
 * Adds a cohort with a fresh join code (drawn again on the rare clash with a stored code).
 * @param pick - random integer source for the code (tests)
 */
export async function addCohort(
  db: DbHandle,
  studyId: string,
  label: string,
  actor: Actor,
  baseUrl: string,
  pick?: (n: number) => number,
): Promise<Cohort> {
  await requireStudy(db, studyId);
  const at = nowIso();
  for (let tries = 0; tries < 20; tries++) {
    const joinCode = generateJoinCode(pick);
    if (await joinCodeExists(db, joinCode)) continue;
    try {
      const cohort = await insertCohort(db, { id: randomUUID(), studyId, label, joinCode, createdAt: at });
      await insertAuditEntry(db, {
        id: randomUUID(),
        at,
        actor,
        action: 'cohort.create',
        subject: cohort.id,
        details: { studyId, label },
      });
      return cohortRecordToCohort(cohort, baseUrl);
    } catch (error) {
      if (!isUniqueViolation(error)) throw error;
    }
  }
  throw new AppError('CONFLICT', 'Could not find an unused join code; try again.');
}

export async function getCohorts(db: DbHandle, studyId: string, baseUrl: string): Promise<Cohort[]> {
  await requireStudy(db, studyId);
  return (await listCohorts(db, studyId)).map((record) => cohortRecordToCohort(record, baseUrl));
}

export async function getCohort(
  db: DbHandle,
  studyId: string,
  cohortId: string,
  baseUrl: string,
): Promise<Cohort> {
  await requireStudy(db, studyId);
  const record = await findCohortById(db, cohortId);
  if (!record || record.studyId !== studyId) {
    throw new AppError('COHORT_NOT_FOUND', `No cohort ${cohortId} in this study.`, {
      field: 'params.cohortId',
    });
  }
  return cohortRecordToCohort(record, baseUrl);
}
