/**
 * HTML built from template literals with every interpolation escaped. Only a {@link SafeHtml}
 * (made by `html`, `raw` or `jsonScript`) is inserted as markup; anything else becomes text.
 */

/** Markup that is already safe to insert: the result of `html`, `raw` or `jsonScript`. */
export class SafeHtml {
  readonly #markup: string;
  constructor(markup: string) {
    this.#markup = markup;
  }
  toString(): string {
    return this.#markup;
  }
}

/** What may be interpolated: text and numbers are escaped; null, undefined and false print nothing. */
export type HtmlValue = SafeHtml | string | number | boolean | null | undefined | readonly HtmlValue[];

const entities: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/**
 * Escapes text for HTML element content and quoted attribute values.
 * @example escapeHtml('<a href="x">') // '&lt;a href=&quot;x&quot;&gt;'
 */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => entities[character]!);
}

function render(value: HtmlValue): string {
  if (value instanceof SafeHtml) return value.toString();
  if (value === null || value === undefined || value === false) return '';
  if (Array.isArray(value)) return value.map(render).join('');
  return escapeHtml(String(value));
}

/**
 * Tagged template: the literal parts are markup, every `${value}` is escaped (arrays are joined).
 * @example html`<p>${'<b>'}</p>`.toString() // '<p>&lt;b&gt;</p>'
 */
export function html(strings: TemplateStringsArray, ...values: readonly HtmlValue[]): SafeHtml {
  let markup = strings[0] ?? '';
  values.forEach((value, index) => {
    markup += render(value) + (strings[index + 1] ?? '');
  });
  return new SafeHtml(markup);
}

/**
 * Marks a trusted string as markup, unescaped: only for output of our own renderers (chart SVG).
 * Never pass text that came from a request or a file authored outside the project.
 */
export function raw(trusted: string): SafeHtml {
  return new SafeHtml(trusted);
}

/**
 * A `<script type="application/json">` block holding `value`, safe inside HTML: `<`, `>`, `&` and
 * the line separators are written as \u escapes so the data cannot close the script element.
 * @example jsonScript('x', { a: '</script>' }).toString()
 * // '<script type="application/json" id="x">{"a":"\\u003c/script\\u003e"}</script>'
 */
export function jsonScript(id: string, value: unknown): SafeHtml {
  const json = JSON.stringify(value)
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
  return new SafeHtml(`<script type="application/json" id="${escapeHtml(id)}">${json}</script>`);
}
