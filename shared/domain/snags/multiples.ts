// Multiples: how many copies of one garment design a schedule needs when distress is
// irreversible and scenes are shot out of story order, and which copy to use where.
//
// One copy can only move up in distress (or stay), so it covers a non-decreasing run of the
// required stages in shoot order. The minimum number of copies is the minimum cover of the
// sequence by non-decreasing subsequences, which by Dilworth's theorem equals the length of the
// longest strictly decreasing subsequence; patience sorting finds both in O(n log n).
//
// Day rule (extension). Two more things stop one copy serving two uses:
//  - a wet or stunt use takes its copy out of use for the rest of that shoot day (or performance);
//  - uses in the same scene on the same day happen at once, so they need different copies.
// "Use i can be followed by use j on one copy" (i earlier, level_i ≤ level_j, not the same scene
// occurrence, not (i wet/stunt and same day)) is still transitive, so it is a partial order and
// Dilworth still says: minimum copies = largest set of pairwise incompatible uses.
// Algorithm: walk uses in shoot order; inside one scene occurrence take them by rising level.
// Each use goes on the available copy with the largest top ≤ its level (lowest copy number on
// ties), or a new copy. A copy used in the current scene waits until the scene ends; a copy used
// wet/stunt waits until the day ends. Available copies are bucketed by level rank with a Fenwick
// tree over ranks ("largest rank ≤ r that has a copy"), so each use costs O(log n) and every copy
// is released at most once per use: O(n log n) overall. The tests check the count against an
// exhaustive minimum cover for small n.
// Stage: every performance plays the same running order, so one performance is planned (the
// copies are reset between shows). Not modelled: a group shared by several characters may hand
// one copy from one character to another on the same day when their scenes do not overlap.
import type { CopyAssignment, JsonValue, SnagDraft, SnapshotIndex } from "./types";

/** Indices of one longest strictly decreasing subsequence of `levels` (O(n log n)). */
export function longestStrictlyDecreasing(levels: readonly number[]): number[] {
  // tails[k] = index ending the best decreasing run of length k+1 (its last value is the largest possible).
  const tails: number[] = [];
  const prev: number[] = new Array(levels.length).fill(-1);
  for (let i = 0; i < levels.length; i++) {
    const x = levels[i];
    // first k with levels[tails[k]] <= x (tails' last values are strictly decreasing in k)
    let lo = 0;
    let hi = tails.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (levels[tails[mid]] <= x) hi = mid;
      else lo = mid + 1;
    }
    prev[i] = lo > 0 ? tails[lo - 1] : -1;
    tails[lo] = i;
  }
  const out: number[] = [];
  let cur = tails.length ? tails[tails.length - 1] : -1;
  while (cur !== -1) {
    out.push(cur);
    cur = prev[cur];
  }
  return out.reverse();
}

/** Patience sorting without the day rule: piles of indices, each non-decreasing in level.
 * Each level goes on the pile whose top is the largest value ≤ it, else a new pile. */
export function patienceCover(levels: readonly number[]): number[][] {
  const piles: number[][] = [];
  const tops: number[] = []; // strictly decreasing from pile 0 onwards
  for (let i = 0; i < levels.length; i++) {
    const x = levels[i];
    let lo = 0;
    let hi = tops.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (tops[mid] <= x) hi = mid;
      else lo = mid + 1;
    }
    if (lo === tops.length) {
      piles.push([i]);
      tops.push(x);
    } else {
      piles[lo].push(i);
      tops[lo] = x;
    }
  }
  return piles;
}

/** One use of a copy: required level, day number and scene-occurrence number (both non-decreasing in shoot order). */
export interface CopyDemand {
  level: number;
  day: number;
  batch: number;
  /** Wet or stunt: the copy is out of use for the rest of the day. */
  outForDay: boolean;
}

export interface CopyPlan {
  copies: number;
  /** 0-based copy for each demand (same order as the input). */
  copyOf: number[];
}

// Small binary min-heap on number arrays (copy ids), so ties go to the lowest copy number.
function heapPush(h: number[], v: number): void {
  h.push(v);
  let i = h.length - 1;
  while (i > 0) {
    const p = (i - 1) >> 1;
    if (h[p] <= h[i]) break;
    [h[p], h[i]] = [h[i], h[p]];
    i = p;
  }
}
function heapPop(h: number[]): number {
  const top = h[0];
  const last = h.pop() as number;
  if (h.length > 0) {
    h[0] = last;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < h.length && h[l] < h[m]) m = l;
      if (r < h.length && h[r] < h[m]) m = r;
      if (m === i) break;
      [h[m], h[i]] = [h[i], h[m]];
      i = m;
    }
  }
  return top;
}

/** Minimum copies under distress order plus the day rule, with a copy for each demand (see file header). */
export function assignCopies(demands: readonly CopyDemand[]): CopyPlan {
  const n = demands.length;
  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => {
    const da = demands[a];
    const db = demands[b];
    return da.day - db.day || da.batch - db.batch || da.level - db.level || a - b;
  });
  const ranks = Array.from(new Set(demands.map((d) => d.level))).sort((a, b) => a - b);
  const rankOf = new Map<number, number>();
  ranks.forEach((v, i) => rankOf.set(v, i));
  const L = ranks.length;
  const fen = new Array<number>(L + 1).fill(0);
  const fenAdd = (r: number, d: number) => {
    for (let i = r + 1; i <= L; i += i & -i) fen[i] += d;
  };
  const fenPrefix = (r: number): number => {
    let s = 0;
    for (let i = r + 1; i > 0; i -= i & -i) s += fen[i];
    return s;
  };
  let logStep = 1;
  while (logStep * 2 <= L) logStep *= 2;
  // smallest rank whose prefix count reaches c
  const fenFind = (c: number): number => {
    let pos = 0;
    for (let step = logStep; step > 0; step >>= 1) {
      if (pos + step <= L && fen[pos + step] < c) {
        pos += step;
        c -= fen[pos];
      }
    }
    return pos; // 0-based rank
  };
  const buckets: number[][] = Array.from({ length: L }, () => []);
  const topRank: number[] = [];
  const copyOf = new Array<number>(n).fill(-1);
  let waitScene: number[] = [];
  let waitDay: number[] = [];
  const release = (list: number[]) => {
    for (const c of list) {
      heapPush(buckets[topRank[c]], c);
      fenAdd(topRank[c], 1);
    }
  };
  let curDay = Number.NaN;
  let curBatch = Number.NaN;
  for (const i of order) {
    const d = demands[i];
    if (d.day !== curDay) {
      release(waitScene);
      release(waitDay);
      waitScene = [];
      waitDay = [];
      curDay = d.day;
      curBatch = d.batch;
    } else if (d.batch !== curBatch) {
      release(waitScene);
      waitScene = [];
      curBatch = d.batch;
    }
    const r = rankOf.get(d.level) as number;
    const have = fenPrefix(r);
    let copy: number;
    if (have === 0) {
      copy = topRank.length;
      topRank.push(r);
    } else {
      const rr = fenFind(have);
      copy = heapPop(buckets[rr]);
      fenAdd(rr, -1);
      topRank[copy] = r;
    }
    copyOf[i] = copy;
    (d.outForDay ? waitDay : waitScene).push(copy);
  }
  return { copies: topRank.length, copyOf };
}

/** One demand on a multiples group: a change item of an appearance in a scheduled scene. */
export interface GroupDemand extends CopyDemand {
  appearanceId: string;
  sceneId: string;
  characterId: string;
  itemId: string;
  runId: string;
  isShootDay: boolean;
}

/** The copy plan of one multiples group. */
export interface GroupPlan {
  groupId: string;
  groupName: string;
  /** The group's garments in copy order (#1 first). */
  copyIds: string[];
  copiesHeld: number;
  copiesNeeded: number;
  /** Demands in shoot order (scene occurrences in order, rising level inside one). */
  demands: GroupDemand[];
  copyOf: number[];
  /** Indices into demands of one longest strictly decreasing run of levels. */
  longestFalling: number[];
}

/** Sort demands into the canonical shoot order used by every consumer. */
export function sortDemands(ds: GroupDemand[]): GroupDemand[] {
  return ds.sort(
    (a, b) =>
      a.day - b.day ||
      a.batch - b.batch ||
      a.level - b.level ||
      (a.appearanceId < b.appearanceId ? -1 : a.appearanceId > b.appearanceId ? 1 : 0) ||
      (a.itemId < b.itemId ? -1 : a.itemId > b.itemId ? 1 : 0),
  );
}

/** Plan one group from its demands (already in canonical order). */
export function planGroup(groupId: string, groupName: string, copyIds: string[], demands: GroupDemand[]): GroupPlan {
  const { copies, copyOf } = assignCopies(demands);
  return {
    groupId,
    groupName,
    copyIds,
    copiesHeld: copyIds.length,
    copiesNeeded: copies,
    demands,
    copyOf,
    longestFalling: longestStrictlyDecreasing(demands.map((d) => d.level)),
  };
}

/** Demands per group from the schedule, in one pass over scheduled scenes. */
export function groupDemands(ix: SnapshotIndex): Map<string, GroupDemand[]> {
  const byGroup = new Map<string, GroupDemand[]>();
  let batch = 0;
  ix.runs.forEach((run, day) => {
    for (const sceneId of run.sceneIds) {
      batch++;
      for (const app of ix.appearancesByScene.get(sceneId) ?? []) {
        for (const item of ix.itemsByChange.get(app.changeId) ?? []) {
          const gid = item.multiplesGroupId;
          if (!gid || !ix.groupsById.has(gid)) continue;
          let list = byGroup.get(gid);
          if (!list) byGroup.set(gid, (list = []));
          list.push({
            level: app.distressStage,
            day,
            batch,
            outForDay: app.wet || app.stunt,
            appearanceId: app.id,
            sceneId,
            characterId: app.characterId,
            itemId: item.id,
            runId: run.id,
            isShootDay: run.isShootDay,
          });
        }
      }
    }
  });
  for (const list of byGroup.values()) sortDemands(list);
  return byGroup;
}

/** Copy plans for every multiples group that the schedule uses, sorted by group id. */
export function planMultiples(ix: SnapshotIndex): GroupPlan[] {
  const byGroup = groupDemands(ix);
  const ids = Array.from(byGroup.keys()).sort();
  return ids.map((gid) => {
    const g = ix.groupsById.get(gid);
    return planGroup(gid, g?.name ?? gid, ix.groupCopies.get(gid) ?? [], byGroup.get(gid) ?? []);
  });
}

function uniq(xs: string[]): string[] {
  return Array.from(new Set(xs));
}

/** Copy index → appearances/scenes/shoot days, from a plan. */
export function assignmentOf(plan: GroupPlan): CopyAssignment[] {
  const out: CopyAssignment[] = [];
  for (let c = 0; c < plan.copiesNeeded; c++) {
    out.push({ copy: c + 1, garmentId: plan.copyIds[c] ?? null, appearanceIds: [], sceneIds: [], shootDayIds: [] });
  }
  plan.demands.forEach((d, i) => {
    const a = out[plan.copyOf[i]];
    a.appearanceIds.push(d.appearanceId);
    a.sceneIds.push(d.sceneId);
    if (d.isShootDay) a.shootDayIds.push(d.runId);
  });
  for (const a of out) {
    a.appearanceIds = uniq(a.appearanceIds);
    a.sceneIds = uniq(a.sceneIds);
    a.shootDayIds = uniq(a.shootDayIds);
  }
  return out;
}

function listNumbers(xs: (string | number)[], max = 30): string {
  return xs.length > max ? `${xs.slice(0, max).join(", ")}, \u2026 (${xs.length} in all)` : xs.join(", ");
}

/** The multiples snag for a plan (blocking when the group holds too few copies), else null. */
export function multiplesSnagFromPlan(plan: GroupPlan, sceneNumber: (sceneId: string) => string): SnagDraft | null {
  if (plan.copiesNeeded <= plan.copiesHeld) return null;
  const levels = plan.demands.map((d) => d.level);
  const lf = plan.longestFalling;
  const assignment = assignmentOf(plan);
  const chars = uniq(plan.demands.map((d) => d.characterId));
  const copies = (n: number) => `${n} ${n === 1 ? "copy" : "copies"}`;
  let explanation =
    `The group holds ${copies(plan.copiesHeld)} but ${plan.copiesNeeded} are needed. ` +
    `In shoot order the scenes ask for distress stages ${listNumbers(levels)}; ` +
    (lf.length > 1
      ? `the longest strictly falling run is ${lf.map((i) => levels[i]).join(" \u2192 ")} ` +
        `(scenes ${lf.map((i) => sceneNumber(plan.demands[i].sceneId)).join(", ")}), ` +
        `and distress cannot be undone, so at least ${copies(lf.length)}.`
      : `the stages never fall, so distress alone needs ${copies(lf.length)}.`);
  if (plan.copiesNeeded > lf.length) {
    explanation +=
      ` Wet or stunt scenes (the copy is out of use for the rest of that day) and copies worn side by side` +
      ` in one scene raise this to ${plan.copiesNeeded}.`;
  }
  if (plan.demands.some((d) => d.outForDay)) {
    explanation +=
      " Wet and stunt costumes: agree drying, padding and quick-release fastenings with the stunt coordinator" +
      " and follow local safety rules.";
  }
  explanation +=
    " Plan: " +
    assignment.map((a) => `copy #${a.copy} \u2192 scenes ${listNumbers(uniq(a.sceneIds.map(sceneNumber)), 12)}`).join("; ") +
    ".";
  const evidence: { [k: string]: JsonValue } = {
    copiesHeld: plan.copiesHeld,
    copiesNeeded: plan.copiesNeeded,
    longestFalling: lf.length,
    stages: levels,
    sceneIds: plan.demands.map((d) => d.sceneId),
    runIds: plan.demands.map((d) => d.runId),
    outOfUseForDay: plan.demands.flatMap((d, i) => (d.outForDay ? [i] : [])),
  };
  return {
    key: `multiples:${plan.groupId}`,
    kind: "multiples",
    severity: "blocking",
    title: `Multiples \u201c${plan.groupName}\u201d: ${copies(plan.copiesHeld)}, ${plan.copiesNeeded} needed`,
    explanation,
    subject: {
      groupId: plan.groupId,
      ...(chars.length === 1 ? { characterId: chars[0] } : {}),
      sceneIds: uniq(plan.demands.map((d) => d.sceneId)),
      shootDayIds: uniq(plan.demands.filter((d) => d.isShootDay).map((d) => d.runId)),
      appearanceIds: uniq(plan.demands.map((d) => d.appearanceId)),
    },
    evidence,
    assignment,
  };
}

/** Multiples snags from the plans. */
export function multiplesSnags(ix: SnapshotIndex, plans: GroupPlan[]): SnagDraft[] {
  const num = (id: string) => ix.scenesById.get(id)?.number ?? id;
  const out: SnagDraft[] = [];
  for (const p of plans) {
    const s = multiplesSnagFromPlan(p, num);
    if (s) out.push(s);
  }
  return out;
}
