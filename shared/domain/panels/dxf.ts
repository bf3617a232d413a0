// Pattern pieces from ASCII DXF, the drawing-interchange format pattern software exchanges pieces in.
// dxf-parser reads the group codes; this module places BLOCKs by their INSERTs (scale, rotation,
// mirroring, arrays), converts drawing units to millimetres, flattens every curve (polyline bulges,
// ARC, CIRCLE, ELLIPSE, SPLINE with weights) within a stated chord tolerance, joins outlines drawn as
// separate LINE/ARC/SPLINE entities end to end, and then builds pieces:
// - Files using the ASTM D6673 layer numbers (see astm-d6673.ts): layer 1 is the cut line, layer 14 the
//   sew line, 7 the grain line, 4 and 80–83 notches; "Piece Name:", "Size:", "Quantity:" texts.
// - Other files: each closed outline is a piece's sew line; text inside it names it ("CUT n" for the
//   count), the longest line inside is the grain line, short lines from the edge are notches.
// Everything not used is listed with the reason, so a cutter can see what the file held.
import DxfParser from "dxf-parser";
import type {
  IArcEntity,
  IDxf,
  IEntity,
  IInsertEntity,
  ILineEntity,
  ILwpolylineEntity,
  IMtextEntity,
  IPointEntity,
  IPolylineEntity,
  ITextEntity,
} from "dxf-parser";
import { Limits } from "../../constants";
import {
  pointInPolygon,
  pointSegmentDistance,
  polygonArea,
  perimeter,
  boundingBox,
  validatePolygon,
  type Notch,
  type PanelShape,
  type Point,
} from "./geometry";
import { CHORD_TOLERANCE_MM, flattenArc, flattenBulge, flattenEllipse, flattenNurbs, nurbsProblem } from "./curves";
import { ASTM_ROLE_LABEL, ASTM_TEXT_LABEL, astmLayerRole, splitLabelledText, type AstmLayerRole } from "./astm-d6673";
import { cutLineFromSewLine, sewLineFromCutLine } from "./offset";
import { DXF_UNITS, INSUNITS, type DxfUnit } from "./dxf-units";

export { panelsToDxf } from "./dxf-writer";

/** Endpoints closer than this are joined when an outline is drawn as separate entities, mm. */
export const JOIN_TOLERANCE_MM = 0.1;
/** Lines at most this long that start on the outline are read as notches (files without layer numbers), mm. */
const NOTCH_MAX_MM = 15;
/** Closed outlines smaller than this are marks (drill holes, notch shapes), not pieces, mm². */
const MIN_PIECE_AREA_MM2 = 100;
/** INSERTs nested deeper than this are not followed (a block that places itself would never end). */
const MAX_INSERT_DEPTH = 8;

export { DXF_UNITS, type DxfUnit } from "./dxf-units";

/** Options for {@link readDxfPieces}. */
export interface DxfReadOptions {
  /** Drawing units to use instead of what the file says (or for a file that says nothing). */
  units?: DxfUnit;
  /** Seam allowance for pieces whose file has no separate cut and sew line, mm (default 10). */
  seamAllowanceMm?: number;
}

/** A limit was exceeded: the whole file is refused with this message. */
export class DxfLimitError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "DxfLimitError";
  }
}

/** One piece found in the file. */
export interface DxfPiece extends PanelShape {
  /** Sew line, mm (the panel outline). */
  outline: Point[];
  /** The cut line as drawn in the file, if it had one. */
  cutLine: Point[] | null;
  seamAllowanceMm: number;
  /** "file": measured between the file's cut and sew lines; "entered": the allowance given for the import. */
  seamAllowanceFrom: "file" | "entered";
  /** Size from a "Size:" text; Seamscene panels belong to one garment, so it is shown, not stored. */
  size: string | null;
  /** What was used for this piece, in plain words. */
  recognised: string[];
  /** Why the piece cannot be imported (empty when it can). */
  problems: string[];
  importable: boolean;
  areaMm2: number;
  /** Area inside the cut line Seamscene draws (sew line offset by the allowance), mm²; null when it cannot draw one. */
  cutAreaMm2: number | null;
  perimeterMm: number;
  widthMm: number;
  heightMm: number;
}

/** Entities left out, grouped by type, layer and reason. */
export interface DxfIgnored {
  entity: string;
  layer: string;
  reason: string;
  count: number;
  /** Up to 20 entity handles (or block names), to find them in a CAD program. */
  where: string[];
}

/** What {@link readDxfPieces} found. */
export interface DxfImport {
  units: {
    unit: DxfUnit;
    /** Where the unit came from. */
    from: "header" | "annotation" | "override" | "assumed";
    /** The header's $INSUNITS code, null when absent. */
    headerCode: number | null;
  };
  convention: "astm-d6673" | "generic";
  chordToleranceMm: number;
  joinToleranceMm: number;
  pieces: DxfPiece[];
  ignored: DxfIgnored[];
  warnings: string[];
}

// ---------------------------------------------------------------------------------------------
// Reading group codes: dxf-parser, plus entity handlers that keep what its own ones drop
// (SPLINE weights, CIRCLE and ELLIPSE extrusion). They collect the raw groups of the entity.

interface Scanner {
  next(): { code: number; value: unknown };
  rewind(n?: number): void;
  isEOF(): boolean;
}
interface RawEntity extends IEntity {
  groups: Array<[number, unknown]>;
}
function rawHandler(name: string) {
  return class {
    ForEntityName = name;
    parseEntity(scanner: Scanner, curr: { code: number; value: unknown }): RawEntity {
      const entity = { type: curr.value as string, layer: "0", groups: [] as Array<[number, unknown]> } as unknown as RawEntity;
      curr = scanner.next();
      while (!scanner.isEOF() && curr.code !== 0) {
        if (curr.code === 8) entity.layer = String(curr.value);
        else if (curr.code === 5) (entity as { handle?: unknown }).handle = String(curr.value);
        else entity.groups.push([curr.code, curr.value]);
        curr = scanner.next();
      }
      return entity;
    }
  };
}
const groupValues = (e: RawEntity, code: number) => e.groups.filter(([c]) => c === code).map(([, v]) => Number(v));
const groupValue = (e: RawEntity, code: number, fallback: number) => {
  const g = e.groups.find(([c]) => c === code);
  return g ? Number(g[1]) : fallback;
};

function parseDxfText(text: string): IDxf | null {
  const parser = new DxfParser();
  for (const name of ["SPLINE", "CIRCLE", "ELLIPSE"]) parser.registerEntityHandler(rawHandler(name) as never);
  return parser.parseSync(text);
}

/** Entity types of the ENTITIES and BLOCKS sections, counted by a plain scan (dxf-parser skips the ones it does not know). */
function countEntityTypes(lines: string[]): Map<string, number> {
  const counts = new Map<string, number>();
  let section = "";
  for (let i = 0; i + 1 < lines.length; i += 2) {
    const code = lines[i].trim();
    const value = lines[i + 1].trim();
    if (code === "2" && lines[i - 2]?.trim() === "0" && lines[i - 1]?.trim() === "SECTION") section = value;
    if (code !== "0" || (section !== "ENTITIES" && section !== "BLOCKS")) continue;
    if (["SECTION", "ENDSEC", "BLOCK", "ENDBLK", "SEQEND", "VERTEX", "EOF"].includes(value)) continue;
    counts.set(value, (counts.get(value) ?? 0) + 1);
  }
  return counts;
}
/** Entity types dxf-parser reads (the others it skips, so they are named from the plain scan). */
const PARSED_TYPES = new Set([
  "3DFACE",
  "ARC",
  "ATTDEF",
  "CIRCLE",
  "DIMENSION",
  "ELLIPSE",
  "INSERT",
  "LINE",
  "LWPOLYLINE",
  "MTEXT",
  "POINT",
  "POLYLINE",
  "SOLID",
  "SPLINE",
  "TEXT",
]);

// ---------------------------------------------------------------------------------------------
// Placing: 2D affine transforms [a, b, c, d, e, f]: x' = a·x + c·y + e, y' = b·x + d·y + f.

type Affine = readonly [number, number, number, number, number, number];
const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];
const compose = (m: Affine, n: Affine): Affine => [
  m[0] * n[0] + m[2] * n[1],
  m[1] * n[0] + m[3] * n[1],
  m[0] * n[2] + m[2] * n[3],
  m[1] * n[2] + m[3] * n[3],
  m[0] * n[4] + m[2] * n[5] + m[4],
  m[1] * n[4] + m[3] * n[5] + m[5],
];
const apply = (m: Affine, [x, y]: Point): Point => [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
const scaling = (sx: number, sy: number): Affine => [sx, 0, 0, sy, 0, 0];
const translation = (dx: number, dy: number): Affine => [1, 0, 0, 1, dx, dy];
const rotation = (deg: number): Affine => {
  const r = (deg * Math.PI) / 180;
  return [Math.cos(r), Math.sin(r), -Math.sin(r), Math.cos(r), 0, 0];
};
/** Largest stretch the transform applies (largest singular value), so chord tolerances can be scaled. */
function stretchOf(m: Affine): number {
  const [a, b, c, d] = m;
  const s = a * a + b * b + c * c + d * d;
  const det = a * d - b * c;
  return Math.sqrt((s + Math.sqrt(Math.max(0, s * s - 4 * det * det))) / 2) || 1;
}
/** A plane normal pointing down (extrusion z < 0) mirrors the entity's own x axis (DXF arbitrary-axis rule). */
const OCS_MIRROR: Affine = [-1, 0, 0, 1, 0, 0];

// ---------------------------------------------------------------------------------------------
// Items: every entity placed, in millimetres.

interface Source {
  type: string;
  layer: string;
  /** Handle, or block name when the file has no handles. */
  where: string;
  /** Block the entity was placed from, if any. */
  block: string | null;
}
interface PathItem {
  kind: "path";
  pts: Point[];
  closed: boolean;
  layer: string;
  group: string | null;
  sources: Source[];
  /** How the path was drawn, e.g. "LWPOLYLINE with 4 bulge arcs". */
  drawn: string;
}
interface PointItem {
  kind: "point";
  at: Point;
  layer: string;
  group: string | null;
  source: Source;
}
interface TextItem {
  kind: "text";
  at: Point;
  text: string;
  layer: string;
  group: string | null;
  source: Source;
}
type Item = PathItem | PointItem | TextItem;

const same = (p: Point, q: Point) => p[0] === q[0] && p[1] === q[1];
const dist = (p: Point, q: Point) => Math.hypot(p[0] - q[0], p[1] - q[1]);
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const mmText = (v: number) => `${Math.round(v * 100) / 100} mm`;

/** Decodes DXF text escapes: \U+XXXX characters, %%d/%%p/%%c symbols and a doubled backslash. */
export function decodeDxfText(s: string): string {
  return s
    .replace(/\\\\|\\U\+([0-9A-Fa-f]{4})/g, (m, hex: string | undefined) => (hex ? String.fromCharCode(parseInt(hex, 16)) : "\\"))
    .replace(/%%[dD]/g, "°")
    .replace(/%%[pP]/g, "±")
    .replace(/%%[cC]/g, "Ø");
}

/** MTEXT formatting codes stripped; paragraphs become separate lines. */
function mtextLines(s: string): string[] {
  return s
    .replace(/\\[Pp]/g, "\n")
    .replace(/\\[A-Za-z][^;\\]*;/g, "")
    .replace(/[{}]/g, "")
    .split("\n")
    .map((t) => decodeDxfText(t).trim())
    .filter(Boolean);
}

interface Expansion {
  /** Names of the blocks an INSERT placed. */
  placed: Set<string>;
  items: Item[];
  ignored: Map<string, DxfIgnored>;
  vertices: number;
  entities: number;
}

function ignore(ex: { ignored: Map<string, DxfIgnored> }, entity: string, layer: string, reason: string, where: string) {
  const key = `${entity}\u0000${layer}\u0000${reason}`;
  const row = ex.ignored.get(key) ?? { entity, layer, reason, count: 0, where: [] };
  row.count += 1;
  if (where && row.where.length < 20) row.where.push(where);
  ex.ignored.set(key, row);
}

/** Walks the entities, placing blocks, converting units and flattening curves. */
function expand(dxf: IDxf, toMm: number, tolerance: number): Expansion {
  const ex: Expansion = { placed: new Set(), items: [], ignored: new Map(), vertices: 0, entities: 0 };
  const blocks = (dxf.blocks ?? {}) as Record<string, { name: string; position?: { x: number; y: number }; entities?: IEntity[] }>;
  let insertCount = 0;

  const countVertices = (n: number) => {
    ex.vertices += n;
    if (ex.vertices > Limits.dxfMaxTotalVertices) {
      throw new DxfLimitError(
        `the drawing has more than ${Limits.dxfMaxTotalVertices.toLocaleString("en-GB")} points once its curves are flattened; split it into smaller files`,
      );
    }
  };

  const walk = (
    entities: IEntity[],
    m: Affine,
    group: string | null,
    insertLayer: string | null,
    blockName: string | null,
    depth: number,
  ) => {
    for (const e of entities) {
      ex.entities += 1;
      if (ex.entities > Limits.dxfMaxEntities) {
        throw new DxfLimitError(
          `the drawing places more than ${Limits.dxfMaxEntities.toLocaleString("en-GB")} entities; split it into smaller files`,
        );
      }
      // Entities on layer 0 inside a block take the layer of the INSERT that places the block.
      const layer = (e.layer === "0" || !e.layer) && insertLayer ? insertLayer : (e.layer ?? "0");
      const where = e.handle ? `handle ${e.handle}` : blockName ? `block ${blockName}` : "";
      const source: Source = { type: e.type, layer, where, block: blockName };
      const tol = tolerance / stretchOf(m);
      const path = (pts: Point[], closed: boolean, drawn: string, local: Affine = IDENTITY) => {
        const mm = compose(m, local);
        const placed = pts.map((p) => apply(mm, p));
        countVertices(placed.length);
        ex.items.push({ kind: "path", pts: placed, closed, layer, group, sources: [source], drawn });
      };
      const ocs = (z: number | undefined) => ((z ?? 1) < 0 ? OCS_MIRROR : IDENTITY);

      switch (e.type) {
        case "LINE": {
          const l = e as ILineEntity;
          const a: Point = [l.vertices[0].x, l.vertices[0].y];
          const b: Point = [l.vertices[1].x, l.vertices[1].y];
          if (same(a, b)) ignore(ex, e.type, layer, "zero length", where);
          else path([a, b], false, "LINE");
          break;
        }
        case "LWPOLYLINE":
        case "POLYLINE": {
          const p = e as (ILwpolylineEntity | IPolylineEntity) & {
            is3dPolygonMesh?: boolean;
            isPolyfaceMesh?: boolean;
            extrusionDirectionZ?: number;
            extrusionDirection?: { z: number };
          };
          if (p.is3dPolygonMesh || p.isPolyfaceMesh) {
            ignore(ex, e.type, layer, "3D mesh, not a flat outline", where);
            break;
          }
          const verts = p.vertices.map((v) => ({ pt: [v.x, v.y] as Point, bulge: (v as { bulge?: number }).bulge ?? 0 }));
          if (verts.length < 2) {
            ignore(ex, e.type, layer, "fewer than 2 points", where);
            break;
          }
          const closedFlag = Boolean(p.shape);
          const pts: Point[] = [];
          let arcs = 0;
          const segs = closedFlag ? verts.length : verts.length - 1;
          for (let i = 0; i < verts.length; i++) {
            pts.push(verts[i].pt);
            if (i >= segs) break;
            const next = verts[(i + 1) % verts.length].pt;
            if (verts[i].bulge) {
              arcs += 1;
              pts.push(...flattenBulge(verts[i].pt, next, verts[i].bulge, tol));
            }
          }
          if (closedFlag && pts.length > 1 && same(pts[0], pts[pts.length - 1])) pts.pop();
          const z = p.extrusionDirectionZ ?? p.extrusionDirection?.z;
          path(pts, closedFlag, `${e.type}${arcs ? ` with ${plural(arcs, "bulge arc")}` : ""}`, ocs(z));
          break;
        }
        case "ARC": {
          const a = e as IArcEntity & { extrusionDirectionZ?: number };
          let sweep = a.endAngle - a.startAngle;
          while (sweep <= 0) sweep += 2 * Math.PI;
          path(flattenArc([a.center.x, a.center.y], a.radius, a.startAngle, sweep, tol), false, "ARC", ocs(a.extrusionDirectionZ));
          break;
        }
        case "CIRCLE": {
          const c = e as RawEntity;
          const r = groupValue(c, 40, 0);
          if (!(r > 0)) {
            ignore(ex, e.type, layer, "no radius", where);
            break;
          }
          const pts = flattenArc([groupValue(c, 10, 0), groupValue(c, 20, 0)], r, 0, 2 * Math.PI, tol);
          pts.pop();
          path(pts, true, "CIRCLE", ocs(groupValue(c, 230, 1)));
          break;
        }
        case "ELLIPSE": {
          const el = e as RawEntity;
          const start = groupValue(el, 41, 0);
          const end = groupValue(el, 42, 2 * Math.PI);
          const full = Math.abs(end - start - 2 * Math.PI) < 1e-9 || (start === 0 && end === 0);
          const pts = flattenEllipse(
            {
              center: [groupValue(el, 10, 0), groupValue(el, 20, 0)],
              majorAxis: [groupValue(el, 11, 1), groupValue(el, 21, 0)],
              ratio: groupValue(el, 40, 1),
              startParam: start,
              endParam: full ? start + 2 * Math.PI : end,
              normalZ: groupValue(el, 230, 1),
            },
            tol,
          );
          if (full) pts.pop();
          path(pts, full, full ? "ELLIPSE" : "elliptical arc");
          break;
        }
        case "SPLINE": {
          const sp = e as RawEntity;
          const flags = groupValue(sp, 70, 0);
          const xs = groupValues(sp, 10);
          const ys = groupValues(sp, 20);
          const controlPoints = xs.map((x, i): Point => [x, ys[i] ?? 0]);
          if (!controlPoints.length) {
            ignore(
              ex,
              e.type,
              layer,
              groupValues(sp, 11).length
                ? "defined by fit points only (no control points); save it with control points"
                : "no control points",
              where,
            );
            break;
          }
          const weights = groupValues(sp, 41);
          const curve = {
            degree: groupValue(sp, 71, 3),
            knots: groupValues(sp, 40),
            controlPoints,
            weights: weights.length ? weights : undefined,
            periodic: (flags & 2) !== 0,
          };
          const problem = nurbsProblem(curve);
          if (problem) {
            ignore(ex, e.type, layer, `cannot be drawn: ${problem}`, where);
            break;
          }
          const pts = flattenNurbs(curve, tol);
          const closedFlag = (flags & 1) !== 0;
          if (pts.length > 2 && dist(pts[0], pts[pts.length - 1]) <= 1e-9 * Math.max(1, Math.abs(pts[0][0]) + Math.abs(pts[0][1])))
            pts.pop();
          const rational = weights.length && weights.some((w) => w !== weights[0]);
          path(
            pts,
            closedFlag || same(controlPoints[0], controlPoints[controlPoints.length - 1]),
            `${closedFlag ? "closed " : ""}SPLINE (degree ${curve.degree}${rational ? ", weighted" : ""})`,
            ocs(groupValue(sp, 230, 1)),
          );
          break;
        }
        case "POINT": {
          const pt = e as IPointEntity;
          countVertices(1);
          ex.items.push({ kind: "point", at: apply(m, [pt.position.x, pt.position.y]), layer, group, source });
          break;
        }
        case "TEXT": {
          const t = e as ITextEntity;
          if (!t.startPoint) break;
          const text = decodeDxfText(String(t.text ?? "")).trim();
          if (text) ex.items.push({ kind: "text", at: apply(m, [t.startPoint.x, t.startPoint.y]), text, layer, group, source });
          break;
        }
        case "MTEXT": {
          const t = e as IMtextEntity;
          const at = apply(m, [t.position.x, t.position.y]);
          for (const line of mtextLines(String(t.text ?? ""))) ex.items.push({ kind: "text", at, text: line, layer, group, source });
          break;
        }
        case "INSERT": {
          const ins = e as IInsertEntity & { extrusionDirection?: { z: number } };
          const block = blocks[ins.name];
          if (!block) {
            ignore(ex, e.type, layer, `places block "${ins.name}", which the file does not define`, where);
            break;
          }
          if (depth >= MAX_INSERT_DEPTH) {
            ignore(ex, e.type, layer, `blocks nested more than ${MAX_INSERT_DEPTH} deep`, where);
            break;
          }
          ex.placed.add(block.name);
          const base = block.position ?? { x: 0, y: 0 };
          const sx = ins.xScale ?? 1;
          const sy = ins.yScale ?? 1;
          const cols = Math.max(1, Math.min(1000, ins.columnCount ?? 1));
          const rows = Math.max(1, Math.min(1000, ins.rowCount ?? 1));
          for (let r = 0; r < rows; r++) {
            for (let c = 0; c < cols; c++) {
              const off = apply(rotation(ins.rotation ?? 0), [c * (ins.columnSpacing ?? 0), r * (ins.rowSpacing ?? 0)]);
              // WCS = [mirror if the normal points down] · move to position · rotate · scale · move base point to origin.
              let t = compose(
                translation(ins.position.x + off[0], ins.position.y + off[1]),
                compose(rotation(ins.rotation ?? 0), compose(scaling(sx, sy), translation(-base.x, -base.y))),
              );
              if ((ins.extrusionDirection?.z ?? 1) < 0) t = compose(OCS_MIRROR, t);
              insertCount += 1;
              walk(block.entities ?? [], compose(m, t), group ?? `insert-${insertCount}`, layer, block.name, depth + 1);
            }
          }
          break;
        }
        default:
          ignore(ex, e.type, layer, "not a pattern line, point or text", where);
      }
    }
  };
  walk(dxf.entities ?? [], scaling(toMm, toMm), null, null, null, 0);
  for (const b of Object.values(blocks)) {
    // Blocks whose names start with "*" are the drawing's own (model and paper space, dimensions).
    if (!b.name || b.name.startsWith("*") || ex.placed.has(b.name) || !b.entities?.length) continue;
    ignore(
      ex,
      "BLOCK",
      "any",
      `block "${b.name}" is defined but no INSERT places it, so its ${plural(b.entities.length, "entity", "entities")} are not drawn`,
      "",
    );
  }
  return ex;
}

// ---------------------------------------------------------------------------------------------
// Joining open paths end to end.

interface Chain {
  pts: Point[];
  closed: boolean;
  layer: string;
  group: string | null;
  sources: Source[];
  drawn: string;
  /** For an open chain of several paths, the distance between its two ends, mm. */
  gap: number | null;
  parts: PathItem[];
}

function pathLength(pts: readonly Point[]): number {
  let s = 0;
  for (let i = 1; i < pts.length; i++) s += dist(pts[i - 1], pts[i]);
  return s;
}

/** How a chain of paths was drawn: "3 LINE + 2 ARC joined end to end". */
function describeJoined(parts: PathItem[]): string {
  if (parts.length === 1) return parts[0].drawn;
  const counts = new Map<string, number>();
  for (const p of parts) for (const s of p.sources) counts.set(s.type, (counts.get(s.type) ?? 0) + 1);
  return `${[...counts].map(([t, n]) => `${n} ${t}`).join(" + ")} joined end to end`;
}

/**
 * Joins open paths of one layer and group whose ends meet within the tolerance. At a point where more
 * than two paths meet, the walk keeps to the longer paths (a notch or arrow stroke is not the outline).
 */
function joinPaths(paths: PathItem[], tolerance: number): { chains: Chain[]; singles: PathItem[] } {
  const cell = tolerance;
  const grid = new Map<string, number[]>();
  const nodes: Point[] = [];
  const nodeOf = (p: Point): number => {
    const cx = Math.floor(p[0] / cell);
    const cy = Math.floor(p[1] / cell);
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        for (const id of grid.get(`${cx + dx},${cy + dy}`) ?? []) if (dist(nodes[id], p) <= tolerance) return id;
      }
    }
    nodes.push(p);
    const key = `${cx},${cy}`;
    grid.set(key, [...(grid.get(key) ?? []), nodes.length - 1]);
    return nodes.length - 1;
  };
  const ends = paths.map((p) => [nodeOf(p.pts[0]), nodeOf(p.pts[p.pts.length - 1])] as const);
  const lengths = paths.map((p) => pathLength(p.pts));
  const incident = new Map<number, number[]>();
  ends.forEach(([a, b], i) => {
    incident.set(a, [...(incident.get(a) ?? []), i]);
    if (b !== a) incident.set(b, [...(incident.get(b) ?? []), i]);
  });
  const used = new Set<number>();
  const chains: Chain[] = [];
  const singles: PathItem[] = [];
  const order = paths.map((_, i) => i).sort((a, b) => lengths[b] - lengths[a]);
  const pick = (node: number): number | undefined => {
    const cands = (incident.get(node) ?? []).filter((i) => !used.has(i));
    if (!cands.length) return undefined;
    const long = cands.filter((i) => lengths[i] > NOTCH_MAX_MM);
    return (long.length ? long : cands).sort((a, b) => lengths[b] - lengths[a])[0];
  };
  for (const first of order) {
    if (used.has(first)) continue;
    used.add(first);
    // Each step: [path index, walked forward?]
    const steps: Array<[number, boolean]> = [[first, true]];
    const startNode = ends[first][0];
    let head = ends[first][1];
    let tail = startNode;
    let closed = head === tail && paths[first].pts.length > 2;
    while (!closed) {
      const next = pick(head);
      if (next === undefined) break;
      used.add(next);
      const forward = ends[next][0] === head;
      steps.push([next, forward]);
      head = forward ? ends[next][1] : ends[next][0];
      closed = head === tail;
    }
    while (!closed) {
      const prev = pick(tail);
      if (prev === undefined) break;
      used.add(prev);
      const forward = ends[prev][1] === tail;
      steps.unshift([prev, forward]);
      tail = forward ? ends[prev][0] : ends[prev][1];
      closed = head === tail;
    }
    const parts = steps.map(([i]) => paths[i]);
    if (steps.length === 1 && !closed) {
      singles.push(paths[first]);
      continue;
    }
    const pts: Point[] = [];
    for (const [i, forward] of steps) {
      const seq = forward ? paths[i].pts : [...paths[i].pts].reverse();
      pts.push(...(pts.length ? seq.slice(1) : seq));
    }
    if (closed && pts.length > 1 && dist(pts[0], pts[pts.length - 1]) <= tolerance) pts.pop();
    chains.push({
      pts,
      closed,
      layer: paths[first].layer,
      group: paths[first].group,
      sources: parts.flatMap((p) => p.sources),
      drawn: describeJoined(parts),
      gap: closed ? null : dist(pts[0], pts[pts.length - 1]),
      parts,
    });
  }
  return { chains, singles };
}

// ---------------------------------------------------------------------------------------------
// Pieces.

interface Outline {
  pts: Point[];
  role: "cut" | "sew" | "plain";
  layer: string;
  group: string | null;
  drawn: string;
  sources: Source[];
  area: number;
}

interface Draft {
  main: Outline;
  cut: Outline | null;
  sew: Outline | null;
  texts: TextItem[];
  lines: PathItem[];
  points: PointItem[];
}

function nearestOnOutline(outline: readonly Point[], p: Point): { edge: number; distance: number; point: Point } {
  let best = { edge: 0, distance: Infinity, t: 0, point: outline[0] as Point };
  outline.forEach((a, i) => {
    const b = outline[(i + 1) % outline.length];
    const { distance, t } = pointSegmentDistance(p, a, b);
    // On a shared vertex, prefer the edge that starts there (t = 0) over the one ending there (t = 1).
    if (distance < best.distance - 1e-9 || (Math.abs(distance - best.distance) <= 1e-9 && best.t >= 1 && t < 1)) {
      best = { edge: i, distance, t, point: [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t] };
    }
  });
  if (best.t >= 1)
    return { edge: (best.edge + 1) % outline.length, distance: best.distance, point: outline[(best.edge + 1) % outline.length] };
  return best;
}

/**
 * Distance between the cut and sew lines: measured from 200 points spread evenly along the cut line
 * (not its vertices, which sit at corners where the distance is larger), as median and spread.
 */
function measureAllowance(cut: readonly Point[], sew: readonly Point[]): { median: number; low: number; high: number } {
  const n = cut.length;
  const lengths = cut.map((p, i) => dist(p, cut[(i + 1) % n]));
  const total = lengths.reduce((x, y) => x + y, 0);
  const samples = 200;
  const d: number[] = [];
  let edge = 0;
  let walked = 0;
  for (let k = 0; k < samples; k++) {
    const at = ((k + 0.5) * total) / samples;
    while (edge < n - 1 && walked + lengths[edge] < at) walked += lengths[edge++];
    const t = lengths[edge] ? (at - walked) / lengths[edge] : 0;
    const a = cut[edge];
    const b = cut[(edge + 1) % n];
    d.push(nearestOnOutline(sew, [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t]).distance);
  }
  d.sort((x, y) => x - y);
  const q = (f: number) => d[Math.min(d.length - 1, Math.floor(f * d.length))];
  return { median: q(0.5), low: q(0.1), high: q(0.9) };
}

const CUT_TEXT = /^CUT\s+(\d+)(\s+MIRRORED)?$/i;
/** "Label: value" texts of pattern files; any other text with a colon is plain text (a name may hold one). */
const KNOWN_LABELS = new Set([
  ...Object.values(ASTM_TEXT_LABEL).map((l) => l.toLowerCase()),
  "units",
  "material",
  "rotation",
  "grade rule table",
  "sample size",
]);
const MIRRORED_TEXT = /mirrored pairs?/i;

/**
 * Reads pattern pieces from DXF text. Throws an Error for a file that is not readable DXF, and a
 * {@link DxfLimitError} when the drawing is larger than the limits.
 */
export function readDxfPieces(text: string, options: DxfReadOptions = {}): DxfImport {
  if (text.startsWith("AutoCAD Binary DXF")) throw new Error("binary DXF is not read; save the file as ASCII DXF");
  const lines = text.split(/\r\n|\r|\n/g);
  let dxf: IDxf | null;
  try {
    dxf = parseDxfText(text);
  } catch (err) {
    const msg = err instanceof Error ? err.message : "parse error";
    // dxf-parser's own words are for programmers; say what they mean for the file.
    if (/EOF group not read|Unexpected end of input/i.test(msg))
      throw new Error("the file ends before DXF's end marker: it is cut short or not a DXF drawing");
    if (/Empty file/i.test(msg)) throw new Error("the file is empty");
    throw new Error(`the DXF groups could not be read (${msg})`);
  }
  if (!dxf || (!dxf.entities?.length && !Object.keys(dxf.blocks ?? {}).length)) throw new Error("the file holds no drawing entities");
  const warnings: string[] = [];

  // Units: an override, the header, an ASTM-style "Units:" text, or millimetres assumed.
  const headerCode = typeof dxf.header?.$INSUNITS === "number" ? (dxf.header.$INSUNITS as number) : null;
  let units: DxfImport["units"];
  const unitsText = lines.map((l) => /^\s*Units\s*:\s*(metric|english)\s*$/i.exec(l)?.[1]).find(Boolean);
  if (options.units) units = { unit: options.units, from: "override", headerCode };
  else if (headerCode !== null && INSUNITS[headerCode]) units = { unit: INSUNITS[headerCode], from: "header", headerCode };
  else if (unitsText) units = { unit: unitsText.toLowerCase() === "english" ? "in" : "mm", from: "annotation", headerCode };
  else {
    units = { unit: "mm", from: "assumed", headerCode };
    warnings.push(
      headerCode === null || headerCode === 0
        ? "The file does not say its drawing units; millimetres assumed. Check the piece sizes and choose the units if they look wrong."
        : `The file's units code $INSUNITS ${headerCode} is not one a pattern uses; millimetres assumed. Choose the units if the sizes look wrong.`,
    );
  }

  const ex = expand(dxf, DXF_UNITS[units.unit], CHORD_TOLERANCE_MM);
  for (const [type, n] of countEntityTypes(lines)) {
    if (PARSED_TYPES.has(type)) continue;
    const key = `${type}\u0000*\u0000skip`;
    ex.ignored.set(key, { entity: type, layer: "any", reason: "not a pattern line, point or text", count: n, where: [] });
  }

  const roleOf = (layer: string): AstmLayerRole | null => astmLayerRole(layer);
  const astm = ex.items.some((i) => i.kind === "path" && (roleOf(i.layer) === "cut_line" || roleOf(i.layer) === "sew_line"));
  const convention: DxfImport["convention"] = astm ? "astm-d6673" : "generic";
  const outlineLayer = (layer: string) => {
    if (!astm) return true;
    const r = roleOf(layer);
    return r === "cut_line" || r === "sew_line" || r === null;
  };

  // Join open paths per group and layer; keep closed ones as they are.
  const outlines: Outline[] = [];
  const loose: PathItem[] = [];
  const byKey = new Map<string, PathItem[]>();
  for (const it of ex.items) {
    if (it.kind !== "path") continue;
    if (!outlineLayer(it.layer)) {
      loose.push(it);
      continue;
    }
    if (it.closed) {
      outlines.push(toOutline(it.pts, it.layer, it.group, it.drawn, it.sources));
      continue;
    }
    const key = `${it.group}\u0000${it.layer}`;
    byKey.set(key, [...(byKey.get(key) ?? []), it]);
  }
  function toOutline(pts: Point[], layer: string, group: string | null, drawn: string, sources: Source[]): Outline {
    const r = astm ? roleOf(layer) : null;
    return {
      pts,
      role: r === "cut_line" ? "cut" : r === "sew_line" ? "sew" : "plain",
      layer,
      group,
      drawn,
      sources,
      area: polygonArea(pts),
    };
  }
  for (const paths of byKey.values()) {
    const { chains, singles } = joinPaths(paths, JOIN_TOLERANCE_MM);
    for (const c of chains) {
      const parts = c.parts;
      const length = pathLength(c.pts);
      const layerIsOutline = astm && (roleOf(c.layer) === "cut_line" || roleOf(c.layer) === "sew_line");
      if (c.closed) outlines.push(toOutline(c.pts, c.layer, c.group, c.drawn, c.sources));
      else if (layerIsOutline || (c.gap !== null && c.gap <= 0.1 * length)) {
        for (const s of c.sources) {
          ignore(
            ex,
            s.type,
            s.layer,
            `part of ${plural(parts.length, "entity", "entities")} drawn end to end that do not close: the ends are ${mmText(c.gap ?? 0)} apart (joined within ${JOIN_TOLERANCE_MM} mm)`,
            s.where,
          );
        }
      } else loose.push(...parts);
    }
    for (const s of singles) {
      if (astm && (roleOf(s.layer) === "cut_line" || roleOf(s.layer) === "sew_line")) {
        ignore(
          ex,
          s.sources[0].type,
          s.layer,
          `open ${ASTM_ROLE_LABEL[roleOf(s.layer)!]}: its ends are ${mmText(dist(s.pts[0], s.pts[s.pts.length - 1]))} apart`,
          s.sources[0].where,
        );
      } else loose.push(s);
    }
  }

  // Marks too small to be pieces.
  const big = outlines.filter((o) => {
    if (o.area >= MIN_PIECE_AREA_MM2) return true;
    for (const s of o.sources)
      ignore(
        ex,
        s.type,
        s.layer,
        `closed outline of ${Math.round(o.area * 10) / 10} mm², too small to be a piece (under ${MIN_PIECE_AREA_MM2} mm²)`,
        s.where,
      );
    return false;
  });
  if (units.from === "assumed" && big.length < outlines.length) {
    warnings.push(
      "Some outlines are too small to be pieces in millimetres; if the file was drawn in inches or centimetres, choose those units.",
    );
  }
  const closedCount = big.filter((o) => o.role !== "sew").length || big.length;
  if (closedCount > Limits.dxfMaxPieces)
    throw new DxfLimitError(`the file holds ${closedCount} piece outlines; at most ${Limits.dxfMaxPieces} are read from one file`);

  // Sew lines pair with the smallest cut line of the same group that contains them.
  const drafts: Draft[] = [];
  const cuts = big.filter((o) => o.role === "cut");
  const sews = big.filter((o) => o.role === "sew");
  const cutDraft = new Map<Outline, Draft>();
  for (const o of big.filter((x) => x.role !== "sew")) {
    const d: Draft = { main: o, cut: o.role === "cut" ? o : null, sew: null, texts: [], lines: [], points: [] };
    drafts.push(d);
    if (o.role === "cut") cutDraft.set(o, d);
  }
  for (const s of sews) {
    const host = cuts
      .filter((c) => c.group === s.group && pointInPolygon(s.pts[0], c.pts, JOIN_TOLERANCE_MM) !== "outside")
      .sort((a, b) => a.area - b.area)
      .find((c) => !cutDraft.get(c)!.sew);
    if (host) cutDraft.get(host)!.sew = s;
    else drafts.push({ main: s, cut: null, sew: s, texts: [], lines: [], points: [] });
  }

  // Texts, loose lines and points go to the smallest piece of their block that holds them.
  const owner = (p: Point, layer: string, group: string | null): Draft | undefined => {
    const sameGroup = drafts.filter((d) => d.main.group === group);
    const pool = sameGroup.length ? sameGroup : drafts;
    const containing = pool.filter((d) => pointInPolygon(p, (d.cut ?? d.main).pts, 0.05) !== "outside");
    containing.sort((a, b) => (a.main.layer === layer ? 0 : 1) - (b.main.layer === layer ? 0 : 1) || a.main.area - b.main.area);
    if (containing[0]) return containing[0];
    // A block holding one piece: what it holds belongs to that piece wherever it is drawn.
    return group !== null && sameGroup.length === 1 ? sameGroup[0] : undefined;
  };
  for (const it of ex.items) {
    if (it.kind === "text") {
      const d = owner(it.at, it.layer, it.group);
      if (d) d.texts.push(it);
      else ignore(ex, "TEXT", it.layer, `"${it.text.slice(0, 60)}" lies outside every piece`, it.source.where);
    } else if (it.kind === "point") {
      const d = owner(it.at, it.layer, it.group);
      if (d) d.points.push(it);
      else ignore(ex, "POINT", it.layer, "lies outside every piece", it.source.where);
    }
  }
  for (const l of loose) {
    const d = l.pts.map((p) => owner(p, l.layer, l.group)).find(Boolean);
    if (d) d.lines.push(l);
    else for (const s of l.sources) ignore(ex, s.type, s.layer, "lies outside every piece", s.where);
  }

  const defaultAllowance = options.seamAllowanceMm ?? 10;
  const pieces = drafts.map((d, i) => buildPiece(d, i));

  function buildPiece(d: Draft, index: number): DxfPiece {
    const recognised: string[] = [];
    const problems: string[] = [];
    const label = (o: Outline) => `${o.drawn} on layer ${o.layer}`;
    let outline: Point[];
    let seamAllowanceMm = defaultAllowance;
    let seamAllowanceFrom: DxfPiece["seamAllowanceFrom"] = "entered";
    if (d.cut && d.sew) {
      outline = d.sew.pts;
      const a = measureAllowance(d.cut.pts, d.sew.pts);
      // Stored to 0.1 mm, as the panel record keeps it.
      seamAllowanceMm = Math.round(a.median * 10) / 10;
      seamAllowanceFrom = "file";
      recognised.push(
        `cut line: ${label(d.cut)}`,
        `sew line: ${label(d.sew)}`,
        `seam allowance ${mmText(seamAllowanceMm)}, measured between the cut and sew lines`,
      );
      if (a.high - a.low > 0.5) {
        warnings.push(
          `Piece ${index + 1}: the seam allowance varies from ${mmText(a.low)} to ${mmText(a.high)} along the piece; Seamscene keeps one allowance per piece (${mmText(seamAllowanceMm)}, the median), so the cut line will be redrawn from the sew line.`,
        );
      }
    } else if (d.cut) {
      recognised.push(`cut line: ${label(d.cut)} (no sew line in the file: the sew line is set ${mmText(defaultAllowance)} inside)`);
      try {
        outline = defaultAllowance > 0 ? sewLineFromCutLine(d.cut.pts, defaultAllowance) : d.cut.pts;
      } catch {
        outline = d.cut.pts;
        problems.push(`the piece is too narrow for a ${mmText(defaultAllowance)} seam allowance inside its cut line`);
      }
    } else {
      outline = d.main.pts;
      recognised.push(`${d.main.role === "sew" ? "sew line" : "outline (taken as the sew line)"}: ${label(d.main)}`);
    }

    // Annotations.
    let name: string | null = null;
    let size: string | null = null;
    let cutCount: number | null = null;
    let mirrored = false;
    const plain: string[] = [];
    for (const t of d.texts) {
      const legacy = CUT_TEXT.exec(t.text.trim());
      const split = splitLabelledText(t.text);
      const lab = split && KNOWN_LABELS.has(split.label) ? split : null;
      if (legacy) {
        cutCount = Number(legacy[1]);
        mirrored ||= Boolean(legacy[2]);
      } else if (lab && lab.label === ASTM_TEXT_LABEL.pieceName.toLowerCase()) name = lab.value;
      else if (lab && lab.label === ASTM_TEXT_LABEL.size.toLowerCase()) size = lab.value || null;
      else if (lab && lab.label === ASTM_TEXT_LABEL.quantity.toLowerCase() && /^\d+$/.test(lab.value)) cutCount = Number(lab.value);
      else if (lab && lab.label === ASTM_TEXT_LABEL.annotation.toLowerCase() && MIRRORED_TEXT.test(lab.value)) mirrored = true;
      else if (lab && lab.label !== "units")
        ignore(
          ex,
          t.source.type,
          t.layer,
          `piece text "${t.text.slice(0, 60)}" is not used (Seamscene reads piece name, size, quantity)`,
          t.source.where,
        );
      else if (!lab) plain.push(t.text);
    }
    if (name === null && plain.length) name = plain.shift()!;
    for (const p of plain) ignore(ex, "TEXT", d.main.layer, `extra text "${p.slice(0, 60)}" in a piece that already has a name`, "");
    if (name === null) {
      const block = d.main.sources[0].block;
      name = block && !block.startsWith("*") ? block : astm || d.main.layer === "0" ? `Piece ${index + 1}` : d.main.layer;
      warnings.push(`Piece ${index + 1}: no name text, "${name}" used.`);
    } else recognised.push(`name "${name}"${size ? `, size ${size} (shown only: a panel belongs to one garment)` : ""}`);
    if (cutCount === null) {
      cutCount = 1;
      warnings.push(`Piece "${name}": no quantity or "CUT n" text, 1 assumed.`);
    } else recognised.push(`cut ${cutCount}${mirrored ? " as mirrored pairs" : ""}`);

    // Grain line, notches and what else sits inside.
    const grains: PathItem[] = [];
    const notchMarks: Point[][] = [];
    const notchSources: Source[] = [];
    for (const l of d.lines) {
      const role = astm ? roleOf(l.layer) : null;
      const isLine = l.pts.length === 2;
      if (role === "grain_line" && isLine) grains.push(l);
      else if (role === "notches") {
        notchMarks.push(l.pts);
        notchSources.push(...l.sources);
      } else if (role && role !== "cut_line" && role !== "sew_line")
        for (const s of l.sources)
          ignore(ex, s.type, s.layer, `${ASTM_ROLE_LABEL[role]} (layer ${s.layer}): not kept by Seamscene`, s.where);
      else if (isLine && pathLength(l.pts) <= NOTCH_MAX_MM && !astm && l.pts.some((p) => nearestOnOutline(outline, p).distance <= 0.05)) {
        notchMarks.push(l.pts);
        notchSources.push(...l.sources);
      } else if (isLine && !astm) grains.push(l);
      else
        for (const s of l.sources)
          ignore(
            ex,
            s.type,
            s.layer,
            `${l.drawn} inside the piece is not an outline, grain line or notch (internal lines are not kept)`,
            s.where,
          );
    }
    for (const p of d.points) {
      const role = astm ? roleOf(p.layer) : null;
      if (role === "notches" || (!astm && nearestOnOutline(d.cut?.pts ?? outline, p.at).distance <= 0.05)) {
        notchMarks.push([p.at]);
        notchSources.push(p.source);
      } else {
        const why = role
          ? `${ASTM_ROLE_LABEL[role]} (layer ${p.layer}): ${role === "turn_points" || role === "curve_points" ? "the outline itself carries its corners and curves" : "not kept by Seamscene"}`
          : "point inside the piece, not on its outline";
        ignore(ex, "POINT", p.layer, why, p.source.where);
      }
    }
    grains.sort((a, b) => pathLength(b.pts) - pathLength(a.pts));
    for (const extra of grains.slice(1))
      for (const s of extra.sources)
        ignore(ex, s.type, s.layer, "another line inside the piece; only the longest is taken as the grain line", s.where);
    const grain = grains[0];
    if (grain) recognised.push(`grain line: LINE on layer ${grain.layer}`);
    const notches: Notch[] = notchMarks.map((mark) => {
      // The end nearest the sew line marks the notch; its foot on the sew line is where it sits.
      const best = mark.map((p) => nearestOnOutline(outline, p)).sort((a, b) => a.distance - b.distance)[0];
      return { point: best.point, edge: best.edge };
    });
    if (notches.length)
      recognised.push(
        `${plural(notches.length, "notch", "notches")}: ${[...new Set(notchSources.map((s) => `${s.type} on layer ${s.layer}`))].join(", ")}`,
      );

    // Checks: the size cap refuses the file; a crossing outline is shown but not imported.
    if (outline.length > Limits.panelMaxVertices) {
      throw new DxfLimitError(
        `piece "${name}" has ${outline.length.toLocaleString("en-GB")} points once its curves are flattened; at most ${Limits.panelMaxVertices.toLocaleString("en-GB")} are accepted per piece — simplify it in the pattern program`,
      );
    }
    const check = validatePolygon(outline);
    if (!check.valid) problems.push(...check.issues.map((x) => x.message));
    const bb = boundingBox(outline);
    // No cut area for an outline that crosses itself or that clipper cannot offset (never the sew-line area).
    let cutAreaMm2: number | null = null;
    if (check.valid) {
      try {
        cutAreaMm2 = polygonArea(cutLineFromSewLine(outline, seamAllowanceMm));
      } catch {
        cutAreaMm2 = null;
      }
    }
    return {
      id: `piece-${index + 1}`,
      name,
      outline,
      cutLine: d.cut?.pts ?? null,
      grainline: grain ? [grain.pts[0], grain.pts[1]] : null,
      notches,
      seamAllowanceMm,
      seamAllowanceFrom,
      cutCount,
      mirrored,
      size,
      recognised,
      problems,
      importable: problems.length === 0,
      areaMm2: polygonArea(outline),
      cutAreaMm2,
      perimeterMm: perimeter(outline),
      widthMm: bb.width,
      heightMm: bb.height,
    };
  }

  return {
    units,
    convention,
    chordToleranceMm: CHORD_TOLERANCE_MM,
    joinToleranceMm: JOIN_TOLERANCE_MM,
    pieces,
    ignored: [...ex.ignored.values()],
    warnings,
  };
}

/** Why a file gave no piece, in one sentence built from what was skipped. */
export function noPieceReason(result: DxfImport): string {
  const reasons = result.ignored
    .filter((g) => !/outside every piece|not a pattern line/.test(g.reason))
    .sort((a, b) => b.count - a.count)
    .slice(0, 3)
    .map((g) => `${g.count} × ${g.entity} on layer ${g.layer}: ${g.reason}`);
  const types = result.ignored.filter((g) => /not a pattern line/.test(g.reason)).map((g) => g.entity);
  const parts = [...reasons];
  if (types.length) parts.push(`entities that are not pattern lines (${[...new Set(types)].join(", ")})`);
  return parts.length
    ? `no closed piece outline found: ${parts.join("; ")}`
    : "no closed piece outline found: the file has no closed polyline, circle, closed spline or chain of lines and arcs meeting end to end";
}
