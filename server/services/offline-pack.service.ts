// What a set costumer's phone keeps for a day without a signal. Read-only; built from the same
// services and presenters the screens use, so the phone shows what the office sees.
import { Op, QueryTypes } from "sequelize";
import { OFFLINE_DAYS, OFFLINE_ENTRIES_PER_CHARACTER, type OfflinePackDto } from "@shared/schemas/offline.js";
import { sequelize } from "../db.js";
import { clock } from "../lib/clock.js";
import { Fabric, Garment, MultiplesGroup, ShootDay } from "../models/index.js";
import { presentGarment } from "../presenters/garments.presenter.js";
import { presentProduction } from "../presenters/productions.presenter.js";
import { listCharacters } from "./cast.service.js";
import { listChanges } from "./changes.service.js";
import { getContinuityEntry } from "./continuity.service.js";
import { getSceneDetail } from "./scenes.service.js";
import { getShootDay } from "./shoot-days.service.js";
import { todayForProduction } from "./productions.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { Production } from "../models/index.js";

/**
 * The offline pack: the next shoot days (or performances) from the production's today with their
 * scenes, characters, changes, the garments those changes name and each character's latest entries.
 */
export async function offlinePack(actor: Actor, production: Production): Promise<OfflinePackDto> {
  const savedAt = clock.now().toISOString();
  const pid = actor.productionId;
  const today = await todayForProduction(pid);
  const kind = production.kind === "stage" ? "performance" : "shoot";
  const next = await ShootDay.findAll({
    where: { productionId: pid, kind, date: { [Op.gte]: today } },
    order: [
      ["date", "ASC"],
      ["startsAt", "ASC"],
      ["dayNumber", "ASC"],
    ],
    limit: OFFLINE_DAYS,
    attributes: ["id"],
  });
  const shootDays = await Promise.all(next.map((d) => getShootDay(actor, d.id)));
  const sceneIds = [...new Set(shootDays.flatMap((d) => d.scenes.map((s) => s.id)))];
  const scenes = await Promise.all(sceneIds.map((id) => getSceneDetail(actor, id)));

  const characterIds = new Set(scenes.flatMap((s) => s.appearances.map((a) => a.characterId)));
  const changeIds = [...new Set(scenes.flatMap((s) => s.appearances.map((a) => a.changeId)).filter((x): x is string => Boolean(x)))];
  const [characters, changes] = await Promise.all([
    listCharacters(actor),
    changeIds.length ? listChanges(actor, { ids: changeIds }) : Promise.resolve([]),
  ]);

  // The garments the set will handle: those the changes name, and every copy of a named group.
  const garmentIds = changes.flatMap((c) => c.items.map((i) => i.garmentId)).filter((x): x is string => Boolean(x));
  const groupIds = changes.flatMap((c) => c.items.map((i) => i.multiplesGroupId)).filter((x): x is string => Boolean(x));
  const garments =
    garmentIds.length || groupIds.length
      ? await Garment.findAll({
          where: { productionId: pid, [Op.or]: [{ id: { [Op.in]: garmentIds } }, { multiplesGroupId: { [Op.in]: groupIds } }] },
          include: [
            { model: Fabric, as: "fabric", attributes: ["id", "name"] },
            { model: MultiplesGroup, as: "multiplesGroup", attributes: ["id", "name"] },
          ],
          order: [["tagCode", "ASC"]],
        })
      : [];

  // Each character's latest entries that have photos (reference for the next scenes).
  const latest = characterIds.size
    ? await sequelize.query<{ id: string }>(
        `SELECT id FROM (
           SELECT e.id, row_number() OVER (PARTITION BY e.character_id ORDER BY e.created_at DESC) AS n
             FROM continuity_entries e
            WHERE e.production_id = :pid AND e.character_id IN (:chars) AND e.scene_id IS NOT NULL
              AND EXISTS (SELECT 1 FROM photos p WHERE p.owner_type = 'continuity_entry' AND p.owner_id = e.id)
         ) t WHERE n <= :per`,
        { replacements: { pid, chars: [...characterIds], per: OFFLINE_ENTRIES_PER_CHARACTER }, type: QueryTypes.SELECT },
      )
    : [];
  const continuity = await Promise.all(latest.map((r) => getContinuityEntry(actor, r.id)));

  return {
    savedAt,
    production: presentProduction(production, actor.role),
    shootDays,
    scenes,
    characters: characters.filter((c) => characterIds.has(c.id)),
    changes,
    garments: garments.map((g) => presentGarment(g, today)),
    continuity: continuity.sort((a, b) => b.createdAt.localeCompare(a.createdAt)),
  };
}
