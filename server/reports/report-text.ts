import { chartTypePluralNames } from './chart-type-names.js';
import { pilotSectionText } from './pilot-section.js';
import type { Interval, Report } from './report-types.js';

const percent = (share: number) => `${Math.round(share * 100)}%`;
const range = (interval: Interval, format: (x: number) => string) =>
  interval ? ` (${format(interval.lower)} to ${format(interval.upper)})` : '';
const logit = (x: number) => x.toFixed(2);

/**
 * The report as a short plain-text summary for a terminal: who answered, their ability, the ladder
 * in sentences, the reading ceiling, the comparison, and the caution.
 */
export function reportToText(report: Report): string {
  const lines: string[] = [];
  const level = percent(report.settings.confidenceLevel);
  lines.push(`Readability report: ${report.study.title}`);
  for (const a of report.audiences) {
    lines.push('');
    lines.push(
      `${a.label}: ${a.respondents} respondents${a.completionRate === null ? '' : `, ${percent(a.completionRate)} finished`}.`,
    );
    lines.push(
      `  Ability ${logit(a.ability.mean)} logits${range(a.ability.meanInterval, logit)}, SD ${logit(a.ability.sd)}${range(a.ability.sdInterval, logit)} [${level} intervals]; reliability ${a.reliability ?? 'n/a'}.`,
    );
    for (const sentence of a.ladder.sentences) lines.push(`  ${sentence}`);
    lines.push(`  ${a.ladder.ceilingSentence}`);
  }
  const cmp = report.comparison;
  if (cmp) {
    lines.push('');
    lines.push(
      `${cmp.to.label} vs ${cmp.from.label}: ${cmp.meanDifference >= 0 ? '+' : ''}${logit(cmp.meanDifference)} logits${range(cmp.meanDifferenceInterval, logit)}, SE ${cmp.standardError ?? 'n/a'}, effect size d = ${cmp.effectSize.toFixed(2)}.`,
    );
    const biggest = [...cmp.cells].sort((x, y) => y.shareAtRpDifference - x.shareAtRpDifference)[0];
    if (biggest)
      lines.push(
        `  Largest gain: ${chartTypePluralNames[biggest.chartType]} (${biggest.level}), ${biggest.shareAtRpDifference >= 0 ? '+' : ''}${Math.round(biggest.shareAtRpDifference * 100)} points in the share who can handle them.`,
      );
  }
  const fairness = report.fairness;
  if (fairness) {
    lines.push('');
    lines.push(`Fairness, ${fairness.focalLabel} vs ${fairness.referenceLabel}: ${fairness.sentence}`);
    for (const item of fairness.items)
      if (item.flagged && item.explanation) lines.push(`  ${item.explanation}`);
    lines.push(`  ${fairness.smallStrata}`);
  }
  if (report.pilots) lines.push(...pilotSectionText(report.pilots));
  const flagged = report.items.filter((i) => i.infitFlag || i.outfitFlag).length;
  lines.push('');
  lines.push(
    `${report.calibration.itemsCalibrated} items calibrated, ${report.calibration.uncalibrated.length} not yet; ${flagged} flagged for fit outside ${report.settings.fitRange.low}–${report.settings.fitRange.high}.`,
  );
  lines.push(report.foot.calibration);
  lines.push(report.foot.caution);
  return `${lines.join('\n')}\n`;
}
