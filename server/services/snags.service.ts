// Snags: load one production as a plain snapshot (one raw query per table), run the pure engine,
// merge the department's dismissals and resolve names and links for the client.
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { SnagDismissal, User } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { buildPlan } from "./workroom.service.js";
import { clock, productionTimeZone } from "../lib/clock.js";
import { VersionedCache } from "../lib/versioned-cache.js";
import { zonedParts } from "../lib/zoned-time.js";
import type { Actor } from "../middleware/require-auth.js";
import {
  GARMENT_FACTS_SQL,
  currentMeasurementsSql,
  easeOverridesOf,
  garmentRecOf,
  measurementValuesOf,
  type GarmentFactsRow,
} from "./fit-facts.js";
import { computeMultiplesPlans, computeSnags } from "@shared/domain/snags/engine.js";
import { mergeSameCause } from "@shared/domain/snags/merge.js";
import { scheduleLabels } from "@shared/domain/schedule-labels.js";
import type {
  AppearanceRec,
  CharacterRec,
  CheckoutRec,
  ContinuityEntryRec,
  GarmentRec,
  PerformanceRec,
  ProductionSnapshot,
  ShootDayRec,
  Snag,
} from "@shared/domain/snags/types.js";
import {
  snagKinds,
  snagSeverities,
  type DismissSnagInput,
  type ListSnagsQuery,
  type MultiplesPlanDto,
  type SnagCounts,
  type SnagDismissalDto,
  type SnagDto,
  type SnagLinkDto,
  type SnagListDto,
} from "@shared/schemas/snags.js";

/** Quick-change threshold when the production sets none (minutes; common practice, no source). */
export const DEFAULT_QUICK_CHANGE_MIN = 3;

/** What the engine needs plus what the client needs to read the answer (names, dates, kinds). */
export interface LoadedProduction {
  snapshot: ProductionSnapshot;
  /** Every shoot day and performance, by date. */
  days: { id: string; date: string; kind: "shoot" | "performance" }[];
  /** The production's time zone ("today" is judged there). */
  timeZone: string;
}

type Row = Record<string, unknown>;

const num = (v: unknown): number | null => {
  if (v === null || v === undefined || v === "") return null;
  const n = typeof v === "number" ? v : Number(v);
  return Number.isFinite(n) ? n : null;
};

/**
 * Reads the production into the engine's plain snapshot: one query per table, all production-scoped.
 * Garments, measurements and ease ranges become fit facts through ./fit-facts.ts, as in the fitting view.
 */
export async function loadSnapshot(productionId: string): Promise<LoadedProduction> {
  const q = <T extends Row>(sql: string) => sequelize.query<T>(sql, { replacements: { pid: productionId }, type: QueryTypes.SELECT });
  const [
    productions,
    scenes,
    days,
    dayScenes,
    characters,
    doubles,
    performers,
    measurements,
    changes,
    items,
    appearances,
    garments,
    groups,
    entries,
    checkouts,
  ] = await Promise.all([
    q(`SELECT id, kind, settings FROM productions WHERE id = :pid`),
    q(`SELECT id, number, story_day, story_order, running_minutes FROM scenes WHERE production_id = :pid ORDER BY story_order, id`),
    q(`SELECT id, to_char(date, 'YYYY-MM-DD') AS date, kind, to_char(starts_at, 'HH24:MI') AS starts_at
         FROM shoot_days WHERE production_id = :pid ORDER BY date, day_number`),
    q(`SELECT shoot_day_id, scene_id FROM shoot_day_scenes WHERE production_id = :pid ORDER BY shoot_day_id, position, id`),
    q(`SELECT id, name, performer_id FROM characters WHERE production_id = :pid ORDER BY sort_order, name`),
    q(`SELECT character_id, performer_id FROM character_doubles WHERE production_id = :pid ORDER BY character_id, performer_id`),
    q(`SELECT id, name FROM performers WHERE production_id = :pid`),
    // The newest set per performer is the current one.
    q(currentMeasurementsSql()),
    q(`SELECT id, character_id, number FROM changes WHERE production_id = :pid`),
    q(`SELECT id, change_id, garment_id, multiples_group_id FROM change_items WHERE production_id = :pid`),
    q(`SELECT id, scene_id, character_id, change_id, distress_stage, wet, stunt, blood, vfx_shot, change_here
         FROM appearances WHERE production_id = :pid`),
    q(GARMENT_FACTS_SQL),
    q(`SELECT id, name FROM multiples_groups WHERE production_id = :pid`),
    // Entries whose scene or character went while they waited on a phone are for review, not for rules.
    q(`SELECT e.id, e.shoot_day_id, e.scene_id, e.character_id, e.distress_stage,
              COALESCE(array_agg(eg.garment_id ORDER BY eg.garment_id) FILTER (WHERE eg.garment_id IS NOT NULL), '{}') AS garment_ids
         FROM continuity_entries e LEFT JOIN continuity_entry_garments eg ON eg.continuity_entry_id = e.id
         WHERE e.production_id = :pid AND e.scene_id IS NOT NULL AND e.character_id IS NOT NULL GROUP BY e.id`),
    // Open check-outs only: a returned garment is nobody's snag.
    q(`SELECT id, garment_id, to_name, to_performer_id, to_char(due_back_on, 'YYYY-MM-DD') AS due_back_on,
              checked_out_at,
              shoot_day_id, scene_id
         FROM garment_checkouts WHERE production_id = :pid AND returned_at IS NULL ORDER BY id`),
  ]);
  const prod = productions[0];
  if (!prod) throw NotFoundError("Production not found.");
  const settings = (prod.settings ?? {}) as { quickChangeThresholdMin?: unknown; easeOverrides?: unknown; timeZone?: string };
  const timeZone = productionTimeZone({ settings });

  const sceneIdsOfDay = new Map<string, string[]>();
  for (const r of dayScenes) {
    const d = r.shoot_day_id as string;
    let l = sceneIdsOfDay.get(d);
    if (!l) sceneIdsOfDay.set(d, (l = []));
    l.push(r.scene_id as string);
  }
  const shootDays: ShootDayRec[] = [];
  const performances: PerformanceRec[] = [];
  for (const d of days) {
    if (d.kind === "performance")
      performances.push({ id: d.id as string, date: d.date as string, startsAt: (d.starts_at as string | null) ?? "19:30" });
    else shootDays.push({ id: d.id as string, date: d.date as string, sceneIds: sceneIdsOfDay.get(d.id as string) ?? [] });
  }

  const doublesOf = new Map<string, string[]>();
  for (const r of doubles) {
    const c = r.character_id as string;
    const l = doublesOf.get(c) ?? [];
    if (!l.includes(r.performer_id as string)) l.push(r.performer_id as string);
    doublesOf.set(c, l);
  }
  const measurementsOf = new Map<string, Record<string, number>>();
  for (const m of measurements) measurementsOf.set(m.performer_id as string, measurementValuesOf(m.values_mm));

  const groupGarments = new Map<string, string[]>();
  const garmentRecs: GarmentRec[] = garments.map((row) => {
    const g = garmentRecOf(row as unknown as GarmentFactsRow);
    if (g.multiplesGroupId) {
      const l = groupGarments.get(g.multiplesGroupId) ?? [];
      l.push(g.id);
      groupGarments.set(g.multiplesGroupId, l);
    }
    return g;
  });

  const appearanceRecs: AppearanceRec[] = [];
  for (const a of appearances) {
    // An appearance without a change yet has nothing to check; counting it would invent breaks.
    if (!a.change_id) continue;
    appearanceRecs.push({
      id: a.id as string,
      sceneId: a.scene_id as string,
      characterId: a.character_id as string,
      changeId: a.change_id as string,
      distressStage: num(a.distress_stage) ?? 0,
      wet: Boolean(a.wet),
      stunt: Boolean(a.stunt),
      blood: Boolean(a.blood),
      vfxShot: Boolean(a.vfx_shot),
      changeHere: Boolean(a.change_here),
    });
  }

  const entryRecs: ContinuityEntryRec[] = entries.map((e) => ({
    id: e.id as string,
    sceneId: e.scene_id as string,
    characterId: e.character_id as string,
    // An entry not tied to a shoot day still records what was worn; it just has no date.
    shootDayId: (e.shoot_day_id as string | null) ?? "",
    garmentIds: (e.garment_ids as string[]) ?? [],
    distressStage: num(e.distress_stage),
  }));

  const characterRecs: CharacterRec[] = characters.map((c) => ({
    id: c.id as string,
    name: c.name as string,
    performerId: (c.performer_id as string | null) ?? null,
    doublePerformerIds: doublesOf.get(c.id as string) ?? [],
  }));

  const snapshot: ProductionSnapshot = {
    production: {
      id: productionId,
      kind: prod.kind as ProductionSnapshot["production"]["kind"],
      quickChangeThresholdMin: num(settings.quickChangeThresholdMin) ?? DEFAULT_QUICK_CHANGE_MIN,
      easeOverrides: easeOverridesOf(settings),
    },
    scenes: scenes.map((s, i) => ({
      id: s.id as string,
      number: s.number as string,
      // No story day: the scene is alone in its day, so the same-day rule cannot invent a break.
      storyDay: num(s.story_day) ?? -(i + 1),
      storyOrder: num(s.story_order) ?? i,
      runningMinutes: num(s.running_minutes),
      stageOrder: null,
    })),
    shootDays,
    performances,
    characters: characterRecs,
    performers: performers.map((p) => ({
      id: p.id as string,
      name: p.name as string,
      measurements: measurementsOf.get(p.id as string) ?? {},
    })),
    changes: changes.map((c) => ({ id: c.id as string, characterId: c.character_id as string, number: num(c.number) ?? String(c.number) })),
    changeItems: items.map((i) => ({
      id: i.id as string,
      changeId: i.change_id as string,
      garmentId: (i.garment_id as string | null) ?? null,
      multiplesGroupId: (i.multiples_group_id as string | null) ?? null,
    })),
    appearances: appearanceRecs,
    garments: garmentRecs,
    multiplesGroups: groups.map((g) => ({
      id: g.id as string,
      name: g.name as string,
      garmentIds: groupGarments.get(g.id as string) ?? [],
    })),
    continuityEntries: entryRecs,
    checkouts: checkouts.map((c): CheckoutRec => ({
      id: c.id as string,
      garmentId: c.garment_id as string,
      toName: c.to_name as string,
      toPerformerId: (c.to_performer_id as string | null) ?? null,
      dueBackOn: c.due_back_on as string,
      checkedOutOn: zonedParts(new Date(c.checked_out_at as string | Date), timeZone).date,
      shootDayId: (c.shoot_day_id as string | null) ?? null,
      sceneId: (c.scene_id as string | null) ?? null,
    })),
  };
  return {
    snapshot,
    days: days.map((d) => ({ id: d.id as string, date: d.date as string, kind: d.kind === "performance" ? "performance" : "shoot" })),
    timeZone,
  };
}

/** Lookups for resolving names, links and "what does this snag concern". */
class Resolver {
  readonly characters = new Map<string, string>();
  readonly garments = new Map<string, GarmentRec>();
  readonly scenes = new Map<string, string>();
  readonly days = new Map<string, { date: string; kind: "shoot" | "performance" }>();
  readonly groups = new Map<string, string>();
  readonly appearanceCharacter = new Map<string, string>();
  /** Garment → characters whose changes use it (directly or as a copy of a group). */
  readonly wearersOfGarment = new Map<string, Set<string>>();
  /** Group → characters whose changes draw on it. */
  readonly wearersOfGroup = new Map<string, Set<string>>();

  constructor(
    readonly productionId: string,
    readonly loaded: LoadedProduction,
  ) {
    const s = loaded.snapshot;
    for (const c of s.characters) this.characters.set(c.id, c.name);
    for (const g of s.garments) this.garments.set(g.id, g);
    for (const sc of s.scenes) this.scenes.set(sc.id, sc.number);
    for (const d of loaded.days) this.days.set(d.id, { date: d.date, kind: d.kind });
    for (const g of s.multiplesGroups) this.groups.set(g.id, g.name);
    for (const a of s.appearances) this.appearanceCharacter.set(a.id, a.characterId);
    const charOfChange = new Map(s.changes.map((c) => [c.id, c.characterId]));
    const copies = new Map<string, string[]>();
    for (const g of s.garments)
      if (g.multiplesGroupId) (copies.get(g.multiplesGroupId) ?? copies.set(g.multiplesGroupId, []).get(g.multiplesGroupId)!).push(g.id);
    const add = (m: Map<string, Set<string>>, k: string, c: string) => (m.get(k) ?? m.set(k, new Set()).get(k)!).add(c);
    for (const it of s.changeItems) {
      const c = charOfChange.get(it.changeId);
      if (!c) continue;
      if (it.garmentId) add(this.wearersOfGarment, it.garmentId, c);
      if (it.multiplesGroupId) {
        add(this.wearersOfGroup, it.multiplesGroupId, c);
        for (const g of copies.get(it.multiplesGroupId) ?? []) add(this.wearersOfGarment, g, c);
      }
    }
  }

  /** Every character a snag concerns: its subject, the wearers in its appearances, its garment's wearers. */
  charactersOf(s: Snag): Set<string> {
    const out = new Set<string>();
    if (s.subject.characterId) out.add(s.subject.characterId);
    for (const a of s.subject.appearanceIds ?? []) {
      const c = this.appearanceCharacter.get(a);
      if (c) out.add(c);
    }
    if (out.size === 0 && s.subject.garmentId) for (const c of this.wearersOfGarment.get(s.subject.garmentId) ?? []) out.add(c);
    if (out.size === 0 && s.subject.groupId) for (const c of this.wearersOfGroup.get(s.subject.groupId) ?? []) out.add(c);
    return out;
  }

  private path(rest: string): string {
    return `/p/${this.productionId}/${rest}`;
  }

  /** Links to the records that fix a snag; the first is the one to open. */
  linksOf(s: Snag): SnagLinkDto[] {
    const links: SnagLinkDto[] = [];
    const sub = s.subject;
    const garment = sub.garmentId ? this.garments.get(sub.garmentId) : undefined;
    const garmentLink = () =>
      garment && links.push({ label: `Garment ${garment.tagCode}`, href: this.path(`wardrobe/garments/${garment.id}`) });
    const sceneLinks = (ids: string[]) => {
      for (const id of ids) links.push({ label: `Scene ${this.scenes.get(id) ?? "?"}`, href: this.path(`breakdown/scenes/${id}`) });
    };
    const later = [...(sub.sceneIds ?? [])].reverse();
    switch (s.kind) {
      case "fit":
      case "booking":
      case "rental":
      case "availability":
        garmentLink();
        if (s.kind === "booking") sceneLinks(sub.sceneIds ?? []);
        break;
      case "multiples":
        if (sub.groupId) {
          links.push({
            label: `Copy plan for \u201c${this.groups.get(sub.groupId) ?? "?"}\u201d`,
            href: this.path(`snags/multiples/${sub.groupId}`),
          });
        }
        break;
      case "continuity":
      case "quick_change":
        // The later scene is where the breakdown (or the copy) has to change.
        sceneLinks(later);
        garmentLink();
        break;
      case "checkout_overdue":
        garmentLink();
        if (typeof s.evidence.checkoutId === "string") {
          const c = this.loaded.snapshot.checkouts?.find((x) => x.id === s.evidence.checkoutId);
          if (c?.toPerformerId) links.push({ label: c.toName, href: this.path(`cast/performers/${c.toPerformerId}`) });
        }
        break;
      case "workroom_late":
        // The ticket is what to fix: its row opens on the Workroom's ticket list.
        if (typeof s.evidence.ticketId === "string") {
          const g = garment ? ` for ${garment.tagCode}` : "";
          links.push({ label: `Alteration ticket${g}`, href: this.path(`workroom?tab=tickets&ticket=${s.evidence.ticketId}`) });
        }
        garmentLink();
        links.push({ label: "Workroom plan", href: this.path("workroom?tab=tickets") });
        break;
      case "workroom_overbooked":
        links.push({ label: "Workroom plan", href: this.path("workroom?tab=tickets") });
        break;
    }
    for (const c of this.charactersOf(s)) {
      links.push({ label: this.characters.get(c) ?? "Character", href: this.path(`cast/characters/${c}`) });
    }
    return links;
  }

  /** The snag with names resolved and links added. */
  present(s: Snag): SnagDto {
    const sub = s.subject;
    const garmentIds = sub.garmentId ? [sub.garmentId] : [];
    return {
      key: s.key,
      kind: s.kind,
      severity: s.severity,
      title: s.title,
      explanation: s.explanation,
      evidence: s.evidence,
      evidenceHash: s.evidenceHash,
      subject: sub,
      characters: Array.from(this.charactersOf(s)).map((id) => ({ id, name: this.characters.get(id) ?? id })),
      garments: garmentIds.flatMap((id) => {
        const g = this.garments.get(id);
        return g ? [{ id, tagCode: g.tagCode, name: g.name }] : [];
      }),
      scenes: (sub.sceneIds ?? []).map((id) => ({ id, number: this.scenes.get(id) ?? id })),
      shootDays: (sub.shootDayIds ?? []).flatMap((id) => {
        const d = this.days.get(id);
        return d ? [{ id, date: d.date }] : [];
      }),
      group: sub.groupId ? { id: sub.groupId, name: this.groups.get(sub.groupId) ?? sub.groupId } : null,
      links: this.linksOf(s),
      dismissal: null,
      lapsedDismissal: null,
      ...(s.assignment ? { assignment: s.assignment } : {}),
      ...(s.facts ? { facts: s.facts } : {}),
    };
  }

  /** Does a snag touch this shoot day: listed on it, in one of its scenes, or a garment/group worn that day? */
  touchesDay(dayId: string): (s: Snag) => boolean {
    const snap = this.loaded.snapshot;
    const day = snap.shootDays.find((d) => d.id === dayId);
    if (!day) return () => true; // a performance plays the whole running order
    const scenes = new Set(day.sceneIds);
    const changes = new Set<string>();
    for (const a of snap.appearances) if (scenes.has(a.sceneId)) changes.add(a.changeId);
    const garments = new Set<string>();
    const groups = new Set<string>();
    for (const it of snap.changeItems) {
      if (!changes.has(it.changeId)) continue;
      if (it.garmentId) garments.add(it.garmentId);
      if (it.multiplesGroupId) groups.add(it.multiplesGroupId);
    }
    for (const g of snap.garments) if (g.multiplesGroupId && groups.has(g.multiplesGroupId)) garments.add(g.id);
    // A snag about named days (a double booking, a multiples plan) touches only those days.
    return (s) =>
      s.subject.shootDayIds?.length
        ? s.subject.shootDayIds.includes(dayId)
        : (s.subject.sceneIds ?? []).some((id) => scenes.has(id)) ||
          (s.subject.garmentId !== undefined && garments.has(s.subject.garmentId)) ||
          (s.subject.groupId !== undefined && groups.has(s.subject.groupId));
  }
}

function presentDismissal(d: SnagDismissal): SnagDismissalDto {
  return {
    id: d.id,
    snagKey: d.snagKey,
    reason: d.reason,
    dismissedByName: d.dismisser?.name ?? null,
    dismissedAt: d.updatedAt.toISOString(),
  };
}

/** A production's snags at one data version, judged on one day, with what presenting them needs. */
interface SnagState {
  loaded: LoadedProduction;
  snags: Snag[];
  today: string;
  resolver: Resolver;
  dismissalByKey: Map<string, SnagDismissal>;
  /** Finished lists by query, filled as they are asked for. */
  lists: Map<string, SnagListDto>;
}

/** Productions whose snags this server keeps in memory (a 10× production takes tens of MB). */
const SNAG_CACHE_PRODUCTIONS = 8;
/** Filter combinations kept per production (the screens ask for a handful). */
const SNAG_LISTS_PER_PRODUCTION = 64;

/**
 * Computed snags per production, in this process's memory. Valid while the production's data version
 * (bumped by database triggers on every committed write, dismissals included) and today's date in its
 * zone are unchanged. Kept in memory rather than in PostgreSQL: answering from it costs nothing, and the
 * version read before each answer makes every server agree; each server recomputes once per change.
 */
const snagStates = new VersionedCache<SnagState>(SNAG_CACHE_PRODUCTIONS);

/** The production's data version and today in its zone: what a snag list is valid for. */
async function snagValidity(productionId: string): Promise<{ key: string; today: string }> {
  const [row] = await sequelize.query<{ data_version: string; settings: { timeZone?: string } | null }>(
    `SELECT data_version::text AS data_version, settings FROM productions WHERE id = :pid`,
    { replacements: { pid: productionId }, type: QueryTypes.SELECT },
  );
  if (!row) throw NotFoundError("Production not found.");
  // Judged on today in the production's time zone (server/lib/clock.ts is the one clock).
  const today = clock.today(productionTimeZone({ settings: row.settings }));
  return { key: `${row.data_version}@${today}`, today };
}

/**
 * The production's snags: from this server's memory when nothing changed since they were computed,
 * else recomputed. The version is read before the data, so a result is never older than its key.
 */
async function snagState(productionId: string): Promise<SnagState> {
  const { key, today } = await snagValidity(productionId);
  return snagStates.get(productionId, key, async () => {
    const [loaded, dismissals] = await Promise.all([
      loadSnapshot(productionId),
      SnagDismissal.findAll({ where: { productionId }, include: [{ model: User, as: "dismisser", attributes: ["id", "name"] }] }),
    ]);
    // Late tickets and overbooked workroom days come from the workroom plan, judged on the same day.
    const plan = await buildPlan(productionId, today);
    return {
      loaded,
      // One cause, one card: a late alteration and "in the workroom on the day" of the same garment merge.
      snags: mergeSameCause([...computeSnags(loaded.snapshot, { today }), ...plan.snags]),
      today,
      resolver: new Resolver(productionId, loaded),
      dismissalByKey: new Map(dismissals.map((d) => [d.snagKey, d])),
      lists: new Map(),
    };
  });
}

/** Current snags of a production with the date they were judged on. */
export async function currentSnags(productionId: string): Promise<{ loaded: LoadedProduction; snags: Snag[]; today: string }> {
  const { loaded, snags, today } = await snagState(productionId);
  return { loaded, snags, today };
}

const zeroCounts = (): SnagCounts => ({
  total: 0,
  dismissed: 0,
  lapsed: 0,
  bySeverity: Object.fromEntries(snagSeverities.map((s) => [s, 0])) as SnagCounts["bySeverity"],
  byKind: Object.fromEntries(snagKinds.map((k) => [k, 0])) as SnagCounts["byKind"],
});

/** The snag list with dismissals merged, filtered, counted and explained (kept per filter until the data change). */
export async function listSnags(actor: Actor, query: ListSnagsQuery): Promise<SnagListDto> {
  const state = await snagState(actor.productionId);
  const queryKey = JSON.stringify(query);
  const kept = state.lists.get(queryKey);
  if (kept) return kept;
  const list = buildSnagList(state, query);
  if (state.lists.size < SNAG_LISTS_PER_PRODUCTION) state.lists.set(queryKey, list);
  return list;
}

function buildSnagList(state: SnagState, query: ListSnagsQuery): SnagListDto {
  const { loaded, snags, today, resolver: r, dismissalByKey } = state;
  const upcoming = loaded.days.filter(
    (d) => d.date >= today && (loaded.snapshot.production.kind === "stage" ? d.kind === "performance" : d.kind === "shoot"),
  );
  const next = upcoming[0] ?? null;

  let dayFilter: ((s: Snag) => boolean) | null = null;
  if (query.shootDayId) {
    const dayId = query.shootDayId === "next" ? next?.id : query.shootDayId;
    if (!dayId) dayFilter = () => false;
    else if (!r.days.has(dayId)) throw NotFoundError(`${scheduleLabels(loaded.snapshot.production.kind).Day} not found.`);
    else dayFilter = r.touchesDay(dayId);
  }

  const counts = zeroCounts();
  const out: SnagDto[] = [];
  const lapsed: SnagDismissalDto[] = [];
  for (const s of snags) {
    if (dayFilter && !dayFilter(s)) continue;
    if (query.characterId && !r.charactersOf(s).has(query.characterId)) continue;
    const d = dismissalByKey.get(s.key);
    const dismissed = d !== undefined && d.evidenceHash === s.evidenceHash;
    const dto = r.present(s);
    if (d && dismissed) dto.dismissal = presentDismissal(d);
    if (d && !dismissed) {
      dto.lapsedDismissal = presentDismissal(d);
      lapsed.push(dto.lapsedDismissal);
      counts.lapsed++;
    }
    if (dismissed) counts.dismissed++;
    else {
      counts.total++;
      counts.bySeverity[s.severity]++;
      counts.byKind[s.kind]++;
    }
    if (dismissed && !query.includeDismissed) continue;
    if (query.severity && s.severity !== query.severity) continue;
    if (query.kind && s.kind !== query.kind) continue;
    out.push(dto);
  }
  return {
    today,
    nextShootDay: next,
    snags: out,
    counts,
    lapsedDismissals: lapsed,
    characters: loaded.snapshot.characters.map((c) => ({ id: c.id, name: c.name })),
    shootDays: loaded.days.filter((d) => d.kind === "shoot").map((d) => ({ id: d.id, date: d.date })),
  };
}

/**
 * Dismisses a current snag with a reason, against its current evidence hash. A dismissal of the
 * same snag made against older evidence is replaced. 404 when no such snag exists now.
 */
export async function dismissSnag(actor: Actor, input: DismissSnagInput): Promise<SnagDismissalDto> {
  const { snags } = await currentSnags(actor.productionId);
  const snag = snags.find((s) => s.key === input.snagKey);
  if (!snag) throw NotFoundError("No such snag now; it may have been fixed already.");
  const saved = await sequelize.transaction(async (transaction) => {
    const existing = await SnagDismissal.findOne({
      where: { productionId: actor.productionId, snagKey: snag.key },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    const before = existing ? { reason: existing.reason, evidenceHash: existing.evidenceHash } : null;
    const row = existing
      ? await existing.update({ reason: input.reason, evidenceHash: snag.evidenceHash, dismissedBy: actor.user.id }, { transaction })
      : await SnagDismissal.create(
          {
            productionId: actor.productionId,
            snagKey: snag.key,
            evidenceHash: snag.evidenceHash,
            reason: input.reason,
            dismissedBy: actor.user.id,
          },
          { transaction },
        );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "snag.dismiss",
        entityType: "snag_dismissal",
        entityId: row.id,
        before,
        after: { snagKey: snag.key, reason: input.reason, evidenceHash: snag.evidenceHash, title: snag.title },
      },
      transaction,
    );
    return row;
  });
  saved.dismisser = actor.user;
  return presentDismissal(saved);
}

/** Undoes a dismissal (the snag shows again). */
export async function undoDismissal(actor: Actor, dismissalId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const row = await SnagDismissal.findOne({
      where: { id: dismissalId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!row) throw NotFoundError("Dismissal not found.");
    await row.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "snag.undismiss",
        entityType: "snag_dismissal",
        entityId: row.id,
        before: { snagKey: row.snagKey, reason: row.reason, evidenceHash: row.evidenceHash },
      },
      transaction,
    );
  });
}

/** The copy plan of one multiples group: which copy goes into which scene, in shoot order. */
export async function multiplesPlan(actor: Actor, groupId: string): Promise<MultiplesPlanDto> {
  const { loaded, resolver: r } = await snagState(actor.productionId);
  const s = loaded.snapshot;
  const group = s.multiplesGroups.find((g) => g.id === groupId);
  if (!group) throw NotFoundError("Multiples group not found.");
  const garmentRef = (id: string | undefined | null) => {
    const g = id ? r.garments.get(id) : undefined;
    return g ? { id: g.id, tagCode: g.tagCode, name: g.name } : null;
  };
  const plan = computeMultiplesPlans(s).find((p) => p.groupId === groupId);
  // A group the schedule does not use yet needs no copies.
  const copyIds =
    plan?.copyIds ??
    [...group.garmentIds].sort(
      (a, b) => (r.garments.get(a)?.copyNumber ?? 1e9) - (r.garments.get(b)?.copyNumber ?? 1e9) || (a < b ? -1 : 1),
    );
  const needed = plan?.copiesNeeded ?? 0;
  const falling = new Set(plan?.longestFalling ?? []);
  const uses = (plan?.demands ?? []).map((d, i) => {
    const copy = plan!.copyOf[i];
    const day = d.isShootDay ? r.days.get(d.runId) : undefined;
    return {
      copy: copy + 1,
      garment: garmentRef(copyIds[copy]),
      sceneId: d.sceneId,
      sceneNumber: r.scenes.get(d.sceneId) ?? d.sceneId,
      shootDayId: d.isShootDay ? d.runId : null,
      date: day?.date ?? null,
      characterId: d.characterId,
      characterName: r.characters.get(d.characterId) ?? d.characterId,
      stage: d.level,
      outForDay: d.outForDay,
      inLongestFalling: falling.has(i),
    };
  });
  const copies = Array.from({ length: Math.max(needed, copyIds.length) }, (_, c) => {
    const mine = uses.filter((u) => u.copy === c + 1);
    return {
      copy: c + 1,
      garment: garmentRef(copyIds[c]),
      sceneNumbers: Array.from(new Set(mine.map((u) => u.sceneNumber))),
      uses: mine.length,
    };
  });
  return { groupId, groupName: group.name, copiesHeld: copyIds.length, copiesNeeded: needed, copies, uses };
}
