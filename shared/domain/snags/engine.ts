// The snag engine: index the snapshot once (Maps by id), run every rule on the index, add
// stable evidence hashes. Every rule is a single pass over its inputs plus sorting, so a full
// recompute stays near-linear in the size of the production.
import { bookingSnags } from "./bookings";
import { checkoutSnags } from "./checkouts";
import { continuitySnags } from "./continuity";
import { fitSnags } from "./fit";
import { multiplesSnags, planMultiples, type GroupPlan } from "./multiples";
import { quickChangeSnags, runningOrder } from "./quick-changes";
import type {
  AppearanceRec,
  ChangeItemRec,
  ContinuityEntryRec,
  JsonValue,
  ProductionSnapshot,
  ScheduleRun,
  Snag,
  SnagDraft,
  SnagOptions,
  SnapshotIndex,
} from "./types";

/** JSON with object keys sorted at every level (undefined members dropped), for hashing. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== "object") {
    if (typeof value === "number" && !Number.isFinite(value)) return "null";
    return value === undefined ? "null" : JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(",")}}`;
}

/** 32-bit FNV-1a over the UTF-8 bytes of a string, as 8 hex digits. */
export function fnv1a32(text: string): string {
  let h = 0x811c9dc5;
  const byte = (b: number) => {
    h ^= b;
    h = Math.imul(h, 0x01000193);
  };
  for (let i = 0; i < text.length; i++) {
    const cp = text.codePointAt(i) as number;
    if (cp > 0xffff) i++; // surrogate pair consumed
    if (cp < 0x80) byte(cp);
    else if (cp < 0x800) {
      byte(0xc0 | (cp >> 6));
      byte(0x80 | (cp & 63));
    } else if (cp < 0x10000) {
      byte(0xe0 | (cp >> 12));
      byte(0x80 | ((cp >> 6) & 63));
      byte(0x80 | (cp & 63));
    } else {
      byte(0xf0 | (cp >> 18));
      byte(0x80 | ((cp >> 12) & 63));
      byte(0x80 | ((cp >> 6) & 63));
      byte(0x80 | (cp & 63));
    }
  }
  return (h >>> 0).toString(16).padStart(8, "0");
}

/** Stable hash of a snag's evidence (kind and key are mixed in so equal evidence of two snags differs). */
export function evidenceHash(key: string, evidence: { [k: string]: JsonValue }): string {
  return fnv1a32(`${key}\n${canonicalJson(evidence)}`);
}

/** Add the evidence hash to a draft. */
export function finishSnag(d: SnagDraft): Snag {
  return { ...d, evidenceHash: evidenceHash(d.key, d.evidence) };
}

const SEVERITY_RANK = { blocking: 0, warning: 1, note: 2 } as const;

/** Order snags: blocking first, then warnings, then notes; by key inside each. Drops duplicate keys. */
export function sortSnags(snags: Snag[]): Snag[] {
  const byKey = new Map<string, Snag>();
  for (const s of snags) if (!byKey.has(s.key)) byKey.set(s.key, s);
  return Array.from(byKey.values()).sort(
    (a, b) => SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity] || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0),
  );
}

const byId = <T extends { id: string }>(xs: readonly T[]): Map<string, T> => {
  const m = new Map<string, T>();
  for (const x of xs) if (!m.has(x.id)) m.set(x.id, x);
  return m;
};
const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** Build the lookups every rule uses (one pass per collection, plus sorting). */
export function buildIndex(s: ProductionSnapshot): SnapshotIndex {
  const isStage = s.production.kind === "stage";
  const scenesById = byId(s.scenes);
  const garmentsById = byId(s.garments);
  const groupsById = byId(s.multiplesGroups);

  const itemsByChange = new Map<string, ChangeItemRec[]>();
  for (const it of s.changeItems) {
    let l = itemsByChange.get(it.changeId);
    if (!l) itemsByChange.set(it.changeId, (l = []));
    l.push(it);
  }
  for (const l of itemsByChange.values()) l.sort((a, b) => cmp(a.id, b.id));

  const appearancesByScene = new Map<string, AppearanceRec[]>();
  const appearanceBySceneCharacter = new Map<string, AppearanceRec>();
  for (const a of s.appearances) {
    let l = appearancesByScene.get(a.sceneId);
    if (!l) appearancesByScene.set(a.sceneId, (l = []));
    l.push(a);
  }
  for (const l of appearancesByScene.values()) {
    l.sort((a, b) => cmp(a.characterId, b.characterId) || cmp(a.id, b.id));
    for (const a of l) {
      const k = `${a.sceneId}|${a.characterId}`;
      if (!appearanceBySceneCharacter.has(k)) appearanceBySceneCharacter.set(k, a);
    }
  }

  // Copies of a group: its listed garments plus garments that name the group; copy order by copyNumber then id.
  const members = new Map<string, Set<string>>();
  for (const g of s.multiplesGroups) {
    const set = members.get(g.id) ?? new Set<string>();
    for (const gid of g.garmentIds) if (garmentsById.has(gid)) set.add(gid);
    members.set(g.id, set);
  }
  for (const g of s.garments) {
    if (g.multiplesGroupId && groupsById.has(g.multiplesGroupId)) members.get(g.multiplesGroupId)!.add(g.id);
  }
  const groupCopies = new Map<string, string[]>();
  for (const [gid, set] of members) {
    groupCopies.set(
      gid,
      Array.from(set).sort((a, b) => {
        const ca = garmentsById.get(a)?.copyNumber ?? Number.POSITIVE_INFINITY;
        const cb = garmentsById.get(b)?.copyNumber ?? Number.POSITIVE_INFINITY;
        return ca === cb ? cmp(a, b) : ca < cb ? -1 : 1;
      }),
    );
  }

  let runs: ScheduleRun[];
  if (isStage) {
    const dates = Array.from(new Set((s.performances ?? []).map((p) => p.date))).sort();
    runs = [{ id: "running-order", isShootDay: false, dates, sceneIds: runningOrder(s.scenes).map((x) => x.id) }];
  } else {
    runs = [...s.shootDays]
      .sort((a, b) => cmp(a.date, b.date) || cmp(a.id, b.id))
      .map((d) => ({ id: d.id, isShootDay: true, dates: [d.date], sceneIds: d.sceneIds.filter((x) => scenesById.has(x)) }));
  }

  const appearancesById = byId(s.appearances);
  const resolvedEntries: { entry: ContinuityEntryRec; appearance: AppearanceRec }[] = [];
  const appearancesWithEntries = new Set<string>();
  for (const e of s.continuityEntries) {
    const app = e.appearanceId
      ? appearancesById.get(e.appearanceId)
      : e.sceneId && e.characterId
        ? appearanceBySceneCharacter.get(`${e.sceneId}|${e.characterId}`)
        : undefined;
    if (!app) continue;
    resolvedEntries.push({ entry: e, appearance: app });
    appearancesWithEntries.add(app.id);
  }

  return {
    snapshot: s,
    isStage,
    scenesById,
    charactersById: byId(s.characters),
    performersById: byId(s.performers),
    changesById: byId(s.changes),
    garmentsById,
    groupsById,
    appearancesById,
    itemsByChange,
    appearancesByScene,
    appearanceBySceneCharacter,
    groupCopies,
    runs,
    resolvedEntries,
    appearancesWithEntries,
  };
}

/** Every snag of a production, sorted (blocking first) with stable keys and evidence hashes. */
export function computeSnags(snapshot: ProductionSnapshot, options: SnagOptions): Snag[] {
  const ix = buildIndex(snapshot);
  const plans = planMultiples(ix);
  const drafts: SnagDraft[] = [
    ...fitSnags(ix),
    ...multiplesSnags(ix, plans),
    ...continuitySnags(ix, plans),
    ...bookingSnags(ix, plans, options.today),
    ...quickChangeSnags(ix),
    ...checkoutSnags(ix, options.today),
  ];
  return sortSnags(drafts.map(finishSnag));
}

/** The multiples copy plans (which copy to use where) for a snapshot, whether or not a group is short. */
export function computeMultiplesPlans(snapshot: ProductionSnapshot): GroupPlan[] {
  return planMultiples(buildIndex(snapshot));
}
