import { describe, expect, it } from 'vitest';
import { documentHead } from '../../server/pages/document-head.js';
import { html } from '../../server/pages/html.js';

describe('documentHead', () => {
  it('escapes the title, keeps the stylesheets in order, and defaults the language to English', () => {
    const head =
      html`${documentHead({ title: 'Fish & <chips>', stylesheets: ['/a.css', '/b.css'] })}`.toString();
    expect(head.startsWith('<!doctype html>\n<html lang="en">\n<head>\n')).toBe(true);
    expect(head).toContain('<title>Fish &amp; &lt;chips&gt;</title>');
    expect(head).toContain('<meta name="referrer" content="no-referrer">');
    expect(head.indexOf('href="/a.css"')).toBeLessThan(head.indexOf('href="/b.css"'));
    expect(head.endsWith('</head>')).toBe(true);
    expect(head).not.toMatch(/<script|<style/);
  });

  it('takes the page language', () => {
    expect(documentHead({ lang: 'cy', title: 't', stylesheets: [] }).toString()).toContain(
      '<html lang="cy">',
    );
  });
});
