import { stringify } from 'csv-stringify/sync';
import type { ExportedResponse } from '../storage/response-repository.js';

/** Columns of the long export, in order; background questions follow as `bg_<questionId>`. */
export const longColumns = [
  'attempt_id',
  'cohort_id',
  'cohort_label',
  'item_id',
  'item_version',
  'position',
  'answer_kind',
  'answer',
  'score',
  'server_ms',
  'client_ms',
  'received_at',
] as const;

export type ExportCell = string | number | null;

/** A table ready for a CSV writer: header, then rows of the same length. */
export interface ExportTable {
  columns: string[];
  rows: ExportCell[][];
}

/**
 * The answer as one cell: option ids joined by `;`, the number, the text, or empty for
 * "I don't know" (whose answer_kind says so).
 * @example answerCell({ kind: 'choice', optionIds: ['a', 'c'] }) // 'a;c'
 */
export function answerCell(answer: unknown): ExportCell {
  if (answer === null || typeof answer !== 'object') return null;
  const a = answer as { kind?: string; optionIds?: string[]; value?: number; text?: string };
  if (a.kind === 'choice') return (a.optionIds ?? []).join(';');
  if (a.kind === 'number') return a.value ?? null;
  if (a.kind === 'text') return a.text ?? null;
  return null;
}

/**
 * One row per response (long format), with the attempt's background answers in `bg_<id>` columns.
 *
 * @param responses - from listStudyResponses, already in a stable order
 * @param backgroundIds - the study's background question ids (columns appear even when unanswered)
 */
export function longResponseTable(
  responses: readonly ExportedResponse[],
  backgroundIds: readonly string[],
): ExportTable {
  const columns = [...longColumns, ...backgroundIds.map((id) => `bg_${id}`)];
  const rows = responses.map((r) => [
    r.attemptId,
    r.cohortId,
    r.cohortLabel,
    r.itemId,
    r.itemVersion,
    r.position,
    r.answerKind,
    answerCell(r.answer),
    r.score,
    r.serverMs,
    r.clientMs,
    r.receivedAt,
    ...backgroundIds.map((id) => r.background[id] ?? null),
  ]);
  return { columns, rows };
}

/**
 * The person × item matrix psychometric tools read (wide format): one row per attempt with at least
 * one response, one column per item (`<id>` or, when responses span versions, `<id>@v<version>`),
 * cells 1, 0, or blank. Blank means missing: never shown, or not yet scored (short text); it never
 * means wrong. "I don't know" is 0.
 *
 * @example wideResponseTable(rows).columns // ['attempt_id', 'cohort_label', 'item-a', 'item-b']
 */
export function wideResponseTable(responses: readonly ExportedResponse[]): ExportTable {
  const versionsOf = new Map<string, Set<number>>();
  for (const r of responses) {
    const set = versionsOf.get(r.itemId) ?? new Set<number>();
    set.add(r.itemVersion);
    versionsOf.set(r.itemId, set);
  }
  const columnOf = (itemId: string, version: number) =>
    (versionsOf.get(itemId)?.size ?? 0) > 1 ? `${itemId}@v${version}` : itemId;
  const itemColumns = [...new Set(responses.map((r) => columnOf(r.itemId, r.itemVersion)))].sort();
  const index = new Map(itemColumns.map((c, i) => [c, i]));
  const attempts = new Map<string, { cohortLabel: string; cells: ExportCell[] }>();
  for (const r of responses) {
    let row = attempts.get(r.attemptId);
    if (!row) {
      row = { cohortLabel: r.cohortLabel, cells: itemColumns.map(() => null) };
      attempts.set(r.attemptId, row);
    }
    row.cells[index.get(columnOf(r.itemId, r.itemVersion))!] = r.score;
  }
  return {
    columns: ['attempt_id', 'cohort_label', ...itemColumns],
    rows: [...attempts.entries()].map(([attemptId, row]) => [attemptId, row.cohortLabel, ...row.cells]),
  };
}

/**
 * Writes an export table as CSV (RFC 4180 quoting by csv-stringify, CRLF line ends, a header row).
 * Empty cells stand for null: missing, unscored, or not asked.
 */
export function exportTableToCsv(table: ExportTable): string {
  return stringify(
    [table.columns, ...table.rows.map((row) => row.map((cell) => (cell === null ? '' : cell)))],
    {
      record_delimiter: 'windows',
    },
  );
}
