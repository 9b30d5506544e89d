import { describe, expect, it } from 'vitest';
import {
  checkCategoricalColours,
  MIN_CATEGORICAL_DIFFERENCE,
} from '../../../server/charts/colour/check-categorical-colours.js';
import { colourDifference } from '../../../server/charts/colour/colour-difference.js';
import { contrastRatio } from '../../../server/charts/colour/contrast-ratio.js';
import { simulateColourVision } from '../../../server/charts/colour/simulate-colour-vision.js';

describe('checkCategoricalColours', () => {
  it('matches the documented example: blue and purple merge under protanopia and deuteranopia', () => {
    const report = checkCategoricalColours(['#3050c0', '#8040c0'], '#ffffff');
    expect(report.confusablePairs.map((pair) => pair.vision)).toEqual(['protanopia', 'deuteranopia']);
    expect(report.ok).toBe(false);
  });

  it('flags a red/green pair under deuteranopia that normal vision separates ([C] via the Machado 2009 pipeline)', () => {
    const report = checkCategoricalColours(['#cc3333', '#558822'], '#ffffff');
    const deutan = report.confusablePairs.find((pair) => pair.vision === 'deuteranopia');
    expect(deutan).toBeDefined();
    expect(deutan!.first).toBe(0);
    expect(deutan!.second).toBe(1);
    expect(deutan!.difference).toBeLessThan(1);
    // The reported distance is the ΔE00 between the simulated colours, computed independently here.
    const expected = colourDifference(
      simulateColourVision('#cc3333', 'deuteranopia'),
      simulateColourVision('#558822', 'deuteranopia'),
    );
    expect(deutan!.difference).toBeCloseTo(expected, 12);
    expect(deutan!.firstSeen).toMatch(/^#[0-9a-f]{6}$/);
    expect(report.confusablePairs.some((pair) => pair.vision === 'normal')).toBe(false);
    expect(colourDifference('#cc3333', '#558822')).toBeGreaterThan(MIN_CATEGORICAL_DIFFERENCE);
  });

  it('flags a green/blue pair under tritanopia only (blue-yellow confusion, [C] via the Machado 2009 pipeline)', () => {
    const colours = ['#3a8a6a', '#4a86b0'];
    const report = checkCategoricalColours(colours, '#ffffff');
    expect(report.confusablePairs.map((pair) => pair.vision)).toEqual(['tritanopia']);
    // every vision agrees with an independent recomputation of the simulated ΔE00
    for (const vision of ['normal', 'protanopia', 'deuteranopia', 'tritanopia'] as const) {
      const difference = colourDifference(
        simulateColourVision(colours[0]!, vision),
        simulateColourVision(colours[1]!, vision),
      );
      expect(report.confusablePairs.some((pair) => pair.vision === vision)).toBe(
        difference < MIN_CATEGORICAL_DIFFERENCE,
      );
    }
  });

  it('reports each colour contrast against the background, unrounded (WCAG 2.1 SC 1.4.11)', () => {
    const report = checkCategoricalColours(['#959595', '#949494', '#000000'], '#ffffff');
    expect(report.contrasts.map((entry) => entry.meetsThreshold)).toEqual([false, true, true]);
    expect(report.contrasts[0]!.ratio).toBeCloseTo(2.9953, 4); // check-values.md §1 [C]: fails 3:1
    expect(report.contrasts[2]!.ratio).toBeCloseTo(21, 9); // ACT afw4f7 Passed Example 8
    expect(report.problems.filter((problem) => problem.problem.includes('contrast'))).toEqual([
      { indices: [0], problem: '#959595 has contrast 2.995:1 on #ffffff (needs >= 3:1)' },
    ]);
  });

  it('uses the background given, not white', () => {
    const report = checkCategoricalColours(['#ffffff'], '#333');
    expect(report.contrasts[0]!.ratio).toBeCloseTo(contrastRatio('#fff', '#333'), 12);
    expect(report.contrasts[0]!.meetsThreshold).toBe(true);
  });

  it('reports a pair confusable with normal vision once in problems but lists every vision in pairs', () => {
    const report = checkCategoricalColours(['#0c4888', '#0d4989'], '#ffffff');
    expect(report.confusablePairs.map((pair) => pair.vision)).toEqual([
      'normal',
      'protanopia',
      'deuteranopia',
      'tritanopia',
    ]);
    expect(report.problems).toHaveLength(1);
    expect(report.problems[0]!.problem).toMatch(
      /^#0c4888 and #0d4989 differ by only 0\.\d CIEDE2000 with normal vision/,
    );
  });

  it('never throws on unreadable colours; it reports them and checks the rest', () => {
    const report = checkCategoricalColours(['#0c4888', 'blue', '#0c4888'], 'paper');
    expect(report.unreadable).toEqual([
      { index: 1, text: 'blue' },
      { index: -1, text: 'paper' },
    ]);
    expect(report.contrasts).toEqual([]);
    expect(report.confusablePairs[0]).toMatchObject({ vision: 'normal', first: 0, second: 2, difference: 0 });
    expect(report.problems.map((problem) => problem.problem).slice(0, 2)).toEqual([
      'cannot read colour "blue"',
      'cannot read background colour "paper"',
    ]);
  });

  it('passes a well-separated set and an empty list', () => {
    expect(checkCategoricalColours(['#0c4888', '#905c14'], '#ffffff').ok).toBe(true);
    expect(checkCategoricalColours([], '#ffffff')).toMatchObject({ ok: true, problems: [], contrasts: [] });
  });

  it('uses the default thresholds 10 and 3 and honours overrides', () => {
    const report = checkCategoricalColours(['#0c4888', '#905c14'], '#ffffff', {
      minDifference: 200,
      minContrast: 21,
    });
    expect(report.ok).toBe(false);
    expect(report.confusablePairs).toHaveLength(4);
    expect(checkCategoricalColours([], '#fff')).toMatchObject({ minDifference: 10, minContrast: 3 });
    expect(MIN_CATEGORICAL_DIFFERENCE).toBe(10);
  });

  it('rejects nonsense thresholds', () => {
    expect(() => checkCategoricalColours([], '#fff', { minDifference: 0 })).toThrow(
      'checkCategoricalColours requires positive finite thresholds',
    );
  });
});
