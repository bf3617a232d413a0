// Sew line ↔ cut line: offsetting a panel outline by its seam allowance with clipper-lib.
// Clipper works on integer coordinates, so millimetres are scaled by CLIPPER_SCALE (1 unit = 1 µm)
// and rounded; results are scaled back. Rounding moves a point by at most 0.0005 mm, and pattern
// coordinates (a few metres at most) stay far below clipper's fast-arithmetic range (±4.7e7 units).
// @ts-expect-error clipper-lib ships no type declarations; the part used here is typed by ClipperLibApi below.
import ClipperLibRaw from "clipper-lib";
import { signedArea, type Point, type Polygon } from "./geometry";

/** Integer units per millimetre used for clipper-lib (1 unit = 1 µm). */
export const CLIPPER_SCALE = 1000;

/** A clipper integer point. */
export interface IntPoint {
  X: number;
  Y: number;
}
/** A clipper integer path. */
export type IntPath = IntPoint[];

interface ClipperInstance {
  AddPath(path: IntPath, polyType: number, closed: boolean): boolean;
  AddPaths(paths: IntPath[], polyType: number, closed: boolean): boolean;
  Execute(clipType: number, solution: IntPath[], subjFill: number, clipFill: number): boolean;
}
interface ClipperOffsetInstance {
  AddPath(path: IntPath, joinType: number, endType: number): void;
  Execute(solution: IntPath[], delta: number): void;
}
/** The subset of clipper-lib that Seamscene uses. */
export interface ClipperLibApi {
  Clipper: {
    new (): ClipperInstance;
    Area(path: IntPath): number;
    MinkowskiSum(pattern: IntPath, path: IntPath, pathIsClosed: boolean): IntPath[];
    CleanPolygons(paths: IntPath[], distance: number): IntPath[];
  };
  ClipperOffset: new (miterLimit?: number, arcTolerance?: number) => ClipperOffsetInstance;
  ClipType: { ctIntersection: number; ctUnion: number; ctDifference: number; ctXor: number };
  PolyType: { ptSubject: number; ptClip: number };
  PolyFillType: { pftEvenOdd: number; pftNonZero: number; pftPositive: number; pftNegative: number };
  JoinType: { jtSquare: number; jtRound: number; jtMiter: number };
  EndType: { etClosedPolygon: number };
}

/** clipper-lib with the types above. */
export const ClipperLib = ClipperLibRaw as ClipperLibApi;

/** Converts a polygon in mm to a clipper integer path. */
export function toIntPath(poly: Polygon, scale = CLIPPER_SCALE): IntPath {
  return poly.map(([x, y]) => ({ X: Math.round(x * scale), Y: Math.round(y * scale) }));
}

/** Converts a clipper integer path back to mm. */
export function fromIntPath(path: IntPath, scale = CLIPPER_SCALE): Point[] {
  return path.map((p) => [p.X / scale, p.Y / scale] as Point);
}

/** Corner treatment when offsetting: miter keeps sharp corners (up to the miter limit), round adds arcs, square bevels. */
export type JoinKind = "miter" | "round" | "square";

/** Options for {@link offsetOutline}. */
export interface OffsetOptions {
  /** Corner joins; default "miter", as cut lines on pattern pieces usually follow the sew line's corners. */
  join?: JoinKind;
  /** Miter limit as a multiple of the offset distance (clipper default 2); sharper corners are squared off. */
  miterLimit?: number;
  /** For round joins: greatest distance between the true arc and its chords, mm (default 0.05 mm). */
  arcToleranceMm?: number;
}

/**
 * Offsets a closed outline outward (positive distance) or inward (negative), mm.
 * @returns the offset polygons (one normally; none if an inward offset consumes the piece), counter-clockwise
 */
export function offsetOutline(outline: Polygon, distanceMm: number, options: OffsetOptions = {}): Point[][] {
  const join = options.join ?? "miter";
  const joinType =
    join === "round" ? ClipperLib.JoinType.jtRound : join === "square" ? ClipperLib.JoinType.jtSquare : ClipperLib.JoinType.jtMiter;
  const co = new ClipperLib.ClipperOffset(options.miterLimit ?? 2, (options.arcToleranceMm ?? 0.05) * CLIPPER_SCALE);
  // Clipper offsets outward for positively oriented paths; orient first so the sign means "outward".
  const path = toIntPath(signedArea(outline) < 0 ? [...outline].reverse() : outline);
  co.AddPath(path, joinType, ClipperLib.EndType.etClosedPolygon);
  const solution: IntPath[] = [];
  co.Execute(solution, distanceMm * CLIPPER_SCALE);
  return solution.filter((p) => ClipperLib.Clipper.Area(p) > 0).map((p) => fromIntPath(p));
}

function single(polys: Point[][], what: string): Point[] {
  if (polys.length === 0) throw new Error(`${what}: offset left no outline`);
  // Outward offsets of a simple polygon give one outline; keep the largest if clipper splits an inward one.
  return polys.reduce((best, p) => (signedArea(p) > signedArea(best) ? p : best));
}

/** Cut line from a sew line: the outline grown by the seam allowance. */
export function cutLineFromSewLine(sewLine: Polygon, seamAllowanceMm: number, options: OffsetOptions = {}): Point[] {
  if (seamAllowanceMm === 0) return [...sewLine];
  return single(offsetOutline(sewLine, seamAllowanceMm, options), "cut line");
}

/** Sew line from a cut line: the outline shrunk by the seam allowance. */
export function sewLineFromCutLine(cutLine: Polygon, seamAllowanceMm: number, options: OffsetOptions = {}): Point[] {
  if (seamAllowanceMm === 0) return [...cutLine];
  return single(offsetOutline(cutLine, -seamAllowanceMm, options), "sew line");
}
