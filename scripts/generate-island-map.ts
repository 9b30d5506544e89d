/**
 * Writes the invented geography used by the map items:
 *   items/maps/velmora_isle.geojson    the ten districts of Velmora Isle (an invented island)
 *   items/maps/corrowen_wards.geojson  the seven wards of Corrowen (an invented town)
 *
 * Each map is a Voronoi partition (d3-delaunay) of a few seeded sites, relaxed with a few Lloyd
 * steps so the regions have similar sizes, and clipped to a wavy invented outline. Coordinates are
 * invented planar map units with y pointing up (not longitude and latitude); exterior rings run
 * counter-clockwise (RFC 7946 convention), rings are closed, and every polygon is checked to be
 * simple and to take only its share of the plane when drawn with d3-geo's geoIdentity.
 *
 * Deterministic: fixed seeds, no clock, coordinates rounded to 0.1 map units.
 *
 * Usage: npx tsx scripts/generate-island-map.ts
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Delaunay } from 'd3-delaunay';
import { geoIdentity, geoPath } from 'd3-geo';

type Point = [number, number];

interface Region {
  readonly id: string;
  readonly name: string;
  /** Rough position of the region's seed as a fraction of the outline's bounding box (x right, y up). */
  readonly at: Point;
}

interface MapPlan {
  readonly file: string;
  readonly seed: number;
  /** Plane size in map units. */
  readonly width: number;
  readonly height: number;
  /** Outline: an ellipse of these radii with seeded waves on its radius. */
  readonly radiusX: number;
  readonly radiusY: number;
  readonly waves: number;
  readonly regions: readonly Region[];
}

const plans: readonly MapPlan[] = [
  {
    file: 'velmora_isle.geojson',
    seed: 20310417,
    width: 1000,
    height: 700,
    radiusX: 460,
    radiusY: 300,
    waves: 0.14,
    regions: [
      { id: 'windlow', name: 'Windlow', at: [0.2, 0.78] },
      { id: 'gullstone', name: 'Gullstone', at: [0.45, 0.85] },
      { id: 'lanternpoint', name: 'Lanternpoint', at: [0.75, 0.8] },
      { id: 'driftholm', name: 'Driftholm', at: [0.1, 0.45] },
      { id: 'mossridge', name: 'Mossridge', at: [0.38, 0.55] },
      { id: 'quarrytop', name: 'Quarrytop', at: [0.62, 0.55] },
      { id: 'heronmoor', name: 'Heronmoor', at: [0.9, 0.5] },
      { id: 'pebblewick', name: 'Pebblewick', at: [0.25, 0.18] },
      { id: 'reedhaven', name: 'Reedhaven', at: [0.52, 0.2] },
      { id: 'tidewell', name: 'Tidewell', at: [0.8, 0.2] },
    ],
  },
  {
    file: 'corrowen_wards.geojson',
    seed: 7310,
    width: 800,
    height: 700,
    radiusX: 360,
    radiusY: 310,
    waves: 0.06,
    regions: [
      { id: 'northgate', name: 'Northgate', at: [0.5, 0.85] },
      { id: 'bellfield', name: 'Bellfield', at: [0.18, 0.68] },
      { id: 'hollins', name: 'Hollins', at: [0.82, 0.68] },
      { id: 'old_market', name: 'Old Market', at: [0.5, 0.5] },
      { id: 'mill_row', name: 'Mill Row', at: [0.2, 0.25] },
      { id: 'riverside', name: 'Riverside', at: [0.8, 0.28] },
      { id: 'tannery', name: 'Tannery', at: [0.5, 0.12] },
    ],
  },
];

/** Small seeded generator (mulberry32), so the maps never change between runs. */
function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Signed area by the shoelace formula; positive for a counter-clockwise ring with y up. */
function signedArea(ring: readonly Point[]): number {
  let sum = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x0, y0] = ring[i]!;
    const [x1, y1] = ring[(i + 1) % ring.length]!;
    sum += x0 * y1 - x1 * y0;
  }
  return sum / 2;
}

function centroid(ring: readonly Point[]): Point {
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x0, y0] = ring[i]!;
    const [x1, y1] = ring[(i + 1) % ring.length]!;
    const cross = x0 * y1 - x1 * y0;
    cx += (x0 + x1) * cross;
    cy += (y0 + y1) * cross;
  }
  const a = signedArea(ring);
  return [cx / (6 * a), cy / (6 * a)];
}

/** Open ring (last point not repeated), counter-clockwise. */
function openCcw(ring: readonly Point[]): Point[] {
  const open = ring.slice();
  const first = open[0]!;
  const last = open[open.length - 1]!;
  if (first[0] === last[0] && first[1] === last[1]) open.pop();
  return signedArea(open) < 0 ? open.reverse() : open;
}

/** A wavy ellipse around the plane's centre, counter-clockwise, 96 vertices. */
function outline(plan: MapPlan, random: () => number): Point[] {
  const phases = [random(), random(), random()].map((p) => p * 2 * Math.PI);
  const ring: Point[] = [];
  const steps = 96;
  for (let i = 0; i < steps; i++) {
    const t = (i / steps) * 2 * Math.PI;
    const wave =
      1 +
      plan.waves *
        (Math.sin(2 * t + phases[0]!) +
          0.6 * Math.sin(3 * t + phases[1]!) +
          0.35 * Math.sin(5 * t + phases[2]!));
    ring.push([
      plan.width / 2 + plan.radiusX * wave * Math.cos(t),
      plan.height / 2 + plan.radiusY * wave * Math.sin(t),
    ]);
  }
  return ring;
}

/**
 * Sutherland-Hodgman: clips `subject` by the convex, counter-clockwise polygon `clip`.
 * @see Sutherland and Hodgman, 1974, "Reentrant polygon clipping", Communications of the ACM 17(1)
 */
function clipByConvex(subject: readonly Point[], clip: readonly Point[]): Point[] {
  let output = subject.slice();
  for (let i = 0; i < clip.length && output.length > 0; i++) {
    const a = clip[i]!;
    const b = clip[(i + 1) % clip.length]!;
    const inside = (p: Point) => (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]) >= 0;
    const cut = (p: Point, q: Point): Point => {
      const d1 = (b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0]);
      const d2 = (b[0] - a[0]) * (q[1] - a[1]) - (b[1] - a[1]) * (q[0] - a[0]);
      const t = d1 / (d1 - d2);
      return [p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])];
    };
    const input = output;
    output = [];
    for (let j = 0; j < input.length; j++) {
      const p = input[j]!;
      const q = input[(j + 1) % input.length]!;
      if (inside(q)) {
        if (!inside(p)) output.push(cut(p, q));
        output.push(q);
      } else if (inside(p)) {
        output.push(cut(p, q));
      }
    }
  }
  return output;
}

/** True when two segments cross or touch (used to prove each ring is simple). */
function segmentsTouch(p1: Point, p2: Point, p3: Point, p4: Point): boolean {
  const orient = (a: Point, b: Point, c: Point) =>
    Math.sign((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]));
  const o1 = orient(p1, p2, p3);
  const o2 = orient(p1, p2, p4);
  const o3 = orient(p3, p4, p1);
  const o4 = orient(p3, p4, p2);
  if (o1 !== o2 && o3 !== o4) return true;
  const onSegment = (a: Point, b: Point, c: Point) =>
    Math.min(a[0], b[0]) <= c[0] &&
    c[0] <= Math.max(a[0], b[0]) &&
    Math.min(a[1], b[1]) <= c[1] &&
    c[1] <= Math.max(a[1], b[1]);
  return (
    (o1 === 0 && onSegment(p1, p2, p3)) ||
    (o2 === 0 && onSegment(p1, p2, p4)) ||
    (o3 === 0 && onSegment(p3, p4, p1)) ||
    (o4 === 0 && onSegment(p3, p4, p2))
  );
}

function isSimple(ring: readonly Point[]): boolean {
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (j === i + 1 || (i === 0 && j === n - 1)) continue;
      if (segmentsTouch(ring[i]!, ring[(i + 1) % n]!, ring[j]!, ring[(j + 1) % n]!)) return false;
    }
  }
  return true;
}

/** Rounds to 0.1 units and drops repeated or collinear points left by clipping and rounding. */
function tidy(ring: readonly Point[]): Point[] {
  const rounded = ring.map(([x, y]): Point => [Math.round(x * 10) / 10, Math.round(y * 10) / 10]);
  const unique = rounded.filter((p, i) => {
    const prev = rounded[(i - 1 + rounded.length) % rounded.length]!;
    return p[0] !== prev[0] || p[1] !== prev[1];
  });
  return unique.filter((p, i) => {
    const prev = unique[(i - 1 + unique.length) % unique.length]!;
    const next = unique[(i + 1) % unique.length]!;
    return (p[0] - prev[0]) * (next[1] - prev[1]) - (p[1] - prev[1]) * (next[0] - prev[0]) !== 0;
  });
}

function buildMap(plan: MapPlan): object {
  const random = seededRandom(plan.seed);
  const coast = outline(plan, random);
  const xs = coast.map((p) => p[0]);
  const ys = coast.map((p) => p[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  let sites: Point[] = plan.regions.map((r) => [
    minX + (maxX - minX) * (r.at[0] + (random() - 0.5) * 0.06),
    minY + (maxY - minY) * (r.at[1] + (random() - 0.5) * 0.06),
  ]);
  const bounds: [number, number, number, number] = [0, 0, plan.width, plan.height];
  let cells: Point[][] = [];
  // A few Lloyd steps (move each site to its clipped cell's centroid) even out the region sizes.
  for (let step = 0; step <= 4; step++) {
    const voronoi = Delaunay.from(sites).voronoi(bounds);
    cells = sites.map((_, i) => clipByConvex(coast, openCcw(voronoi.cellPolygon(i) as Point[])));
    if (step < 4) sites = cells.map((cell) => centroid(cell));
  }
  const plane = plan.width * plan.height;
  const features = plan.regions.map((region, i) => {
    const ring = openCcw(tidy(cells[i]!));
    if (ring.length < 3) throw new Error(`region ${region.id} vanished`);
    if (!isSimple(ring)) throw new Error(`region ${region.id} is not a simple polygon`);
    const closed = [...ring, ring[0]!];
    const feature = {
      type: 'Feature' as const,
      properties: { id: region.id, name: region.name },
      geometry: { type: 'Polygon' as const, coordinates: [closed] },
    };
    // d3-geo check: drawn with geoIdentity (y flipped, as for y-up coordinates) the region must
    // take only a small share of the plane, never its complement.
    const path = geoPath(geoIdentity().reflectY(true));
    const share = path.area(feature) / plane;
    if (!(share > 0.01 && share < 0.4)) throw new Error(`region ${region.id} covers ${share} of the plane`);
    return feature;
  });
  return { type: 'FeatureCollection', features };
}

const here = dirname(fileURLToPath(import.meta.url));
const outDir = join(here, '..', 'items', 'maps');
mkdirSync(outDir, { recursive: true });
for (const plan of plans) {
  const map = buildMap(plan);
  writeFileSync(join(outDir, plan.file), `${JSON.stringify(map)}\n`);
  console.log(`wrote items/maps/${plan.file}`);
}
