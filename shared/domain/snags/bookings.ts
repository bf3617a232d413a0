// Bookings: one garment copy on two characters the same day, rentals due back before their last
// scene, and garments that are not available (workroom, cleaning, returned, lost) when needed.
import type { GarmentRec, GarmentStatus, JsonValue, SnagDraft, SnapshotIndex } from "./types";
import { calendarDaysBetween } from "../../calendar-days";
import type { GroupPlan } from "./multiples";
import { formatDate } from "../../format";

const cmpStr = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** A garment pinned to a character on a run (shoot day, or the running order on stage). */
export interface PinnedUse {
  garmentId: string;
  runId: string;
  isShootDay: boolean;
  characterId: string;
  appearanceId: string;
  sceneId: string;
}

/** Facts for a double booking: one garment, one run, two or more characters. */
export interface DoubleBookingFacts {
  garment: GarmentRec;
  runId: string;
  isShootDay: boolean;
  runLabel: string;
  /** Per character (sorted by id): name and the scenes/appearances. */
  characters: { id: string; name: string; sceneNumbers: string[]; appearanceIds: string[]; sceneIds: string[] }[];
}

/** The blocking snag for a garment on two characters the same day. */
export function doubleBookingSnag(f: DoubleBookingFacts): SnagDraft {
  const who = f.characters.map((c) => `${c.name} (scene${c.sceneNumbers.length > 1 ? "s" : ""} ${c.sceneNumbers.join(", ")})`);
  const evidence: { [k: string]: JsonValue } = {
    runId: f.runId,
    characterIds: f.characters.map((c) => c.id),
    appearanceIds: f.characters.flatMap((c) => c.appearanceIds).sort(),
  };
  return {
    key: `booking:${f.garment.id}:${f.runId}`,
    kind: "booking",
    severity: "blocking",
    title: `${f.garment.tagCode} ${f.garment.name} booked for ${f.characters.length} characters ${f.runLabel}`,
    explanation:
      `${f.garment.tagCode} ${f.garment.name} is worn by ${who.join(" and ")} ${f.runLabel}; ` +
      `one copy cannot dress ${f.characters.length} characters on the same day.`,
    subject: {
      garmentId: f.garment.id,
      sceneIds: Array.from(new Set(f.characters.flatMap((c) => c.sceneIds))).sort(),
      shootDayIds: f.isShootDay ? [f.runId] : [],
      appearanceIds: f.characters.flatMap((c) => c.appearanceIds).sort(),
    },
    evidence,
  };
}

/** Calls `visit` for each pinned use, in pinnedUses order, building nothing per use. */
export function forEachPinnedUse(
  ix: SnapshotIndex,
  visit: (garmentId: string, runId: string, isShootDay: boolean, characterId: string, appearanceId: string, sceneId: string) => void,
): void {
  const recorded = new Map<string, Set<string>>(); // shoot day → appearances with an entry that day
  const shootDayIds = new Set<string>();
  for (const r of ix.runs) if (r.isShootDay) shootDayIds.add(r.id);
  if (!ix.isStage) {
    for (const { entry, appearance } of ix.resolvedEntries) {
      if (!shootDayIds.has(entry.shootDayId)) continue;
      let set = recorded.get(entry.shootDayId);
      if (!set) recorded.set(entry.shootDayId, (set = new Set()));
      set.add(appearance.id);
      for (const gid of entry.garmentIds) visit(gid, entry.shootDayId, true, appearance.characterId, appearance.id, appearance.sceneId);
    }
  }
  for (const run of ix.runs) {
    const done = recorded.get(run.id);
    for (const sceneId of run.sceneIds) {
      for (const app of ix.appearancesByScene.get(sceneId) ?? []) {
        if (done?.has(app.id)) continue;
        for (const item of ix.itemsByChange.get(app.changeId) ?? []) {
          if (item.garmentId) visit(item.garmentId, run.id, run.isShootDay, app.characterId, app.id, sceneId);
        }
      }
    }
  }
}

/** Garments pinned to characters per run: direct change items (unless a continuity entry
 * records what was worn that day) and continuity entries (film/series). Only garments that
 * pass `keep` are listed (all by default). */
export function pinnedUses(ix: SnapshotIndex, keep?: (garmentId: string) => boolean): PinnedUse[] {
  const out: PinnedUse[] = [];
  forEachPinnedUse(ix, (garmentId, runId, isShootDay, characterId, appearanceId, sceneId) => {
    if (!keep || keep(garmentId)) out.push({ garmentId, runId, isShootDay, characterId, appearanceId, sceneId });
  });
  return out;
}

/** Plain label for a run: "on shoot day Wed 4 Mar 2026" or "in the running order (every performance)". */
export function runLabelOf(ix: SnapshotIndex, runId: string): string {
  const run = ix.runs.find((r) => r.id === runId);
  if (run && run.isShootDay) return `on shoot day ${formatDate(run.dates[0]!)}`;
  const day = ix.snapshot.shootDays.find((d) => d.id === runId);
  if (day) return `on shoot day ${formatDate(day.date)}`;
  return "in the running order (every performance)";
}

/** Double-booking snags. Uses are grouped by garment; most garments dress one character only,
 * so only the rest are sorted by day to find days with two or more characters. */
export function doubleBookingSnags(ix: SnapshotIndex, uses: PinnedUse[] = pinnedUses(ix)): SnagDraft[] {
  const byGarment = new Map<string, PinnedUse[]>();
  for (const u of uses) {
    let list = byGarment.get(u.garmentId);
    if (!list) byGarment.set(u.garmentId, (list = []));
    list.push(u);
  }
  const labels = new Map<string, string>();
  for (const r of ix.runs)
    labels.set(r.id, r.isShootDay ? `on shoot day ${formatDate(r.dates[0]!)}` : "in the running order (every performance)");
  const out: SnagDraft[] = [];
  for (const [garmentId, list] of byGarment) {
    const garment = ix.garmentsById.get(garmentId);
    if (!garment || list.every((u) => u.characterId === list[0].characterId)) continue;
    list.sort((a, b) => cmpStr(a.runId, b.runId) || cmpStr(a.characterId, b.characterId));
    for (let i = 0; i < list.length;) {
      let j = i;
      while (j < list.length && list[j].runId === list[i].runId) j++;
      const day = list.slice(i, j);
      if (day[0].characterId !== day[day.length - 1].characterId) {
        const charIds = Array.from(new Set(day.map((u) => u.characterId)));
        out.push(
          doubleBookingSnag({
            garment,
            runId: day[0].runId,
            isShootDay: day[0].isShootDay,
            runLabel: labels.get(day[0].runId) ?? runLabelOf(ix, day[0].runId),
            characters: charIds.map((cid) => {
              const mine = day.filter((u) => u.characterId === cid);
              const sceneIds = Array.from(new Set(mine.map((u) => u.sceneId))).sort();
              return {
                id: cid,
                name: ix.charactersById.get(cid)?.name ?? cid,
                sceneIds,
                sceneNumbers: sceneIds.map((x) => ix.scenesById.get(x)?.number ?? x),
                appearanceIds: Array.from(new Set(mine.map((u) => u.appearanceId))).sort(),
              };
            }),
          }),
        );
      }
      i = j;
    }
  }
  return out;
}

/** Dates a garment is needed: pinned uses, continuity entries and planned multiples copies (garments passing `keep`). */
export function neededDates(
  ix: SnapshotIndex,
  plans: GroupPlan[],
  uses: PinnedUse[] = pinnedUses(ix),
  keep?: (garmentId: string) => boolean,
): Map<string, string[]> {
  const datesOfRun = new Map<string, string[]>();
  for (const r of ix.runs) datesOfRun.set(r.id, r.dates);
  for (const d of ix.snapshot.shootDays) if (!datesOfRun.has(d.id)) datesOfRun.set(d.id, [d.date]);
  for (const p of ix.snapshot.performances ?? []) if (!datesOfRun.has(p.id)) datesOfRun.set(p.id, [p.date]);
  const acc = new Map<string, Set<string>>();
  const add = (gid: string, runId: string) => {
    if (keep && !keep(gid)) return;
    const ds = datesOfRun.get(runId);
    if (!ds || ds.length === 0) return;
    let s = acc.get(gid);
    if (!s) acc.set(gid, (s = new Set()));
    for (const d of ds) s.add(d);
  };
  for (const u of uses) add(u.garmentId, u.runId);
  for (const { entry } of ix.resolvedEntries) for (const gid of entry.garmentIds) add(gid, entry.shootDayId);
  for (const plan of plans) {
    plan.demands.forEach((d, i) => {
      const gid = plan.copyIds[plan.copyOf[i]];
      if (gid) add(gid, d.runId);
    });
  }
  const out = new Map<string, string[]>();
  for (const [gid, s] of acc) out.set(gid, Array.from(s).sort());
  return out;
}

/** The rental snag when a rented garment is due back before its last needed date, else null. */
export function rentalSnag(g: GarmentRec, dates: string[]): SnagDraft | null {
  if (g.source !== "rented" || !g.rentalDueDate || dates.length === 0) return null;
  const last = dates[dates.length - 1];
  if (last <= g.rentalDueDate) return null;
  const after = dates.filter((d) => d > g.rentalDueDate!);
  const late = calendarDaysBetween(g.rentalDueDate, last);
  return {
    key: `rental:${g.id}`,
    kind: "rental",
    severity: "warning",
    title: `Rental ${g.tagCode} ${g.name} due back ${formatDate(g.rentalDueDate)}, needed until ${formatDate(last)}`,
    explanation:
      `${g.tagCode} ${g.name} is rented and due back on ${formatDate(g.rentalDueDate)}, but it is needed on ${after.length} ` +
      `later day${after.length === 1 ? "" : "s"}, the last on ${formatDate(last)} (${late} day${late === 1 ? "" : "s"} after the due date). ` +
      `Extend the rental, buy it out or plan a replacement.`,
    subject: { garmentId: g.id },
    evidence: { dueDate: g.rentalDueDate, lastNeeded: last, daysLate: late, datesAfterDue: after },
  };
}

const GONE: GarmentStatus[] = ["returned", "lost"];
const AWAY: GarmentStatus[] = ["workroom", "cleaning"];

/** The availability snag for a garment not in a usable state on a day it is needed, else null. */
export function availabilitySnag(g: GarmentRec, dates: string[], today: string): SnagDraft | null {
  const upcoming = dates.filter((d) => d >= today);
  if (upcoming.length === 0) return null;
  if (GONE.includes(g.status)) {
    return {
      key: `availability:${g.id}`,
      kind: "availability",
      severity: "blocking",
      title: `${g.tagCode} ${g.name} is ${g.status} but needed from ${upcoming[0]}`,
      explanation:
        `${g.tagCode} ${g.name} has status \u201c${g.status}\u201d, yet ${upcoming.length} upcoming ` +
        `day${upcoming.length === 1 ? " needs" : "s need"} it, the first on ${upcoming[0]} and the last on ${upcoming[upcoming.length - 1]}.`,
      subject: { garmentId: g.id },
      evidence: { status: g.status, firstNeeded: upcoming[0], lastNeeded: upcoming[upcoming.length - 1] },
    };
  }
  if (AWAY.includes(g.status) && upcoming[0] === today) {
    return {
      key: `availability:${g.id}`,
      kind: "availability",
      severity: "blocking",
      title: `${g.tagCode} ${g.name} is in ${g.status === "workroom" ? "the workroom" : "cleaning"} and needed today`,
      explanation: `${g.tagCode} ${g.name} has status \u201c${g.status}\u201d and is needed today, ${today}.`,
      subject: { garmentId: g.id },
      evidence: { status: g.status, neededOn: today },
    };
  }
  return null;
}

/** All booking, rental and availability snags. */
export function bookingSnags(ix: SnapshotIndex, plans: GroupPlan[], today: string): SnagDraft[] {
  // Only two kinds of garment can give a snag here: one pinned to two or more characters (double
  // booking) and one that is rented or not available (dates needed). Find them in a pass that builds
  // nothing per use, then build uses and dates for those garments alone.
  const firstCharacter = new Map<string, string>();
  const shared = new Set<string>();
  forEachPinnedUse(ix, (gid, _run, _isDay, characterId) => {
    const first = firstCharacter.get(gid);
    if (first === undefined) firstCharacter.set(gid, characterId);
    else if (first !== characterId) shared.add(gid);
  });
  const needsDates = (gid: string): boolean => {
    const g = ix.garmentsById.get(gid);
    return g !== undefined && ((g.source === "rented" && !!g.rentalDueDate) || GONE.includes(g.status) || AWAY.includes(g.status));
  };
  const uses = pinnedUses(ix, (gid) => shared.has(gid) || needsDates(gid));
  const out = doubleBookingSnags(ix, uses);
  for (const [gid, dates] of neededDates(ix, plans, uses, needsDates)) {
    const g = ix.garmentsById.get(gid);
    if (!g) continue;
    const r = rentalSnag(g, dates);
    if (r) out.push(r);
    const a = availabilitySnag(g, dates, today);
    if (a) out.push(a);
  }
  return out;
}
