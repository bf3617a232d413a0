// Benchmark: nest an invented 30-copy shirt/jacket set on 150 cm cloth (145 cm usable): the first
// layout, then the local search within a 10 s budget; prints time, marker efficiency and marker
// length against the area lower bound.
import { pathToFileURL } from "node:url";
import { nestPieces, type NestPiece } from "../../shared/domain/panels/nesting";
import type { Point } from "../../shared/domain/panels/geometry";

/** Samples a quadratic Bézier curve from a to b with control c (excluding a, including b). */
function curve(a: Point, c: Point, b: Point, steps = 6): Point[] {
  const out: Point[] = [];
  for (let i = 1; i <= steps; i++) {
    const t = i / steps;
    const u = 1 - t;
    out.push([u * u * a[0] + 2 * u * t * c[0] + t * t * b[0], u * u * a[1] + 2 * u * t * c[1] + t * t * b[1]]);
  }
  return out;
}

function rect(w: number, h: number): Point[] {
  return [
    [0, 0],
    [w, 0],
    [w, h],
    [0, h],
  ];
}

/** Invented jacket/shirt pieces, cut lines in mm, drafted with the grain along y. */
export function benchPieces(): NestPiece[] {
  const front: Point[] = [
    [0, 0],
    [310, 0],
    [300, 480],
    ...curve([300, 480], [240, 500], [225, 600]),
    [230, 710],
    [95, 740],
    ...curve([95, 740], [90, 650], [0, 640]),
  ];
  const back: Point[] = [
    [0, 0],
    [290, 0],
    [285, 490],
    ...curve([285, 490], [230, 520], [225, 640]),
    [215, 735],
    [70, 755],
    ...curve([70, 755], [60, 735], [0, 735]),
  ];
  const sleeve: Point[] = [
    [40, 0],
    [300, 0],
    [370, 470],
    ...curve([370, 470], [330, 640], [190, 650], 8),
    ...curve([190, 650], [40, 640], [0, 470], 8),
  ];
  const underSleeve: Point[] = [[30, 0], [230, 0], [260, 430], ...curve([260, 430], [130, 520], [0, 430], 8)];
  const collar: Point[] = [[0, 0], ...curve([0, 0], [225, -30], [450, 0], 8), [440, 90], ...curve([440, 90], [225, 60], [10, 90], 8)];
  const stand: Point[] = [[0, 0], ...curve([0, 0], [210, -15], [420, 0], 6), [415, 40], ...curve([415, 40], [210, 25], [5, 40], 6)];
  const facing: Point[] = [
    [0, 0],
    [90, 0],
    [90, 560],
    ...curve([90, 560], [100, 660], [160, 700]),
    [140, 740],
    ...curve([140, 740], [40, 700], [0, 600]),
  ];
  const backFacing: Point[] = [[0, 0], ...curve([0, 0], [190, 60], [380, 0], 8), [380, 80], ...curve([380, 80], [190, 140], [0, 80], 8)];
  const pocket: Point[] = [
    [0, 40],
    ...curve([0, 40], [0, 0], [40, 0], 4),
    [120, 0],
    ...curve([120, 0], [160, 0], [160, 40], 4),
    [160, 180],
    [0, 180],
  ];
  const bias = (w: number, h: number): Point[] => rect(w, h);
  return [
    { id: "front", name: "Front bodice", outline: front, cutCount: 2, mirrored: true },
    { id: "back", name: "Back bodice", outline: back, cutCount: 2, mirrored: true },
    { id: "sleeve", name: "Top sleeve", outline: sleeve, cutCount: 2, mirrored: true },
    { id: "under-sleeve", name: "Under sleeve", outline: underSleeve, cutCount: 2, mirrored: true },
    {
      id: "collar",
      name: "Collar",
      outline: collar,
      cutCount: 2,
      grainline: [
        [0, 45],
        [450, 45],
      ],
    },
    {
      id: "stand",
      name: "Collar stand",
      outline: stand,
      cutCount: 2,
      grainline: [
        [0, 20],
        [420, 20],
      ],
    },
    {
      id: "cuff",
      name: "Cuff",
      outline: rect(260, 70),
      cutCount: 4,
      grainline: [
        [0, 35],
        [260, 35],
      ],
    },
    { id: "facing", name: "Front facing", outline: facing, cutCount: 2, mirrored: true },
    {
      id: "back-facing",
      name: "Back neck facing",
      outline: backFacing,
      cutCount: 1,
      grainline: [
        [190, 0],
        [190, 80],
      ],
    },
    { id: "pocket", name: "Patch pocket", outline: pocket, cutCount: 2 },
    { id: "flap", name: "Pocket flap", outline: rect(170, 60), cutCount: 4 },
    { id: "yoke", name: "Yoke", outline: rect(450, 120), cutCount: 2 },
    { id: "placket", name: "Sleeve placket", outline: rect(30, 250), cutCount: 2, grainMode: "free" },
    {
      id: "binding",
      name: "Bias binding",
      outline: bias(40, 600),
      cutCount: 1,
      grainMode: "bias",
      grainline: [
        [0, 0],
        [40, 40],
      ],
    },
  ];
}

/** Process CPU time, ms: the search budget in the bench, so other work on a shared machine does not eat into it (a browser worker has its own core). */
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/** Runs the nesting benchmark and prints its figures; returns them too. */
export function runNestingBench(budgetMs = 10_000): {
  ms: number;
  efficiency: number;
  ratioToLowerBound: number;
  copies: number;
  firstRatio: number;
  evaluations: number;
} {
  const pieces = benchPieces();
  const copies = pieces.reduce((s, p) => s + p.cutCount, 0);
  const t0 = performance.now();
  const first = nestPieces(pieces, { usableWidthMm: 1450 });
  const firstMs = performance.now() - t0;
  let evaluations = 0;
  const t1 = performance.now();
  const c1 = cpuMs();
  const result = nestPieces(pieces, {
    usableWidthMm: 1450,
    search: { seed: 1, timeBudgetMs: budgetMs, now: cpuMs, onProgress: (p) => (evaluations = p.evaluations) },
  });
  const ms = performance.now() - t1;
  const cpu = cpuMs() - c1;
  const ratio = result.markerLengthMm / result.lowerBoundMm;
  const firstRatio = first.markerLengthMm / first.lowerBoundMm;
  console.log(`nesting: ${copies} copies of ${pieces.length} pieces on 150 cm cloth (1450 mm usable)`);
  console.log(
    `  first layout    ${firstMs.toFixed(0)} ms, ${(first.markerLengthMm / 10).toFixed(1)} cm, efficiency ${(first.efficiency * 100).toFixed(1)} %, length / bound ${firstRatio.toFixed(3)}`,
  );
  console.log(
    `  local search    ${(cpu / 1000).toFixed(1)} s CPU (${(ms / 1000).toFixed(1)} s wall), budget ${(budgetMs / 1000).toFixed(0)} s CPU, seed 1, ${evaluations} layouts`,
  );
  console.log(`  marker length   ${(result.markerLengthMm / 10).toFixed(1)} cm (lower bound ${(result.lowerBoundMm / 10).toFixed(1)} cm)`);
  console.log(`  efficiency      ${(result.efficiency * 100).toFixed(1)} %`);
  console.log(`  length / bound  ${ratio.toFixed(3)} (target ≤ 1.18)`);
  console.log(`  unplaced        ${result.unplaced.length}`);
  return { ms, efficiency: result.efficiency, ratioToLowerBound: ratio, copies, firstRatio, evaluations };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runNestingBench();
}
