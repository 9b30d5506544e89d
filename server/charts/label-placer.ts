/**
 * Greedy placement of labels beside point-like marks (scatter points, bubbles, map symbols and
 * region names): each label tries candidate positions around its anchor and takes the cheapest
 * one that stays inside the bounds and clear of every text already placed.
 */
import type { Rect } from './axis.js';
import { estimateTextWidth } from './text-metrics.js';

/** One label to place next to the mark at (x, y). */
export interface LabelRequest {
  readonly text: string;
  readonly x: number;
  readonly y: number;
  /** Radius of the mark the label belongs to (0 for a bare point such as a region centre). */
  readonly markRadius: number;
  readonly size: number;
  readonly bold?: boolean;
  /** Try the label centred on (x, y) first (region names on regions without a symbol). */
  readonly centred?: boolean;
  /** Where the label should preferably sit (e.g. inside its own region); a box point outside costs. */
  readonly prefer?: (x: number, y: number) => boolean;
}

/** A round mark a label should not cover; `weight` is the cost of covering all of it. */
export interface MarkObstacle {
  readonly x: number;
  readonly y: number;
  readonly r: number;
  readonly weight: number;
}

export interface LabelPlacement {
  /** Text position for `canvas.text` with `align: 'middle'` and this `anchor`. */
  readonly x: number;
  readonly y: number;
  readonly anchor: 'start' | 'middle' | 'end';
  /** The label's estimated box. */
  readonly box: Rect;
  /** A leader line from the mark's edge to the label, when the label sits away from its mark. */
  readonly leader?: { readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number };
  /** False when no candidate was clear of other labels (the label sits at its first choice). */
  readonly clear: boolean;
}

export interface PlaceLabelsOptions {
  /** Every label box must lie inside this rectangle. */
  readonly bounds: Rect;
  /** Boxes of texts drawn before (ticks, titles, legends); placed labels are added as they go. */
  readonly fixed?: readonly Rect[];
  /** Marks to keep clear of where possible. */
  readonly marks?: readonly MarkObstacle[];
  /** Free space kept between two label boxes, default 2 units. */
  readonly padding?: number;
  /** Gap between a mark's edge and its label, default 4 units. */
  readonly gap?: number;
  /** Rings of leader-line positions tried beyond the adjacent ones, default 4. */
  readonly rings?: number;
}

/** Adjacent positions in order of preference: right, left, above, below, then the diagonals. */
const adjacentAngles = [0, 180, 270, 90, 315, 225, 45, 135];
/** Directions for the leader-line rings, every 22.5 degrees starting to the right. */
const ringAngles = Array.from({ length: 16 }, (_, index) => index * 22.5);
/** Cost of moving one ring out (covering a whole mark costs its weight, e.g. 300). */
const ringCost = 60;
/** Cost of an adjacent label that sits as near another mark as its own (which mark does it name?). */
const ambiguityCost = 90;
/** Cost of a label sitting fully outside its preferred area. */
const outsideCost = 400;

/**
 * Places labels greedily in the order given. Each label tries, in order, a centred position (when
 * asked), the eight positions adjacent to its mark (right, left, above, below, diagonals), then
 * rings of 16 positions further out joined to the mark by a leader line. A candidate is allowed
 * only inside `bounds` and clear (by `padding`) of the fixed boxes and the labels placed before;
 * among allowed candidates the one with the least cost wins (covered mark area x weight, the
 * share of the box outside `prefer`, 60 per ring), ties going to the earlier candidate. So the
 * result is deterministic. A label with no allowed candidate keeps its first choice and is
 * flagged `clear: false` (the bank's overlap lint then reports it).
 *
 * Greedy candidate-position labelling: see Christensen, Marks and Shieber (1995), "An empirical
 * study of algorithms for point-feature label placement", ACM Transactions on Graphics 14(3)
 * (the 8-position model and the greedy baseline).
 *
 * @param requests labels in placement order (earlier labels get the better positions)
 * @param options bounds, fixed boxes, marks to avoid, padding, gap, rings
 * @returns one placement per request, in the same order
 * @example
 * placeLabels([{ text: 'A', x: 50, y: 50, markRadius: 5, size: 16 }],
 *   { bounds: { x: 0, y: 0, width: 100, height: 100 } })[0]; // { x: 59, y: 50, anchor: 'start', ... }
 */
export function placeLabels(
  requests: readonly LabelRequest[],
  options: PlaceLabelsOptions,
): LabelPlacement[] {
  const padding = options.padding ?? 2;
  const gap = options.gap ?? 4;
  const rings = options.rings ?? 4;
  const taken: Rect[] = [...(options.fixed ?? [])];
  const marks = options.marks ?? [];
  return requests.map((request) => {
    const width = estimateTextWidth(request.text, request.size, request.bold ?? false);
    const candidates = candidatePositions(request, width, gap, rings);
    let best: { placement: LabelPlacement; cost: number } | undefined;
    for (const candidate of candidates) {
      if (!inside(candidate.box, options.bounds)) continue;
      if (taken.some((box) => overlaps(box, candidate.box, padding))) continue;
      const cost =
        candidate.ring * ringCost +
        marks.reduce(
          (sum, mark) => (isOwnMark(request, mark) ? sum : sum + markCost(request, candidate, mark)),
          0,
        ) +
        (request.prefer === undefined ? 0 : outsideShare(candidate.box, request.prefer) * outsideCost);
      if (best === undefined || cost < best.cost) best = { placement: candidate, cost };
      if (cost === 0) break;
    }
    const placement = best?.placement ?? { ...candidates[0]!, clear: false };
    taken.push(placement.box);
    return placement;
  });
}

interface Candidate extends LabelPlacement {
  readonly ring: number;
}

function candidatePositions(request: LabelRequest, width: number, gap: number, rings: number): Candidate[] {
  const candidates: Candidate[] = [];
  if (request.centred === true) candidates.push(atAngle(request, width, 0, 0, -1));
  const adjacent = request.markRadius + gap;
  for (const angle of adjacentAngles) candidates.push(atAngle(request, width, angle, adjacent, 0));
  for (let ring = 1; ring <= rings; ring += 1) {
    const distance = adjacent + ring * request.size;
    for (const angle of ringAngles) candidates.push(atAngle(request, width, angle, distance, ring));
  }
  return candidates;
}

/**
 * The label whose nearest side (or corner) sits `distance` from the anchor in direction `degrees`
 * (0 = right, 90 = down). Ring -1 is the centred position.
 */
function atAngle(
  request: LabelRequest,
  width: number,
  degrees: number,
  distance: number,
  ring: number,
): Candidate {
  const radians = (degrees * Math.PI) / 180;
  const cos = Math.cos(radians);
  const sin = Math.sin(radians);
  const px = request.x + distance * cos;
  const py = request.y + distance * sin;
  const height = request.size;
  const centred = distance === 0;
  const anchor: LabelPlacement['anchor'] = centred
    ? 'middle'
    : cos > 0.38
      ? 'start'
      : cos < -0.38
        ? 'end'
        : 'middle';
  const y = centred ? py : sin > 0.38 ? py + height / 2 : sin < -0.38 ? py - height / 2 : py;
  const left = anchor === 'start' ? px : anchor === 'end' ? px - width : px - width / 2;
  const box = { x: left, y: y - height / 2, width, height };
  const leader =
    ring >= 1
      ? {
          x1: request.x + request.markRadius * cos,
          y1: request.y + request.markRadius * sin,
          x2: px,
          y2: py,
        }
      : undefined;
  return {
    x: px,
    y,
    anchor,
    box,
    ring: Math.max(ring, 0),
    clear: true,
    ...(leader === undefined ? {} : { leader }),
  };
}

function inside(box: Rect, bounds: Rect): boolean {
  return (
    box.x >= bounds.x &&
    box.y >= bounds.y &&
    box.x + box.width <= bounds.x + bounds.width &&
    box.y + box.height <= bounds.y + bounds.height
  );
}

function overlaps(a: Rect, b: Rect, padding: number): boolean {
  return (
    a.x < b.x + b.width + padding &&
    b.x < a.x + a.width + padding &&
    a.y < b.y + b.height + padding &&
    b.y < a.y + a.height + padding
  );
}

function isOwnMark(request: LabelRequest, mark: MarkObstacle): boolean {
  return mark.x === request.x && mark.y === request.y && mark.r === request.markRadius;
}

/**
 * Cost of a candidate with respect to another mark: the share of the mark's bounding square the
 * box covers, times the mark's weight; and, for a label without a leader line, `ambiguityCost` when
 * the box is as close to that mark's edge as to its own mark's edge (plus 2 units).
 */
function markCost(request: LabelRequest, candidate: Candidate, mark: MarkObstacle): number {
  const box = candidate.box;
  const w = Math.min(box.x + box.width, mark.x + mark.r) - Math.max(box.x, mark.x - mark.r);
  const h = Math.min(box.y + box.height, mark.y + mark.r) - Math.max(box.y, mark.y - mark.r);
  const side = Math.max(2 * mark.r, 1);
  const covered = w > 0 && h > 0 ? (w * h) / (side * side) : 0;
  let cost = covered * mark.weight;
  if (candidate.leader === undefined) {
    const own = Math.max(boxDistance(box, request.x, request.y) - request.markRadius, 0);
    const other = Math.max(boxDistance(box, mark.x, mark.y) - mark.r, 0);
    if (other <= own + 2) cost += ambiguityCost;
  }
  return cost;
}

/** Distance from a point to the nearest point of a box (0 inside). */
function boxDistance(box: Rect, x: number, y: number): number {
  const dx = Math.max(box.x - x, 0, x - (box.x + box.width));
  const dy = Math.max(box.y - y, 0, y - (box.y + box.height));
  return Math.hypot(dx, dy);
}

/** Share of the box's corners and centre that lie outside the preferred area (0 to 1). */
function outsideShare(box: Rect, prefer: (x: number, y: number) => boolean): number {
  const points = [
    [box.x, box.y],
    [box.x + box.width, box.y],
    [box.x, box.y + box.height],
    [box.x + box.width, box.y + box.height],
    [box.x + box.width / 2, box.y + box.height / 2],
  ] as const;
  return points.filter(([x, y]) => !prefer(x, y)).length / points.length;
}
