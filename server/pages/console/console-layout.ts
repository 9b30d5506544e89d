import { documentHead } from '../document-head.js';
import { html, type SafeHtml } from '../html.js';

/** Which part of the console a page belongs to (marks its link in the header as the current page). */
export type ConsoleSection = 'studies' | 'bank' | 'scoring';

/** Who is signed in, as the header shows it. */
export interface ConsolePrincipal {
  role: 'admin' | 'analyst';
  label: string;
}

export interface ConsolePageParts {
  /** The page's own title (the `<title>` adds " · plotgauge console"). */
  title: string;
  principal: ConsolePrincipal;
  active: ConsoleSection;
  /** The content of `<main>`. */
  main: SafeHtml;
  /** The session's CSRF token (server/http/console-csrf.ts): the sign-out form carries it. */
  csrfToken: string;
  /** File name of a script under /console-assets/ (for example `console.js`), loaded as a module. */
  script?: string;
}

const sections: readonly { key: ConsoleSection; label: string; href: string }[] = [
  { key: 'studies', label: 'Studies', href: '/console' },
  { key: 'bank', label: 'Bank', href: '/console/bank' },
  { key: 'scoring', label: 'Scoring queue', href: '/console/scoring' },
];

/**
 * The HTML document every console page shares: the report's style sheet plus the console's own,
 * a header with the three sections, who is signed in and a Sign out form, a skip link, a polite
 * live region (`#console-status`) for notices, and at most one same-origin script (the
 * Content-Security-Policy forbids inline script and style). The CSRF token is also on `<body
 * data-csrf>` so a script can send it with a fetch.
 */
export function renderConsolePage(parts: ConsolePageParts): string {
  const nav = sections.map(
    (s) =>
      html`<li><a class="nav-link" href="${s.href}"${s.key === parts.active ? html` aria-current="page"` : ''}>${s.label}</a></li>`,
  );
  return html`${documentHead({ title: `${parts.title} · plotgauge console`, stylesheets: ['/report-assets/report.css', '/console-assets/console.css'] })}
<body class="console" data-csrf="${parts.csrfToken}">
<a class="skip-link" href="#main">Skip to content</a>
<header class="console-header">
<p class="console-name"><a class="home-link" href="/console">plotgauge console</a></p>
<nav aria-label="Console sections"><ul>${nav}</ul></nav>
<form method="post" action="/sign-out" class="sign-out">
<input type="hidden" name="csrf" value="${parts.csrfToken}">
<span class="who">${parts.principal.label} (${parts.principal.role})</span>
<button type="submit">Sign out</button>
</form>
</header>
<main id="main" tabindex="-1">
<p id="console-status" class="console-status" role="status" aria-live="polite"></p>
${parts.main}
</main>
${parts.script === undefined ? '' : html`<script type="module" src="/console-assets/${parts.script}"></script>`}
</body>
</html>
`.toString();
}
