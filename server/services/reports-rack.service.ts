// Tomorrow's rack list: the next shoot day (or performance) after today by the server's clock, each
// character in call order with every garment to pull, the copy the copy plan gives, status and warnings.
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { Production } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { config } from "../config.js";
import { loadSnapshot } from "./snags.service.js";
import { todayForProduction } from "./productions.service.js";
import type { Actor } from "../middleware/require-auth.js";
import { buildRackList, rackListCounts } from "@shared/domain/reports/rack-list.js";
import type { RackDayDto, RackListDto, RackListQuery } from "@shared/schemas/reports.js";

/** Client path that opens check-out (Wardrobe → Check in / out) with the tag filled in, moving it to "on set". */
export function checkOutPath(productionId: string, tagCode: string): string {
  return `/p/${productionId}/wardrobe/scan?tag=${encodeURIComponent(tagCode)}&to=on_set`;
}

/** The full address a QR code holds (the app's public address + the client path). */
export function checkOutUrl(path: string): string {
  return new URL(path, config.APP_URL).toString();
}

/** The rack list for the next day after today (or the named day). */
export async function rackList(actor: Actor, query: RackListQuery): Promise<RackListDto> {
  const production = await Production.findByPk(actor.productionId, { attributes: ["id", "kind", "settings"] });
  if (!production) throw NotFoundError("Production not found.");
  const today = await todayForProduction(actor.productionId);
  const rep = { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT } as const;
  const stage = production.kind === "stage";
  const [days, locations, changes, items, characters] = await Promise.all([
    sequelize.query<{
      id: string;
      date: string;
      kind: "shoot" | "performance";
      day_number: number;
      starts_at: string | null;
      notes: string | null;
    }>(
      `SELECT id, to_char(date, 'YYYY-MM-DD') AS date, kind, day_number, to_char(starts_at, 'HH24:MI') AS starts_at, notes
         FROM shoot_days WHERE production_id = :pid ORDER BY date, day_number`,
      rep,
    ),
    sequelize.query<{ id: string; location_rack: string | null; location_bin: string | null }>(
      `SELECT id, location_rack, location_bin FROM garments WHERE production_id = :pid`,
      rep,
    ),
    sequelize.query<{ id: string; description: string | null }>(`SELECT id, description FROM changes WHERE production_id = :pid`, rep),
    sequelize.query<{ id: string; label: string; sort_order: number }>(
      `SELECT id, label, sort_order FROM change_items WHERE production_id = :pid`,
      rep,
    ),
    sequelize.query<{ id: string; sort_order: number }>(`SELECT id, sort_order FROM characters WHERE production_id = :pid`, rep),
  ]);
  // A stage production's list is for the next performance; a film's for the next shoot day.
  const kind = stage ? "performance" : "shoot";
  const upcoming = days.filter((d) => d.kind === kind && d.date > today);
  let chosen: (typeof days)[number] | undefined = upcoming[0];
  if (query.shootDayId) {
    chosen = days.find((d) => d.id === query.shootDayId);
    if (!chosen) throw NotFoundError("Shoot day not found.");
  }
  const day: RackDayDto | null = chosen
    ? {
        id: chosen.id,
        date: chosen.date,
        kind: chosen.kind,
        dayNumber: Number(chosen.day_number),
        startsAt: chosen.starts_at,
        notes: chosen.notes,
      }
    : null;
  const characterList = day
    ? buildRackList({
        snapshot: (await loadSnapshot(actor.productionId)).snapshot,
        day: { id: day.id, date: day.date, kind: day.kind },
        locations: new Map(locations.map((l) => [l.id, { rack: l.location_rack, bin: l.location_bin }])),
        changeDescriptions: new Map(changes.map((c) => [c.id, c.description])),
        items: new Map(items.map((i) => [i.id, { label: i.label, sortOrder: Number(i.sort_order) }])),
        characterSort: new Map(characters.map((c) => [c.id, Number(c.sort_order)])),
        checkOutPath: (g) => checkOutPath(actor.productionId, g.tagCode),
      })
    : [];
  return {
    today,
    productionKind: production.kind,
    day,
    upcoming: upcoming.slice(0, 14).map((d) => ({ id: d.id, date: d.date, kind: d.kind, dayNumber: Number(d.day_number) })),
    characters: characterList,
    counts: rackListCounts(characterList),
  };
}
