// Benchmark: full snag recompute on a synthetic feature-scale production and at 10×, against the
// quadratic reference. Seeded, so runs repeat. Run: npx tsx scripts/bench/snags.ts [--reference-10x]
import { pathToFileURL } from "node:url";
import { computeSnags } from "../../shared/domain/snags/engine";
import { easeRangeFor } from "../../shared/domain/snags/fit";
import { computeSnagsReference } from "../../shared/domain/snags/reference";
import type {
  AppearanceRec,
  ChangeItemRec,
  ContinuityEntryRec,
  GarmentRec,
  ProductionSnapshot,
  ShootDayRec,
} from "../../shared/domain/snags/types";

/** Small seeded PRNG (mulberry32) returning floats in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const CATEGORIES = ["jacket", "shirt", "trousers", "dress", "waistcoat", "coat", "skirt", "knit_top"] as const;
const POINTS: Record<string, [string, string][]> = {
  jacket: [["chest", "chest_girth"], ["waist", "waist_girth"], ["sleeve", "arm_length"]],
  coat: [["chest", "chest_girth"], ["hip", "hip_girth"], ["sleeve", "arm_length"]],
  shirt: [["chest", "chest_girth"], ["neck", "neck_girth"], ["sleeve", "arm_length"]],
  waistcoat: [["chest", "chest_girth"], ["waist", "waist_girth"]],
  dress: [["bust", "chest_girth"], ["waist", "waist_girth"], ["hip", "hip_girth"]],
  knit_top: [["bust", "chest_girth"], ["waist", "waist_girth"]],
  trousers: [["waist", "waist_girth"], ["hip", "hip_girth"], ["inside_leg", "inside_leg_length"]],
  skirt: [["waist", "waist_girth"], ["hip", "hip_girth"]],
};

function addDays(iso: string, n: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

/** Invented production at `scale` × (400 scenes, 90 shoot days, 80 characters, 3,000 garments, 600 groups). */
export function buildSyntheticProduction(scale = 1, seed = 20270104): ProductionSnapshot {
  const rnd = mulberry32(seed);
  const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
  const nScenes = Math.max(2, Math.round(400 * scale));
  const nDays = Math.max(1, Math.round(90 * scale));
  const nChars = Math.max(2, Math.round(80 * scale));
  const nGarments = Math.max(4, Math.round(3000 * scale));
  const nGroups = Math.max(1, Math.round(600 * scale));
  const storyDays = Math.max(1, Math.round(nScenes / 10));
  const changesPerChar = 6;
  const start = "2027-01-04";

  const scenes = Array.from({ length: nScenes }, (_, i) => ({
    id: `sc-${i}`,
    number: String(i + 1),
    storyDay: Math.floor((i * storyDays) / nScenes) + 1,
    storyOrder: i + 1,
  }));

  // Shoot out of story order: shuffle, then cut into days of varying length.
  const order = scenes.map((s) => s.id);
  for (let i = order.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1));
    [order[i], order[j]] = [order[j], order[i]];
  }
  const shootDays: ShootDayRec[] = Array.from({ length: nDays }, (_, d) => ({ id: `sd-${d}`, date: addDays(start, d), sceneIds: [] }));
  order.forEach((sid, i) => shootDays[Math.min(nDays - 1, Math.floor((i * nDays) / order.length))].sceneIds.push(sid));
  // A few scenes are split over two days.
  for (const sid of order) if (rnd() < 0.03) pick(shootDays).sceneIds.push(sid);

  const performers = [];
  const characters = [];
  for (let c = 0; c < nChars; c++) {
    const doubles: string[] = [];
    if (c % 4 === 0) doubles.push(`pf-d${c}`);
    characters.push({ id: `ch-${c}`, name: `Character ${c + 1}`, performerId: `pf-${c}`, doublePerformerIds: doubles });
    for (const pid of [`pf-${c}`, ...doubles]) {
      performers.push({
        id: pid,
        name: `Performer ${pid.slice(3)}`,
        measurements: {
          chest_girth: int(850, 1150),
          waist_girth: int(680, 1000),
          hip_girth: int(880, 1150),
          neck_girth: int(330, 420),
          arm_length: int(560, 660),
          inside_leg_length: int(730, 860),
        },
      });
    }
  }
  const bodyOf = new Map(performers.map((p) => [p.id, p.measurements as Record<string, number>]));

  const changes = [];
  for (let c = 0; c < nChars; c++) {
    for (let k = 0; k < changesPerChar; k++) changes.push({ id: `cg-${c}-${k}`, characterId: `ch-${c}`, number: k + 1 });
  }

  // Garments: 60 % sit in multiples groups (2–4 copies, the rest singles); each has an owning character.
  const garments: GarmentRec[] = [];
  const groups: { id: string; name: string; garmentIds: string[] }[] = [];
  const owner = (i: number) => i % nChars;
  const makeGarment = (i: number, ownerChar: number, groupId: string | null, copy: number | null): GarmentRec => {
    const category = CATEGORIES[i % CATEGORIES.length];
    const body = bodyOf.get(`pf-${ownerChar}`)!;
    const fitIntent = pick(["fitted", "regular", "loose"] as const);
    const finished: Record<string, number> = {};
    for (const [pt, key] of POINTS[category]) {
      // Mostly inside the ease band for the intent; about one point in eight is off by 1–4 cm.
      const band = easeRangeFor(category, pt, fitIntent)?.range ?? { min: 0, max: 50 };
      const hi = band.max ?? band.min + 60;
      const ease = rnd() < 0.88 ? band.min + rnd() * (hi - band.min) : rnd() < 0.5 ? band.min - int(10, 40) : hi + int(10, 40);
      finished[pt] = Math.round(body[key] + ease);
    }
    const rented = rnd() < 0.15;
    const r = rnd();
    return {
      id: `g-${i}`,
      tagCode: `T${String(i).padStart(5, "0")}`,
      name: `${category} ${i}`,
      category,
      fitIntent,
      construction: category === "knit_top" ? "knit" : "woven",
      stretchRatio: category === "knit_top" ? 1.25 : null,
      finished,
      source: rented ? "rented" : pick(["built", "bought"] as const),
      rentalDueDate: rented ? addDays(start, int(nDays / 2, nDays + 20)) : null,
      status: r < 0.01 ? "lost" : r < 0.02 ? "workroom" : r < 0.03 ? "cleaning" : "in_stock",
      multiplesGroupId: groupId,
      copyNumber: copy,
    };
  };
  let gi = 0;
  const groupBudget = Math.round(nGarments * 0.6);
  for (let g = 0; g < nGroups; g++) {
    const copies = Math.max(1, Math.min(4, Math.round(groupBudget / nGroups) + int(-1, 1)));
    const id = `mg-${g}`;
    const ids: string[] = [];
    for (let k = 0; k < copies && gi < nGarments; k++) {
      garments.push(makeGarment(gi, owner(g), id, k + 1));
      ids.push(`g-${gi}`);
      gi++;
    }
    groups.push({ id, name: `Group ${g + 1}`, garmentIds: ids });
  }
  const firstSingle = gi;
  for (; gi < nGarments; gi++) garments.push(makeGarment(gi, owner(gi - firstSingle), null, null));

  // Change items: each character's groups and singles spread over its changes.
  const changeItems: ChangeItemRec[] = [];
  let itemNo = 0;
  groups.forEach((g, i) => {
    const c = owner(i);
    changeItems.push({ id: `ci-${itemNo++}`, changeId: `cg-${c}-${i % changesPerChar}`, garmentId: null, multiplesGroupId: g.id });
  });
  for (let i = firstSingle; i < nGarments; i++) {
    const c = owner(i - firstSingle);
    const k = Math.floor(rnd() * changesPerChar);
    // A few garments are shared between two characters (a double-booking source).
    const cc = rnd() < 0.01 ? (c + 1) % nChars : c;
    changeItems.push({ id: `ci-${itemNo++}`, changeId: `cg-${cc}-${k}`, garmentId: `g-${i}`, multiplesGroupId: null });
  }

  // Appearances: 3–7 characters per scene; change follows the story day; a quarter of the
  // characters get a distress arc.
  const appearances: AppearanceRec[] = [];
  const arc = new Set<number>();
  for (let c = 0; c < nChars; c++) if (rnd() < 0.5) arc.add(c);
  for (const sc of scenes) {
    const k = int(3, 7);
    const chosen = new Set<number>();
    while (chosen.size < Math.min(k, nChars)) chosen.add(int(0, nChars - 1));
    for (const c of chosen) {
      const changeK = Math.min(changesPerChar - 1, Math.floor(((sc.storyDay - 1) * changesPerChar) / storyDays));
      // Distress rises through the story days a change is worn (0..3), with rare breakdown slips.
      const within = ((sc.storyDay - 1) * changesPerChar) / storyDays - changeK;
      const stage = arc.has(c) ? Math.min(3, Math.floor(within * 4)) + (rnd() < 0.03 ? -1 : 0) : 0;
      appearances.push({
        id: `ap-${sc.id}-${c}`,
        sceneId: sc.id,
        characterId: `ch-${c}`,
        changeId: `cg-${c}-${changeK}`,
        distressStage: Math.max(0, stage),
        wet: rnd() < 0.03,
        stunt: rnd() < 0.03,
        blood: rnd() < 0.02,
        vfxShot: rnd() < 0.05,
        changeHere: false,
      });
    }
  }
  // Mark changes where the breakdown has them, leaving about 2 % unmarked.
  const byChar = new Map<string, AppearanceRec[]>();
  for (const a of appearances) {
    const l = byChar.get(a.characterId) ?? [];
    l.push(a);
    byChar.set(a.characterId, l);
  }
  const storyOf = new Map(scenes.map((s) => [s.id, s]));
  for (const l of byChar.values()) {
    l.sort((a, b) => storyOf.get(a.sceneId)!.storyOrder - storyOf.get(b.sceneId)!.storyOrder);
    for (let i = 1; i < l.length; i++) if (l[i].changeId !== l[i - 1].changeId && rnd() > 0.02) l[i].changeHere = true;
  }

  // Continuity entries for the first third of the shoot days (already shot).
  const continuityEntries: ContinuityEntryRec[] = [];
  const appsByScene = new Map<string, AppearanceRec[]>();
  for (const a of appearances) {
    const l = appsByScene.get(a.sceneId) ?? [];
    l.push(a);
    appsByScene.set(a.sceneId, l);
  }
  const itemsByChange = new Map<string, ChangeItemRec[]>();
  for (const it of changeItems) {
    const l = itemsByChange.get(it.changeId) ?? [];
    l.push(it);
    itemsByChange.set(it.changeId, l);
  }
  let en = 0;
  for (const day of shootDays.slice(0, Math.floor(nDays / 3))) {
    for (const sid of day.sceneIds) {
      for (const a of appsByScene.get(sid) ?? []) {
        const gids = (itemsByChange.get(a.changeId) ?? []).flatMap((it) => (it.garmentId ? [it.garmentId] : []));
        continuityEntries.push({ id: `ce-${en++}`, appearanceId: a.id, shootDayId: day.id, garmentIds: gids, distressStage: a.distressStage });
      }
    }
  }

  return {
    production: { id: "pr-bench", kind: "film", quickChangeThresholdMin: 3 },
    scenes,
    shootDays,
    characters,
    performers,
    changes,
    changeItems,
    appearances,
    garments,
    multiplesGroups: groups,
    continuityEntries,
  };
}

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
  const today = "2027-02-01";
  const s1 = buildSyntheticProduction(1);
  const s10 = buildSyntheticProduction(10);
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
  log(`  engine ${e1.ms.toFixed(1)} ms wall (${e1.cpuMs.toFixed(1)} ms CPU), reference ${r1.ms.toFixed(1)} ms, ` +
    `ratio ${(r1.ms / e1.ms).toFixed(1)}x, ${e1.result.length} snags, reference agrees: ${same1}`);
  log(`snags 10x: ${describe(s10)}`);
  log(`  engine ${e10.ms.toFixed(1)} ms wall (${e10.cpuMs.toFixed(1)} ms CPU), ${e10.result.length} snags` +
    (r10
      ? `, reference ${r10.ms.toFixed(0)} ms, ratio ${(r10.ms / e10.ms).toFixed(1)}x`
      : ", reference not run at 10x (about 100x its 1x time; pass --reference-10x)"));
  log(`  growth 1x -> 10x: ${growth.toFixed(1)}x wall, ${growthCpu.toFixed(1)}x CPU (target <= ~12x); ` +
    `medians of 21 (1x) and 7 (10x) runs`);
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
