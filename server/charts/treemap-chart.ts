/** Treemap: nested rectangles, area proportional to value, optionally grouped. */
import { type HierarchyRectangularNode, hierarchy, treemap, treemapSquarify } from 'd3-hierarchy';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { categoriesOf, cellText, fieldOf, fieldTitle, numberOrNull, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { contrastRatio } from './colour/contrast-ratio.js';
import { drawLegend } from './legend.js';
import { element } from './svg.js';
import { estimateTextWidth } from './text-metrics.js';

interface TreeDatum {
  readonly name: string;
  readonly value?: number;
  readonly row?: number;
  readonly children?: TreeDatum[];
}

/**
 * Renders a treemap with d3-hierarchy: `treemapSquarify` at its fixed default aspect ratio (the
 * golden ratio), nodes sorted by value, ties by data order, so the layout is deterministic. With
 * `group`, leaves are nested in their group and coloured by it (legend for `labelling: 'legend'`,
 * group names in a header strip for 'direct'); leaf labels are printed only where they fit.
 *
 * @param spec a parsed `treemap` spec
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each leaf is `<rect class="mark tile" data-row="i">`
 * @throws when a value is negative
 */
export function renderTreemapChart(spec: ChartSpecOf<'treemap'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const groupField = spec.group;
  const groups = groupField === undefined ? [''] : categoriesOf(spec, groupField);
  const colours = seriesColours(spec, canvas.theme, groups.length);
  const parts: string[] = [];
  if (groupField !== undefined && spec.labelling === 'legend') {
    parts.push(
      drawLegend(
        canvas,
        groups.map((label, index) => ({ label, colour: colours[index]!, shape: 'square' })),
      ),
    );
  }
  const leaves = groups.map(() => [] as TreeDatum[]);
  spec.data.forEach((row, index) => {
    const value = numberOrNull(row, spec.value);
    if (value === null) return;
    if (value < 0) throw new Error('renderTreemapChart requires values >= 0');
    const group = groupField === undefined ? 0 : groups.indexOf(cellText(row[groupField]));
    leaves[group]!.push({ name: cellText(row[spec.category]), value, row: index });
  });
  const root: TreeDatum =
    groupField === undefined
      ? { name: '', children: leaves[0] }
      : { name: '', children: groups.map((name, index) => ({ name, children: leaves[index] })) };
  const size = canvas.theme.fontSize.label;
  const headers = groupField !== undefined && spec.labelling === 'direct';
  const order = (node: { data: TreeDatum }) => node.data.row ?? groups.indexOf(node.data.name);
  const laidOut = treemap<TreeDatum>()
    .tile(treemapSquarify)
    .size([canvas.right - canvas.left, canvas.bottom - canvas.top])
    .paddingInner(2)
    .paddingOuter(groupField === undefined ? 0 : 2)
    .paddingTop((node) => (headers && node.depth === 1 ? size * 1.5 : node.depth === 0 ? 0 : 2))
    .round(false)(
    hierarchy(root)
      .sum((datum) => datum.value ?? 0)
      .sort((a, b) => (b.value ?? 0) - (a.value ?? 0) || order(a) - order(b)),
  );
  const n = (value: number) => canvas.n(value);
  const offsetX = canvas.left;
  const offsetY = canvas.top;
  const marks: string[] = [];
  const labels: string[] = [];
  if (headers) {
    for (const group of laidOut.children ?? []) {
      const header = group.data.name;
      if (estimateTextWidth(header, size, true) + 8 <= group.x1 - group.x0) {
        labels.push(
          canvas.text(offsetX + group.x0 + 4, offsetY + group.y0 + 2, header, {
            kind: 'tile',
            className: 'group-label',
            bold: true,
            align: 'top',
          }),
        );
      }
    }
  }
  for (const leaf of laidOut.leaves() as Array<HierarchyRectangularNode<TreeDatum>>) {
    if (leaf.data.row === undefined) continue;
    const fill = colours[groupField === undefined ? 0 : groups.indexOf(leaf.parent?.data.name ?? '')]!;
    const [x0, y0, width, height] = [
      offsetX + leaf.x0,
      offsetY + leaf.y0,
      leaf.x1 - leaf.x0,
      leaf.y1 - leaf.y0,
    ];
    canvas.anchor(leaf.data.row, x0 + width / 2, y0 + height / 2);
    marks.push(
      element('rect', {
        class: 'mark tile',
        'data-row': leaf.data.row,
        x: n(x0),
        y: n(y0),
        width: n(width),
        height: n(height),
        fill,
      }),
    );
    if (estimateTextWidth(leaf.data.name, size) + 8 <= width && size * 1.4 <= height) {
      const dark = canvas.theme.colours.text;
      const light = canvas.theme.colours.background;
      const textFill = contrastRatio(dark, fill) >= contrastRatio(light, fill) ? dark : light;
      labels.push(
        canvas.text(x0 + 4, y0 + 4, leaf.data.name, {
          kind: 'tile',
          className: 'tile-label',
          align: 'top',
          fill: textFill,
        }),
      );
    }
  }
  return canvas.finish(
    [...parts, element('g', { class: 'marks' }, marks), element('g', { class: 'labels' }, labels)],
    {
      marks: marks.length,
      markNoun: `rectangles whose areas show ${fieldTitle(fieldOf(spec, spec.value))}`,
      series: groupField === undefined ? undefined : groups.length,
    },
  );
}
