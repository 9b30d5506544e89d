import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import {
  answerCell,
  exportTableToCsv,
  longColumns,
  longResponseTable,
  wideResponseTable,
} from '../../server/reports/export-responses.js';
import type { ExportedResponse } from '../../server/storage/response-repository.js';

function response(partial: Partial<ExportedResponse>): ExportedResponse {
  return {
    id: 'r',
    attemptId: 'att-1',
    itemId: 'item-a',
    itemVersion: 1,
    position: 0,
    answerKind: 'answer',
    answer: { kind: 'choice', optionIds: ['b'] },
    score: 1,
    serverMs: 5210,
    clientMs: 5000,
    receivedAt: '2031-05-04T10:15:00.000Z',
    cohortId: 'coh-1',
    cohortLabel: 'Saturday walk-ups',
    attemptStatus: 'finished',
    background: { 'age-band': '12-17' },
    ...partial,
  };
}

const rows: ExportedResponse[] = [
  response({}),
  response({ itemId: 'item-b', position: 1, answer: { kind: 'number', value: 12.5 }, score: 0 }),
  response({
    itemId: 'item-c',
    position: 2,
    answer: { kind: 'text', text: 'rain, "then" sun\nnext day' },
    score: null,
    clientMs: null,
  }),
  response({
    attemptId: 'att-2',
    itemId: 'item-b',
    answerKind: 'dont-know',
    answer: null,
    score: 0,
    background: {},
  }),
  response({ attemptId: 'att-2', itemId: 'item-d', itemVersion: 2, position: 1, score: 1, background: {} }),
];

describe('long export', () => {
  it('writes one row per response and survives a round trip through csv-parse', () => {
    const csv = exportTableToCsv(longResponseTable(rows, ['age-band', 'works-with-data']));
    const parsed = parse(csv, { columns: true }) as Record<string, string>[];
    expect(Object.keys(parsed[0]!)).toEqual([...longColumns, 'bg_age-band', 'bg_works-with-data']);
    expect(parsed).toHaveLength(5);
    expect(parsed[0]).toMatchObject({
      answer: 'b',
      score: '1',
      server_ms: '5210',
      client_ms: '5000',
      'bg_age-band': '12-17',
      'bg_works-with-data': '',
    });
    expect(parsed[1]).toMatchObject({ answer: '12.5', score: '0' });
    // Quotes, commas and a line break inside an answer come back intact (RFC 4180 quoting).
    expect(parsed[2]).toMatchObject({ answer: 'rain, "then" sun\nnext day', score: '', client_ms: '' });
    expect(parsed[3]).toMatchObject({ answer_kind: 'dont-know', answer: '', score: '0', 'bg_age-band': '' });
    expect(csv.endsWith('\r\n')).toBe(true);
  });

  it('joins chosen options with ;', () => {
    expect(answerCell({ kind: 'choice', optionIds: ['a', 'c'] })).toBe('a;c');
    expect(answerCell(null)).toBeNull();
  });
});

describe('wide export (the 0/1/blank matrix)', () => {
  it('has one row per attempt, blank for never shown or unscored, 0 for "I don\'t know"', () => {
    const table = wideResponseTable(rows);
    expect(table.columns).toEqual(['attempt_id', 'cohort_label', 'item-a', 'item-b', 'item-c', 'item-d']);
    expect(table.rows).toEqual([
      ['att-1', 'Saturday walk-ups', 1, 0, null, null],
      ['att-2', 'Saturday walk-ups', null, 0, null, 1],
    ]);
    const parsed = parse(exportTableToCsv(table)) as string[][];
    expect(parsed[2]).toEqual(['att-2', 'Saturday walk-ups', '', '0', '', '1']);
  });

  it('splits an item into one column per version when answers span versions', () => {
    const table = wideResponseTable([
      response({}),
      response({ attemptId: 'att-2', itemVersion: 2, score: 0 }),
    ]);
    expect(table.columns).toEqual(['attempt_id', 'cohort_label', 'item-a@v1', 'item-a@v2']);
    expect(table.rows).toEqual([
      ['att-1', 'Saturday walk-ups', 1, null],
      ['att-2', 'Saturday walk-ups', null, 0],
    ]);
  });
});
