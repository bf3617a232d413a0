/** Digital doubles test data: plain-SQL rows on the core tables plus panels and seams. */
import { randomUUID } from "node:crypto";
import { sequelize } from "../../server/db.js";
import { Panel, Seam } from "../../server/models/index.js";

// ---------------------------------------------------------------------------------------------
// Digital doubles. Characters, changes, garments, fabrics, scenes and appearances belong to other
// features' models; until those land, these builders insert rows with plain SQL on the core tables.

async function insert(table: string, row: Record<string, unknown>): Promise<string> {
  const id = (row.id as string | undefined) ?? randomUUID();
  const cols = Object.keys(row).filter((k) => k !== "id");
  const json = new Set(["fibre_content", "readings", "values_mm", "variants", "finished_measurements"]);
  await sequelize.query(
    `INSERT INTO ${table} (id, ${cols.join(", ")}) VALUES (:id, ${cols.map((c) => (json.has(c) ? `CAST(:${c} AS jsonb)` : `:${c}`)).join(", ")})`,
    {
      replacements: { id, ...Object.fromEntries(cols.map((c) => [c, json.has(c) ? JSON.stringify(row[c]) : row[c]])) },
    },
  );
  return id;
}

/** A fabric, optionally with recorded tests (kind, direction, readings). */
export async function buildFabric(
  productionId: string,
  overrides: Partial<{ name: string; construction: "woven" | "knit"; widthMm: number; gsm: number | null }> = {},
  tests: Array<{ kind: string; direction?: string | null; readings: object }> = [],
) {
  const id = await insert("fabrics", {
    production_id: productionId,
    name: overrides.name ?? `Fabric ${randomUUID().slice(0, 4)}`,
    construction: overrides.construction ?? "woven",
    width_mm: overrides.widthMm ?? 1500,
    mass_per_area_gsm: overrides.gsm === undefined ? 200 : overrides.gsm,
    fibre_content: [{ fibre: "wool", pct: 100 }],
  });
  const testIds: string[] = [];
  for (const t of tests) {
    testIds.push(
      await insert("fabric_tests", {
        production_id: productionId,
        fabric_id: id,
        kind: t.kind,
        direction: t.direction ?? null,
        readings: t.readings,
        tested_on: "2026-11-20",
      }),
    );
  }
  return { id, testIds };
}

/** A character (with performer), one change, and garments on it as change items. */
export async function buildChangeWithGarments(
  productionId: string,
  opts: { garments?: number; fabricId?: string | null; name?: string } = {},
) {
  const performerId = await insert("performers", { production_id: productionId, name: "Test Performer" });
  const characterId = await insert("characters", {
    production_id: productionId,
    name: opts.name ?? `Character ${randomUUID().slice(0, 4)}`,
    performer_id: performerId,
  });
  const changeId = await insert("changes", {
    production_id: productionId,
    character_id: characterId,
    number: 1,
    description: "Main change",
  });
  const garmentIds: string[] = [];
  for (let i = 0; i < (opts.garments ?? 1); i++) {
    const gid = await insert("garments", {
      production_id: productionId,
      tag_code: `T${randomUUID().slice(0, 6)}`,
      name: `Garment ${i + 1}`,
      category: "jacket",
      source: "built",
      fabric_id: opts.fabricId ?? null,
    });
    await insert("change_items", {
      production_id: productionId,
      change_id: changeId,
      label: `Item ${i + 1}`,
      garment_id: gid,
      sort_order: i,
    });
    garmentIds.push(gid);
  }
  return { performerId, characterId, changeId, garmentIds };
}

/** A scene and an appearance of the character in the change, marked as an effects shot unless told otherwise. */
export async function buildShot(
  productionId: string,
  characterId: string,
  changeId: string,
  opts: { number: string; storyOrder: number; distressStage?: number; vfxShot?: boolean },
) {
  const sceneId = await insert("scenes", { production_id: productionId, number: opts.number, story_order: opts.storyOrder, story_day: 1 });
  const appearanceId = await insert("appearances", {
    production_id: productionId,
    scene_id: sceneId,
    character_id: characterId,
    change_id: changeId,
    distress_stage: opts.distressStage ?? 0,
    vfx_shot: opts.vfxShot ?? true,
  });
  return { sceneId, appearanceId };
}

/** A measurement set of a performer (values in mm). */
export async function buildMeasurementSet(productionId: string, performerId: string, valuesMm: Record<string, number>) {
  return insert("measurement_sets", {
    production_id: productionId,
    performer_id: performerId,
    taken_on: "2026-11-10",
    values_mm: valuesMm,
  });
}

/** A photo row whose file is stored under key (the caller writes the file). */
export async function buildPhotoRow(productionId: string, ownerType: string, ownerId: string, key: string, bytes: number, hash: string) {
  return insert("photos", {
    production_id: productionId,
    owner_type: ownerType,
    owner_id: ownerId,
    view: "front",
    caption: "Fitting turnaround",
    content_hash: hash,
    width: 4,
    height: 4,
    bytes,
    variants: { display: key },
  });
}

/** A panel on a garment (a 200 × 300 mm rectangle unless an outline is given). */
export async function buildPanel(
  productionId: string,
  garmentId: string,
  overrides: Partial<{
    name: string;
    outline: [number, number][];
    cutCount: number;
    fabricId: string | null;
    seamAllowanceMm: number;
  }> = {},
) {
  return Panel.create({
    productionId,
    garmentId,
    name: overrides.name ?? "Piece",
    outline: overrides.outline ?? [
      [0, 0],
      [200, 0],
      [200, 300],
      [0, 300],
    ],
    grainline: [
      [100, 50],
      [100, 250],
    ],
    notches: [],
    seamAllowanceMm: overrides.seamAllowanceMm ?? 10,
    cutCount: overrides.cutCount ?? 1,
    mirrored: false,
    grainMode: "straight",
    fabricId: overrides.fabricId ?? null,
  });
}

/** A seam between two panel runs (vertex indices). */
export async function buildSeam(
  productionId: string,
  a: { panelId: string; from: number; to: number },
  b: { panelId: string; from: number; to: number },
  name = "Seam",
) {
  return Seam.create({
    productionId,
    name,
    panelAId: a.panelId,
    aFrom: a.from,
    aTo: a.to,
    aDirection: "forward",
    panelBId: b.panelId,
    bFrom: b.from,
    bTo: b.to,
    bDirection: "forward",
    toleranceMm: null,
    eased: false,
    easeMinMm: null,
    easeMaxMm: null,
  });
}
