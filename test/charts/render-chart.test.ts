import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { chartTypes } from '../../server/charts/chart-spec.js';
import { findOverlappingLabels } from '../../server/charts/label-box.js';
import { collectLabelBoxes, renderChart } from '../../server/charts/render-chart.js';
import { byClass, findElements, normalizeSvgNumbers, num, parseSvg } from '../helpers/svg.js';
import { barSpec, goldenSpecs, pieSpec } from './fixtures/specs.js';
import { testMaps } from './fixtures/test-map.js';

const goldenDir = join(dirname(fileURLToPath(import.meta.url)), 'golden');
const render = (spec: (typeof goldenSpecs)[number]) => renderChart(spec, { maps: testMaps });

describe('renderChart', () => {
  it('has one golden spec per chart type', () => {
    expect(goldenSpecs.map((spec) => spec.type)).toEqual([...chartTypes]);
  });

  for (const spec of goldenSpecs) {
    describe(spec.type, () => {
      const svg = render(spec);
      const root = parseSvg(svg);

      it('is an accessible SVG: xmlns, role="img", viewBox, title and desc named by aria-labelledby', () => {
        expect(root.attributes['xmlns']).toBe('http://www.w3.org/2000/svg');
        expect(root.attributes['role']).toBe('img');
        expect(root.attributes['viewBox']).toMatch(/^0 0 600 \d+(\.\d+)?$/);
        expect(root.attributes['width']).toBeUndefined();
        const [titleId, descId] = root.attributes['aria-labelledby']!.split(' ');
        const title = findElements(root, (element) => element.name === 'title');
        const desc = findElements(root, (element) => element.name === 'desc');
        expect(title.map((element) => element.attributes['id'])).toEqual([titleId]);
        expect(desc.map((element) => element.attributes['id'])).toEqual([descId]);
        expect(title[0]!.text).toBe(spec.title);
        expect(desc[0]!.text.length).toBeGreaterThan(10);
      });

      it('draws every text at least 14 units high in a 600-unit-wide viewBox', () => {
        const texts = findElements(root, (element) => element.name === 'text');
        expect(texts.length).toBeGreaterThan(0);
        for (const text of texts) expect(num(text, 'font-size')).toBeGreaterThanOrEqual(14);
      });

      it('draws at least one data mark', () => {
        expect(byClass(root, 'mark').length).toBeGreaterThan(0);
      });

      it('renders byte-identical output twice', () => {
        expect(render(spec)).toBe(svg);
      });

      it('names no number in the default description except structural counts', () => {
        const desc = findElements(root, (element) => element.name === 'desc')[0]!.text;
        // Allowed: counts of rows, marks, categories, classes, map regions, nodes, and the 1.5 of Tukey's rule.
        const allowed = new Set<number>([
          spec.data.length,
          byClass(root, 'mark').length,
          1.5,
          testMaps.get('test_isle')!.features.length,
        ]);
        for (const field of spec.fields) allowed.add(new Set(spec.data.map((row) => row[field.name])).size);
        if ('classes' in spec) allowed.add(spec.classes);
        if ('columns' in spec) allowed.add(spec.columns.length);
        if ('nodes' in spec)
          allowed.add(spec.nodes.length).add(new Set(spec.nodes.map((node) => node.group)).size);
        const numbers = (desc.match(/\d+(\.\d+)?/g) ?? []).map(Number);
        for (const value of numbers) expect(allowed).toContain(value);
      });

      it('reports one label box per <text> element', () => {
        const boxes = collectLabelBoxes(spec, { maps: testMaps });
        expect(boxes.length).toBe(findElements(root, (element) => element.name === 'text').length);
        for (const box of boxes) expect(box.width).toBeGreaterThan(0);
      });

      it('matches its golden file after number normalisation', () => {
        const file = join(goldenDir, `${spec.type}.svg`);
        if (process.env['UPDATE_GOLDEN'] === '1' || !existsSync(file)) {
          mkdirSync(goldenDir, { recursive: true });
          writeFileSync(file, `${svg}\n`);
        }
        expect(normalizeSvgNumbers(svg)).toBe(normalizeSvgNumbers(readFileSync(file, 'utf8').trimEnd()));
      });
    });
  }

  it('uses options.description as <desc> and options.idPrefix for ids', () => {
    const root = parseSvg(
      renderChart(barSpec, { description: 'Bars of ferry trips & more', idPrefix: 'q7' }),
    );
    expect(root.attributes['aria-labelledby']).toBe('q7-title q7-desc');
    expect(findElements(root, (element) => element.name === 'desc')[0]!.text).toBe(
      'Bars of ferry trips & more',
    );
  });

  it('gives different charts different default id prefixes', () => {
    const ids = [barSpec, pieSpec].map((spec) => parseSvg(renderChart(spec)).attributes['aria-labelledby']);
    expect(ids[0]).not.toBe(ids[1]);
  });

  it('throws when a map spec names a map that was not passed in', () => {
    const map = goldenSpecs.find((spec) => spec.type === 'choropleth-map')!;
    expect(() => renderChart(map)).toThrow('no stored map test_isle');
  });

  it('lays out the golden charts without overlapping labels', () => {
    for (const spec of goldenSpecs) {
      const overlaps = findOverlappingLabels(collectLabelBoxes(spec, { maps: testMaps }));
      expect({ type: spec.type, overlaps }).toEqual({ type: spec.type, overlaps: [] });
    }
  });
});
