import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { en } from '../../server/pages/strings/en.js';

const script = readFileSync(new URL('../../server/pages/assets/respondent.js', import.meta.url), 'utf8');
const templates = ['start-page.ts', 'respondent-page.ts', 'layout.ts']
  .map((name) => readFileSync(new URL(`../../server/pages/${name}`, import.meta.url), 'utf8'))
  .join('\n');

/** Keys the page script asks for with t('key'). */
function scriptKeys(): string[] {
  return [...script.matchAll(/\bt\(\s*'([A-Za-z]+)'/g)].map((match) => match[1]!);
}

/**
 * Syllables of an English word by vowel groups, minus a silent final e (common practice, no
 * source; good to about one syllable per word, which is what a grade estimate needs).
 */
function syllables(word: string): number {
  const lower = word.toLowerCase().replace(/[^a-z]/g, '');
  if (lower.length === 0) return 0;
  if (lower.length <= 3) return 1;
  const trimmed = lower.replace(/(?:[^laeiouy]es|[^laeiouy]ed|[^laeiouy]e)$/, '').replace(/^y/, '');
  const groups = trimmed.match(/[aeiouy]{1,2}/g);
  return Math.max(1, groups?.length ?? 1);
}

/**
 * Flesch-Kincaid grade level: 0.39 (words/sentences) + 11.8 (syllables/words) - 15.59.
 * @see Kincaid, Fishburne, Rogers and Chissom (1975), Derivation of new readability formulas for
 * Navy enlisted personnel, Research Branch Report 8-75 (the formula, from memory).
 */
function fleschKincaidGrade(texts: readonly string[]): number {
  let words = 0;
  let sentences = 0;
  let syllableCount = 0;
  for (const text of texts) {
    const clean = text.replace(/\{[a-zA-Z]+\}/g, '12');
    const parts = clean.split(/[.!?…]+/).filter((part) => /[A-Za-z0-9]/.test(part));
    sentences += Math.max(1, parts.length);
    for (const word of clean.split(/\s+/).filter((w) => /[A-Za-z0-9]/.test(w))) {
      words += 1;
      syllableCount += /[0-9]/.test(word) ? 1 : syllables(word);
    }
  }
  return 0.39 * (words / sentences) + 11.8 * (syllableCount / words) - 15.59;
}

describe('respondent strings', () => {
  it('has every key the page script uses', () => {
    const missing = scriptKeys().filter((key) => !(key in en));
    expect(scriptKeys().length).toBeGreaterThan(20);
    expect(missing).toEqual([]);
  });

  it('has no string that nothing uses (a translator should not translate dead text)', () => {
    // Any quoted key in the script counts (t(last ? 'finishButton' : 'nextButton') uses two).
    const quoted = [...script.matchAll(/'([A-Za-z]+)'/g)].map((m) => m[1]!);
    const used = new Set([...quoted, ...[...templates.matchAll(/strings\.([A-Za-z]+)/g)].map((m) => m[1]!)]);
    const unused = Object.keys(en).filter((key) => !used.has(key));
    expect(unused).toEqual([]);
  });

  it('counts syllables well enough on everyday words', () => {
    // Dictionary syllable counts (from memory).
    const words = {
      chart: 1,
      question: 2,
      answer: 2,
      reading: 2,
      visitor: 3,
      understand: 3,
      charts: 1,
      easy: 2,
    };
    for (const [word, count] of Object.entries(words)) expect([word, syllables(word)]).toEqual([word, count]);
  });

  it('reads at about a 12-year-old level (Flesch-Kincaid grade 7 or below)', () => {
    // US grade 6-7 is ages 11-13 (common practice, no source).
    const sentences = Object.entries(en)
      .filter(([key]) => key !== 'lang')
      .map(([, text]) => text);
    const grade = fleschKincaidGrade(sentences);
    expect(grade).toBeLessThanOrEqual(7);
  });

  it('the readability formula tells plain text from dense text', () => {
    const plain = fleschKincaidGrade(['We will show you some charts. It is not a test.']);
    const dense = fleschKincaidGrade([
      'Participation necessitates acknowledgement of institutional data-processing responsibilities.',
    ]);
    expect(plain).toBeLessThan(4);
    expect(dense).toBeGreaterThan(14);
  });

  it('never says item, score or logit to a respondent', () => {
    const jargon = Object.values(en).filter((text) =>
      /\b(item|items|score|scores|logit|rasch)\b/i.test(text),
    );
    expect(jargon).toEqual([]);
  });
});
