/** Shared pieces of the map renderers: projecting a stored planar map into a rectangle. */
import type { ExtendedFeature, ExtendedFeatureCollection } from 'd3-geo';
import { type GeoPath, geoIdentity, geoPath } from 'd3-geo';
import type { Rect } from './axis.js';
import type { StoredMap } from './chart-spec.js';

export interface MapFrame {
  /** d3 geoPath in string mode (context null) with the theme's digits. */
  readonly path: GeoPath;
  readonly features: readonly ExtendedFeature[];
  /** Feature id -> its feature, for joining rows to regions. */
  readonly byId: ReadonlyMap<string, ExtendedFeature>;
  /** Whether a drawn point (viewBox units) lies inside the feature's projected outline. */
  readonly contains: (feature: ExtendedFeature, x: number, y: number) => boolean;
}

/**
 * Fits a stored map into `rect`: invented planar coordinates (y pointing north) go through
 * `geoIdentity().reflectY(true).fitExtent(...)`, so no spherical projection or clipping applies.
 *
 * @throws `map has duplicate region id <id>` when two features share an id
 */
export function mapFrame(map: StoredMap, rect: Rect, digits: number): MapFrame {
  const collection = map as unknown as ExtendedFeatureCollection;
  const projection = geoIdentity()
    .reflectY(true)
    .fitExtent(
      [
        [rect.x, rect.y],
        [rect.x + rect.width, rect.y + rect.height],
      ],
      collection,
    );
  const byId = new Map<string, ExtendedFeature>();
  for (const feature of collection.features) {
    const id = String(feature.properties?.['id']);
    if (byId.has(id)) throw new Error(`map has duplicate region id ${id}`);
    byId.set(id, feature);
  }
  const projectedRings = new Map<ExtendedFeature, Array<Array<[number, number]>>>();
  for (const feature of collection.features) {
    const geometry = feature.geometry;
    const polygons =
      geometry?.type === 'Polygon'
        ? [geometry.coordinates]
        : geometry?.type === 'MultiPolygon'
          ? geometry.coordinates
          : [];
    projectedRings.set(
      feature,
      polygons.flatMap((rings) =>
        rings.map((ring) =>
          ring.map((point): [number, number] => {
            const projected = projection([point[0]!, point[1]!]);
            return projected === null ? [Number.NaN, Number.NaN] : [projected[0], projected[1]];
          }),
        ),
      ),
    );
  }
  const contains = (feature: ExtendedFeature, x: number, y: number) =>
    insideRings(projectedRings.get(feature) ?? [], x, y);
  return { path: geoPath(projection).digits(digits), features: collection.features, byId, contains };
}

/**
 * Even-odd ray casting over all rings (outer rings and holes alike), so a point in a hole is
 * outside. Planar coordinates only.
 */
function insideRings(
  rings: ReadonlyArray<ReadonlyArray<readonly [number, number]>>,
  x: number,
  y: number,
): boolean {
  let inside = false;
  for (const ring of rings) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i, i += 1) {
      const [xi, yi] = ring[i]!;
      const [xj, yj] = ring[j]!;
      if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
    }
  }
  return inside;
}

/** Name of a map feature (properties.name). */
export function featureName(feature: ExtendedFeature): string {
  return String(feature.properties?.['name'] ?? '');
}

/** Id of a map feature (properties.id). */
export function featureId(feature: ExtendedFeature): string {
  return String(feature.properties?.['id'] ?? '');
}
