import type { StudyRecord, StudyRow } from '../storage/study-repository.js';
import { type StudySettings, studySettingsSchema } from './study-settings.js';

/** How many studies' parsed settings are kept; past it the cache starts again empty. */
const maxStudies = 256;

interface Entry {
  /** The stored settings JSON the entry was parsed from: any edit changes it. */
  json: string;
  raw: unknown;
  settings: StudySettings;
}

const entries = new Map<string, Entry>();

/**
 * A study row as a record with its validated settings, parsed once per stored settings text
 * rather than on every respondent request. The entry is keyed by study id and checked against the
 * settings JSON just read in the same transaction, so an edit (by any path) is seen by the next
 * request without any invalidation call. Both parsed objects are shared between requests and
 * therefore frozen: a caller that wants to change settings must parse its own copy
 * (`parseStudySettings`).
 */
export function studyWithSettings(row: StudyRow): { study: StudyRecord; settings: StudySettings } {
  let entry = entries.get(row.id);
  if (entry === undefined || entry.json !== row.settings) {
    const raw = deepFreeze(JSON.parse(row.settings) as unknown);
    entry = { json: row.settings, raw, settings: deepFreeze(studySettingsSchema.parse(raw)) };
    if (entries.size >= maxStudies) entries.clear();
    entries.set(row.id, entry);
  }
  const study: StudyRecord = {
    id: row.id,
    title: row.title,
    settings: entry.raw,
    status: row.status,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
  return { study, settings: entry.settings };
}

/** How many studies are cached now (for tests). */
export function cachedStudyCount(): number {
  return entries.size;
}

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value)) deepFreeze(child);
  }
  return value;
}
