import type { ReportRow } from './report-rows.js';
import type { RubricAgreementSection } from './rubric-agreement-section.js';

/**
 * The rubric section's numbers as report rows (section `rubric`, audience '', subject an item id),
 * so the CSV and the HTML page print the same numbers.
 */
export function rubricAgreementRows(section: RubricAgreementSection): ReportRow[] {
  const rows: ReportRow[] = [];
  for (const item of section.items) {
    const add = (
      measure: string,
      value: number | null,
      lower: number | null = null,
      upper: number | null = null,
    ) => rows.push({ section: 'rubric', audience: '', subject: item.itemId, measure, value, lower, upper });
    add('double_scored', item.doubleScored);
    add('weighted_kappa', item.kappa, item.kappaInterval?.lower ?? null, item.kappaInterval?.upper ?? null);
    add('exact_agreement', item.exactAgreement);
    add('step_1', item.steps?.[0] ?? null);
    add('step_2', item.steps?.[1] ?? null);
  }
  return rows;
}
