/** Shaded (choropleth) map: each region filled by its value's equal-interval class. */
import { ChartCanvas, type ChartRenderOptions } from './chart-canvas.js';
import { cellText, fieldOf, fieldTitle, numberOrNull } from './chart-data.js';
import type { ChartSpecOf, StoredMap } from './chart-spec.js';
import { drawClassLegend, equalIntervalClasses } from './class-legend.js';
import { featureId, featureName, mapFrame } from './map-layout.js';
import { element } from './svg.js';

/**
 * Renders a choropleth map of `map` (passed in; renderers do no I/O): rows join regions through
 * `region` = feature `properties.id`; regions are shaded by equal-interval classes of `value`
 * (`classes`, default 5) with a class legend above; regions without a row are light grey and the
 * legend then adds a "No data" swatch. Region names (`regionLabels`, default on) sit at each
 * region's centroid with a white halo.
 *
 * @param spec a parsed `choropleth-map` spec
 * @param map the stored map named by `spec.map`
 * @param options size, ids, alt text, label callback, theme
 * @returns one SVG document; each region with data is `<path class="mark region" data-row="i">`
 * @throws `choropleth map has no region <id>` when a row names a region the map lacks
 */
export function renderChoroplethMapChart(
  spec: ChartSpecOf<'choropleth-map'>,
  map: StoredMap,
  options: ChartRenderOptions = {},
): string {
  const canvas = new ChartCanvas(spec, options);
  const valueField = fieldOf(spec, spec.value);
  const rowsByRegion = new Map<string, { index: number; value: number }>();
  spec.data.forEach((row, index) => {
    const value = numberOrNull(row, spec.value);
    if (value !== null) rowsByRegion.set(cellText(row[spec.region]), { index, value });
  });
  const classes = equalIntervalClasses(
    [...rowsByRegion.values()].map((entry) => entry.value),
    spec.classes,
    canvas.theme,
  );
  const missing = map.features.some((feature) => !rowsByRegion.has(feature.properties.id));
  const legend = drawClassLegend(canvas, classes, fieldTitle(valueField), missing ? 'No data' : undefined);
  const rect = {
    x: canvas.left,
    y: canvas.top,
    width: canvas.right - canvas.left,
    height: canvas.bottom - canvas.top,
  };
  const frame = mapFrame(map, rect, canvas.theme.digits);
  for (const region of rowsByRegion.keys()) {
    if (!frame.byId.has(region)) throw new Error(`choropleth map has no region ${region}`);
  }
  const shapes: string[] = [];
  const labels: string[] = [];
  for (const feature of frame.features) {
    const id = featureId(feature);
    const entry = rowsByRegion.get(id);
    const [cx, cy] = frame.path.centroid(feature);
    if (entry !== undefined) canvas.anchor(entry.index, cx, cy);
    shapes.push(
      element('path', {
        class: entry === undefined ? 'region no-data' : 'mark region',
        'data-row': entry?.index,
        'data-region': id,
        d: frame.path(feature) ?? '',
        fill: entry === undefined ? canvas.theme.colours.noData : classes.colourOf(entry.value),
        stroke: canvas.theme.colours.outline,
        'stroke-width': 1,
        'stroke-linejoin': 'round',
      }),
    );
    if (spec.regionLabels) {
      labels.push(
        canvas.text(cx, cy, featureName(feature), {
          kind: 'region',
          className: 'region-label',
          anchor: 'middle',
          align: 'middle',
          halo: true,
        }),
      );
    }
  }
  const marks = rowsByRegion.size;
  return canvas.finish(
    [legend, element('g', { class: 'marks' }, shapes), element('g', { class: 'labels' }, labels)],
    {
      marks,
      markNoun: `shaded regions out of ${map.features.length}, in ${spec.classes} classes of ${fieldTitle(valueField)} shown in a legend`,
    },
  );
}
