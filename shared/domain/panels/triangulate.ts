// Flat triangulation of a panel outline with earcut, for OBJ export and interior label points.
import earcut from "earcut";
import { toCounterClockwise, type Point, type Polygon } from "./geometry";

/** A flat triangle mesh of one panel. */
export interface PanelMesh {
  /** Vertex positions [x, y, z] in metres, z = 0 (the panel lies flat). */
  positions: number[];
  /** Triangles as triples of vertex indices (0-based), counter-clockwise seen from +z. */
  triangles: number[];
  /** Texture coordinates [u, v] per vertex: the flat position in metres. */
  uvs: number[];
  /** The outline used, counter-clockwise, mm; vertex i of the mesh is outline point i. */
  outline: Point[];
}

/** Triangulates a simple polygon (mm) into a flat mesh whose positions and UVs are in metres. */
export function triangulatePanel(outline: Polygon): PanelMesh {
  // Counter-clockwise order keeps the outline's vertex numbering consistent for callers; faces face +z.
  const ccw = toCounterClockwise(outline);
  const flat = ccw.flatMap(([x, y]) => [x, y]);
  const triangles = earcut(flat);
  for (let i = 0; i < triangles.length; i += 3) {
    const [a, b, c] = [ccw[triangles[i]], ccw[triangles[i + 1]], ccw[triangles[i + 2]]];
    // Make every face counter-clockwise explicitly rather than rely on earcut's output order.
    if ((b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1]) < 0) {
      [triangles[i + 1], triangles[i + 2]] = [triangles[i + 2], triangles[i + 1]];
    }
  }
  const positions: number[] = [];
  const uvs: number[] = [];
  for (const [x, y] of ccw) {
    positions.push(x / 1000, y / 1000, 0);
    uvs.push(x / 1000, y / 1000);
  }
  return { positions, triangles, uvs, outline: ccw };
}

/**
 * A point strictly inside the polygon (the centroid of its largest ear-cut triangle); used to place
 * labels, since the area centroid of a concave piece can fall outside it.
 */
export function interiorPoint(outline: Polygon, rank = 0): Point {
  const ccw = toCounterClockwise(outline);
  const tris = earcut(ccw.flatMap(([x, y]) => [x, y]));
  const found: { area: number; c: Point }[] = [];
  for (let i = 0; i < tris.length; i += 3) {
    const a = ccw[tris[i]];
    const b = ccw[tris[i + 1]];
    const c = ccw[tris[i + 2]];
    const area = Math.abs((b[0] - a[0]) * (c[1] - a[1]) - (c[0] - a[0]) * (b[1] - a[1])) / 2;
    found.push({ area, c: [(a[0] + b[0] + c[0]) / 3, (a[1] + b[1] + c[1]) / 3] });
  }
  if (found.length === 0) throw new Error("outline could not be triangulated");
  found.sort((p, q) => q.area - p.area);
  return found[Math.min(rank, found.length - 1)].c;
}
