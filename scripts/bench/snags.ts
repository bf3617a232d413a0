// Benchmark: full snag recompute on a synthetic feature-scale production and at 10×, against the
// quadratic reference. Seeded, so runs repeat. Run: npx tsx scripts/bench/snags.ts [--reference-10x]
import { pathToFileURL } from "node:url";
import { format } from "date-fns";
import { addCalendarDays } from "../../shared/calendar-days";
import { computeSnags } from "../../shared/domain/snags/engine";
import { computeSnagsReference } from "../../shared/domain/snags/reference";
import type { ProductionSnapshot } from "../../shared/domain/snags/types";
import { buildSyntheticProduction } from "../../seeds/synthetic";

export { buildSyntheticProduction, mulberry32 } from "../../seeds/synthetic";

/** Median wall time and median process CPU time of `repeats` runs (after one warm-up run unless told otherwise).
 * CPU time is printed too because on a shared machine wall time also counts waiting for a core. */
function time<T>(fn: () => T, repeats: number, warmUp = true): { ms: number; cpuMs: number; result: T } {
  let result = warmUp ? fn() : (undefined as T);
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    result = fn();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  const median = (xs: number[]) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  return { ms: median(wall), cpuMs: median(cpu), result };
}

export interface SnagBenchResult {
  scale1: { appearances: number; snags: number; engineMs: number; engineCpuMs: number; referenceMs: number; ratio: number };
  scale10: {
    appearances: number;
    snags: number;
    engineMs: number;
    engineCpuMs: number;
    referenceMs: number | null;
    ratio: number | null;
  };
  growth: number;
  growthCpu: number;
}

/** Run the benchmark and print the figures; pass referenceAt10x to also time the quadratic reference at 10×. */
export function runSnagBench(options: { referenceAt10x?: boolean; log?: (line: string) => void } = {}): SnagBenchResult {
  const log = options.log ?? ((l: string) => console.log(l));
  // The shoot began four weeks ago.
  const today = format(new Date(), "yyyy-MM-dd");
  const start = addCalendarDays(today, -28);
  const s1 = buildSyntheticProduction(1, { start });
  const s10 = buildSyntheticProduction(10, { start });
  const e1 = time(() => computeSnags(s1, { today }), 21);
  const r1 = time(() => computeSnagsReference(s1, { today }), 1, false);
  const e10 = time(() => computeSnags(s10, { today }), 7);
  const same1 = e1.result.map((s) => s.key + s.evidenceHash).join() === r1.result.map((s) => s.key + s.evidenceHash).join();
  let r10: { ms: number; result: unknown[] } | null = null;
  if (options.referenceAt10x) r10 = time(() => computeSnagsReference(s10, { today }), 1, false);
  const growth = e10.ms / e1.ms;
  const growthCpu = e10.cpuMs / e1.cpuMs;
  const describe = (s: ProductionSnapshot) =>
    `${s.scenes.length} scenes, ${s.shootDays.length} shoot days, ${s.characters.length} characters, ` +
    `${s.garments.length} garments, ${s.multiplesGroups.length} groups, ${s.appearances.length} appearances`;
  log(`snags 1x : ${describe(s1)}`);
  log(
    `  engine ${e1.ms.toFixed(1)} ms wall (${e1.cpuMs.toFixed(1)} ms CPU), reference ${r1.ms.toFixed(1)} ms, ` +
      `ratio ${(r1.ms / e1.ms).toFixed(1)}x, ${e1.result.length} snags, reference agrees: ${same1}`,
  );
  log(`snags 10x: ${describe(s10)}`);
  log(
    `  engine ${e10.ms.toFixed(1)} ms wall (${e10.cpuMs.toFixed(1)} ms CPU), ${e10.result.length} snags` +
      (r10
        ? `, reference ${r10.ms.toFixed(0)} ms, ratio ${(r10.ms / e10.ms).toFixed(1)}x`
        : ", reference not run at 10x (about 100x its 1x time; pass --reference-10x)"),
  );
  log(
    `  growth 1x -> 10x: ${growth.toFixed(1)}x wall, ${growthCpu.toFixed(1)}x CPU (target <= ~12x); ` +
      `medians of 21 (1x) and 7 (10x) runs`,
  );
  return {
    scale1: {
      appearances: s1.appearances.length,
      snags: e1.result.length,
      engineMs: e1.ms,
      engineCpuMs: e1.cpuMs,
      referenceMs: r1.ms,
      ratio: r1.ms / e1.ms,
    },
    scale10: {
      appearances: s10.appearances.length,
      snags: e10.result.length,
      engineMs: e10.ms,
      engineCpuMs: e10.cpuMs,
      referenceMs: r10 ? r10.ms : null,
      ratio: r10 ? r10.ms / e10.ms : null,
    },
    growth,
    growthCpu,
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runSnagBench({ referenceAt10x: process.argv.includes("--reference-10x") });
}
