// Benchmark: mesh the demo change (Elias Marr's jacket, shirt and trousers: 16 panels, 11 seams) for
// simulation at the default 10 mm target and print time, triangle count and the smallest angle.
import { pathToFileURL } from "node:url";
import { demoPanels, demoSeams } from "../../seeds/doubles-patterns.js";
import { DEFAULT_MESH_EDGE_MM, meshPanelsForSimulation } from "../../shared/domain/panels/mesh.js";

/** Runs the meshing benchmark and prints its figures; returns them too. */
export function runMeshingBench(targetEdgeMm = DEFAULT_MESH_EDGE_MM): {
  ms: number;
  triangles: number;
  vertices: number;
  minAngleDeg: number;
  stitchPairs: number;
} {
  const panels = demoPanels.map((p) => ({ id: p.key, outline: p.outline }));
  const seams = demoSeams.map((s) => ({
    id: s.key,
    a: { panelId: s.a.panel, from: s.a.from, to: s.a.to, direction: s.a.direction },
    b: { panelId: s.b.panel, from: s.b.from, to: s.b.to, direction: s.b.direction },
  }));
  const t0 = performance.now();
  const r = meshPanelsForSimulation(panels, seams, { targetEdgeMm });
  const ms = performance.now() - t0;
  const triangles = r.meshes.reduce((n, m) => n + m.triangles.length / 3, 0);
  const vertices = r.meshes.reduce((n, m) => n + m.vertices.length, 0);
  const minAngleDeg = Math.min(...r.meshes.map((m) => m.minAngleDeg));
  const stitchPairs = r.stitches.reduce((n, s) => n + s.a.indices.length, 0);
  console.log(`meshing: demo change, ${panels.length} panels and ${seams.length} seams at ${targetEdgeMm} mm`);
  console.log(`  time            ${ms.toFixed(0)} ms`);
  console.log(`  triangles       ${triangles} (${vertices} vertices)`);
  console.log(`  smallest angle  ${minAngleDeg.toFixed(2)}° (target ≥ ${r.minAngleTargetDeg}°)`);
  console.log(`  stitch pairs    ${stitchPairs} over ${r.stitches.length} seams (${r.skipped.length} skipped)`);
  return { ms, triangles, vertices, minAngleDeg, stitchPairs };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runMeshingBench();
}
