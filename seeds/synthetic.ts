// A synthetic feature-scale production for benchmarks, engine tests and `npm run seed -- --scale N`:
// 400 scenes, 90 shoot days, 80 characters, 3,000 garments and 600 multiples groups per unit of scale,
// seeded so it repeats. Shoot days are numbered from 0 and dated from `start`, which the caller gives:
// the scaled seed the demo's anchor day, the benchmark the clock's today, a test its own fixed day.
import { easeRangeFor } from "../shared/domain/snags/fit.js";
import { addCalendarDays } from "../shared/calendar-days.js";
import type {
  AppearanceRec,
  ChangeItemRec,
  ContinuityEntryRec,
  GarmentRec,
  ProductionSnapshot,
  ShootDayRec,
} from "../shared/domain/snags/types.js";

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
  jacket: [
    ["chest", "chest_girth"],
    ["waist", "waist_girth"],
    ["sleeve", "arm_length"],
  ],
  coat: [
    ["chest", "chest_girth"],
    ["hip", "hip_girth"],
    ["sleeve", "arm_length"],
  ],
  shirt: [
    ["chest", "chest_girth"],
    ["neck", "neck_girth"],
    ["sleeve", "arm_length"],
  ],
  waistcoat: [
    ["chest", "chest_girth"],
    ["waist", "waist_girth"],
  ],
  dress: [
    ["bust", "chest_girth"],
    ["waist", "waist_girth"],
    ["hip", "hip_girth"],
  ],
  knit_top: [
    ["bust", "chest_girth"],
    ["waist", "waist_girth"],
  ],
  trousers: [
    ["waist", "waist_girth"],
    ["hip", "hip_girth"],
    ["inside_leg", "inside_leg_length"],
  ],
  skirt: [
    ["waist", "waist_girth"],
    ["hip", "hip_girth"],
  ],
};

/** Invented production at `scale` × (400 scenes, 90 shoot days, 80 characters, 3,000 garments, 600 groups). */
export function buildSyntheticProduction(scale: number, { start, seed = 20270104 }: { start: string; seed?: number }): ProductionSnapshot {
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
  const shootDays: ShootDayRec[] = Array.from({ length: nDays }, (_, d) => ({
    id: `sd-${d}`,
    date: addCalendarDays(start, d),
    sceneIds: [],
  }));
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
      rentalDueDate: rented ? addCalendarDays(start, int(nDays / 2, nDays + 20)) : null,
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
        continuityEntries.push({
          id: `ce-${en++}`,
          appearanceId: a.id,
          shootDayId: day.id,
          garmentIds: gids,
          distressStage: a.distressStage,
        });
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
