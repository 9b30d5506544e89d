/**
 * The typed schema of plotgauge's database: one interface per table, composed into `Database`.
 * Both engines store the same types: ids and timestamps as text (timestamps are ISO-8601 UTC,
 * e.g. `2031-05-04T10:15:00.000Z`), flags as integers 0/1, JSON documents as text, numbers as
 * integer or double precision. Migrations in `migrations/` create exactly these columns.
 */
import type { Insertable, Selectable } from 'kysely';

export interface ItemsTable {
  id: string;
  /** 1, 2, 3, ... in the order new content hashes of this id were first seen. */
  version: number;
  content_hash: string;
  status: 'active' | 'retired' | 'draft';
  first_seen_at: string;
}

export interface StudiesTable {
  id: string;
  title: string;
  /** JSON: item pool, form design, limits, consent text, background questions, kiosk mode. */
  settings: string;
  status: 'open' | 'closed';
  created_at: string;
  updated_at: string;
}

export interface CohortsTable {
  id: string;
  study_id: string;
  label: string;
  join_code: string;
  created_at: string;
}

export interface AttemptsTable {
  id: string;
  cohort_id: string;
  /** SHA-256 of the respondent's 128-bit token; the token itself is never stored. */
  token_hash: string;
  status: 'started' | 'finished' | 'abandoned';
  /** JSON: the ordered item ids (and versions) this attempt presents, or the adaptive state. */
  form: string;
  /** JSON: answers to the study's background questions; '{}' when none. */
  background: string;
  consented_at: string | null;
  started_at: string;
  last_seen_at: string;
  finished_at: string | null;
}

export interface ResponsesTable {
  id: string;
  attempt_id: string;
  item_id: string;
  item_version: number;
  /** 0-based position of the item in the attempt. */
  position: number;
  /** 'answer', or 'dont-know' (scored 0, stored as its own kind). */
  answer_kind: 'answer' | 'dont-know';
  /** JSON of the answer as given (option id(s), number or text); null for 'dont-know'. */
  answer: string | null;
  /** Score from the key; null until a person scores a rubric item. */
  score: number | null;
  /** Time from the item being shown to the answer arriving, measured by the server. */
  server_ms: number | null;
  /** The client's own measurement, kept beside the server's. */
  client_ms: number | null;
  received_at: string;
}

export interface CalibrationsTable {
  id: string;
  study_id: string | null;
  method: 'cml' | 'mml';
  /** JSON: options, groups, anchors. */
  settings: string;
  converged: number;
  iterations: number;
  log_likelihood: number | null;
  /** Number of responses used, and the newest response time included, to tell when it is stale. */
  response_count: number;
  responses_until: string | null;
  created_at: string;
}

export interface CalibrationItemsTable {
  calibration_id: string;
  item_id: string;
  item_version: number;
  difficulty: number;
  standard_error: number | null;
  infit: number | null;
  outfit: number | null;
  anchored: number;
}

export interface AuditLogTable {
  id: string;
  at: string;
  /** Who did it: a token label, 'cli', or 'system'. */
  actor: string;
  action: string;
  subject: string;
  /** JSON with the particulars; never answers or tokens. */
  details: string;
}

export interface AccessTokensTable {
  id: string;
  /** Who holds it, e.g. "analysis laptop"; the audit log's actor for changes made with it. */
  label: string;
  role: 'admin' | 'analyst';
  /** SHA-256 (hex) of the token; the token itself is printed once and never stored. */
  token_hash: string;
  created_at: string;
  last_used_at: string | null;
  revoked_at: string | null;
}

/** A pilot chart of a study (see migrations/…-create-pilot-items.ts). */
export interface PilotItemsTable {
  id: string;
  study_id: string;
  prompt: string;
  alt: string;
  /** JSON: [{ id, text }]. */
  options: string;
  /** JSON: the keyed option id. */
  key: string;
  media_type: 'image/svg+xml' | 'image/png';
  /** base64 of the stored image bytes (SVG already sanitized). */
  image: string;
  min_responses: number;
  status: 'active' | 'retired';
  created_at: string;
}

/** One answer to a pilot chart (see migrations/…-create-pilot-responses.ts); never in `responses`. */
export interface PilotResponsesTable {
  id: string;
  attempt_id: string;
  pilot_id: string;
  /** 0-based place of the pilot among everything the attempt showed (bank items and pilots). */
  position: number;
  answer_kind: 'answer' | 'dont-know';
  /** JSON of the answer as given (option ids); null for 'dont-know'. */
  answer: string | null;
  /** 1 when the keyed option alone was chosen, else 0 ("I don't know" is 0). */
  score: number;
  server_ms: number | null;
  received_at: string;
}

/** One rater's rubric score of a short-text answer (see migrations/…-create-rubric-scores.ts). */
export interface RubricScoresTable {
  id: string;
  /** The scored answer; erasing it removes its scores. */
  response_id: string;
  /** The team token's label of the rater (the audit actor). */
  rater: string;
  /** 0, 1 or 2 on the item's rubric. */
  score: number;
  scored_at: string;
}

/** One retire or reinstate of an item (append-only; see migrations/…-create-item-status-changes.ts). */
export interface ItemStatusChangesTable {
  id: string;
  item_id: string;
  /** The item's version (items.version) when the change was made. */
  item_version: number;
  /** 1, 2, 3, ... per item; the highest is the item's status now. */
  change_number: number;
  status: 'retired' | 'active';
  reason: string;
  /** The token label of who made the change (the audit actor). */
  actor: string;
  changed_at: string;
}

/** Tuned Sympson–Hetter values of a study (see migrations/…-create-exposure-controls.ts). */
export interface ExposureControlsTable {
  id: string;
  study_id: string;
  /** The calibration whose difficulties the values were tuned on. */
  calibration_id: string;
  /** JSON: the adaptive settings the values hold for (server/delivery/stored-exposure-control.ts). */
  settings: string;
  /** SHA-256 (hex) of `settings` as stored: the lookup key. */
  settings_hash: string;
  /** JSON: { itemId: K }, K in [0, 1]. */
  item_parameters: string;
  target_max_exposure: number;
  /** Largest exposure of the simulation the values were checked on. */
  achieved_max_exposure: number;
  /** JSON: seed, persons, rounds and per-round results of the tuning. */
  simulation: string;
  created_at: string;
  /** The audit actor (token label or 'cli'). */
  created_by: string;
}

export interface Database {
  access_tokens: AccessTokensTable;
  items: ItemsTable;
  studies: StudiesTable;
  cohorts: CohortsTable;
  attempts: AttemptsTable;
  responses: ResponsesTable;
  calibrations: CalibrationsTable;
  calibration_items: CalibrationItemsTable;
  audit_log: AuditLogTable;
  pilot_items: PilotItemsTable;
  item_status_changes: ItemStatusChangesTable;
  exposure_controls: ExposureControlsTable;
  pilot_responses: PilotResponsesTable;
  rubric_scores: RubricScoresTable;
}

export type ItemRow = Selectable<ItemsTable>;
export type NewItemRow = Insertable<ItemsTable>;
export type AuditRow = Selectable<AuditLogTable>;
