/**
 * Pilot items of a study: a designer's own chart, uploaded as an image (SVG, sanitized; or PNG)
 * with a prompt, single-choice options and the keyed option. Stored in `pilot_items`; the image is
 * served with a restrictive content type and CSP (server/http/pilot-routes.ts).
 */
import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import { kebabIdSchema } from '../../bank/item-schema.js';
import { chartSpecSchema, type StoredMap } from '../../charts/chart-spec.js';
import { AppError } from '../../errors.js';
import { insertAuditEntry } from '../../storage/audit-repository.js';
import { type DbHandle, nowIso } from '../../storage/db-handle.js';
import {
  findPilotById,
  insertPilot,
  type PilotRecord,
  setPilotStatus,
} from '../../storage/pilot-repository.js';
import { requireStudy } from '../study-service.js';
import { renderPilotChart } from './check-pilot-chart.js';
import { checkPilotImage } from './check-pilot-image.js';

/** Responses a pilot needs before it is calibrated, unless the author sets another number. */
export const defaultPilotMinResponses = 100;

/** The body of `POST /api/admin/studies/:studyId/pilots`. */
export const pilotInputSchema = z
  .strictObject({
    prompt: z.string().trim().min(1).max(300),
    /** Text alternative of the chart (read by screen readers; required). */
    alt: z.string().trim().min(1).max(1000),
    options: z
      .array(z.strictObject({ id: kebabIdSchema, text: z.string().trim().min(1).max(120) }))
      .min(2)
      .max(8)
      .refine((options) => new Set(options.map((o) => o.id)).size === options.length, {
        message: 'option ids must be unique',
      }),
    /** The id of the one right option (required). */
    key: kebabIdSchema,
    image: z
      .strictObject({
        type: z.string().min(1).max(100),
        /** base64 of the file; at most pilotImageMaxBytes once decoded (413 beyond; the route's body limit bounds the text). */
        base64: z.string().min(1),
      })
      .optional(),
    /** Or the chart in the bank's item format (data + encoding), drawn by the bank's renderer. */
    chart: chartSpecSchema.optional(),
    minResponses: z.number().int().min(30).max(5000).default(defaultPilotMinResponses),
  })
  .refine((p) => p.options.some((o) => o.id === p.key), {
    message: 'the key must be the id of one of the options',
    path: ['key'],
  })
  .refine((p) => (p.image === undefined) !== (p.chart === undefined), {
    message: 'give the chart either as an image or as a chart spec (exactly one of image and chart)',
    path: ['image'],
  });
export type PilotInput = z.infer<typeof pilotInputSchema>;

/** A pilot as the admin API shows it (no image bytes). */
export interface PilotSummary {
  id: string;
  studyId: string;
  prompt: string;
  alt: string;
  options: { id: string; text: string }[];
  key: string;
  mediaType: string;
  bytes: number;
  minResponses: number;
  status: string;
  createdAt: string;
  /** True when the SVG sanitizer removed something from the upload. */
  sanitized?: boolean;
}

export function pilotSummary(pilot: PilotRecord): PilotSummary {
  const { image, ...rest } = pilot;
  return { ...rest, bytes: image.length };
}

/**
 * Adds a pilot to a study (call inside a transaction).
 *
 * @throws AppError STUDY_NOT_FOUND; VALIDATION_FAILED, UNSUPPORTED_MEDIA_TYPE, BODY_TOO_LARGE
 *   from the image check.
 */
export async function addPilot(
  db: DbHandle,
  studyId: string,
  input: PilotInput,
  actor: string,
  options: { readonly maps?: ReadonlyMap<string, StoredMap> } = {},
): Promise<PilotSummary> {
  await requireStudy(db, studyId);
  const image =
    input.chart !== undefined
      ? {
          type: 'image/svg+xml' as const,
          bytes: Buffer.from(
            renderPilotChart({ ...input, chart: input.chart }, options.maps ?? new Map()),
            'utf8',
          ),
          removed: false,
        }
      : checkPilotImage(input.image!);
  const at = nowIso();
  const record: PilotRecord = {
    id: randomUUID(),
    studyId,
    prompt: input.prompt,
    alt: input.alt,
    options: input.options,
    key: input.key,
    mediaType: image.type,
    image: image.bytes,
    minResponses: input.minResponses,
    status: 'active',
    createdAt: at,
  };
  await insertPilot(db, record);
  await insertAuditEntry(db, {
    id: randomUUID(),
    at,
    actor,
    action: 'pilot.add',
    subject: studyId,
    details: {
      pilotId: record.id,
      format: input.chart !== undefined ? 'chart' : 'image',
      mediaType: image.type,
      bytes: image.bytes.length,
      sanitized: image.removed,
    },
  });
  return { ...pilotSummary(record), sanitized: image.removed };
}

/** Throws PILOT_NOT_FOUND unless the pilot exists in the study. */
export function requirePilotOfStudy(pilot: PilotRecord | undefined, studyId: string): PilotRecord {
  if (!pilot || pilot.studyId !== studyId) {
    throw new AppError('PILOT_NOT_FOUND', 'No pilot with this id in the study.', { field: 'params.pilotId' });
  }
  return pilot;
}

/** Headers every pilot image is served with. */
export function pilotImageHeaders(pilot: Pick<PilotRecord, 'mediaType'>): Record<string, string> {
  return {
    'content-type': pilot.mediaType,
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'",
    'x-content-type-options': 'nosniff',
    'cache-control': 'private, max-age=300',
  };
}

/**
 * Stops giving a pilot to new attempts (call inside a transaction): its status becomes `retired`,
 * audited as `pilot.retire` with the pilot id. Attempts that already hold it still show it in its
 * place (their form is fixed when they join), its answers stay, and the report keeps reporting it.
 * Retiring a retired pilot changes nothing and is not audited again.
 *
 * @throws AppError STUDY_NOT_FOUND; PILOT_NOT_FOUND (also for a pilot of another study).
 */
export async function retirePilot(
  db: DbHandle,
  studyId: string,
  pilotId: string,
  actor: string,
): Promise<PilotSummary> {
  await requireStudy(db, studyId);
  const pilot = requirePilotOfStudy(await findPilotById(db, pilotId), studyId);
  if (pilot.status === 'retired') return pilotSummary(pilot);
  await setPilotStatus(db, pilot.id, 'retired');
  await insertAuditEntry(db, {
    id: randomUUID(),
    at: nowIso(),
    actor,
    action: 'pilot.retire',
    subject: studyId,
    details: { pilotId: pilot.id },
  });
  return pilotSummary({ ...pilot, status: 'retired' });
}
