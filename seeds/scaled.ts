/**
 * `npm run seed -- --scale N`: adds "Tidewater Reach", an invented feature at N × the size of a
 * typical one (400 scenes, 90 shoot days, 80 characters, 3,000 garments, 600 multiples groups per
 * unit), for trying the screens and the server at scale. Built from seeds/synthetic.ts (the generator
 * the snag benchmarks use), written with bulk inserts, and anchored to the demo calendar: the first
 * third of its shoot days are done, the rest are to come. Re-seeding replaces it.
 */
import type { Transaction } from "sequelize";
import { sequelize } from "../server/db.js";
import { demoAccounts, userId } from "./accounts.js";
import { DEMO_TIME_ZONE, demoDaysFromToday, demoWorkday } from "./calendar.js";
import { demoId } from "./ids.js";
import { buildSyntheticProduction, mulberry32 } from "./synthetic.js";
import { generateTagCode } from "../shared/domain/tag-codes.js";

/** The scaled production's id for a scale (fixed, so re-seeding replaces it). */
export const scaledProductionId = (scale: number) => demoId(`production:tidewater-reach:x${scale}`);

const SETS = [
  "Harbour office",
  "Quay steps",
  "Chandlery",
  "Fish market",
  "Customs house",
  "Ferry deck",
  "Sea wall",
  "Boathouse",
  "Assembly rooms",
  "Lamp room",
];
const TIMES = ["DAY", "DAY", "NIGHT", "DUSK", "DAWN"];
const CHUNK = 5000;

/** Inserts plain rows (column → value) in chunks of one statement each; omitted columns take their defaults. */
async function bulkInsert(table: string, rows: Array<Record<string, unknown>>, transaction: Transaction): Promise<void> {
  if (!rows.length) return;
  const cols = Object.keys(rows[0]!);
  const list = cols.map((c) => `"${c}"`).join(", ");
  for (let i = 0; i < rows.length; i += CHUNK) {
    await sequelize.query(`INSERT INTO ${table} (${list}) SELECT ${list} FROM json_populate_recordset(NULL::${table}, $1::json)`, {
      bind: [JSON.stringify(rows.slice(i, i + CHUNK))],
      transaction,
    });
  }
}

export interface ScaledSeedOptions {
  /** Only what the list screens read (no doubles, measurements or continuity), for the query-plan test. */
  listsOnly?: boolean;
}

/** Seeds (or replaces) the scaled production; returns what it wrote. */
export async function seedScaledProduction(
  scale: number,
  options: ScaledSeedOptions = {},
): Promise<{ productionId: string; counts: Record<string, number> }> {
  if (!Number.isInteger(scale) || scale < 1 || scale > 20) throw new Error(`--scale takes a whole number from 1 to 20, not "${scale}"`);
  const snap = buildSyntheticProduction(scale, { start: demoDaysFromToday(0) });
  const rnd = mulberry32(4242 + scale);
  const pid = scaledProductionId(scale);
  const id = (key: string) => demoId(`tidewater:x${scale}:${key}`);
  const base = { production_id: pid };

  // Day d of the synthetic schedule is working day d − done from today: a third of the shoot is done.
  const done = Math.floor(snap.shootDays.length / 3);
  const startIso = snap.shootDays[0]!.date;
  const dayIndex = (iso: string) => Math.round((Date.parse(`${iso}T00:00:00Z`) - Date.parse(`${startIso}T00:00:00Z`)) / 86_400_000);
  // Memoised: demoWorkday walks day by day, and thousands of rows share a few hundred dates.
  const dates = new Map<string, string>();
  const dateOf = (iso: string) => {
    let d = dates.get(iso);
    if (d === undefined) dates.set(iso, (d = demoWorkday(dayIndex(iso) - done)));
    return d;
  };

  const performers = snap.performers.map((p) => ({ ...base, id: id(p.id), name: `${p.name} (Tidewater)` }));
  const characters = snap.characters.map((c, i) => ({
    ...base,
    id: id(c.id),
    name: c.name,
    performer_id: c.performerId ? id(c.performerId) : null,
    sort_order: i,
  }));
  const doubles = snap.characters.flatMap((c) =>
    c.doublePerformerIds.map((d) => ({ ...base, id: id(`dbl-${c.id}-${d}`), character_id: id(c.id), performer_id: id(d), kind: "stunt" })),
  );
  const measurements = snap.performers.map((p) => ({
    ...base,
    id: id(`ms-${p.id}`),
    performer_id: id(p.id),
    taken_on: demoDaysFromToday(-40),
    values_mm: p.measurements,
    entered_unit: "cm",
  }));
  const scenes = snap.scenes.map((s, i) => ({
    ...base,
    id: id(s.id),
    number: s.number,
    set_name: SETS[i % SETS.length],
    int_ext: i % 3 === 0 ? "EXT" : "INT",
    time_of_day: TIMES[i % TIMES.length],
    story_day: s.storyDay,
    story_order: s.storyOrder,
    length_eighths: 2 + Math.floor(rnd() * 20),
  }));
  const shootDays = snap.shootDays.map((d, i) => ({ ...base, id: id(d.id), day_number: i + 1, date: dateOf(d.date), kind: "shoot" }));
  const dayScenes = snap.shootDays.flatMap((d) =>
    [...new Set(d.sceneIds)].map((sid, k) => ({
      ...base,
      id: id(`sds-${d.id}-${sid}`),
      shoot_day_id: id(d.id),
      scene_id: id(sid),
      position: k + 1,
    })),
  );
  const changes = snap.changes.map((c) => ({
    ...base,
    id: id(c.id),
    character_id: id(c.characterId),
    number: Number(c.number),
    description: `Change ${c.number}`,
    approval: "approved",
  }));
  const appearances = snap.appearances.map((a) => ({
    ...base,
    id: id(a.id),
    scene_id: id(a.sceneId),
    character_id: id(a.characterId),
    change_id: id(a.changeId),
    distress_stage: a.distressStage,
    wet: a.wet,
    stunt: a.stunt,
    blood: a.blood,
    vfx_shot: a.vfxShot,
    change_here: a.changeHere,
  }));
  // Fabrics: a knit for the knit tops, and wovens for the rest.
  const knitId = id("fabric-knit");
  const wovens = Array.from({ length: 20 * scale }, (_, i) => id(`fabric-${i}`));
  const fabrics = [
    { ...base, id: knitId, name: "Cotton jersey", construction: "knit", stretch_weft_pct: 25, fibre_content: [] },
    ...wovens.map((fid, i) => ({
      ...base,
      id: fid,
      name: `Woven ${i + 1}`,
      construction: "woven",
      stretch_weft_pct: null,
      fibre_content: [],
    })),
  ];
  const groups = snap.multiplesGroups.map((g) => ({ ...base, id: id(g.id), name: g.name }));
  const tagCodes = new Set<string>();
  const randomInt = (n: number) => Math.floor(rnd() * n);
  const garments = snap.garments.map((g, i) => {
    let tag = generateTagCode(randomInt);
    while (tagCodes.has(tag)) tag = generateTagCode(randomInt);
    tagCodes.add(tag);
    return {
      ...base,
      id: id(g.id),
      tag_code: tag,
      name: g.name,
      category: g.category,
      fit_intent: g.fitIntent,
      finished_measurements: g.finished,
      fabric_id: g.construction === "knit" ? knitId : wovens[i % wovens.length],
      source: g.source,
      vendor: g.source === "rented" ? "Invented Hire Co." : null,
      rental_due_on: g.rentalDueDate ? dateOf(g.rentalDueDate) : null,
      location_rack: `R${1 + (i % 60)}`,
      location_bin: String(1 + (i % 24)),
      status: g.status,
      multiples_group_id: g.multiplesGroupId ? id(g.multiplesGroupId) : null,
      copy_number: g.copyNumber,
    };
  });
  const items = snap.changeItems.map((it, k) => ({
    ...base,
    id: id(it.id),
    change_id: id(it.changeId),
    label: it.garmentId ? "garment" : "copies",
    garment_id: it.garmentId ? id(it.garmentId) : null,
    multiples_group_id: it.multiplesGroupId ? id(it.multiplesGroupId) : null,
    sort_order: k,
  }));
  const appearanceById = new Map(snap.appearances.map((a) => [a.id, a]));
  const entries = snap.continuityEntries.map((e) => {
    const a = appearanceById.get(e.appearanceId!)!;
    return {
      ...base,
      id: id(e.id),
      shoot_day_id: id(e.shootDayId),
      scene_id: id(a.sceneId),
      character_id: id(a.characterId),
      distress_stage: e.distressStage ?? null,
    };
  });
  const entryGarments = snap.continuityEntries.flatMap((e) =>
    [...new Set(e.garmentIds)].map((g) => ({ ...base, id: id(`ceg-${e.id}-${g}`), continuity_entry_id: id(e.id), garment_id: id(g) })),
  );

  const tables: Array<[string, Array<Record<string, unknown>>]> = [
    ["performers", performers],
    ["characters", characters],
    ["character_doubles", options.listsOnly ? [] : doubles],
    ["measurement_sets", options.listsOnly ? [] : measurements],
    ["scenes", scenes],
    ["shoot_days", shootDays],
    ["shoot_day_scenes", dayScenes],
    ["changes", changes],
    ["appearances", appearances],
    ["fabrics", fabrics],
    ["multiples_groups", groups],
    ["garments", garments],
    ["change_items", items],
    ["continuity_entries", options.listsOnly ? [] : entries],
    ["continuity_entry_garments", options.listsOnly ? [] : entryGarments],
  ];
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(`DELETE FROM productions WHERE id = $1`, { bind: [pid], transaction });
    await bulkInsert(
      "productions",
      [
        {
          id: pid,
          title: `Tidewater Reach (×${scale})`,
          kind: "film",
          starts_on: shootDays[0]!.date,
          ends_on: shootDays[shootDays.length - 1]!.date,
          units: "cm",
          settings: { timeZone: DEMO_TIME_ZONE },
          created_by: userId("supervisor"),
        },
      ],
      transaction,
    );
    await bulkInsert(
      "memberships",
      demoAccounts.map((a) => ({ id: id(`membership-${a.key}`), production_id: pid, user_id: userId(a.key), role: a.role })),
      transaction,
    );
    for (const [table, rows] of tables) await bulkInsert(table, rows, transaction);
  });
  // Fresh statistics, so the planner sees the new size; and for a database people use, a fresh visibility
  // map too (counts can use index-only scans).
  await sequelize.query(
    `${options.listsOnly ? "ANALYZE" : "VACUUM ANALYZE"} productions, memberships, ${tables
      .filter(([, rows]) => rows.length)
      .map(([t]) => t)
      .join(", ")}`,
  );
  return {
    productionId: pid,
    counts: {
      scenes: scenes.length,
      shootDays: shootDays.length,
      characters: characters.length,
      garments: garments.length,
      multiplesGroups: groups.length,
      appearances: appearances.length,
      changeItems: items.length,
      continuityEntries: entries.length,
    },
  };
}
