import { stringify } from 'csv-stringify/sync';
import { fairnessRows } from './fairness-rows.js';
import { pilotRows } from './pilot-rows.js';
import type { Interval, Report } from './report-types.js';
import { rubricAgreementRows } from './rubric-agreement-rows.js';

/** Columns of the report's CSV, in order. */
export const reportCsvColumns = [
  'section',
  'audience',
  'subject',
  'measure',
  'value',
  'lower',
  'upper',
] as const;

/** One number (or text) of the report with its interval: a CSV row and an HTML `<data>` key. */
export interface ReportRow {
  readonly section:
    | 'calibration'
    | 'audience'
    | 'profile'
    | 'ladder'
    | 'comparison'
    | 'item'
    | 'fairness'
    | 'rubric'
    | 'pilot';
  /** 'all', a cohort id, or '' when the row belongs to no audience. */
  readonly audience: string;
  /** What is measured: '' (the audience itself), `<chartType>/<level>`, or an item id. */
  readonly subject: string;
  readonly measure: string;
  readonly value: number | string | null;
  readonly lower: number | null;
  readonly upper: number | null;
}

/** The key the HTML page writes in `data-key`, the same for a CSV row: section|audience|subject|measure. */
export function rowKey(row: Pick<ReportRow, 'section' | 'audience' | 'subject' | 'measure'>): string {
  return `${row.section}|${row.audience}|${row.subject}|${row.measure}`;
}

function withInterval(value: number | null, interval: Interval | undefined) {
  return { value, lower: interval?.lower ?? null, upper: interval?.upper ?? null };
}

/**
 * Every number of the report as rows, in the order the CSV lists them. The HTML page looks its
 * numbers up by {@link rowKey} from these same rows, so the page, the CSV and the JSON agree.
 */
export function reportRows(report: Report): ReportRow[] {
  const rows: ReportRow[] = [];
  const add = (
    section: ReportRow['section'],
    audience: string,
    subject: string,
    measure: string,
    value: number | string | null,
    interval?: Interval,
  ) => rows.push({ section, audience, subject, measure, ...withInterval(null, interval), value });
  const c = report.calibration;
  add('calibration', '', '', 'calibration_id', c.id);
  add('calibration', '', '', 'created_at', c.createdAt);
  add('calibration', '', '', 'response_count', c.responseCount);
  add('calibration', '', '', 'newer_responses', c.newerResponses);
  add('calibration', '', '', 'items_calibrated', c.itemsCalibrated);
  add('calibration', '', '', 'items_not_calibrated', c.uncalibrated.length);
  add('calibration', '', '', 'response_probability', report.settings.responseProbability);
  add('calibration', '', '', 'ceiling_share', report.settings.ceilingShare);
  add('calibration', '', '', 'confidence_level', report.settings.confidenceLevel);
  add('calibration', '', '', 'bootstrap_replicates', report.settings.replicates);
  for (const a of report.audiences) {
    add('audience', a.key, '', 'label', a.label);
    add('audience', a.key, '', 'respondents', a.respondents);
    add('audience', a.key, '', 'consented', a.consented);
    add('audience', a.key, '', 'finished', a.finished);
    add('audience', a.key, '', 'completion_rate', a.completionRate);
    add('audience', a.key, '', 'ability_mean', a.ability.mean, a.ability.meanInterval);
    add('audience', a.key, '', 'ability_sd', a.ability.sd, a.ability.sdInterval);
    add('audience', a.key, '', 'reliability', a.reliability);
    for (const cell of a.profile) {
      const subject = `${cell.chartType}/${cell.level}`;
      add('profile', a.key, subject, 'item_count', cell.itemCount);
      add('profile', a.key, subject, 'typical_difficulty', cell.typicalDifficulty);
      add('profile', a.key, subject, 'rp_location', cell.rpLocation);
      add(
        'profile',
        a.key,
        subject,
        'expected_share_correct',
        cell.expectedShareCorrect,
        cell.expectedShareInterval,
      );
      add('profile', a.key, subject, 'share_at_rp', cell.shareAtRp, cell.shareAtRpInterval);
    }
    const ceiling = a.ladder.readingCeiling;
    add(
      'ladder',
      a.key,
      ceiling ? `${ceiling.chartType}/${ceiling.level}` : '',
      'reading_ceiling',
      ceiling?.rpLocation ?? null,
    );
    for (const [index, sentence] of a.ladder.sentences.entries()) {
      add('ladder', a.key, String(index + 1), 'sentence', sentence);
    }
  }
  const cmp = report.comparison;
  if (cmp) {
    const pair = `${cmp.from.id}->${cmp.to.id}`;
    add('comparison', pair, '', 'mean_difference', cmp.meanDifference, cmp.meanDifferenceInterval);
    add('comparison', pair, '', 'mean_difference_se', cmp.standardError);
    add('comparison', pair, '', 'effect_size', cmp.effectSize, cmp.effectSizeInterval);
    for (const cell of cmp.cells) {
      const subject = `${cell.chartType}/${cell.level}`;
      add(
        'comparison',
        pair,
        subject,
        'expected_share_difference',
        cell.expectedShareDifference,
        cell.expectedShareDifferenceInterval,
      );
      add(
        'comparison',
        pair,
        subject,
        'share_at_rp_difference',
        cell.shareAtRpDifference,
        cell.shareAtRpDifferenceInterval,
      );
    }
  }
  for (const item of report.items) {
    add('item', '', item.itemId, 'difficulty', item.difficulty);
    add('item', '', item.itemId, 'standard_error', item.standardError);
    add('item', '', item.itemId, 'infit', item.infit);
    add('item', '', item.itemId, 'outfit', item.outfit);
    add('item', '', item.itemId, 'responses', item.responses);
    add('item', '', item.itemId, 'dont_know_share', item.dontKnowShare);
  }
  if (report.fairness) rows.push(...fairnessRows(report.fairness));
  if (report.rubric) rows.push(...rubricAgreementRows(report.rubric));
  if (report.pilots) rows.push(...pilotRows(report.pilots));
  return rows;
}

/** The report as CSV (RFC 4180 by csv-stringify, CRLF, a header row; empty cell = none). */
export function reportToCsv(report: Report): string {
  return stringify(
    [
      [...reportCsvColumns],
      ...reportRows(report).map((r) => [
        r.section,
        r.audience,
        r.subject,
        r.measure,
        r.value ?? '',
        r.lower ?? '',
        r.upper ?? '',
      ]),
    ],
    { record_delimiter: 'windows' },
  );
}
