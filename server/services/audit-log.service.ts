import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { AuditEvent, User } from "../models/index.js";
import type { PaginationQuery } from "@shared/schemas/common.js";
import type { AuditRecordDto } from "@shared/schemas/productions.js";
import { scheduleLabels } from "@shared/domain/schedule-labels.js";
import type { Actor } from "../middleware/require-auth.js";
import { pageWindow } from "../lib/http.js";

type Row = { id: string; label: string; [k: string]: unknown };

/**
 * How to name and link each kind of record the audit trail mentions: one query per kind (ids as an
 * array, production-scoped), a label, and the client path of the screen that shows it.
 */
const RECORDS: Record<string, { sql: string; href: (r: Row) => string }> = {
  garment: {
    sql: `SELECT id, tag_code || ' ' || name AS label FROM garments WHERE production_id = :pid AND id IN (:ids)`,
    href: (r) => `wardrobe/garments/${r.id}`,
  },
  fabric: { sql: `SELECT id, name AS label FROM fabrics WHERE production_id = :pid AND id IN (:ids)`, href: (r) => `fabrics/${r.id}` },
  fabric_test: {
    sql: `SELECT t.id, t.kind || ' test of ' || f.name AS label, f.id AS fabric_id FROM fabric_tests t JOIN fabrics f ON f.id = t.fabric_id WHERE t.production_id = :pid AND t.id IN (:ids)`,
    href: (r) => `fabrics/${r.fabric_id}`,
  },
  scene: {
    sql: `SELECT id, 'Scene ' || number AS label FROM scenes WHERE production_id = :pid AND id IN (:ids)`,
    href: (r) => `breakdown/scenes/${r.id}`,
  },
  character: {
    sql: `SELECT id, name AS label FROM characters WHERE production_id = :pid AND id IN (:ids)`,
    href: (r) => `cast/characters/${r.id}`,
  },
  performer: {
    sql: `SELECT id, name AS label FROM performers WHERE production_id = :pid AND id IN (:ids)`,
    href: (r) => `cast/performers/${r.id}`,
  },
  measurement_set: {
    sql: `SELECT m.id, 'Measurements of ' || p.name || ' (' || to_char(m.taken_on, 'YYYY-MM-DD') || ')' AS label, p.id AS performer_id
            FROM measurement_sets m JOIN performers p ON p.id = m.performer_id WHERE m.production_id = :pid AND m.id IN (:ids)`,
    href: (r) => `cast/performers/${r.performer_id}/measurements`,
  },
  change: {
    sql: `SELECT c.id, ch.name || ', change ' || c.number AS label FROM changes c JOIN characters ch ON ch.id = c.character_id WHERE c.production_id = :pid AND c.id IN (:ids)`,
    href: () => `changes`,
  },
  appearance: {
    sql: `SELECT a.id, ch.name || ' in scene ' || s.number AS label, s.id AS scene_id FROM appearances a JOIN characters ch ON ch.id = a.character_id JOIN scenes s ON s.id = a.scene_id
           WHERE a.production_id = :pid AND a.id IN (:ids)`,
    href: (r) => `breakdown/scenes/${r.scene_id}`,
  },
  shoot_day: {
    sql: `SELECT id, kind, day_number, to_char(date, 'YYYY-MM-DD') AS date, '' AS label FROM shoot_days WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `breakdown`,
  },
  continuity_entry: {
    sql: `SELECT e.id, 'Continuity of ' || ch.name || ' in scene ' || s.number AS label, ch.id AS character_id FROM continuity_entries e
            JOIN characters ch ON ch.id = e.character_id JOIN scenes s ON s.id = e.scene_id WHERE e.production_id = :pid AND e.id IN (:ids)`,
    href: (r) => `continuity/timeline/${r.character_id}`,
  },
  fitting: {
    sql: `SELECT f.id, 'Fitting of ' || p.name || ', ' || to_char(f.starts_at, 'YYYY-MM-DD') AS label FROM fittings f JOIN performers p ON p.id = f.performer_id WHERE f.production_id = :pid AND f.id IN (:ids)`,
    href: (r) => `workroom/fittings/${r.id}`,
  },
  alteration_ticket: {
    sql: `SELECT t.id, 'Alteration of ' || g.tag_code || ' ' || g.name AS label FROM alteration_tickets t JOIN garments g ON g.id = t.garment_id WHERE t.production_id = :pid AND t.id IN (:ids)`,
    href: (r) => `workroom?tab=tickets&ticket=${r.id}`,
  },
  membership: {
    sql: `SELECT m.id, u.name AS label FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.production_id = :pid AND m.id IN (:ids)`,
    href: () => `team`,
  },
  invitation: {
    sql: `SELECT id, 'Invitation to ' || email AS label FROM invitations WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `team`,
  },
  packet: {
    sql: `SELECT k.id, ch.name || ', change ' || c.number || COALESCE(', version ' || k.version, ', draft') AS label FROM packets k JOIN characters ch ON ch.id = k.character_id JOIN changes c ON c.id = k.change_id
           WHERE k.production_id = :pid AND k.id IN (:ids)`,
    href: (r) => `doubles/packets/${r.id}`,
  },
  panel: {
    sql: `SELECT p.id, p.name || ' of ' || g.tag_code || ' ' || g.name AS label FROM panels p JOIN garments g ON g.id = p.garment_id WHERE p.production_id = :pid AND p.id IN (:ids)`,
    href: () => `doubles`,
  },
  seam: {
    sql: `SELECT id, 'Seam ' || name AS label FROM seams WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `doubles?tab=seams`,
  },
  marker: {
    sql: `SELECT id, 'Yardage marker' AS label FROM markers WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `doubles?tab=yardage`,
  },
  production: { sql: `SELECT id, title AS label FROM productions WHERE id = :pid AND id IN (:ids)`, href: () => `team` },
  snag_dismissal: {
    sql: `SELECT id, 'Dismissed snag' AS label FROM snag_dismissals WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `snags?includeDismissed=true`,
  },
  workroom_email_job: {
    sql: `SELECT id, 'Workroom e-mail' AS label FROM workroom_email_jobs WHERE production_id = :pid AND id IN (:ids)`,
    href: () => `workroom?tab=capacity`,
  },
  // Capacity rows are audited by the person they belong to.
  user_capacity: {
    sql: `SELECT u.id, 'Hours of ' || u.name AS label FROM users u JOIN memberships m ON m.user_id = u.id AND m.production_id = :pid WHERE u.id IN (:ids)`,
    href: () => `workroom?tab=capacity`,
  },
};

/** Kinds of record the trail can name and link. */
export const auditRecordTypes = Object.keys(RECORDS);

type Json = Record<string, unknown> | null | undefined;
const obj = (v: unknown): Json => (v && typeof v === "object" && !Array.isArray(v) ? (v as Record<string, unknown>) : null);

/** The record an event is about: a photo is about its owner, capacity about its person. */
function targetOf(e: AuditEvent): { type: string; id: string } | null {
  const after = obj(e.after);
  const before = obj(e.before);
  if (e.entityType === "photo") {
    const o = after ?? before;
    return typeof o?.ownerType === "string" && typeof o.ownerId === "string" ? { type: o.ownerType, id: o.ownerId } : null;
  }
  if (e.entityType === "workroom_capacity") return typeof after?.userId === "string" ? { type: "user_capacity", id: after.userId } : null;
  return e.entityId ? { type: e.entityType, id: e.entityId } : null;
}

/** A name from the event's own before/after, for a record that is gone (deleted since). */
function nameFromEvent(e: AuditEvent): string | null {
  for (const o of [obj(e.after), obj(e.before)]) {
    if (!o) continue;
    if (typeof o.title === "string") return o.title;
    if (typeof o.tagCode === "string" && typeof o.name === "string") return `${o.tagCode} ${o.name}`;
    if (typeof o.name === "string") return o.name;
    if (typeof o.number === "string" || typeof o.number === "number") return `${e.entityType === "scene" ? "Scene " : ""}${o.number}`;
    if (typeof o.email === "string") return o.email;
    if (Array.isArray(o.garmentIds)) return `${o.garmentIds.length} garment${o.garmentIds.length === 1 ? "" : "s"}`;
  }
  return null;
}

/**
 * Names and links for the records a page of events mentions, one query per kind of record.
 * @returns a lookup from event id to the record (label, client path, or gone)
 */
export async function resolveAuditRecords(productionId: string, events: AuditEvent[]): Promise<Map<string, AuditRecordDto | null>> {
  const byType = new Map<string, Set<string>>();
  const targets = new Map<string, { type: string; id: string } | null>();
  for (const e of events) {
    const t = targetOf(e);
    targets.set(e.id, t);
    if (t && RECORDS[t.type]) (byType.get(t.type) ?? byType.set(t.type, new Set()).get(t.type)!).add(t.id);
  }
  const found = new Map<string, { label: string; href: string }>();
  await Promise.all(
    [...byType].map(async ([type, ids]) => {
      const def = RECORDS[type]!;
      const rows = await sequelize.query<Row>(def.sql, { replacements: { pid: productionId, ids: [...ids] }, type: QueryTypes.SELECT });
      for (const r of rows) {
        // A day names itself by its kind: "Day 4 · 2026-12-03" or "Performance 2 · 2026-12-03".
        const label =
          type === "shoot_day"
            ? `${scheduleLabels(r.kind === "performance" ? "stage" : "film").numbered(Number(r.day_number))} · ${r.date}`
            : r.label;
        found.set(`${type}:${r.id}`, { label, href: `/p/${productionId}/${def.href(r)}` });
      }
    }),
  );
  const out = new Map<string, AuditRecordDto | null>();
  for (const e of events) {
    const t = targets.get(e.id);
    const hit = t ? found.get(`${t.type}:${t.id}`) : undefined;
    if (hit)
      out.set(e.id, { type: t!.type, label: e.entityType === "photo" ? `Photo of ${hit.label}` : hit.label, href: hit.href, gone: false });
    else {
      const name = nameFromEvent(e);
      out.set(
        e.id,
        name || t ? { type: t?.type ?? e.entityType, label: name ?? e.entityType.replace(/_/g, " "), href: null, gone: Boolean(t) } : null,
      );
    }
  }
  return out;
}

/** The production's audit trail, newest first, with the actor's name and the record each event is about. */
export async function listAuditEvents(actor: Actor, q: PaginationQuery) {
  const { rows, count } = await AuditEvent.findAndCountAll({
    where: { productionId: actor.productionId },
    order: [["createdAt", "DESC"]],
    ...pageWindow(q),
  });
  const actorIds = [...new Set(rows.map((r) => r.actorId).filter((x): x is string => Boolean(x)))];
  const [users, records] = await Promise.all([
    actorIds.length ? User.findAll({ where: { id: actorIds }, attributes: ["id", "name"] }) : Promise.resolve([] as User[]),
    resolveAuditRecords(actor.productionId, rows),
  ]);
  const names = new Map(users.map((u) => [u.id, u.name]));
  return {
    count,
    rows: rows.map((r) => ({ event: r, actorName: r.actorId ? (names.get(r.actorId) ?? null) : null, record: records.get(r.id) ?? null })),
  };
}
