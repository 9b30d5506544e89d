import type { Study } from '../../delivery/study-service.js';
import { html, type SafeHtml } from '../html.js';

export interface StudiesPageOptions {
  studies: readonly Study[];
  /** Cohorts per study id. */
  cohortCounts: ReadonlyMap<string, number>;
  /** Admins get the "New study" button. */
  canEdit: boolean;
}

const designNames = { fixed: 'Fixed', rotated: 'Rotated', adaptive: 'Adaptive' } as const;

/** The console's first page: every study with its state and links to its pages. */
export function renderStudiesMain(options: StudiesPageOptions): SafeHtml {
  const rows = options.studies.map((study) => {
    const base = `/console/studies/${encodeURIComponent(study.id)}`;
    return html`<tr>
<th scope="row"><a href="${base}">${study.title}</a></th>
<td>${study.status === 'open' ? 'Open' : 'Closed'}</td>
<td>${designNames[study.settings.design]}</td>
<td class="number">${study.poolSize}</td>
<td class="number">${options.cohortCounts.get(study.id) ?? 0}</td>
<td><a href="${base}/progress">Progress</a> · <a href="/studies/${encodeURIComponent(study.id)}/report">Report</a></td>
</tr>`;
  });
  return html`<div class="page-head">
<h1>Studies</h1>
${options.canEdit ? html`<a class="button" href="/console/studies/new">New study</a>` : ''}
</div>
${
  options.studies.length === 0
    ? html`<p>No studies yet.${options.canEdit ? ' Start with "New study".' : ' An admin can create one.'}</p>`
    : html`<div class="table-wrap"><table class="studies">
<caption>All studies, newest first</caption>
<thead><tr><th scope="col">Study</th><th scope="col">Status</th><th scope="col">Design</th><th scope="col">Items in pool</th><th scope="col">Cohorts</th><th scope="col">Pages</th></tr></thead>
<tbody>${rows}</tbody>
</table></div>`
}`;
}
