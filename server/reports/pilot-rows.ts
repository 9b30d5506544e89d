import type { PilotSection } from './pilot-section.js';
import type { ReportRow } from './report-rows.js';

/**
 * The Pilot charts section as report rows (section `pilot`, subject the pilot id; audience '' for
 * the pilot's own numbers, a cohort id for that cohort's share), so the CSV and the page agree.
 */
export function pilotRows(section: PilotSection): ReportRow[] {
  const rows: ReportRow[] = [];
  const add = (
    audience: string,
    subject: string,
    measure: string,
    value: number | string | null,
    interval: { lower: number; upper: number } | null = null,
  ) =>
    rows.push({
      section: 'pilot',
      audience,
      subject,
      measure,
      value,
      lower: interval?.lower ?? null,
      upper: interval?.upper ?? null,
    });
  for (const p of section.pilots) {
    add('', p.pilotId, 'state', p.state);
    add('', p.pilotId, 'answers', p.answers);
    add('', p.pilotId, 'answers_used', p.answersUsed);
    add('', p.pilotId, 'min_responses', p.minResponses);
    add('', p.pilotId, 'responses_needed', p.responsesNeeded);
    add('', p.pilotId, 'share_right', p.shareRight);
    if (p.state !== 'calibrated') continue;
    add('', p.pilotId, 'difficulty', p.difficulty);
    add('', p.pilotId, 'difficulty_se', p.standardError);
    add('', p.pilotId, 'rp_location', p.rpLocation);
    add(
      '',
      p.pilotId,
      'ladder_below',
      p.ladder?.below ? `${p.ladder.below.chartType}/${p.ladder.below.level}` : null,
    );
    add(
      '',
      p.pilotId,
      'ladder_above',
      p.ladder?.above ? `${p.ladder.above.chartType}/${p.ladder.above.level}` : null,
    );
    for (const c of p.cohorts) add(c.cohortId, p.pilotId, 'share_likely_to_read', c.share, c.interval);
  }
  return rows;
}
