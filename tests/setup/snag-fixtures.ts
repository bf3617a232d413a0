/**
 * Raw-SQL builders for the records the snag engine reads (scenes, shoot days, cast, changes,
 * appearances, garments, groups, continuity). The snag feature owns none of these tables, so its
 * tests insert rows directly with the core migrations' columns. Every row is production-scoped.
 */
import { randomUUID } from "node:crypto";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../server/db.js";

type Params = Record<string, unknown>;

async function insert(table: string, row: Params): Promise<string> {
  const id = (row.id as string | undefined) ?? randomUUID();
  const cols = Object.keys(row).filter((k) => k !== "id" && row[k] !== undefined);
  const values: Params = { id };
  for (const c of cols) {
    const v = row[c];
    values[c] = v !== null && typeof v === "object" && !(v instanceof Date) ? JSON.stringify(v) : v;
  }
  await sequelize.query(`INSERT INTO ${table} (id, ${cols.join(", ")}) VALUES (:id, ${cols.map((c) => `:${c}`).join(", ")})`, {
    replacements: values,
    type: QueryTypes.INSERT,
  });
  return id;
}

/** Builders bound to one production; each returns the new row's id. */
export function snagFixtures(productionId: string) {
  const pid = { production_id: productionId };
  let sceneOrder = 0;
  let dayNumber = 0;
  return {
    productionId,

    performer: (o: { name?: string } = {}) => insert("performers", { ...pid, name: o.name ?? `Performer ${randomUUID().slice(0, 4)}` }),

    /** A measurement set (values in mm, ISO 8559-1 keys). */
    measurements: (performerId: string, values: Record<string, number>, takenOn = "2026-10-01") =>
      insert("measurement_sets", { ...pid, performer_id: performerId, taken_on: takenOn, values_mm: values }),

    character: (o: { name: string; performerId?: string | null }) =>
      insert("characters", { ...pid, name: o.name, performer_id: o.performerId ?? null }),

    double: (characterId: string, performerId: string, kind: "stunt" | "photo" | "understudy" = "stunt") =>
      insert("character_doubles", { ...pid, character_id: characterId, performer_id: performerId, kind }),

    scene: (o: { number: string; storyDay?: number | null; storyOrder?: number; runningMinutes?: number | null }) =>
      insert("scenes", {
        ...pid,
        number: o.number,
        story_day: o.storyDay ?? 1,
        story_order: o.storyOrder ?? ++sceneOrder,
        running_minutes: o.runningMinutes ?? null,
      }),

    /** A shoot day (or a performance) with its scenes in shooting order. */
    async shootDay(o: { date: string; sceneIds?: string[]; kind?: "shoot" | "performance"; startsAt?: string }) {
      const id = await insert("shoot_days", {
        ...pid,
        day_number: ++dayNumber,
        date: o.date,
        kind: o.kind ?? "shoot",
        starts_at: o.startsAt ?? null,
      });
      let position = 0;
      for (const sceneId of o.sceneIds ?? [])
        await insert("shoot_day_scenes", { ...pid, shoot_day_id: id, scene_id: sceneId, position: ++position });
      return id;
    },

    change: (o: { characterId: string; number: number }) => insert("changes", { ...pid, character_id: o.characterId, number: o.number }),

    changeItem: (o: { changeId: string; garmentId?: string; groupId?: string; label?: string }) =>
      insert("change_items", {
        ...pid,
        change_id: o.changeId,
        label: o.label ?? "item",
        garment_id: o.garmentId ?? null,
        multiples_group_id: o.groupId ?? null,
      }),

    appearance: (o: {
      sceneId: string;
      characterId: string;
      changeId: string | null;
      distressStage?: number;
      wet?: boolean;
      stunt?: boolean;
      changeHere?: boolean;
    }) =>
      insert("appearances", {
        ...pid,
        scene_id: o.sceneId,
        character_id: o.characterId,
        change_id: o.changeId,
        distress_stage: o.distressStage ?? 0,
        wet: o.wet ?? false,
        stunt: o.stunt ?? false,
        change_here: o.changeHere ?? false,
      }),

    fabric: (o: { construction: "woven" | "knit"; stretchWeftPct?: number | null; name?: string }) =>
      insert("fabrics", { ...pid, name: o.name ?? "fabric", construction: o.construction, stretch_weft_pct: o.stretchWeftPct ?? null }),

    group: (o: { name: string }) => insert("multiples_groups", { ...pid, name: o.name }),

    garment: (o: {
      tagCode: string;
      name?: string;
      category?: string;
      fitIntent?: "fitted" | "regular" | "loose";
      finished?: Record<string, number>;
      source?: "built" | "bought" | "rented";
      rentalDueOn?: string | null;
      status?: string;
      groupId?: string | null;
      copyNumber?: number | null;
      fabricId?: string | null;
    }) =>
      insert("garments", {
        ...pid,
        tag_code: o.tagCode,
        name: o.name ?? o.tagCode,
        category: o.category ?? "shirt",
        fit_intent: o.fitIntent ?? "regular",
        finished_measurements: o.finished ?? {},
        source: o.source ?? "built",
        rental_due_on: o.rentalDueOn ?? null,
        status: o.status ?? "in_stock",
        multiples_group_id: o.groupId ?? null,
        copy_number: o.copyNumber ?? null,
        fabric_id: o.fabricId ?? null,
      }),

    async continuityEntry(o: {
      sceneId: string;
      characterId: string;
      shootDayId: string | null;
      distressStage?: number | null;
      garmentIds: string[];
    }) {
      const id = await insert("continuity_entries", {
        ...pid,
        scene_id: o.sceneId,
        character_id: o.characterId,
        shoot_day_id: o.shootDayId,
        distress_stage: o.distressStage ?? null,
      });
      for (const g of o.garmentIds) await insert("continuity_entry_garments", { ...pid, continuity_entry_id: id, garment_id: g });
      return id;
    },

    /** Updates one row's columns (and updated_at, as the app's models do). */
    async update(table: string, id: string, set: Params) {
      const cols = Object.keys(set);
      const values: Params = { id };
      for (const c of cols) values[c] = set[c] !== null && typeof set[c] === "object" ? JSON.stringify(set[c]) : set[c];
      await sequelize.query(`UPDATE ${table} SET ${cols.map((c) => `${c} = :${c}`).join(", ")}, updated_at = now() WHERE id = :id`, {
        replacements: values,
      });
    },
  };
}

export type SnagFixtures = ReturnType<typeof snagFixtures>;

/**
 * A small film production with one snag of each film kind:
 * - fit: Wren's fitted jacket J-1 has chest 1010 mm on a 1000 mm chest (tight);
 * - continuity: Wren changes from change 1 to 2 between scenes 1 and 2 of story day 1, unmarked;
 * - multiples: Moss's oilskin group holds 2 copies; shoot order asks stages 2, 1, 0 (needs 3);
 * - rental: frock coat R-1 due back 2027-01-12, worn on 2027-01-14;
 * - booking: shawl S-1 worn by Wren and Ivy in scene 1 on 2027-01-11.
 * Wren's shirt H-1 (change 2) rises 0, 0, 1, 2 through scenes 2, 5, 6, 7, for recompute tests.
 */
export async function buildFilmScenario(f: SnagFixtures) {
  const pWren = await f.performer({ name: "Ada Tresize" });
  const pMoss = await f.performer({ name: "Bram Colley" });
  const pIvy = await f.performer({ name: "Cass Pengelly" });
  await f.measurements(pWren, { chest_girth: 1000, waist_girth: 820, arm_length: 600 });
  const wren = await f.character({ name: "Wren", performerId: pWren });
  const moss = await f.character({ name: "Moss", performerId: pMoss });
  const ivy = await f.character({ name: "Ivy", performerId: pIvy });

  const s1 = await f.scene({ number: "1", storyDay: 1 });
  const s2 = await f.scene({ number: "2", storyDay: 1 });
  const s3 = await f.scene({ number: "3", storyDay: 2 });
  const s4 = await f.scene({ number: "4", storyDay: 3 });
  const s5 = await f.scene({ number: "5", storyDay: 4 });
  const s6 = await f.scene({ number: "6", storyDay: 5 });
  const s7 = await f.scene({ number: "7", storyDay: 6 });

  // Shoot order: the oilskin scenes 4, 3, 2 come in falling distress 2, 1, 0 on three days.
  const d1 = await f.shootDay({ date: "2027-01-11", sceneIds: [s4, s1] });
  const d2 = await f.shootDay({ date: "2027-01-12", sceneIds: [s3, s5] });
  const d3 = await f.shootDay({ date: "2027-01-13", sceneIds: [s2, s6] });
  const d4 = await f.shootDay({ date: "2027-01-14", sceneIds: [s7] });

  const jacket = await f.garment({
    tagCode: "J-1",
    name: "Keeper jacket",
    category: "jacket",
    fitIntent: "fitted",
    finished: { chest: 1010 },
  });
  const shirt = await f.garment({ tagCode: "H-1", name: "Work shirt", category: "shirt" });
  const shawl = await f.garment({ tagCode: "S-1", name: "Knitted shawl", category: "shawl" });
  const coat = await f.garment({ tagCode: "R-1", name: "Frock coat", category: "coat", source: "rented", rentalDueOn: "2027-01-12" });
  const oilskin = await f.group({ name: "Storm oilskin" });
  const oil1 = await f.garment({ tagCode: "O-1", name: "Oilskin", category: "coat", groupId: oilskin, copyNumber: 1 });
  const oil2 = await f.garment({ tagCode: "O-2", name: "Oilskin", category: "coat", groupId: oilskin, copyNumber: 2 });

  const wren1 = await f.change({ characterId: wren, number: 1 });
  const wren2 = await f.change({ characterId: wren, number: 2 });
  const moss1 = await f.change({ characterId: moss, number: 1 });
  const ivy1 = await f.change({ characterId: ivy, number: 1 });
  await f.changeItem({ changeId: wren1, garmentId: jacket, label: "jacket" });
  await f.changeItem({ changeId: wren2, garmentId: shirt, label: "shirt" });
  await f.changeItem({ changeId: wren1, garmentId: shawl, label: "shawl" });
  await f.changeItem({ changeId: ivy1, garmentId: shawl, label: "shawl" });
  await f.changeItem({ changeId: moss1, groupId: oilskin, label: "oilskin" });
  await f.changeItem({ changeId: ivy1, garmentId: coat, label: "coat" });

  const a = {
    wrenS1: await f.appearance({ sceneId: s1, characterId: wren, changeId: wren1 }),
    ivyS1: await f.appearance({ sceneId: s1, characterId: ivy, changeId: ivy1 }),
    wrenS2: await f.appearance({ sceneId: s2, characterId: wren, changeId: wren2 }),
    mossS2: await f.appearance({ sceneId: s2, characterId: moss, changeId: moss1, distressStage: 0 }),
    mossS3: await f.appearance({ sceneId: s3, characterId: moss, changeId: moss1, distressStage: 1 }),
    mossS4: await f.appearance({ sceneId: s4, characterId: moss, changeId: moss1, distressStage: 2 }),
    wrenS5: await f.appearance({ sceneId: s5, characterId: wren, changeId: wren2, distressStage: 0, changeHere: false }),
    wrenS6: await f.appearance({ sceneId: s6, characterId: wren, changeId: wren2, distressStage: 1 }),
    ivyS6: await f.appearance({ sceneId: s6, characterId: ivy, changeId: ivy1 }),
    wrenS7: await f.appearance({ sceneId: s7, characterId: wren, changeId: wren2, distressStage: 2 }),
    ivyS7: await f.appearance({ sceneId: s7, characterId: ivy, changeId: ivy1 }),
  };
  return {
    performers: { pWren, pMoss, pIvy },
    characters: { wren, moss, ivy },
    scenes: { s1, s2, s3, s4, s5, s6, s7 },
    days: { d1, d2, d3, d4 },
    garments: { jacket, shirt, shawl, coat, oil1, oil2 },
    groups: { oilskin },
    changes: { wren1, wren2, moss1, ivy1 },
    appearances: a,
  };
}
