import { html, type SafeHtml } from '../html.js';

export interface CalibrateStudyPageInput {
  studyId: string;
  studyTitle: string;
  csrfToken: string;
  /** Why the last try was refused (too few answers, ...), shown as an alert. */
  problem?: string | undefined;
}

/**
 * `GET /console/studies/:studyId/calibrate`: what a calibration does, and the button that runs it
 * (the same service as `POST /api/admin/studies/:studyId/calibrations`); the report opens after it.
 */
export function calibrateStudyMain(input: CalibrateStudyPageInput): SafeHtml {
  const studyPath = `/console/studies/${encodeURIComponent(input.studyId)}`;
  return html`<p class="breadcrumb"><a href="${studyPath}">Back to the study</a></p>
<h1>Calibrate ${input.studyTitle}</h1>
${input.problem === undefined ? '' : html`<p class="field-error" role="alert">${input.problem}</p>`}
<p>A calibration fits the Rasch model to every scored answer of the study so far (cohorts as groups) and stores item difficulties, fit and each cohort's ability distribution. The report is drawn from the newest calibration. It takes a few seconds; run it again when more answers have come in.</p>
<form method="post" action="${studyPath}/calibrate">
<input type="hidden" name="csrf" value="${input.csrfToken}">
<button type="submit">Calibrate now and open the report</button>
</form>`;
}
