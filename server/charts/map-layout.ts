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
  return { path: geoPath(projection).digits(digits), features: collection.features, byId };
}

/** Name of a map feature (properties.name). */
export function featureName(feature: ExtendedFeature): string {
  return String(feature.properties?.['name'] ?? '');
}

/** Id of a map feature (properties.id). */
export function featureId(feature: ExtendedFeature): string {
  return String(feature.properties?.['id'] ?? '');
}
