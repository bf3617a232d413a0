/**
 * Digital doubles demo: Elias Marr's main change gets real panels for his jacket, shirt and
 * trousers, seams that match, a yardage marker, and a published handoff packet (version 1) that the
 * demo vfx user has received. Runs after every other step; idempotent (fixed ids, upserts).
 */
import { createHash } from "node:crypto";
import { Readable } from "node:stream";
import { QueryTypes, type Transaction } from "sequelize";
import sharp from "sharp";
import { sequelize } from "../server/db.js";
import { Packet, PacketRecipient, Panel, Seam, User } from "../server/models/index.js";
import { layMarker } from "../server/services/yardage.service.js";
import { snapshotContents, writePacketZip } from "../server/services/packets.service.js";
import { listPhotoCandidates, listVfxShots, findChange } from "../server/services/doubles-records.js";
import { packetStore } from "../server/services/packet-storage.js";
import { packetSelectionSchema } from "../shared/schemas/packets.js";
import { demoId } from "./ids.js";
import { SALTMARSH_ID, userId } from "./accounts.js";
import { characters, keyGarments, performers } from "./scenario.js";
import { demoPanels, demoSeams } from "./doubles-patterns.js";

const P = SALTMARSH_ID;

async function exec(sql: string, replacements: Record<string, unknown>, transaction: Transaction) {
  await sequelize.query(sql, { replacements, transaction });
}

async function one<T extends object>(sql: string, replacements: Record<string, unknown>, transaction: Transaction): Promise<T | undefined> {
  const [row] = await sequelize.query<T>(sql, { replacements, transaction, type: QueryTypes.SELECT });
  return row;
}

/** A plain coloured image standing in for a reference photo (demo data only). */
async function demoImage(label: string, hue: string): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="480" height="640"><rect width="480" height="640" fill="${hue}"/><rect x="140" y="90" width="200" height="420" rx="40" fill="#2B3A67" opacity="0.55"/><text x="240" y="590" font-family="sans-serif" font-size="26" text-anchor="middle" fill="#F7F4EE">${label}</text></svg>`;
  return sharp(Buffer.from(svg)).webp({ quality: 70 }).toBuffer();
}

/**
 * Minimal records the doubles demo needs that other features' seed steps create on main: Elias
 * (performer, character, main change), his jacket, shirt and trousers with tested fabrics, a few
 * effects-shot appearances, a measurement set and two reference photos. Every insert is
 * ON CONFLICT DO NOTHING, so it is harmless next to the real steps; drop it after merging.
 */
export async function ensureDoublesPrerequisites(t: Transaction): Promise<void> {
  const eliasPerformer = performers.elias.id;
  const eliasCharacter = characters.elias.id;
  await exec(`INSERT INTO performers (id, production_id, name) VALUES (:id, :p, :name) ON CONFLICT DO NOTHING`, { id: eliasPerformer, p: P, name: performers.elias.name }, t);
  await exec(`INSERT INTO characters (id, production_id, name, performer_id, sort_order) VALUES (:id, :p, :name, :perf, 2) ON CONFLICT DO NOTHING`, { id: eliasCharacter, p: P, name: characters.elias.name, perf: eliasPerformer }, t);
  await exec(
    `INSERT INTO changes (id, production_id, character_id, number, description, story_day_from, story_day_to, approval)
     VALUES (:id, :p, :c, 1, 'Keeper''s working clothes: wool sack jacket, collarless shirt, high-waisted trousers', 1, 12, 'approved') ON CONFLICT DO NOTHING`,
    { id: demoId("change:elias:1"), p: P, c: eliasCharacter },
    t,
  );
  const change = (await one<{ id: string }>(`SELECT id FROM changes WHERE character_id = :c AND number = 1`, { c: eliasCharacter }, t))!;

  const fabrics = [
    { key: "melton", name: "Navy wool melton", construction: "woven", width: 1500, gsm: 520, thickness: 2.1, fibre: [{ fibre: "wool", pct: 100 }] },
    { key: "shirting", name: "Unbleached cotton shirting", construction: "woven", width: 1400, gsm: 125, thickness: 0.25, fibre: [{ fibre: "cotton", pct: 100 }] },
    { key: "twill", name: "Grey wool twill", construction: "woven", width: 1500, gsm: 340, thickness: 0.9, fibre: [{ fibre: "wool", pct: 85 }, { fibre: "nylon", pct: 15 }] },
  ];
  // Invented test readings in the shapes of ASTM D3776 (mass), D1388 (cantilever) and a strip test.
  const tests: Record<string, Array<{ kind: string; direction: string | null; readings: object }>> = {
    melton: [
      { kind: "mass", direction: null, readings: { massG: 5.2, lengthMm: 100, widthMm: 100 } },
      { kind: "cantilever", direction: "warp", readings: { overhangsMm: [92, 95, 94, 93] } },
      { kind: "cantilever", direction: "weft", readings: { overhangsMm: [86, 88, 85, 87] } },
      { kind: "strip", direction: "warp", readings: { loadN: 20, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 3.2 } },
      { kind: "strip", direction: "weft", readings: { loadN: 20, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4.1 } },
      { kind: "thickness", direction: null, readings: { thicknessMm: 2.1 } },
      { kind: "friction", direction: null, readings: { slideAngleDeg: 31 } },
    ],
    shirting: [
      { kind: "mass", direction: null, readings: { massG: 1.25, lengthMm: 100, widthMm: 100 } },
      { kind: "cantilever", direction: "warp", readings: { overhangsMm: [38, 40, 39, 39] } },
      { kind: "cantilever", direction: "weft", readings: { overhangsMm: [34, 35, 33, 34] } },
      { kind: "strip", direction: "warp", readings: { loadN: 10, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 2.6 } },
      { kind: "strip", direction: "weft", readings: { loadN: 10, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 3.4 } },
    ],
    twill: [
      { kind: "mass", direction: null, readings: { massG: 3.4, lengthMm: 100, widthMm: 100 } },
      { kind: "cantilever", direction: "warp", readings: { overhangsMm: [70, 72, 71, 71] } },
      { kind: "cantilever", direction: "weft", readings: { overhangsMm: [64, 66, 65, 65] } },
      { kind: "strip", direction: "warp", readings: { loadN: 20, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 2.4 } },
    ],
  };
  for (const f of fabrics) {
    const id = demoId(`fabric:doubles-${f.key}`);
    await exec(
      `INSERT INTO fabrics (id, production_id, name, fibre_content, construction, width_mm, mass_per_area_gsm, thickness_mm)
       VALUES (:id, :p, :name, CAST(:fibre AS jsonb), :construction, :width, :gsm, :thickness) ON CONFLICT DO NOTHING`,
      { id, p: P, name: f.name, fibre: JSON.stringify(f.fibre), construction: f.construction, width: f.width, gsm: f.gsm, thickness: f.thickness },
      t,
    );
    for (const [i, test] of tests[f.key]!.entries()) {
      await exec(
        `INSERT INTO fabric_tests (id, production_id, fabric_id, kind, direction, readings, tested_by, tested_on)
         VALUES (:id, :p, :fabric, :kind, :direction, CAST(:readings AS jsonb), :by, '2026-11-18') ON CONFLICT DO NOTHING`,
        { id: demoId(`fabric-test:doubles-${f.key}:${i}`), p: P, fabric: id, kind: test.kind, direction: test.direction, readings: JSON.stringify(test.readings), by: userId("cutter") },
        t,
      );
    }
  }
  const garments = [
    { id: keyGarments.eliasJacket, tag: "EM-J01", name: "Keeper's sack jacket", category: "jacket", fabric: "melton" },
    { id: keyGarments.eliasShirt, tag: "EM-S01", name: "Collarless work shirt", category: "shirt", fabric: "shirting" },
    { id: keyGarments.eliasTrousers, tag: "EM-T01", name: "High-waisted trousers", category: "trousers", fabric: "twill" },
  ];
  for (const [i, g] of garments.entries()) {
    await exec(
      `INSERT INTO garments (id, production_id, tag_code, name, category, size_label, fabric_id, colour, source, location_rack)
       VALUES (:id, :p, :tag, :name, :category, '40R', :fabric, 'navy', 'built', 'R3') ON CONFLICT DO NOTHING`,
      { id: g.id, p: P, tag: g.tag, name: g.name, category: g.category, fabric: demoId(`fabric:doubles-${g.fabric}`) },
      t,
    );
    await exec(
      `INSERT INTO change_items (id, production_id, change_id, label, garment_id, sort_order) VALUES (:id, :p, :change, :label, :g, :i) ON CONFLICT DO NOTHING`,
      { id: demoId(`change-item:elias:1:${g.category}`), p: P, change: change.id, label: g.category, g: g.id, i },
      t,
    );
  }
  // Effects shots: the storm on the quay, the fall into the harbour (wet), the search at dawn.
  const shots = [
    { number: "47", order: 47, day: 9, stage: 1, wet: false, synopsis: "Elias fights the storm lantern on the quay." },
    { number: "48A", order: 48, day: 9, stage: 2, wet: true, synopsis: "Elias is swept off the quay into the harbour." },
    { number: "55", order: 55, day: 10, stage: 3, wet: false, synopsis: "Dawn: Elias, torn and salt-stained, searches the shore." },
  ];
  for (const s of shots) {
    await exec(
      `INSERT INTO scenes (id, production_id, number, set_name, int_ext, time_of_day, story_day, story_order, length_eighths, synopsis)
       VALUES (:id, :p, :number, 'Harbour quay', 'EXT', 'NIGHT', :day, :order, 12, :synopsis) ON CONFLICT DO NOTHING`,
      { id: demoId(`scene:${s.number}`), p: P, number: s.number, day: s.day, order: s.order, synopsis: s.synopsis },
      t,
    );
    const scene = (await one<{ id: string }>(`SELECT id FROM scenes WHERE production_id = :p AND number = :n`, { p: P, n: s.number }, t))!;
    await exec(
      `INSERT INTO appearances (id, production_id, scene_id, character_id, change_id, distress_stage, wet, stunt, vfx_shot)
       VALUES (:id, :p, :scene, :c, :change, :stage, :wet, :wet, true) ON CONFLICT DO NOTHING`,
      { id: demoId(`appearance:${s.number}:elias`), p: P, scene: scene.id, c: eliasCharacter, change: change.id, stage: s.stage, wet: s.wet },
      t,
    );
  }
  await exec(
    `INSERT INTO measurement_sets (id, production_id, performer_id, taken_on, taken_by, values_mm, entered_unit)
     VALUES (:id, :p, :perf, '2026-11-12', :by, CAST(:values AS jsonb), 'cm') ON CONFLICT DO NOTHING`,
    {
      id: demoId("measurements:elias:1"),
      p: P,
      perf: eliasPerformer,
      by: userId("cutter"),
      values: JSON.stringify({ height: 1830, neck_girth: 400, chest_girth: 1010, waist_girth: 870, hip_girth: 1000, across_back_width: 390, shoulder_width: 470, arm_length: 640, upper_arm_girth: 320, wrist_girth: 175, back_waist_length: 460, inside_leg_length: 830 }),
    },
    t,
  );
  // Two reference photos: a fitting turnaround of the jacket and a continuity still of scene 48A.
  const scene48 = (await one<{ id: string }>(`SELECT id FROM scenes WHERE production_id = :p AND number = '48A'`, { p: P }, t))!;
  const entryId = demoId("continuity:48A:elias");
  await exec(
    `INSERT INTO continuity_entries (id, production_id, scene_id, character_id, distress_stage, notes, logged_by)
     VALUES (:id, :p, :scene, :c, 2, 'Soaked through; left sleeve torn at the elbow.', :by) ON CONFLICT DO NOTHING`,
    { id: entryId, p: P, scene: scene48.id, c: eliasCharacter, by: userId("set_costumer") },
    t,
  );
  const photos = [
    { key: "jacket-front", ownerType: "garment", ownerId: keyGarments.eliasJacket, view: "front", caption: "Fitting: jacket front", hue: "#C98B2B" },
    { key: "48A-back", ownerType: "continuity_entry", ownerId: entryId, view: "back", caption: "Scene 48A, after the harbour", hue: "#5B6770" },
  ];
  for (const ph of photos) {
    const id = demoId(`photo:doubles:${ph.key}`);
    const key = `photos/${id.slice(0, 2)}/${id}/display.webp`;
    const bytes = await demoImage(ph.caption, ph.hue);
    if (!(await packetStore().exists(key))) await packetStore().write(key, Readable.from([bytes]));
    await exec(
      `INSERT INTO photos (id, production_id, owner_type, owner_id, view, caption, content_hash, original_name, width, height, bytes, variants, uploaded_by)
       VALUES (:id, :p, :ot, :oid, :view, :caption, :hash, :name, 480, 640, :bytes, CAST(:variants AS jsonb), :by) ON CONFLICT DO NOTHING`,
      { id, p: P, ot: ph.ownerType, oid: ph.ownerId, view: ph.view, caption: ph.caption, hash: createHash("sha256").update(bytes).digest("hex"), name: `${ph.key}.webp`, bytes: bytes.length, variants: JSON.stringify({ display: key, original: key }), by: userId("cutter") },
      t,
    );
  }
}

/** When the demo packet's version 1 was published (fixed, so a rebuilt ZIP is byte-identical). */
const PUBLISHED_AT = new Date("2026-11-27T16:00:00.000Z");

/** Panels, seams, the change's yardage marker and the published, received packet. */
export async function seedDoubles(t: Transaction): Promise<void> {
  const change = await one<{ id: string }>(
    `SELECT c.id FROM changes c LEFT JOIN change_items ci ON ci.change_id = c.id AND ci.garment_id = :jacket
      WHERE c.character_id = :c ORDER BY (ci.id IS NULL), c.number LIMIT 1`,
    { c: characters.elias.id, jacket: keyGarments.eliasJacket },
    t,
  );
  if (!change) return;
  const garmentIds = { jacket: keyGarments.eliasJacket, shirt: keyGarments.eliasShirt, trousers: keyGarments.eliasTrousers };
  for (const [i, p] of demoPanels.entries()) {
    await Panel.upsert(
      {
        id: demoId(`panel:${p.key}`),
        productionId: P,
        garmentId: garmentIds[p.garment],
        name: p.name,
        outline: p.outline,
        grainline: p.grainline,
        notches: p.notches,
        seamAllowanceMm: p.seamAllowanceMm,
        cutCount: p.cutCount,
        mirrored: p.mirrored,
        grainMode: p.grainMode,
        fabricId: null,
        source: "drawn",
        sortOrder: i,
      },
      { transaction: t },
    );
  }
  for (const s of demoSeams) {
    await Seam.upsert(
      {
        id: demoId(`seam:${s.key}`),
        productionId: P,
        name: s.name,
        panelAId: demoId(`panel:${s.a.panel}`),
        aFrom: s.a.from,
        aTo: s.a.to,
        aDirection: s.a.direction,
        panelBId: demoId(`panel:${s.b.panel}`),
        bFrom: s.b.from,
        bTo: s.b.to,
        bDirection: s.b.direction,
        toleranceMm: null,
        eased: Boolean(s.eased),
        easeMinMm: s.eased?.minMm ?? null,
        easeMaxMm: s.eased?.maxMm ?? null,
      },
      { transaction: t },
    );
  }
  await layMarker(P, { scope: "change", scopeId: change.id, multiples: 1 }, userId("cutter"), t);

  const packetId = demoId("packet:elias:1:v1");
  const existing = await Packet.findByPk(packetId, { transaction: t });
  if (existing?.status === "published") {
    // Published versions never change; only restore the ZIP if the storage folder was emptied.
    if (!(await packetStore().exists(existing.zipStorageKey!))) {
      const supervisor = await User.findByPk(userId("supervisor"), { transaction: t });
      await writePacketZip({ id: packetId, version: existing.version! }, existing.contents!, { publishedAt: existing.publishedAt!, publishedByName: supervisor?.name ?? "" });
    }
    return;
  }
  const found = (await findChange(P, change.id, t))!;
  const shots = await listVfxShots(P, change.id, t);
  const photos = await listPhotoCandidates(P, found, Object.values(garmentIds), t);
  const selection = packetSelectionSchema.parse({
    garmentIds: Object.values(garmentIds),
    photoIds: photos.map((p) => p.id),
    appearanceIds: shots.map((s) => s.appearanceId),
    recipientUserIds: [userId("vfx")],
    includeMeasurements: false,
    notes: "First handoff for the harbour sequence. Distress stages follow the shots list.",
  });
  const contents = await snapshotContents(P, change.id, selection, t);
  const supervisor = (await User.findByPk(userId("supervisor"), { transaction: t }))!;
  const zip = await writePacketZip({ id: packetId, version: 1 }, contents, { publishedAt: PUBLISHED_AT, publishedByName: supervisor.name });
  await Packet.create(
    {
      id: packetId,
      productionId: P,
      characterId: characters.elias.id,
      changeId: change.id,
      version: 1,
      status: "published",
      selection: { ...selection, includeMeasurements: false, notes: null },
      includeMeasurements: false,
      notes: selection.notes,
      contents,
      preparedBy: userId("cutter"),
      publishedBy: userId("supervisor"),
      publishedAt: PUBLISHED_AT,
      zipSha256: zip.sha256,
      zipBytes: zip.bytes,
      zipStorageKey: zip.key,
    },
    { transaction: t },
  );
  await PacketRecipient.upsert(
    {
      id: demoId("packet-recipient:elias:1:v1:vfx"),
      productionId: P,
      packetId,
      userId: userId("vfx"),
      notifiedAt: PUBLISHED_AT,
      downloadedAt: new Date("2026-11-28T09:12:00.000Z"),
      receivedAt: new Date("2026-11-28T09:30:00.000Z"),
    },
    { transaction: t },
  );
}
