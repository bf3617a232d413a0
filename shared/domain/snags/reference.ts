// A deliberately plain, quadratic implementation of the same snag rules: linear scans instead of
// indexes, a naive copy-assignment loop instead of the Fenwick tree, O(n²) longest-decreasing.
// It exists as a cross-check for the engine in tests and as the baseline in the benchmark.
// It reuses the snag wording builders and the fit tables (ease ranges, point names), not the fit check:
// plainCheckFit below works the per-point ease out on its own.
import { availabilitySnag, doubleBookingSnag, rentalSnag } from "./bookings";
import { changeBreakSnag, distressBreakSnag, type CopyRecord } from "./continuity";
import { checkoutOverdueSnag } from "./checkouts";
import { finishSnag, sortSnags } from "./engine";
import { FIT_POINTS, easeRangeFor, fitSnagFromFacts, normalisePoint, type PointFit } from "./fit";
import { multiplesSnagFromPlan, type GroupDemand, type GroupPlan } from "./multiples";
import { quickChangeSnag } from "./quick-changes";
import type { AppearanceRec, EaseOverrides, GarmentRec, ProductionSnapshot, SceneRec, Snag, SnagDraft, SnagOptions } from "./types";

const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

interface Run {
  id: string;
  isShootDay: boolean;
  dates: string[];
  sceneIds: string[];
}

function stageOrderOf(s: SceneRec): number {
  return s.stageOrder ?? s.storyOrder;
}

function runsOf(s: ProductionSnapshot): Run[] {
  if (s.production.kind === "stage") {
    const order = [...s.scenes].sort((a, b) => stageOrderOf(a) - stageOrderOf(b) || cmp(a.id, b.id));
    const dates: string[] = [];
    for (const p of s.performances ?? []) if (!dates.includes(p.date)) dates.push(p.date);
    dates.sort();
    return [{ id: "running-order", isShootDay: false, dates, sceneIds: order.map((x) => x.id) }];
  }
  const days = [...s.shootDays].sort((a, b) => cmp(a.date, b.date) || cmp(a.id, b.id));
  return days.map((d) => ({
    id: d.id,
    isShootDay: true,
    dates: [d.date],
    sceneIds: d.sceneIds.filter((x) => s.scenes.some((sc) => sc.id === x)),
  }));
}

function findById<T extends { id: string }>(xs: readonly T[], id: string | null | undefined): T | undefined {
  return id == null ? undefined : xs.find((x) => x.id === id);
}

function appearancesInScene(s: ProductionSnapshot, sceneId: string): AppearanceRec[] {
  return s.appearances.filter((a) => a.sceneId === sceneId).sort((a, b) => cmp(a.characterId, b.characterId) || cmp(a.id, b.id));
}

function itemsOf(s: ProductionSnapshot, changeId: string) {
  return s.changeItems.filter((i) => i.changeId === changeId).sort((a, b) => cmp(a.id, b.id));
}

function copiesOf(s: ProductionSnapshot, groupId: string): string[] {
  const group = findById(s.multiplesGroups, groupId);
  if (!group) return [];
  const ids: string[] = [];
  for (const gid of group.garmentIds) if (findById(s.garments, gid) && !ids.includes(gid)) ids.push(gid);
  for (const g of s.garments) if (g.multiplesGroupId === groupId && !ids.includes(g.id)) ids.push(g.id);
  const num = (id: string) => findById(s.garments, id)?.copyNumber ?? Number.POSITIVE_INFINITY;
  return ids.sort((a, b) => (num(a) === num(b) ? cmp(a, b) : num(a) < num(b) ? -1 : 1));
}

function resolveEntries(s: ProductionSnapshot) {
  const out: { entry: (typeof s.continuityEntries)[number]; appearance: AppearanceRec }[] = [];
  for (const e of s.continuityEntries) {
    let app: AppearanceRec | undefined;
    if (e.appearanceId) app = findById(s.appearances, e.appearanceId);
    else if (e.sceneId && e.characterId) {
      app = s.appearances.filter((a) => a.sceneId === e.sceneId && a.characterId === e.characterId).sort((a, b) => cmp(a.id, b.id))[0];
    }
    if (app) out.push({ entry: e, appearance: app });
  }
  return out;
}

// ---------- fit ----------
function refFit(s: ProductionSnapshot): SnagDraft[] {
  const pairs: { garmentId: string; performerId: string; characterId: string; asDouble: boolean }[] = [];
  const add = (garmentId: string, performerId: string, characterId: string, asDouble: boolean) => {
    const cur = pairs.find((p) => p.garmentId === garmentId && p.performerId === performerId);
    if (!cur) pairs.push({ garmentId, performerId, characterId, asDouble });
    else if (characterId < cur.characterId || (characterId === cur.characterId && cur.asDouble && !asDouble)) {
      cur.characterId = characterId;
      cur.asDouble = asDouble;
    }
  };
  const garmentsOfChange = (changeId: string): string[] => {
    const out: string[] = [];
    for (const item of s.changeItems) {
      if (item.changeId !== changeId) continue;
      if (item.garmentId) out.push(item.garmentId);
      if (item.multiplesGroupId) out.push(...copiesOf(s, item.multiplesGroupId));
    }
    return out;
  };
  for (const change of s.changes) {
    const ch = findById(s.characters, change.characterId);
    if (!ch?.performerId) continue;
    for (const g of garmentsOfChange(change.id)) add(g, ch.performerId, ch.id, false);
  }
  for (const app of s.appearances) {
    if (!app.stunt) continue;
    const ch = findById(s.characters, app.characterId);
    if (!ch) continue;
    for (const g of garmentsOfChange(app.changeId)) for (const d of ch.doublePerformerIds) add(g, d, ch.id, true);
  }
  const out: SnagDraft[] = [];
  for (const p of pairs) {
    const garment = findById(s.garments, p.garmentId);
    const performer = findById(s.performers, p.performerId);
    if (!garment || !performer) continue;
    const snag = fitSnagFromFacts({
      garment,
      performerId: performer.id,
      performerName: performer.name,
      characterId: p.characterId,
      asDouble: p.asDouble,
      points: plainCheckFit(garment, performer.measurements ?? {}, s.production.easeOverrides),
    });
    if (snag) out.push(snag);
  }
  return out;
}

/**
 * Fit per point, written out plainly: ease = finished − body against the ease range; a knit girth may be
 * cut down to body / R (it stretches back to the body), so its lowest ease is body / R − body.
 */
function plainCheckFit(garment: GarmentRec, measurements: Record<string, number>, overrides: EaseOverrides | undefined): PointFit[] {
  const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);
  const out: PointFit[] = [];
  const done: string[] = [];
  for (const raw of Object.keys(garment.finished).sort()) {
    const point = normalisePoint(raw);
    const finished = garment.finished[raw];
    if (!has(FIT_POINTS, point) || done.includes(point) || typeof finished !== "number" || !Number.isFinite(finished)) continue;
    const def = FIT_POINTS[point]!;
    let bodyKey: string | null = null;
    for (const k of def.bodyKeys) {
      const v = has(measurements, k) ? measurements[k] : undefined;
      if (typeof v === "number" && Number.isFinite(v) && v > 0) {
        bodyKey = k;
        break;
      }
    }
    if (bodyKey === null) continue;
    const lookup = easeRangeFor(garment.category, point, garment.fitIntent, overrides);
    if (!lookup) continue;
    done.push(point);
    const body = measurements[bodyKey]!;
    const ease = finished - body;
    const r = garment.stretchRatio ?? null;
    const stretches = garment.construction === "knit" && def.kind === "girth" && r !== null && r > 1;
    const min = stretches ? Math.min(lookup.range.min, body / r - body) : lookup.range.min;
    const max = lookup.range.max;
    const tight = ease < min - 1e-3;
    const loose = !tight && max !== null && ease > max + 1e-3;
    out.push({
      point,
      bodyKey,
      finished,
      body,
      ease,
      min,
      max,
      stretchRatio: stretches ? r : null,
      status: tight ? "tight" : loose ? "loose" : "fits",
      by: tight ? min - ease : loose ? ease - max! : 0,
      source: lookup.source,
    });
  }
  return out;
}

// ---------- multiples ----------
/** O(n²) longest strictly decreasing subsequence (indices). */
function ldsQuadratic(levels: number[]): number[] {
  const len: number[] = [];
  const prev: number[] = [];
  let best = -1;
  for (let i = 0; i < levels.length; i++) {
    len[i] = 1;
    prev[i] = -1;
    for (let j = 0; j < i; j++) {
      if (levels[j] > levels[i] && len[j] + 1 > len[i]) {
        len[i] = len[j] + 1;
        prev[i] = j;
      }
    }
    if (best === -1 || len[i] > len[best]) best = i;
  }
  const out: number[] = [];
  for (let c = best; c !== -1; c = prev[c]) out.push(c);
  return out.reverse();
}

function refPlans(s: ProductionSnapshot, runs: Run[]): GroupPlan[] {
  const groupIds = s.multiplesGroups
    .map((g) => g.id)
    .filter((id, i, a) => a.indexOf(id) === i)
    .sort();
  const all: GroupDemand[] = [];
  const groupOf: string[] = [];
  let batch = 0;
  runs.forEach((run, day) => {
    for (const sceneId of run.sceneIds) {
      batch++;
      for (const app of appearancesInScene(s, sceneId)) {
        for (const item of itemsOf(s, app.changeId)) {
          if (!item.multiplesGroupId || !groupIds.includes(item.multiplesGroupId)) continue;
          groupOf.push(item.multiplesGroupId);
          all.push({
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
  const plans: GroupPlan[] = [];
  for (const gid of groupIds) {
    const demands = all.filter((_, i) => groupOf[i] === gid);
    if (demands.length === 0) continue;
    demands.sort(
      (a, b) => a.day - b.day || a.batch - b.batch || a.level - b.level || cmp(a.appearanceId, b.appearanceId) || cmp(a.itemId, b.itemId),
    );
    // Naive greedy: scan every copy for the largest top ≤ level that is free now.
    const copies: { top: number; lastBatch: number; outDay: number }[] = [];
    const copyOf: number[] = [];
    for (const d of demands) {
      let pick = -1;
      for (let c = 0; c < copies.length; c++) {
        const k = copies[c];
        if (k.top > d.level || k.lastBatch === d.batch || k.outDay === d.day) continue;
        if (pick === -1 || k.top > copies[pick].top) pick = c;
      }
      if (pick === -1) {
        pick = copies.length;
        copies.push({ top: d.level, lastBatch: -1, outDay: -1 });
      }
      copies[pick].top = d.level;
      copies[pick].lastBatch = d.batch;
      if (d.outForDay) copies[pick].outDay = d.day;
      copyOf.push(pick);
    }
    const copyIds = copiesOf(s, gid);
    plans.push({
      groupId: gid,
      groupName: findById(s.multiplesGroups, gid)?.name ?? gid,
      copyIds,
      copiesHeld: copyIds.length,
      copiesNeeded: copies.length,
      demands,
      copyOf,
      longestFalling: ldsQuadratic(demands.map((d) => d.level)),
    });
  }
  return plans;
}

// ---------- continuity ----------
function refChangeBreaks(s: ProductionSnapshot): SnagDraft[] {
  const out: SnagDraft[] = [];
  const sceneOf = s.appearances.map((a) => findById(s.scenes, a.sceneId));
  const before = (i: number, j: number) => {
    const a = s.appearances[i];
    const b = s.appearances[j];
    return (sceneOf[i]!.storyOrder - sceneOf[j]!.storyOrder || cmp(a.sceneId, b.sceneId) || cmp(a.id, b.id)) < 0;
  };
  for (let ci = 0; ci < s.appearances.length; ci++) {
    const cur = s.appearances[ci];
    if (!sceneOf[ci]) continue;
    let pi = -1;
    for (let oi = 0; oi < s.appearances.length; oi++) {
      const o = s.appearances[oi];
      if (oi === ci || o.characterId !== cur.characterId || !sceneOf[oi]) continue;
      if (before(oi, ci) && (pi === -1 || before(pi, oi))) pi = oi;
    }
    if (pi === -1) continue;
    const prev = s.appearances[pi];
    const sp = sceneOf[pi]!;
    const sc = sceneOf[ci]!;
    if (sp.storyDay !== sc.storyDay || prev.changeId === cur.changeId || cur.changeHere) continue;
    const chNo = (id: string) => {
      const c = findById(s.changes, id);
      return c ? String(c.number) : id;
    };
    out.push(
      changeBreakSnag({
        characterName: findById(s.characters, cur.characterId)?.name ?? cur.characterId,
        storyDay: sc.storyDay,
        prev: { appearance: prev, sceneNumber: sp.number, changeNumber: chNo(prev.changeId) },
        cur: { appearance: cur, sceneNumber: sc.number, changeNumber: chNo(cur.changeId) },
      }),
    );
  }
  return out;
}

function refRecords(s: ProductionSnapshot, plans: GroupPlan[]): CopyRecord[] {
  const out: CopyRecord[] = [];
  const push = (r: CopyRecord) => {
    if (!out.some((o) => o.copyId === r.copyId && o.recordId === r.recordId)) out.push(r);
  };
  const resolved = resolveEntries(s);
  const hasEntry = (appId: string) => resolved.some((r) => r.appearance.id === appId);
  const dateOf = (runId: string) => findById(s.shootDays, runId)?.date ?? findById(s.performances ?? [], runId)?.date ?? "";
  for (const { entry, appearance } of resolved) {
    const sc = findById(s.scenes, appearance.sceneId);
    if (!sc) continue;
    for (const gid of entry.garmentIds) {
      push({
        copyId: gid,
        garmentId: gid,
        groupId: findById(s.garments, gid)?.multiplesGroupId ?? null,
        recordId: `entry:${entry.id}`,
        appearanceId: appearance.id,
        characterId: appearance.characterId,
        sceneId: appearance.sceneId,
        storyOrder: sc.storyOrder,
        date: dateOf(entry.shootDayId),
        stage: entry.distressStage ?? appearance.distressStage,
      });
    }
  }
  for (const app of s.appearances) {
    if (hasEntry(app.id)) continue;
    const sc = findById(s.scenes, app.sceneId);
    if (!sc) continue;
    for (const item of s.changeItems) {
      if (item.changeId !== app.changeId || !item.garmentId) continue;
      push({
        copyId: item.garmentId,
        garmentId: item.garmentId,
        groupId: findById(s.garments, item.garmentId)?.multiplesGroupId ?? null,
        recordId: `app:${app.id}`,
        appearanceId: app.id,
        characterId: app.characterId,
        sceneId: app.sceneId,
        storyOrder: sc.storyOrder,
        date: "",
        stage: app.distressStage,
      });
    }
  }
  for (const plan of plans) {
    plan.demands.forEach((d, i) => {
      if (hasEntry(d.appearanceId)) return;
      const sc = findById(s.scenes, d.sceneId);
      if (!sc) return;
      const garmentId = plan.copyIds[plan.copyOf[i]] ?? null;
      push({
        copyId: garmentId ?? `${plan.groupId}#${plan.copyOf[i] + 1}`,
        garmentId,
        groupId: plan.groupId,
        recordId: `app:${d.appearanceId}`,
        appearanceId: d.appearanceId,
        characterId: d.characterId,
        sceneId: d.sceneId,
        storyOrder: sc.storyOrder,
        date: "",
        stage: d.level,
      });
    });
  }
  return out;
}

function refDistressBreaks(s: ProductionSnapshot, plans: GroupPlan[]): SnagDraft[] {
  const records = refRecords(s, plans);
  const before = (a: CopyRecord, b: CopyRecord) =>
    (a.storyOrder - b.storyOrder || cmp(a.sceneId, b.sceneId) || cmp(a.date, b.date) || cmp(a.recordId, b.recordId)) < 0;
  const label = (r: CopyRecord) => {
    const g = r.garmentId ? findById(s.garments, r.garmentId) : undefined;
    if (g) return `${g.tagCode} ${g.name}`;
    if (r.groupId) {
      const name = findById(s.multiplesGroups, r.groupId)?.name ?? r.groupId;
      return `copy #${r.copyId.slice(r.copyId.lastIndexOf("#") + 1)} of \u201c${name}\u201d`;
    }
    return r.copyId;
  };
  const num = (id: string) => findById(s.scenes, id)?.number ?? id;
  const out: SnagDraft[] = [];
  for (const cur of records) {
    let prev: CopyRecord | undefined;
    for (const o of records) {
      if (o.copyId !== cur.copyId || o === cur) continue;
      if (before(o, cur) && (!prev || before(prev, o))) prev = o;
    }
    if (prev && cur.stage < prev.stage) out.push(distressBreakSnag(prev, cur, label(cur), num));
  }
  return out;
}

// ---------- bookings ----------
interface Use {
  garmentId: string;
  runId: string;
  isShootDay: boolean;
  characterId: string;
  appearanceId: string;
  sceneId: string;
}

function refPinned(s: ProductionSnapshot, runs: Run[]): Use[] {
  const out: Use[] = [];
  const resolved = resolveEntries(s);
  const isStage = s.production.kind === "stage";
  const recorded: string[] = [];
  if (!isStage) {
    for (const { entry, appearance } of resolved) {
      if (!runs.some((r) => r.isShootDay && r.id === entry.shootDayId)) continue;
      recorded.push(`${appearance.id}|${entry.shootDayId}`);
      for (const gid of entry.garmentIds) {
        out.push({
          garmentId: gid,
          runId: entry.shootDayId,
          isShootDay: true,
          characterId: appearance.characterId,
          appearanceId: appearance.id,
          sceneId: appearance.sceneId,
        });
      }
    }
  }
  for (const run of runs) {
    for (const sceneId of run.sceneIds) {
      for (const app of s.appearances) {
        if (app.sceneId !== sceneId || recorded.includes(`${app.id}|${run.id}`)) continue;
        for (const item of s.changeItems) {
          if (item.changeId !== app.changeId || !item.garmentId) continue;
          out.push({
            garmentId: item.garmentId,
            runId: run.id,
            isShootDay: run.isShootDay,
            characterId: app.characterId,
            appearanceId: app.id,
            sceneId,
          });
        }
      }
    }
  }
  return out;
}

function refBookings(s: ProductionSnapshot, runs: Run[], plans: GroupPlan[], today: string): SnagDraft[] {
  const uses = refPinned(s, runs);
  const resolved = resolveEntries(s);
  const out: SnagDraft[] = [];
  for (const g of s.garments) {
    if (findById(s.garments, g.id) !== g) continue; // first record wins for duplicate ids
    const mineAll = uses.filter((u) => u.garmentId === g.id);
    for (const run of runs) {
      const here = mineAll.filter((u) => u.runId === run.id);
      const charIds = Array.from(new Set(here.map((u) => u.characterId))).sort();
      if (charIds.length < 2) continue;
      out.push(
        doubleBookingSnag({
          garment: g,
          runId: run.id,
          isShootDay: run.isShootDay,
          runLabel: run.isShootDay ? `on shoot day ${run.dates[0]}` : "in the running order (every performance)",
          characters: charIds.map((cid) => {
            const mine = here.filter((u) => u.characterId === cid);
            const sceneIds = Array.from(new Set(mine.map((u) => u.sceneId))).sort();
            return {
              id: cid,
              name: findById(s.characters, cid)?.name ?? cid,
              sceneIds,
              sceneNumbers: sceneIds.map((x) => findById(s.scenes, x)?.number ?? x),
              appearanceIds: Array.from(new Set(mine.map((u) => u.appearanceId))).sort(),
            };
          }),
        }),
      );
    }
    // Dates this garment is needed.
    const runDates = (runId: string): string[] =>
      runs.find((r) => r.id === runId)?.dates ??
      (findById(s.shootDays, runId) ? [findById(s.shootDays, runId)!.date] : undefined) ??
      (findById(s.performances ?? [], runId) ? [findById(s.performances ?? [], runId)!.date] : []);
    const dates: string[] = [];
    const addRun = (runId: string) => {
      for (const d of runDates(runId)) if (!dates.includes(d)) dates.push(d);
    };
    for (const u of mineAll) addRun(u.runId);
    for (const { entry } of resolved) if (entry.garmentIds.includes(g.id)) addRun(entry.shootDayId);
    for (const plan of plans) plan.demands.forEach((d, i) => plan.copyIds[plan.copyOf[i]] === g.id && addRun(d.runId));
    dates.sort();
    if (dates.length === 0) continue;
    const r = rentalSnag(g, dates);
    if (r) out.push(r);
    const a = availabilitySnag(g, dates, today);
    if (a) out.push(a);
  }
  return out;
}

// ---------- quick changes ----------
function refQuickChanges(s: ProductionSnapshot): SnagDraft[] {
  if (s.production.kind !== "stage") return [];
  const order = [...s.scenes].sort((a, b) => stageOrderOf(a) - stageOrderOf(b) || cmp(a.id, b.id));
  const posOfApp = s.appearances.map((a) => order.findIndex((x) => x.id === a.sceneId));
  const out: SnagDraft[] = [];
  const threshold = s.production.quickChangeThresholdMin;
  for (let bi = 0; bi < s.appearances.length; bi++) {
    const b = s.appearances[bi];
    const pb = posOfApp[bi];
    if (pb < 0) continue;
    let a: AppearanceRec | undefined;
    let pa = -1;
    for (let oi = 0; oi < s.appearances.length; oi++) {
      const o = s.appearances[oi];
      if (oi === bi || o.characterId !== b.characterId) continue;
      const po = posOfApp[oi];
      if (po < 0) continue;
      const earlier = po < pb || (po === pb && o.id < b.id);
      const later = !a || po > pa || (po === pa && o.id > a.id);
      if (earlier && later) {
        a = o;
        pa = po;
      }
    }
    if (!a || a.changeId === b.changeId || pa === pb) continue;
    let minutes = 0;
    let unknown = 0;
    for (let p = pa + 1; p < pb; p++) {
      minutes += order[p].runningMinutes ?? 0;
      if (order[p].runningMinutes == null) unknown++;
    }
    if (minutes >= threshold) continue;
    const chNo = (id: string) => {
      const c = findById(s.changes, id);
      return c ? String(c.number) : id;
    };
    out.push(
      quickChangeSnag({
        characterId: b.characterId,
        characterName: findById(s.characters, b.characterId)?.name ?? b.characterId,
        from: { appearance: a, sceneNumber: order[pa].number, changeNumber: chNo(a.changeId) },
        to: { appearance: b, sceneNumber: order[pb].number, changeNumber: chNo(b.changeId) },
        between: order.slice(pa + 1, Math.min(pb, pa + 13)).map((x) => ({ sceneNumber: x.number, minutes: x.runningMinutes ?? null })),
        betweenCount: pb - pa - 1,
        unknownCount: unknown,
        minutes,
        threshold,
      }),
    );
  }
  return out;
}

/** Quadratic reference implementation of computeSnags (same rules, no indexes). */
function refCheckouts(s: ProductionSnapshot, today: string): SnagDraft[] {
  const out: SnagDraft[] = [];
  const stage = s.production.kind === "stage";
  for (const c of s.checkouts ?? []) {
    const g = findById(s.garments, c.garmentId);
    if (!g) continue;
    const day = findById(s.shootDays, c.shootDayId) ?? findById(s.performances ?? [], c.shootDayId);
    const d = checkoutOverdueSnag({
      checkout: c,
      tagCode: g.tagCode,
      garmentName: g.name,
      dayText: day ? `${stage ? "performance" : "shoot day"} ${day.date}` : null,
      sceneNumber: findById(s.scenes, c.sceneId)?.number ?? null,
      today,
    });
    if (d) out.push(d);
  }
  return out;
}

export function computeSnagsReference(snapshot: ProductionSnapshot, options: SnagOptions): Snag[] {
  const runs = runsOf(snapshot);
  const plans = refPlans(snapshot, runs);
  const num = (id: string) => findById(snapshot.scenes, id)?.number ?? id;
  const drafts: SnagDraft[] = [
    ...refFit(snapshot),
    ...plans.map((p) => multiplesSnagFromPlan(p, num)).filter((x): x is SnagDraft => x !== null),
    ...refChangeBreaks(snapshot),
    ...refDistressBreaks(snapshot, plans),
    ...refBookings(snapshot, runs, plans, options.today),
    ...refQuickChanges(snapshot),
    ...refCheckouts(snapshot, options.today),
  ];
  return sortSnags(drafts.map(finishSnag));
}
