// True-shape nesting of pattern pieces onto a strip of fabric (a marker), bottom-left fill.
//
// Marker frame: x runs along the fabric length (the warp, parallel to the selvages), y across the usable
// width, 0 ≤ y ≤ usable width; the marker starts at x = 0 and its length is the largest x used.
//
// Grain: every copy is first turned so its grainline points along +x (a piece without a grainline is
// taken to be drafted with its grain along its own y axis, the usual drafting habit). "straight" pieces
// may then lie at 0° or 180° only; "bias" and "free" pieces may also lie at 90° or 270° (cross-grain),
// because their drawn grainline does not need to follow the warp.
// Mirrored pairs: copies 0, 2, 4… are cut as drafted and copies 1, 3, 5… as the mirror image (x → −x).
//
// Method: pieces go longest side first (a local search may then change the order and orientations,
// see nestPieces). For each copy and each allowed orientation, the feasible places
// are the inner-fit rectangle of the strip minus the no-fit polygons (NFP) of the pieces already placed,
// NFP(A, B) = A ⊕ (−B) built from convex parts on integers and united with clipper-lib; the left-most (then lowest) feasible vertex
// wins, and the orientation whose right edge ends furthest left is kept. To keep exact touching fits
// (a slot exactly as wide as a piece), NFPs are built from the piece shrunk by a few micrometres and the
// strip is widened by as much; candidates are then snapped to a 0.01 mm grid, on which all piece
// vertices lie, and accepted only after an exact clipper intersection test against their neighbours.
// If no candidate passes, the copy goes right of everything placed, so the result never overlaps.
import {
  boundingBox,
  mirrorPoints,
  polygonArea,
  rotatePoints,
  signedArea,
  type GrainMode,
  type PanelShape,
  type Point,
  type Polygon,
} from "./geometry";
import earcut from "earcut";
import { CLIPPER_SCALE, ClipperLib, cutLineFromSewLine, type IntPath, type IntPoint } from "./offset";

/** One pattern piece to lay, with its cutting outline. */
export interface NestPiece {
  /** Panel id. */
  id: string;
  /** Display name for the marker drawing. */
  name?: string;
  /** The outline to lay (the cut line), mm, y up. */
  outline: Polygon;
  /** Grainline (two points); the piece is turned so it runs along the marker length. */
  grainline?: readonly [Point, Point] | null;
  /** Number of copies to cut. */
  cutCount: number;
  /** Every second copy is mirrored (cut in pairs). */
  mirrored?: boolean;
  /** Rotation freedom; default "straight" (0°/180°). */
  grainMode?: GrainMode;
}

/** Options for {@link nestPieces}. */
export interface NestOptions {
  /** Usable fabric width (cloth width less selvages), mm. */
  usableWidthMm: number;
  /** Called after each copy of the first (constructive) layout is placed: done copies, total copies. */
  onProgress?: (done: number, total: number) => void;
  /** Local search after the first layout; none when omitted. */
  search?: NestSearchOptions;
}

/** Budget and seed of the local search. */
export interface NestSearchOptions {
  /** Seed of the move generator; default 1. */
  seed?: number;
  /** Stop after this many layouts (the first, constructive one included). */
  maxEvaluations?: number;
  /** Stop after this many milliseconds. */
  timeBudgetMs?: number;
  /** Clock for the time budget, ms; default Date.now. */
  now?: () => number;
  /** Called every few layouts and at the end. */
  onProgress?: (p: NestSearchProgress) => void;
}

/** One placed copy of a piece. */
export interface Placement {
  pieceId: string;
  name: string;
  /** Copy number, 0-based. */
  copy: number;
  /** True when this copy is the mirror image (x → −x applied first). */
  mirrored: boolean;
  /** Counter-clockwise rotation applied after mirroring, degrees in [0, 360). */
  rotationDeg: number;
  /** Translation applied after rotation, mm. */
  offset: Point;
  /** The placed outline in marker coordinates, mm (vertices on a 0.01 mm grid). */
  polygon: Point[];
}

/** A copy that could not be laid. */
export interface UnplacedCopy {
  pieceId: string;
  copy: number;
  reason: string;
}

/** Result of {@link nestPieces}. */
export interface NestResult {
  usableWidthMm: number;
  /** Marker length: the largest x reached by any piece, mm. */
  markerLengthMm: number;
  /** Area of the placed pieces, mm². */
  pieceAreaMm2: number;
  /** Marker efficiency = piece area / (marker length × usable width), 0..1 (marker making, common practice, no source). */
  efficiency: number;
  /** Lower bound on the marker length: total area of all copies / usable width, mm (marker making, common practice, no source). */
  lowerBoundMm: number;
  placements: Placement[];
  unplaced: UnplacedCopy[];
}

const S = CLIPPER_SCALE;
/** Grid for piece vertices and positions, clipper units (10 µm). */
const GRID = 10;
/** Shrink of pieces for NFPs and widening of the strip, clipper units; well under GRID / 2 with the miter limit below. */
const EPS = 2;
/** How many candidate places to test exactly before falling back to the right-hand end. */
const MAX_CANDIDATES = 60;

interface Orientation {
  key: string;
  mirrored: boolean;
  rotationDeg: number;
  /** Shape on the grid with its bounding box's lower-left corner at (0, 0). */
  path: IntPath;
  /** Convex parts of the shape, for NFPs where this shape stays put. */
  parts: IntPath[];
  /** Convex parts of the shape shrunk by EPS, for NFPs where this shape moves. */
  shrunkParts: IntPath[];
  /** Grid shift subtracted to normalise: path = round(rotated) − shift. */
  shift: IntPoint;
  width: number;
  height: number;
}

interface Placed {
  orient: Orientation;
  t: IntPoint;
  path: IntPath;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  /** This piece's NFPs against each moving orientation, already translated to where it lies. */
  clips: Map<string, IntPath[]>;
}

const snap = (v: number) => Math.round(v / GRID) * GRID;

function normDeg(d: number): number {
  const r = ((d % 360) + 360) % 360;
  const q = Math.round(r / 90) * 90;
  // Snap rotations that are multiples of 90° up to float noise, so rotatePoints takes its exact branch.
  return Math.abs(r - q) < 1e-7 ? q % 360 : r;
}

function buildOrientation(piece: NestPiece, mirrored: boolean, step: number): Orientation {
  const outline = mirrored ? mirrorPoints(piece.outline) : [...piece.outline];
  let align = -90;
  if (piece.grainline) {
    const g = mirrored ? mirrorPoints(piece.grainline) : piece.grainline;
    const dx = g[1][0] - g[0][0];
    const dy = g[1][1] - g[0][1];
    if (dx !== 0 || dy !== 0) align = (-Math.atan2(dy, dx) * 180) / Math.PI;
  }
  const rotationDeg = normDeg(align + step);
  let rotated = rotatePoints(outline, rotationDeg);
  if (signedArea(rotated) < 0) rotated = rotated.reverse();
  const raw = rotated.map(([x, y]) => ({ X: snap(x * S), Y: snap(y * S) }));
  const minX = Math.min(...raw.map((p) => p.X));
  const minY = Math.min(...raw.map((p) => p.Y));
  const path = ClipperLib.Clipper.CleanPolygons([raw.map((p) => ({ X: p.X - minX, Y: p.Y - minY }))], 0.5)[0];
  const co = new ClipperLib.ClipperOffset(1.5, 0.25);
  co.AddPath(path, ClipperLib.JoinType.jtMiter, ClipperLib.EndType.etClosedPolygon);
  const shrunkAll: IntPath[] = [];
  co.Execute(shrunkAll, -EPS);
  // A sliver narrower than 2·EPS could vanish; then the unshrunk shape is the safe choice.
  const shrunk = shrunkAll.length === 1 ? shrunkAll[0] : path;
  const maxX = Math.max(...path.map((p) => p.X));
  const maxY = Math.max(...path.map((p) => p.Y));
  return {
    key: `${piece.id}|${mirrored ? "m" : "n"}|${step}`,
    mirrored,
    rotationDeg,
    path,
    parts: convexParts(path),
    shrunkParts: convexParts(shrunk),
    shift: { X: minX, Y: minY },
    width: maxX,
    height: maxY,
  };
}

function translate(path: IntPath, t: IntPoint): IntPath {
  return path.map((p) => ({ X: p.X + t.X, Y: p.Y + t.Y }));
}

function cross(o: IntPoint, a: IntPoint, b: IntPoint): number {
  return (a.X - o.X) * (b.Y - o.Y) - (a.Y - o.Y) * (b.X - o.X);
}

function isConvex(path: IntPath): boolean {
  const n = path.length;
  for (let i = 0; i < n; i++) if (cross(path[i], path[(i + 1) % n], path[(i + 2) % n]) < 0) return false;
  return true;
}

/** Convex hull (counter-clockwise, Andrew's monotone chain); exact on integer points. */
function convexHull(points: IntPoint[]): IntPath {
  const pts = [...points].sort((a, b) => a.X - b.X || a.Y - b.Y);
  if (pts.length < 3) return pts;
  const lower: IntPoint[] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: IntPoint[] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/**
 * Splits a counter-clockwise simple polygon into convex parts: ear-cut triangles merged across
 * diagonals while the union stays convex (Hertel–Mehlhorn). The parts tile the polygon exactly.
 */
function convexParts(path: IntPath): IntPath[] {
  if (isConvex(path)) return [path];
  const tris = earcut(path.flatMap((p) => [p.X, p.Y]));
  let parts: number[][] = [];
  for (let i = 0; i < tris.length; i += 3) {
    const t = [tris[i], tris[i + 1], tris[i + 2]];
    if (cross(path[t[0]], path[t[1]], path[t[2]]) < 0) t.reverse();
    parts.push(t);
  }
  const convexIdx = (idx: number[]) => isConvex(idx.map((k) => path[k]));
  let merged = true;
  while (merged) {
    merged = false;
    outer: for (let i = 0; i < parts.length; i++) {
      for (let j = i + 1; j < parts.length; j++) {
        const a = parts[i];
        const b = parts[j];
        // A shared diagonal appears as (u, v) in one part and (v, u) in the other.
        for (let ai = 0; ai < a.length; ai++) {
          const u = a[ai];
          const v = a[(ai + 1) % a.length];
          const bi = b.indexOf(v);
          if (bi < 0 || b[(bi + 1) % b.length] !== u) continue;
          const joined = [...a.slice(0, ai + 1)];
          for (let k = 2; k < b.length; k++) joined.push(b[(bi + k) % b.length]);
          joined.push(...a.slice(ai + 1));
          if (!convexIdx(joined)) continue;
          parts[i] = joined;
          parts = parts.filter((_, k) => k !== j);
          merged = true;
          break outer;
        }
      }
    }
  }
  return parts.map((idx) => idx.map((k) => path[k]));
}

/**
 * NFP of fixed shape A (at the origin) and moving shape B: the positions of B's origin where B
 * overlaps A. A ⊕ (−B) is the union over convex parts of A_i ⊕ (−B_j), and the Minkowski sum of two
 * convex polygons is the convex hull of their vertex sums, so every vertex stays an exact integer.
 */
function noFitPolygon(aParts: IntPath[], bParts: IntPath[]): IntPath[] {
  const hulls: IntPath[] = [];
  for (const a of aParts) {
    for (const b of bParts) {
      const sums: IntPoint[] = [];
      for (const p of a) for (const q of b) sums.push({ X: p.X - q.X, Y: p.Y - q.Y });
      hulls.push(convexHull(sums));
    }
  }
  if (hulls.length === 1) return hulls;
  const c = new ClipperLib.Clipper();
  c.AddPaths(hulls, ClipperLib.PolyType.ptSubject, true);
  const out: IntPath[] = [];
  c.Execute(ClipperLib.ClipType.ctUnion, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return out;
}

function overlapArea(a: IntPath, b: IntPath): number {
  const c = new ClipperLib.Clipper();
  c.AddPath(a, ClipperLib.PolyType.ptSubject, true);
  c.AddPath(b, ClipperLib.PolyType.ptClip, true);
  const out: IntPath[] = [];
  c.Execute(ClipperLib.ClipType.ctIntersection, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return out.reduce((s, p) => s + Math.abs(ClipperLib.Clipper.Area(p)), 0);
}

function fitsWithoutOverlap(o: Orientation, t: IntPoint, placed: Placed[]): boolean {
  const minX = t.X;
  const minY = t.Y;
  const maxX = t.X + o.width;
  const maxY = t.Y + o.height;
  let moved: IntPath | null = null;
  for (const p of placed) {
    if (p.maxX <= minX || p.minX >= maxX || p.maxY <= minY || p.minY >= maxY) continue;
    moved ??= translate(o.path, t);
    // Touching pieces meet on shared grid edges and give zero area; anything above half a grid cell is overlap.
    if (overlapArea(moved, p.path) > (GRID * GRID) / 2) return false;
  }
  return true;
}

/** Best place for one orientation: its translation, or the right-hand fallback. */
function placeOrientation(
  o: Orientation,
  placed: Placed[],
  widthUnits: number,
  rightEdge: number,
  nfpCache: Map<string, IntPath[]>,
): IntPoint {
  const tyMax = widthUnits - o.height;
  if (placed.length === 0) return { X: 0, Y: 0 };
  const fallback = { X: rightEdge, Y: 0 };
  const clips: IntPath[] = [];
  for (const p of placed) {
    let moved = p.clips.get(o.key);
    if (!moved) {
      const key = `${p.orient.key}>${o.key}`;
      let nfp = nfpCache.get(key);
      if (!nfp) {
        nfp = noFitPolygon(p.orient.parts, o.shrunkParts);
        nfpCache.set(key, nfp);
      }
      moved = nfp.map((part) => translate(part, p.t));
      p.clips.set(o.key, moved);
    }
    for (const part of moved) clips.push(part);
  }
  const ifr: IntPath = [
    { X: -EPS, Y: -EPS },
    { X: rightEdge + EPS, Y: -EPS },
    { X: rightEdge + EPS, Y: tyMax + EPS },
    { X: -EPS, Y: tyMax + EPS },
  ];
  const c = new ClipperLib.Clipper();
  c.AddPath(ifr, ClipperLib.PolyType.ptSubject, true);
  c.AddPaths(clips, ClipperLib.PolyType.ptClip, true);
  const free: IntPath[] = [];
  c.Execute(ClipperLib.ClipType.ctDifference, free, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  const seen = new Set<string>();
  const candidates: IntPoint[] = [];
  for (const path of free) {
    for (const v of path) {
      const X = Math.max(0, Math.min(rightEdge, snap(v.X)));
      const Y = Math.max(0, Math.min(tyMax, snap(v.Y)));
      const k = `${X},${Y}`;
      if (seen.has(k)) continue;
      seen.add(k);
      candidates.push({ X, Y });
    }
  }
  candidates.sort((p, q) => p.X - q.X || p.Y - q.Y);
  for (const cand of candidates.slice(0, MAX_CANDIDATES)) {
    if (cand.X >= rightEdge) break;
    if (fitsWithoutOverlap(o, cand, placed)) return cand;
  }
  return fallback;
}

/** Expands pieces into copies, longest bounding-box side first (stable by input order). */
function copiesOf(pieces: readonly NestPiece[]): { piece: NestPiece; copy: number; area: number; order: number }[] {
  const list: { piece: NestPiece; copy: number; area: number; order: number }[] = [];
  pieces.forEach((piece, order) => {
    const area = polygonArea(piece.outline);
    for (let copy = 0; copy < piece.cutCount; copy++) list.push({ piece, copy, area, order });
  });
  // Longest side first (of the grain-aligned bounding box): long pieces, a bias strip lying at 45°
  // included, then shape the marker and small ones fill in; it starts far better than largest area first.
  const key = (c: { piece: NestPiece }) => {
    const o = buildOrientation(c.piece, false, 0);
    return Math.max(o.width, o.height);
  };
  return list.map((c) => ({ ...c, k: key(c) })).sort((a, b) => b.k - a.k || a.order - b.order || a.copy - b.copy);
}

/** Everything a layout needs that does not change between layouts: copies, orientations and the NFP cache. */
interface NestContext {
  W: number;
  widthUnits: number;
  copies: { piece: NestPiece; copy: number; area: number; order: number; mirrored: boolean; steps: number[] }[];
  orientCache: Map<string, Orientation>;
  nfpCache: Map<string, IntPath[]>;
}

function nestContext(pieces: readonly NestPiece[], W: number): NestContext {
  return {
    W,
    widthUnits: Math.floor((W * S) / GRID) * GRID,
    copies: copiesOf(pieces).map((c) => ({
      ...c,
      mirrored: Boolean(c.piece.mirrored) && c.copy % 2 === 1,
      steps: (c.piece.grainMode ?? "straight") === "straight" ? [0, 180] : [0, 90, 180, 270],
    })),
    orientCache: new Map(),
    nfpCache: new Map(),
  };
}

function orientationOf(ctx: NestContext, piece: NestPiece, mirrored: boolean, step: number): Orientation {
  const key = `${piece.id}|${mirrored ? "m" : "n"}|${step}`;
  let o = ctx.orientCache.get(key);
  if (!o) {
    o = buildOrientation(piece, mirrored, step);
    ctx.orientCache.set(key, o);
  }
  return o;
}

/** One layout: the copies in `order`, each in its fixed orientation step or (null) the best allowed one. */
interface Layout {
  order: number[];
  steps: (number | null)[];
  placed: Placed[];
  /** Copy index (into ctx.copies) of each placed entry. */
  placedCopy: number[];
  unplaced: number[];
  /** Marker length, clipper units. */
  length: number;
  /** Sum of the placed pieces' right edges: smaller means packed further left (tie-breaker). */
  compaction: number;
  /** State after the first k copies of the order, so a later layout sharing that prefix resumes there. */
  after: { placed: number; unplaced: number; rightEdge: number; compaction: number }[];
}

/** Length of the common prefix of two layouts' orders (with equal orientation choices). */
function sharedPrefix(a: Layout, order: readonly number[], steps: readonly (number | null)[]): number {
  let k = 0;
  while (k < order.length && a.order[k] === order[k] && a.steps[order[k]] === steps[order[k]]) k++;
  return k;
}

/**
 * Bottom-left fill of the copies in the given order, resuming after the part it shares with `from`.
 * Stops early (returning null) once the marker grows past `abortAbove` units, since such a layout
 * cannot beat the best one known.
 */
function layOut(
  ctx: NestContext,
  order: readonly number[],
  steps: readonly (number | null)[],
  options: { from?: Layout; abortAbove?: number; onPlaced?: (done: number) => void } = {},
): Layout | null {
  const abortAbove = options.abortAbove ?? Infinity;
  const k0 = options.from ? sharedPrefix(options.from, order, steps) : 0;
  const snap0 = k0 > 0 ? options.from!.after[k0 - 1] : { placed: 0, unplaced: 0, rightEdge: 0, compaction: 0 };
  const placed: Placed[] = k0 > 0 ? options.from!.placed.slice(0, snap0.placed) : [];
  const placedCopy: number[] = k0 > 0 ? options.from!.placedCopy.slice(0, snap0.placed) : [];
  const unplaced: number[] = k0 > 0 ? options.from!.unplaced.slice(0, snap0.unplaced) : [];
  const after = k0 > 0 ? options.from!.after.slice(0, k0) : [];
  let rightEdge = snap0.rightEdge;
  let compaction = snap0.compaction;
  for (let k = k0; k < order.length; k++) {
    const ci = order[k];
    const { piece, mirrored } = ctx.copies[ci];
    const fixed = steps[ci];
    let best: { o: Orientation; t: IntPoint; score: [number, number, number] } | null = null;
    for (const step of fixed === null ? ctx.copies[ci].steps : [fixed]) {
      const o = orientationOf(ctx, piece, mirrored, step);
      if (o.height > ctx.widthUnits) continue;
      const t = placeOrientation(o, placed, ctx.widthUnits, rightEdge, ctx.nfpCache);
      // Prefer the orientation whose right edge stays furthest left, then the lowest, then the narrowest.
      const score: [number, number, number] = [t.X + o.width, t.Y, o.width];
      if (
        !best ||
        score[0] < best.score[0] ||
        (score[0] === best.score[0] && (score[1] < best.score[1] || (score[1] === best.score[1] && score[2] < best.score[2])))
      ) {
        best = { o, t, score };
      }
    }
    if (!best) unplaced.push(ci);
    else {
      const { o, t } = best;
      placed.push({
        orient: o,
        t,
        path: translate(o.path, t),
        minX: t.X,
        minY: t.Y,
        maxX: t.X + o.width,
        maxY: t.Y + o.height,
        clips: new Map(),
      });
      placedCopy.push(ci);
      rightEdge = Math.max(rightEdge, t.X + o.width);
      compaction += t.X + o.width;
      if (rightEdge > abortAbove) return null;
    }
    after.push({ placed: placed.length, unplaced: unplaced.length, rightEdge, compaction });
    options.onPlaced?.(k + 1);
  }
  return { order: [...order], steps: [...steps], placed, placedCopy, unplaced, length: rightEdge, compaction, after };
}

const better = (a: Layout, b: Layout) =>
  a.unplaced.length < b.unplaced.length ||
  (a.unplaced.length === b.unplaced.length && (a.length < b.length || (a.length === b.length && a.compaction < b.compaction)));

/** A small seeded generator (mulberry32), so a search repeats exactly for the same seed and budget. */
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

/** Progress of the local search. */
export interface NestSearchProgress {
  /** Layouts tried so far (the first is the constructive one). */
  evaluations: number;
  /** Marker length of the best layout so far, mm. */
  bestLengthMm: number;
  /** Share of the budget used, 0..1. */
  fraction: number;
}

function finish(ctx: NestContext, layout: Layout, lowerBoundMm: number): NestResult {
  const placements: Placement[] = layout.placed.map((p, i) => {
    const c = ctx.copies[layout.placedCopy[i]];
    const o = p.orient;
    return {
      pieceId: c.piece.id,
      name: c.piece.name ?? c.piece.id,
      copy: c.copy,
      mirrored: o.mirrored,
      rotationDeg: o.rotationDeg,
      offset: [(p.t.X - o.shift.X) / S, (p.t.Y - o.shift.Y) / S] as Point,
      polygon: p.path.map((q) => [q.X / S, q.Y / S] as Point),
    };
  });
  const unplaced: UnplacedCopy[] = layout.unplaced.map((ci) => ({
    pieceId: ctx.copies[ci].piece.id,
    copy: ctx.copies[ci].copy,
    reason: `wider than the usable width ${ctx.W} mm in every allowed orientation`,
  }));
  const W = ctx.W;
  const markerLengthMm = placements.length ? Math.max(...placements.map((p) => boundingBox(p.polygon).maxX)) : 0;
  const pieceAreaMm2 = placements.reduce((s, p) => s + polygonArea(p.polygon), 0);
  return {
    usableWidthMm: W,
    markerLengthMm,
    pieceAreaMm2,
    efficiency: markerLengthMm > 0 ? pieceAreaMm2 / (markerLengthMm * W) : 0,
    lowerBoundMm,
    placements,
    unplaced,
  };
}

/**
 * Lays all copies of the pieces on a strip of the given usable width by bottom-left fill with
 * no-fit polygons, then (when given a budget) improves the layout by local search; placed outlines
 * never overlap and stay within 0 ≤ y ≤ width.
 *
 * Local search: starting from the largest-first order with each copy in its best orientation, a move
 * swaps two copies in the order, moves one copy earlier, or fixes one copy's orientation (0°/180°,
 * and 90°/270° where the grain allows); a move is kept when the marker gets no longer (ties go to the
 * layout packed further left). NFPs are cached across layouts, and a layout is abandoned as soon as
 * it grows past the best one. With a fixed seed and `maxEvaluations` (and no time budget) the result
 * is the same on every run; a time budget makes it depend on the machine's speed.
 */
export function nestPieces(pieces: readonly NestPiece[], options: NestOptions): NestResult {
  const W = options.usableWidthMm;
  if (!(W > 0)) throw new Error("usable width must be positive");
  const ctx = nestContext(pieces, W);
  const total = ctx.copies.length;
  const lowerBoundMm = ctx.copies.reduce((s, c) => s + c.area, 0) / W;
  options.onProgress?.(0, total);
  const order = ctx.copies.map((_, i) => i);
  const steps: (number | null)[] = ctx.copies.map(() => null);
  let best = layOut(ctx, order, steps, { onPlaced: (done) => options.onProgress?.(done, total) })!;
  const maxEvaluations = options.search?.maxEvaluations ?? (options.search?.timeBudgetMs !== undefined ? Infinity : 0);
  const budgetMs = options.search?.timeBudgetMs ?? Infinity;
  const now = options.search?.now ?? (() => Date.now());
  const started = now();
  const random = seededRandom(options.search?.seed ?? 1);
  let evaluations = 1;
  const report = () =>
    options.search?.onProgress?.({
      evaluations,
      bestLengthMm: best.length / S,
      fraction: Math.min(
        1,
        Math.max(evaluations / Math.max(1, maxEvaluations), Number.isFinite(budgetMs) ? (now() - started) / budgetMs : 0),
      ),
    });
  if (total > 1) {
    while (evaluations < maxEvaluations && now() - started < budgetMs) {
      const o = [...best.order];
      const st = [...best.steps];
      const move = random();
      // Half the moves start from a copy near the marker's end: that is where the length is decided.
      const tail = best.placed
        .map((p, i) => [p.maxX, i] as const)
        .filter(([x]) => x >= best.length * 0.85)
        .map(([, i]) => o.indexOf(best.placedCopy[i]));
      const pickPos = () => (tail.length && random() < 0.5 ? tail[Math.floor(random() * tail.length)] : Math.floor(random() * total));
      if (move < 0.4) {
        // Swap two copies, mostly near each other in the order.
        const i = pickPos();
        const span = Math.max(1, Math.round(total * (random() < 0.7 ? 0.2 : 1)));
        const j = Math.min(total - 1, Math.max(0, i + Math.floor(random() * (2 * span + 1)) - span));
        if (i === j) continue;
        [o[i], o[j]] = [o[j], o[i]];
      } else if (move < 0.7) {
        // Move one copy earlier.
        const i = Math.max(1, pickPos());
        const j = Math.floor(random() * i);
        const [c] = o.splice(i, 1);
        o.splice(j, 0, c);
      } else {
        // Fix (or free again) one copy's orientation.
        const ci = Math.floor(random() * total);
        const allowed = ctx.copies[ci].steps;
        const pick = Math.floor(random() * (allowed.length + 1));
        st[ci] = pick === allowed.length ? null : allowed[pick];
        if (st[ci] === best.steps[ci]) continue;
      }
      evaluations++;
      const candidate = layOut(ctx, o, st, { from: best, abortAbove: best.length });
      // Keep a layout that is no longer (equal length: only when packed further left).
      if (candidate && !better(best, candidate)) best = candidate;
      if (evaluations % 5 === 0) report();
    }
  }
  report();
  return finish(ctx, best, lowerBoundMm);
}

/** A nesting piece from a panel: its sew line grown by the seam allowance (miter joins) as the cut line. */
export function nestPieceFromPanel(panel: PanelShape): NestPiece {
  const outline = panel.seamAllowanceMm ? cutLineFromSewLine(panel.outline, panel.seamAllowanceMm) : panel.outline;
  return {
    id: panel.id,
    name: panel.name,
    outline,
    grainline: panel.grainline ?? null,
    cutCount: panel.cutCount,
    mirrored: panel.mirrored,
    grainMode: panel.grainMode,
  };
}

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const num = (v: number) => String(Math.round(v * 100) / 100);

/** Draws a nesting result as an SVG string (mm units; marker length left to right, selvage at the bottom). */
export function markerToSvg(result: NestResult): string {
  const L = Math.max(result.markerLengthMm, 1);
  const W = result.usableWidthMm;
  const margin = 10;
  // SVG's y runs down; flip so the marker's y = 0 edge is drawn at the bottom.
  const fy = (y: number) => W - y;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${num(L + 2 * margin)}mm" height="${num(W + 2 * margin + 12)}mm" viewBox="${num(-margin)} ${num(-margin - 12)} ${num(L + 2 * margin)} ${num(W + 2 * margin + 12)}">`,
  );
  parts.push(
    `<text x="0" y="-4" font-size="8" font-family="sans-serif">${esc(
      `Marker ${num(result.markerLengthMm / 10)} cm × ${num(W / 10)} cm, efficiency ${num(result.efficiency * 100)} %, lower bound ${num(result.lowerBoundMm / 10)} cm`,
    )}</text>`,
  );
  parts.push(
    `<rect x="0" y="0" width="${num(L)}" height="${num(W)}" fill="none" stroke="#555" stroke-width="0.8" stroke-dasharray="4 2"/>`,
  );
  for (const p of result.placements) {
    const d = p.polygon.map(([x, y], i) => `${i === 0 ? "M" : "L"}${num(x)} ${num(fy(y))}`).join(" ") + " Z";
    const bb = boundingBox(p.polygon);
    parts.push(
      `<g data-piece="${esc(p.pieceId)}" data-copy="${p.copy}"><path d="${d}" fill="#e8e2d0" stroke="#222" stroke-width="0.5"/>` +
        `<text x="${num((bb.minX + bb.maxX) / 2)}" y="${num(fy((bb.minY + bb.maxY) / 2))}" font-size="10" text-anchor="middle" font-family="sans-serif">${esc(
          `${p.name}${p.mirrored ? " (M)" : ""}`,
        )}</text></g>`,
    );
  }
  parts.push("</svg>");
  return parts.join("\n");
}
