/** Proportional-symbol map: a circle per region, circle area proportional to the value. */
import { scaleLinear, scaleSqrt } from 'd3-scale';
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, formatNumber, numberOrNull } from './chart-data.js';
import type { ChartSpecOf, StoredMap } from './chart-spec.js';
import { drawPlacedLabels } from './draw-placed-labels.js';
import { type LabelRequest, placeLabels } from './label-placer.js';
import { featureId, featureName, mapFrame } from './map-layout.js';
import { element } from './svg.js';

/** Radius of the largest circle as a share of the smaller side of the map area. */
const largestRadiusShare = 0.11;

/**
 * Renders a proportional-symbol map of `map`: regions as a light base map, and for each row a
 * circle at its region's centroid whose AREA is proportional to `value` (d3 `scaleSqrt` from 0,
 * so radius grows with the square root); larger circles are drawn first. A size legend with two
 * round reference values sits above the map. Region names go where {@link placeLabels} finds
 * room around the circle (or centred on a region without one), preferring spots inside the
 * region's own outline; largest circles are labelled first.
 *
 * @param spec a parsed `symbol-map` spec
 * @param map the stored map named by `spec.map`
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each circle is `<circle class="mark symbol" data-row="i">`
 * @throws `symbol map has no region <id>`, or when a value is negative
 */
export function renderSymbolMapChart(
  spec: ChartSpecOf<'symbol-map'>,
  map: StoredMap,
  options: ChartRenderOptions = {},
): string {
  const canvas = new ChartCanvas(spec, options);
  const valueField = fieldOf(spec, spec.value);
  const entries = spec.data.flatMap((row, index) => {
    const value = numberOrNull(row, spec.value);
    if (value !== null && value < 0) throw new Error('renderSymbolMapChart requires values >= 0');
    return value === null ? [] : [{ index, value, region: cellText(row[spec.region]) }];
  });
  const largest = Math.max(...entries.map((entry) => entry.value), 0) || 1;
  const maxRadius = Math.min(canvas.right - canvas.left, canvas.bottom - canvas.top) * largestRadiusShare;
  const radius = scaleSqrt().domain([0, largest]).range([0, maxRadius]);
  const legend = sizeLegend(canvas, radius, largest, fieldTitle(valueField));
  const rect = {
    x: canvas.left + maxRadius,
    y: canvas.top + maxRadius / 2,
    width: canvas.right - canvas.left - 2 * maxRadius,
    height: canvas.bottom - canvas.top - maxRadius,
  };
  const frame = mapFrame(map, rect, canvas.theme.digits);
  const n = (value: number) => canvas.n(value);
  const regions = frame.features.map((feature) =>
    element('path', {
      class: 'region',
      'data-region': featureId(feature),
      d: frame.path(feature) ?? '',
      fill: '#f4f4f4',
      stroke: canvas.theme.colours.outline,
      'stroke-width': 1,
    }),
  );
  const placed = entries.map((entry) => {
    const feature = frame.byId.get(entry.region);
    if (feature === undefined) throw new Error(`symbol map has no region ${entry.region}`);
    const [cx, cy] = frame.path.centroid(feature);
    canvas.anchor(entry.index, cx, cy - radius(entry.value));
    return { ...entry, cx, cy, r: radius(entry.value) };
  });
  const symbols = [...placed]
    .sort((a, b) => b.value - a.value || a.index - b.index)
    .map((entry) =>
      element('circle', {
        class: 'mark symbol',
        'data-row': entry.index,
        cx: n(entry.cx),
        cy: n(entry.cy),
        r: n(entry.r),
        fill: (spec.colours ?? canvas.theme.colours.categorical)[0]!,
        'fill-opacity': 0.7,
        stroke: canvas.theme.colours.text,
        'stroke-width': 1,
      }),
    );
  const labels: string[] = [];
  if (spec.regionLabels) {
    // Regions with the largest circles first: they have the least free room around them.
    const order = frame.features
      .map((feature) => ({
        feature,
        entry: placed.find((candidate) => candidate.region === featureId(feature)),
      }))
      .sort((a, b) => (b.entry?.r ?? 0) - (a.entry?.r ?? 0));
    const requests: LabelRequest[] = order.map(({ feature, entry }) => {
      const [cx, cy] = entry === undefined ? frame.path.centroid(feature) : [entry.cx, entry.cy];
      return {
        text: featureName(feature),
        x: cx,
        y: cy,
        markRadius: entry?.r ?? 0,
        size: canvas.theme.fontSize.label,
        centred: entry === undefined,
        prefer: (x: number, y: number) => frame.contains(feature, x, y),
      };
    });
    labels.push(
      ...drawPlacedLabels(
        canvas,
        requests,
        requests.map(() => 'region'),
        placeLabels(requests, {
          bounds: {
            x: canvas.left,
            y: canvas.top,
            width: canvas.right - canvas.left,
            height: canvas.bottom - canvas.top,
          },
          fixed: canvas.drawnBoxes,
          marks: placed.map((entry) => ({ x: entry.cx, y: entry.cy, r: entry.r, weight: 300 })),
        }),
      ),
    );
  }
  return canvas.finish(
    [
      legend,
      element('g', { class: 'regions' }, regions),
      element('g', { class: 'marks' }, symbols),
      element('g', { class: 'labels' }, labels),
    ],
    {
      marks: symbols.length,
      markNoun: `circles on a map of ${map.features.length} regions, circle area showing ${fieldTitle(valueField)}, with a size legend`,
    },
  );
}

/** Two nested reference circles (round values up to the largest) with their values; reserves its height. */
function sizeLegend(
  canvas: ChartCanvas,
  radius: (value: number) => number,
  largest: number,
  title: string,
): string {
  const references = scaleLinear()
    .domain([0, largest])
    .ticks(3)
    .filter((value) => value > 0 && value <= largest)
    .slice(-2);
  const size = canvas.theme.fontSize.legend;
  const n = (value: number) => canvas.n(value);
  const parts = [
    canvas.text(canvas.left, canvas.top, title, {
      kind: 'legend',
      className: 'legend-title',
      bold: true,
      size,
      align: 'top',
    }),
  ];
  const biggest = radius(references[references.length - 1] ?? largest);
  const bottom = canvas.top + size * canvas.theme.lineHeight + 4 + 2 * biggest;
  const cx = canvas.left + biggest;
  let labelY = bottom - 2 * biggest;
  for (const value of [...references].reverse()) {
    const r = radius(value);
    parts.push(
      element('circle', {
        class: 'legend-symbol',
        cx: n(cx),
        cy: n(bottom - r),
        r: n(r),
        fill: 'none',
        stroke: canvas.theme.colours.outline,
      }),
    );
    parts.push(
      canvas.text(cx + biggest + 8, Math.max(labelY, bottom - 2 * r), formatNumber(value), {
        kind: 'legend',
        className: 'legend-label',
        size,
        align: 'middle',
      }),
    );
    labelY += size * 1.2;
  }
  canvas.reserveTop(bottom + 8 - canvas.top);
  return element('g', { class: 'legend size-legend' }, parts);
}
