// Where a closed outline crosses itself, found by a sweep line in O((n + k) log n) for n edges and
// k reported crossings (Shamos–Hoey, continued past each find): events sorted once, the edges under
// the sweep kept in a splay tree (splaytree), orientation signs computed exactly (robust-predicates).
// Only neighbours in the sweep order are tested, so a 40,000-point outline is checked in milliseconds
// and a badly crossed one stops after `limit` finds instead of listing millions of pairs.
import SplayTree from "splaytree";
import { orient2d } from "robust-predicates";
import type { Point } from "./geometry";

/** A pair of outline edges that cross, touch or overlap. */
export interface EdgeCrossing {
  /** Lower edge index (edge i runs from vertex i to vertex i + 1). */
  edgeA: number;
  /** Higher edge index. */
  edgeB: number;
  /** A point where they meet. */
  point: Point;
}

/** Result of {@link findCrossings}. */
export interface CrossingSearch {
  crossings: EdgeCrossing[];
  /** True when the search stopped at the limit, so there may be more. */
  truncated: boolean;
}

interface Segment {
  /** Edge index in the outline. */
  edge: number;
  /** Left (lexicographically smaller) and right end. */
  l: Point;
  r: Point;
  removed: boolean;
}

/** Sign of the turn a → b → c: positive counter-clockwise (c left of ab), exact. */
function orient(a: Point, b: Point, c: Point): number {
  // robust-predicates answers positive for clockwise; flip so positive means counter-clockwise.
  return -orient2d(a[0], a[1], b[0], b[1], c[0], c[1]);
}

const before = (p: Point, q: Point) => p[0] < q[0] || (p[0] === q[0] && p[1] < q[1]);
const same = (p: Point, q: Point) => p[0] === q[0] && p[1] === q[1];

/**
 * Order of two segments both under the sweep line (bottom to top), valid while they do not cross;
 * ties between collinear segments fall back to their left ends, then to the edge index.
 */
function compareSegments(a: Segment, b: Segment): number {
  if (a === b) return 0;
  const o1 = orient(a.l, a.r, b.l);
  const o2 = orient(a.l, a.r, b.r);
  if (o1 !== 0 || o2 !== 0) {
    if (same(a.l, b.l)) return o2 > 0 ? -1 : 1;
    if (a.l[0] === b.l[0]) return a.l[1] < b.l[1] ? -1 : 1;
    // Compare at the later of the two left ends: whichever started later is placed against the other.
    if (before(a.l, b.l)) return o1 > 0 ? -1 : 1;
    return orient(b.l, b.r, a.l) > 0 ? 1 : -1;
  }
  if (!same(a.l, b.l)) return before(a.l, b.l) ? -1 : 1;
  if (!same(a.r, b.r)) return before(a.r, b.r) ? -1 : 1;
  return a.edge - b.edge;
}

function onSegment(a: Point, b: Point, p: Point): boolean {
  return Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
}

/** Where segments ab and cd meet (touching and overlap count), or null. */
function meet(a: Point, b: Point, c: Point, d: Point): Point | null {
  const d1 = orient(c, d, a);
  const d2 = orient(c, d, b);
  const d3 = orient(a, b, c);
  const d4 = orient(a, b, d);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    const t = d1 / (d1 - d2);
    return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
  }
  if (d1 === 0 && onSegment(c, d, a)) return a;
  if (d2 === 0 && onSegment(c, d, b)) return b;
  if (d3 === 0 && onSegment(a, b, c)) return c;
  if (d4 === 0 && onSegment(a, b, d)) return d;
  return null;
}

/**
 * Finds where a closed outline crosses, touches or folds back over itself. Neighbouring edges may share
 * their common vertex; anything more is reported. Consecutive repeated points are skipped (a zero-length
 * edge is a separate fault).
 * @param limit stop after this many crossings (default 20)
 */
export function findCrossings(points: readonly Point[], limit = 20): CrossingSearch {
  // Drop consecutive duplicates, remembering each kept vertex's original index.
  const pts: Point[] = [];
  const orig: number[] = [];
  points.forEach((p, i) => {
    if (pts.length && same(pts[pts.length - 1], p)) return;
    pts.push(p);
    orig.push(i);
  });
  while (pts.length > 1 && same(pts[0], pts[pts.length - 1])) {
    pts.pop();
    orig.pop();
  }
  const n = pts.length;
  const crossings: EdgeCrossing[] = [];
  if (n < 3) return { crossings, truncated: false };

  const segs: Segment[] = pts.map((p, i) => {
    const q = pts[(i + 1) % n];
    return before(p, q) ? { edge: i, l: p, r: q, removed: false } : { edge: i, l: q, r: p, removed: false };
  });
  // Events: each segment's left end (start) and right end (end). At one point starts come first, so
  // segments that only touch there are under the sweep together and get compared.
  const events: Array<{ at: Point; seg: Segment; start: boolean }> = [];
  for (const s of segs) events.push({ at: s.l, seg: s, start: true }, { at: s.r, seg: s, start: false });
  events.sort((x, y) => x.at[0] - y.at[0] || x.at[1] - y.at[1] || (x.start === y.start ? 0 : x.start ? -1 : 1));

  const adjacent = (a: Segment, b: Segment) => Math.abs(a.edge - b.edge) === 1 || Math.abs(a.edge - b.edge) === n - 1;
  const tree = new SplayTree<Segment, null>(compareSegments);
  let truncated = false;

  /** Tests two segments; on a crossing records it and takes `drop` out of the sweep. */
  const test = (a: Segment | null | undefined, b: Segment | null | undefined): Segment | null => {
    if (!a || !b || a.removed || b.removed) return null;
    const hit = meet(a.l, a.r, b.l, b.r);
    if (!hit) return null;
    if (adjacent(a, b)) {
      // Neighbours share a vertex; they are faulty only when they fold back along each other.
      const [first, second] = (a.edge + 1) % n === b.edge ? [a, b] : [b, a];
      const shared = pts[second.edge];
      const p = pts[first.edge];
      const q = pts[(second.edge + 1) % n];
      const foldsBack = orient(p, shared, q) === 0 && (q[0] - shared[0]) * (p[0] - shared[0]) + (q[1] - shared[1]) * (p[1] - shared[1]) > 0;
      if (!foldsBack) return null;
      record(a, b, shared);
    } else record(a, b, hit);
    // Continue without the later edge: the sweep order of the rest stays valid (Shamos–Hoey finds
    // the leftmost crossing first, so no crossing lies behind the sweep line).
    return a.edge > b.edge ? a : b;
  };
  const record = (a: Segment, b: Segment, point: Point) => {
    const [ea, eb] = [orig[a.edge], orig[b.edge]].sort((x, y) => x - y);
    crossings.push({ edgeA: ea, edgeB: eb, point: [point[0], point[1]] });
  };
  const drop = (s: Segment) => {
    const node = tree.find(s);
    if (!node) return;
    const below = tree.prev(node)?.key;
    const above = tree.next(node)?.key;
    tree.remove(s);
    s.removed = true;
    check(below, above);
  };
  const check = (a: Segment | null | undefined, b: Segment | null | undefined) => {
    if (crossings.length >= limit) return;
    const out = test(a, b);
    if (out) drop(out);
  };

  for (const ev of events) {
    if (crossings.length >= limit) {
      truncated = true;
      break;
    }
    const s = ev.seg;
    if (s.removed) continue;
    if (ev.start) {
      const node = tree.insert(s);
      const below = tree.prev(node)?.key;
      const above = tree.next(node)?.key;
      check(s, below);
      if (!s.removed) check(s, above);
    } else {
      const node = tree.find(s);
      if (!node) continue;
      const below = tree.prev(node)?.key;
      const above = tree.next(node)?.key;
      tree.remove(s);
      s.removed = true;
      check(below, above);
    }
  }
  crossings.sort((x, y) => x.edgeA - y.edgeA || x.edgeB - y.edgeB);
  return { crossings, truncated: truncated || crossings.length >= limit };
}
