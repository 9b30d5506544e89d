/** Node-link diagram drawn from stored node positions (no simulation at render time). */
import { scaleLinear } from 'd3-scale';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, numberOrNull, seriesColours } from './chart-data.js';
import type { ChartSpecOf } from './chart-spec.js';
import { drawLegend } from './legend.js';
import { element } from './svg.js';
import { estimateTextWidth } from './text-metrics.js';

const nodeRadius = 10;

/**
 * Renders a network: nodes at their stored positions ([0, 1] x [0, 1], y downwards) scaled into
 * the free area, links as straight lines (width from `weight` when given, 2 to 8 units), arrow
 * heads when `directed`. Nodes are coloured by `group` (legend when `labelling` is 'legend') and
 * labelled beside the node (left of it in the right fifth of the drawing).
 *
 * @param spec a parsed `network` spec (`data` rows are links)
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; nodes are `<circle class="mark node" data-node="id">`, links
 *   `<line class="mark link" data-row="i">`
 * @throws `network link names unknown node <id>`
 */
export function renderNetworkChart(spec: ChartSpecOf<'network'>, options: ChartRenderOptions = {}): string {
  const canvas = new ChartCanvas(spec, options);
  const groups = [...new Set(spec.nodes.flatMap((node) => (node.group === undefined ? [] : [node.group])))];
  const colours = seriesColours(spec, canvas.theme, Math.max(1, groups.length));
  const parts: string[] = [];
  if (spec.labelling === 'legend' && groups.length > 1) {
    parts.push(
      drawLegend(
        canvas,
        groups.map((label, index) => ({ label, colour: colours[index]!, shape: 'circle' })),
      ),
    );
  }
  const size = canvas.theme.fontSize.label;
  const widest = Math.max(...spec.nodes.map((node) => estimateTextWidth(node.label, size)));
  const left = canvas.left + nodeRadius + 4;
  const right = canvas.right - nodeRadius - 4;
  const x = scaleLinear()
    .domain([0, 1])
    .range([left + Math.min(widest, (right - left) / 4), right - Math.min(widest, (right - left) / 4)]);
  const y = scaleLinear()
    .domain([0, 1])
    .range([canvas.top + nodeRadius + size, canvas.bottom - nodeRadius - size]);
  const byId = new Map(spec.nodes.map((node) => [node.id, node]));
  const weights =
    spec.weight === undefined ? [] : spec.data.map((row) => numberOrNull(row, spec.weight!) ?? 0);
  const width = scaleLinear()
    .domain([0, Math.max(1, ...weights)])
    .range([2, 8]);
  const n = (value: number) => canvas.n(value);
  const markerId = `${canvas.idPrefix}-arrow`;
  if (spec.directed) {
    parts.push(
      element(
        'defs',
        {},
        element(
          'marker',
          {
            id: markerId,
            viewBox: '0 0 10 10',
            refX: 10,
            refY: 5,
            markerWidth: 14,
            markerHeight: 14,
            orient: 'auto-start-reverse',
            markerUnits: 'userSpaceOnUse',
          },
          element('path', { d: 'M0,0L10,5L0,10z', fill: canvas.theme.colours.outline }),
        ),
      ),
    );
  }
  const links = spec.data.map((row, index) => {
    const source = byId.get(cellText(row[spec.source]));
    const target = byId.get(cellText(row[spec.target]));
    if (source === undefined || target === undefined) {
      throw new Error(
        `network link names unknown node ${source === undefined ? cellText(row[spec.source]) : cellText(row[spec.target])}`,
      );
    }
    const [x1, y1, x2, y2] = [x(source.x), y(source.y), x(target.x), y(target.y)];
    const length = Math.hypot(x2 - x1, y2 - y1) || 1;
    const stroke = spec.weight === undefined ? 2 : width(weights[index]!);
    // Stop the line at the target's rim (plus the arrow's length) so the arrow head stays visible.
    const trim = spec.directed ? nodeRadius + 2 : 0;
    const endX = x2 - ((x2 - x1) / length) * trim;
    const endY = y2 - ((y2 - y1) / length) * trim;
    canvas.anchor(index, (x1 + x2) / 2, (y1 + y2) / 2);
    return element('line', {
      class: 'mark link',
      'data-row': index,
      x1: n(x1),
      y1: n(y1),
      x2: n(endX),
      y2: n(endY),
      stroke: canvas.theme.colours.outline,
      'stroke-width': n(stroke),
      'stroke-linecap': 'round',
      'marker-end': spec.directed ? `url(#${markerId})` : undefined,
    });
  });
  const nodes: string[] = [];
  const labels: string[] = [];
  for (const node of spec.nodes) {
    const cx = x(node.x);
    const cy = y(node.y);
    const colour = colours[node.group === undefined ? 0 : groups.indexOf(node.group)]!;
    nodes.push(
      element('circle', {
        class: 'mark node',
        'data-node': node.id,
        cx: n(cx),
        cy: n(cy),
        r: nodeRadius,
        fill: colour,
        stroke: canvas.theme.colours.background,
        'stroke-width': 2,
      }),
    );
    const onLeft = node.x > 0.8;
    labels.push(
      canvas.text(cx + (onLeft ? -1 : 1) * (nodeRadius + 5), cy, node.label, {
        kind: 'node',
        className: 'node-label',
        anchor: onLeft ? 'end' : 'start',
        align: 'middle',
        halo: true,
      }),
    );
  }
  return canvas.finish(
    [
      ...parts,
      element('g', { class: 'links' }, links),
      element('g', { class: 'nodes' }, nodes),
      element('g', { class: 'labels' }, labels),
    ],
    {
      marks: spec.nodes.length,
      markNoun: `nodes joined by ${links.length} ${spec.directed ? 'arrows' : 'lines'}${spec.weight === undefined ? '' : ' whose width shows a weight'}`,
      series: groups.length > 1 ? groups.length : undefined,
    },
  );
}
