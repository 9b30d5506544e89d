import { describe, expect, it } from 'vitest';
import { escapeHtml, html, jsonScript, raw } from '../../server/pages/html.js';

describe('html', () => {
  it('escapes every interpolation (OWASP XSS prevention: & < > " \' in content and attributes)', () => {
    const evil = `"><script>alert('x')</script>&`;
    expect(html`<p title="${evil}">${evil}</p>`.toString()).toBe(
      '<p title="&quot;&gt;&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;&amp;">&quot;&gt;&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;&amp;</p>',
    );
  });
  it('inserts nested html, raw() and arrays; drops null, undefined and false', () => {
    expect(
      html`<ul>${['<a>', html`<li>${'b'}</li>`]}</ul>${null}${undefined}${false}${raw('<svg></svg>')}${0}`.toString(),
    ).toBe('<ul>&lt;a&gt;<li>b</li></ul><svg></svg>0');
    expect(escapeHtml('<a href="x">')).toBe('&lt;a href=&quot;x&quot;&gt;');
  });
  it('jsonScript cannot close its script element', () => {
    expect(jsonScript('x', { a: '</script>' }).toString()).toBe(
      '<script type="application/json" id="x">{"a":"\\u003c/script\\u003e"}</script>',
    );
  });
});
