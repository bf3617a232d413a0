/**
 * Digital doubles demo: Elias Marr's main change gets real panels for his jacket, shirt and
 * trousers, seams that match, a yardage marker, and a published handoff packet (version 1) that the
 * demo vfx user has received. Runs after every other step; idempotent (fixed ids, upserts).
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../server/db.js";
import { Packet, PacketRecipient, Panel, Seam, User } from "../server/models/index.js";
import { layMarker } from "../server/services/yardage.service.js";
import { snapshotContents, writePacketZip } from "../server/services/packets.service.js";
import { listPhotoCandidates, listVfxShots, findChange } from "../server/services/doubles-records.js";
import { packetStore } from "../server/services/packet-storage.js";
import { packetSelectionSchema } from "../shared/schemas/packets.js";
import { demoId } from "./ids.js";
import { SALTMARSH_ID, userId } from "./accounts.js";
import { characters, keyGarments } from "./scenario.js";
import { demoDaysFromToday, demoInstant } from "./calendar.js";
import { demoPanels, demoSeams } from "./doubles-patterns.js";

const P = SALTMARSH_ID;

async function one<T extends object>(sql: string, replacements: Record<string, unknown>, transaction: Transaction): Promise<T | undefined> {
  const [row] = await sequelize.query<T>(sql, { replacements, transaction, type: QueryTypes.SELECT });
  return row;
}

/** Panels, seams, the change's yardage marker and the published, received packet. */
export async function seedDoubles(t: Transaction): Promise<void> {
  const PUBLISHED_AT = demoInstant(demoDaysFromToday(-5), "16:00");
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
      await writePacketZip({ id: packetId, version: existing.version! }, existing.contents!, {
        publishedAt: existing.publishedAt!,
        publishedByName: supervisor?.name ?? "",
      });
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
      downloadedAt: demoInstant(demoDaysFromToday(-4), "09:12"),
      receivedAt: demoInstant(demoDaysFromToday(-4), "09:30"),
    },
    { transaction: t },
  );
}
