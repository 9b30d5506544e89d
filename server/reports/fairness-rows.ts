import type { FairnessSection } from './fairness-section.js';
import type { ReportRow } from './report-rows.js';

/**
 * The Fairness section's numbers as report rows (section `fairness`, audience '', subject an item
 * id or `all-items` / `flagged-excluded`), so the CSV and the HTML page print the same numbers.
 */
export function fairnessRows(section: FairnessSection): ReportRow[] {
  const rows: ReportRow[] = [];
  const add = (subject: string, measure: string, value: number | string | null) =>
    rows.push({ section: 'fairness', audience: '', subject, measure, value, lower: null, upper: null });
  add('', 'reference_group', section.referenceLabel);
  add('', 'focal_group', section.focalLabel);
  add('', 'reference_persons', section.referencePersons);
  add('', 'focal_persons', section.focalPersons);
  add('', 'flagged_items', section.flaggedItemIds.length);
  for (const item of section.items) {
    add(item.itemId, 'ets_class', item.etsClass);
    add(item.itemId, 'reference_answers', item.referenceAnswers);
    add(item.itemId, 'focal_answers', item.focalAnswers);
    add(item.itemId, 'mh_d_dif', item.dDif);
    add(item.itemId, 'mh_d_dif_se', item.dDifStandardError);
    add(item.itemId, 'mh_chi_squared', item.chiSquared);
    add(item.itemId, 'mh_p_value', item.pValue);
    add(item.itemId, 'strata_used', item.strataUsed);
    add(item.itemId, 'rasch_contrast', item.raschContrast);
    add(item.itemId, 'rasch_contrast_se', item.raschStandardError);
  }
  const comparisons = [
    ['all-items', section.comparison.allItems],
    ['flagged-excluded', section.comparison.flaggedExcluded],
  ] as const;
  for (const [subject, c] of comparisons) {
    if (!c) continue;
    add(subject, 'item_count', c.itemCount);
    add(subject, 'reference_mean', c.referenceMean);
    add(subject, 'focal_mean', c.focalMean);
    add(subject, 'difference', c.difference);
  }
  return rows;
}
