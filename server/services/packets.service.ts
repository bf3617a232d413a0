import { Op, type Transaction } from "sequelize";
import { Readable } from "node:stream";
import { sequelize } from "../db.js";
import { config } from "../config.js";
import { logger } from "../lib/logger.js";
import { sendMail } from "../lib/mailer.js";
import { Membership, Packet, PacketRecipient, Panel, Production, Seam, User } from "../models/index.js";
import { ConflictError, NotFoundError, UnprocessableError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { canReceivePacket, canSeePacket } from "../policies/packets.policy.js";
import { can, rolesThatCan } from "@shared/permissions.js";
import {
  findChange,
  garmentsOfChange,
  latestMeasurementSet,
  listChanges,
  listPhotoCandidates,
  listVfxShots,
  type ChangeRow,
} from "./doubles-records.js";
import { physicsForFabrics } from "./yardage.service.js";
import { productionSeamTolerance, presentSeam } from "./seams.service.js";
import { photoZipPath } from "./packet-zip.js";
import { packetStore, packetZipKey, photoStorageKey, type PacketFileStore } from "./packet-storage.js";
import { progressRecorder, readProgress, type WorkProgressDto } from "./work-progress.service.js";
import { runHeavy } from "../lib/worker-pool.js";
import type { HeavyProgress } from "../workers/heavy-tasks.js";
import { Limits } from "@shared/constants.js";
import { packetPublishedEmail } from "../emails/packet-published.email.js";
import type { Actor } from "../middleware/require-auth.js";
import {
  packetSelectionSchema,
  type CreatePacketInput,
  type PacketContents,
  type PacketDetailDto,
  type PacketOptionsDto,
  type PacketRecipientDto,
  type PacketSelection,
  type PacketSummaryDto,
  type UpdatePacketInput,
} from "@shared/schemas/packets.js";
import { diffPacketContents, type PacketDiff } from "@shared/domain/packet-diff.js";
import { polygonArea } from "@shared/domain/panels/geometry.js";

// ---------------------------------------------------------------------------------------------
// Reading

async function recipientsOf(packetIds: string[], transaction?: Transaction): Promise<PacketRecipient[]> {
  if (packetIds.length === 0) return [];
  return PacketRecipient.findAll({
    where: { packetId: { [Op.in]: packetIds } },
    include: [{ model: User, as: "user" }],
    order: [["createdAt", "ASC"]],
    transaction,
  });
}

/** A packet the actor may see, or 404 (drafts and other people's packets look absent to vfx users). */
async function visiblePacket(
  actor: Actor,
  packetId: string,
  transaction?: Transaction,
): Promise<{ packet: Packet; recipients: PacketRecipient[] }> {
  const packet = await Packet.findOne({ where: { id: packetId, productionId: actor.productionId }, transaction });
  if (!packet) throw NotFoundError("Packet not found.");
  const recipients = await recipientsOf([packet.id], transaction);
  if (
    !canSeePacket(
      actor,
      packet,
      recipients.map((r) => r.userId),
    )
  )
    throw NotFoundError("Packet not found.");
  return { packet, recipients };
}

function presentRecipient(r: PacketRecipient): PacketRecipientDto {
  return {
    userId: r.userId,
    name: r.user?.name ?? "",
    email: r.user?.email ?? "",
    notifiedAt: r.notifiedAt?.toISOString() ?? null,
    downloadedAt: r.downloadedAt?.toISOString() ?? null,
    receivedAt: r.receivedAt?.toISOString() ?? null,
  };
}

function summarize(
  actor: Actor,
  p: Packet,
  change: ChangeRow | undefined,
  recipients: PacketRecipient[],
  publisherName: string | null,
  counts: PacketSummaryDto["counts"],
): PacketSummaryDto {
  // A vfx user sees only their own receipt, not who else the packet went to.
  const visible = can(actor.role, "packet.read_all") ? recipients : recipients.filter((r) => r.userId === actor.user.id);
  return {
    id: p.id,
    changeId: p.changeId,
    changeNumber: p.contents?.change.number ?? change?.number ?? 0,
    characterId: p.characterId,
    characterName: p.contents?.character.name ?? change?.characterName ?? "",
    version: p.version,
    status: p.status,
    includeMeasurements: p.includeMeasurements,
    publishedAt: p.publishedAt?.toISOString() ?? null,
    publishedByName: publisherName,
    zipSha256: p.zipSha256,
    zipBytes: p.zipBytes,
    counts,
    recipients: visible.map(presentRecipient),
    updatedAt: p.updatedAt.toISOString(),
  };
}

function countsOf(p: Packet): PacketSummaryDto["counts"] {
  if (p.contents)
    return {
      panels: p.contents.panels.length,
      photos: p.contents.photos.length,
      shots: p.contents.shots.length,
      fabrics: p.contents.fabrics.length,
    };
  const s = p.selection;
  return { panels: s.panelIds?.length ?? 0, photos: s.photoIds?.length ?? 0, shots: s.appearanceIds?.length ?? 0, fabrics: 0 };
}

/** Packets of the production (newest first); a vfx user gets only published versions sent to them. */
export async function listPackets(actor: Actor, query: { changeId?: string }): Promise<PacketSummaryDto[]> {
  const where: Record<string, unknown> = { productionId: actor.productionId };
  if (query.changeId) where.changeId = query.changeId;
  if (!can(actor.role, "packet.read_all")) {
    where.status = "published";
    where.id = {
      [Op.in]: sequelize.literal(`(SELECT packet_id FROM packet_recipients WHERE user_id = ${sequelize.escape(actor.user.id)})`),
    };
  }
  const packets = await Packet.findAll({
    where,
    order: [
      ["changeId", "ASC"],
      [sequelize.literal("version IS NULL"), "DESC"],
      ["version", "DESC"],
    ],
  });
  const recipients = await recipientsOf(packets.map((p) => p.id));
  const changes = new Map((await listChanges(actor.productionId)).map((c) => [c.id, c]));
  const publishers = new Map(
    (await User.findAll({ where: { id: { [Op.in]: packets.map((p) => p.publishedBy).filter((x): x is string => Boolean(x)) } } })).map(
      (u) => [u.id, u.name],
    ),
  );
  return packets.map((p) =>
    summarize(
      actor,
      p,
      changes.get(p.changeId),
      recipients.filter((r) => r.packetId === p.id),
      p.publishedBy ? (publishers.get(p.publishedBy) ?? null) : null,
      countsOf(p),
    ),
  );
}

async function previousPublished(p: Packet, transaction?: Transaction): Promise<Packet | null> {
  return Packet.findOne({
    where: { changeId: p.changeId, status: "published", ...(p.version !== null ? { version: { [Op.lt]: p.version } } : {}) },
    order: [["version", "DESC"]],
    transaction,
  });
}

/** One packet with contents (frozen, or computed now for a draft) and the diff against the previous version. */
export async function getPacket(actor: Actor, packetId: string): Promise<PacketDetailDto> {
  const { packet, recipients } = await visiblePacket(actor, packetId);
  const change = await findChange(actor.productionId, packet.changeId);
  const contents = packet.contents ?? (await snapshotContents(actor.productionId, packet.changeId, normalizedSelection(packet)));
  // vfx users only compare with versions they were sent.
  let prev = await previousPublished(packet);
  if (prev && !can(actor.role, "packet.read_all")) {
    const mine = await PacketRecipient.findOne({ where: { packetId: prev.id, userId: actor.user.id } });
    if (!mine) prev = null;
  }
  const diff: PacketDiff | null = prev?.contents ? diffPacketContents(prev.contents, contents) : null;
  const sinceReceived = await lastReceivedBefore(actor, packet, contents);
  const publisher = packet.publishedBy ? await User.findByPk(packet.publishedBy) : null;
  const counts = {
    panels: contents.panels.length,
    photos: contents.photos.length,
    shots: contents.shots.length,
    fabrics: contents.fabrics.length,
  };
  return {
    ...summarize(actor, packet, change, recipients, publisher?.name ?? null, counts),
    selection: can(actor.role, "packet.read_all")
      ? normalizedSelection(packet)
      : { ...normalizedSelection(packet), recipientUserIds: [actor.user.id] },
    contents,
    previousVersion: prev?.version ?? null,
    diff,
    sinceReceived,
  };
}

/** The actor's own newest receipt of an earlier version of the same change, and the diff from it to these contents. */
async function lastReceivedBefore(actor: Actor, packet: Packet, contents: PacketContents): Promise<PacketDetailDto["sinceReceived"]> {
  const receipts = await PacketRecipient.findAll({
    where: { userId: actor.user.id, productionId: actor.productionId, receivedAt: { [Op.ne]: null } },
  });
  if (receipts.length === 0) return null;
  const earlier = await Packet.findOne({
    where: {
      id: { [Op.in]: receipts.map((r) => r.packetId) },
      changeId: packet.changeId,
      status: "published",
      ...(packet.version !== null ? { version: { [Op.lt]: packet.version } } : {}),
    },
    order: [["version", "DESC"]],
  });
  if (!earlier?.contents || earlier.version === null) return null;
  const receipt = receipts.find((r) => r.packetId === earlier.id)!;
  return { version: earlier.version, receivedAt: receipt.receivedAt!.toISOString(), diff: diffPacketContents(earlier.contents, contents) };
}

function normalizedSelection(p: Packet): PacketSelection {
  return packetSelectionSchema.parse({ ...p.selection, includeMeasurements: p.includeMeasurements, notes: p.notes });
}

// ---------------------------------------------------------------------------------------------
// The builder's choices and the snapshot

async function vfxMembers(productionId: string, transaction?: Transaction) {
  const rows = await Membership.findAll({
    where: { productionId, role: rolesThatCan("packet.receive") },
    include: [{ model: User, as: "user" }],
    transaction,
  });
  return rows.map((m) => ({ userId: m.userId, name: m.user?.name ?? "", email: m.user?.email ?? "" }));
}

/** What the packet builder offers for a change: garments and panels, photos, effects shots, vfx members. */
export async function packetOptions(actor: Actor, changeId: string): Promise<PacketOptionsDto> {
  const change = await findChange(actor.productionId, changeId);
  if (!change) throw NotFoundError("Change not found.");
  const garments = await garmentsOfChange(actor.productionId, change.id);
  const panels = await Panel.findAll({ where: { garmentId: { [Op.in]: garments.map((g) => g.id) } }, order: [["sortOrder", "ASC"]] });
  const photos = await listPhotoCandidates(
    actor.productionId,
    change,
    garments.map((g) => g.id),
  );
  const shots = await listVfxShots(actor.productionId, change.id);
  const hasMeasurements = Boolean(change.performerId && (await latestMeasurementSet(actor.productionId, change.performerId)));
  const garmentName = new Map(garments.map((g) => [g.id, g.name]));
  return {
    change: {
      id: change.id,
      number: change.number,
      description: change.description,
      characterId: change.characterId,
      characterName: change.characterName,
    },
    garments: garments.map((g) => ({
      id: g.id,
      name: g.name,
      category: g.category,
      panels: panels.filter((p) => p.garmentId === g.id).map((p) => ({ id: p.id, name: p.name, cutCount: p.cutCount })),
    })),
    photos: photos.map((p) => ({
      id: p.id,
      ownerType: p.ownerType,
      ownerId: p.ownerId,
      view: p.view,
      caption: p.caption,
      label: p.sceneNumber
        ? `Continuity, scene ${p.sceneNumber} (${p.view})`
        : garmentName.has(p.ownerId)
          ? `${garmentName.get(p.ownerId)} (${p.view})`
          : `${p.ownerType.replace(/_/g, " ")} (${p.view})`,
    })),
    shots: shots.map((s) => ({
      appearanceId: s.appearanceId,
      sceneNumber: s.sceneNumber,
      distressStage: s.distressStage,
      wet: s.wet,
      blood: s.blood,
      stunt: s.stunt,
    })),
    vfxMembers: await vfxMembers(actor.productionId),
    hasMeasurements,
  };
}

function subsetOrThrow(field: string, chosen: readonly string[], allowed: Set<string>, what: string) {
  const bad = chosen.find((id) => !allowed.has(id));
  if (bad) throw ValidationError(`${field}: ${bad} is not ${what}`, { [field]: `contains an id that is not ${what}` });
}

/** Checks that every chosen id belongs to the change (garments, panels, photos, shots) or is a vfx member. */
async function validateSelection(productionId: string, change: ChangeRow, s: PacketSelection, transaction?: Transaction): Promise<void> {
  const garments = await garmentsOfChange(productionId, change.id, transaction);
  subsetOrThrow("garmentIds", s.garmentIds, new Set(garments.map((g) => g.id)), "a garment of this change");
  const panels = await Panel.findAll({ where: { productionId, garmentId: { [Op.in]: s.garmentIds } }, attributes: ["id"], transaction });
  subsetOrThrow("panelIds", s.panelIds, new Set(panels.map((p) => p.id)), "a panel of the chosen garments");
  // An empty panel list means every panel of the chosen garments.
  const panelCount = s.panelIds.length || panels.length;
  if (panelCount > Limits.packetMaxPanels) {
    const msg = `a packet holds at most ${Limits.packetMaxPanels} panels; this choice has ${panelCount} — choose fewer garments or panels`;
    throw ValidationError(`panelIds: ${msg}`, { panelIds: msg });
  }
  const photos = await listPhotoCandidates(
    productionId,
    change,
    garments.map((g) => g.id),
    transaction,
  );
  subsetOrThrow("photoIds", s.photoIds, new Set(photos.map((p) => p.id)), "a reference photo of this change");
  const shots = await listVfxShots(productionId, change.id, transaction);
  subsetOrThrow("appearanceIds", s.appearanceIds, new Set(shots.map((x) => x.appearanceId)), "an effects shot of this change");
  const members = await vfxMembers(productionId, transaction);
  subsetOrThrow("recipientUserIds", s.recipientUserIds, new Set(members.map((m) => m.userId)), "a vfx member of this production");
}

/** Builds the contents snapshot for a selection from the records as they are now. */
export async function snapshotContents(
  productionId: string,
  changeId: string,
  s: PacketSelection,
  transaction?: Transaction,
): Promise<PacketContents> {
  const change = await findChange(productionId, changeId, transaction);
  if (!change) throw NotFoundError("Change not found.");
  const production = await Production.findByPk(productionId, { transaction });
  const garments = (await garmentsOfChange(productionId, change.id, transaction)).filter((g) => s.garmentIds.includes(g.id));
  const garmentById = new Map(garments.map((g) => [g.id, g]));
  let panels = await Panel.findAll({
    where: { productionId, garmentId: { [Op.in]: garments.map((g) => g.id) } },
    order: [
      ["sortOrder", "ASC"],
      ["createdAt", "ASC"],
    ],
    transaction,
  });
  if (s.panelIds.length) panels = panels.filter((p) => s.panelIds.includes(p.id));
  panels.sort((a, b) => garments.findIndex((g) => g.id === a.garmentId) - garments.findIndex((g) => g.id === b.garmentId));
  const panelIds = panels.map((p) => p.id);
  const seams = panelIds.length
    ? await Seam.findAll({
        where: { panelAId: { [Op.in]: panelIds }, panelBId: { [Op.in]: panelIds } },
        include: [
          { model: Panel, as: "panelA" },
          { model: Panel, as: "panelB" },
        ],
        order: [["createdAt", "ASC"]],
        transaction,
      })
    : [];
  const tolerance = await productionSeamTolerance(productionId, transaction);
  const fabricIdOf = (p: Panel) => p.fabricId ?? garmentById.get(p.garmentId)?.fabricId ?? null;
  const fabricIds = [...panels.map(fabricIdOf), ...garments.map((g) => g.fabricId)].filter((x): x is string => Boolean(x));
  const fabrics = await physicsForFabrics(productionId, fabricIds, transaction);
  const photoRows = (
    await listPhotoCandidates(
      productionId,
      change,
      garments.map((g) => g.id),
      transaction,
    )
  ).filter((p) => s.photoIds.includes(p.id));
  const photos = photoRows.map((p, i) => {
    const key = photoStorageKey(p.variants);
    return {
      id: p.id,
      fileName: photoZipPath(i, p.view, p.id, key),
      view: p.view,
      caption: p.caption,
      ownerType: p.ownerType,
      ownerId: p.ownerId,
      contentHash: p.contentHash,
      storageKey: key,
      sceneId: p.sceneId,
    };
  });
  const shots = (await listVfxShots(productionId, change.id, transaction))
    .filter((x) => s.appearanceIds.includes(x.appearanceId))
    .map((x) => ({
      appearanceId: x.appearanceId,
      sceneId: x.sceneId,
      sceneNumber: x.sceneNumber,
      storyDay: x.storyDay,
      distressStage: x.distressStage,
      wet: x.wet,
      blood: x.blood,
      stunt: x.stunt,
      notes: x.notes,
      photoFiles: photos.filter((p) => p.sceneId === x.sceneId).map((p) => p.fileName),
    }));
  let measurements: PacketContents["measurements"] = null;
  if (s.includeMeasurements && change.performerId) {
    const m = await latestMeasurementSet(productionId, change.performerId, transaction);
    if (m) measurements = { performerName: change.performerName ?? "", takenOn: m.takenOn, valuesMm: m.valuesMm };
  }
  return {
    schemaVersion: 1,
    production: { id: productionId, title: production?.title ?? "", kind: production?.kind ?? "film" },
    character: { id: change.characterId, name: change.characterName },
    change: { id: change.id, number: change.number, description: change.description },
    garments: garments.map((g) => ({ id: g.id, name: g.name, category: g.category, tagCode: g.tagCode, fabricId: g.fabricId })),
    panels: panels.map((p) => ({
      id: p.id,
      garmentId: p.garmentId,
      garmentName: garmentById.get(p.garmentId)?.name ?? "",
      name: p.name,
      outline: p.outline,
      grainline: p.grainline,
      notches: p.notches,
      seamAllowanceMm: p.seamAllowanceMm,
      cutCount: p.cutCount,
      mirrored: p.mirrored,
      grainMode: p.grainMode,
      fabricId: fabricIdOf(p),
      areaMm2: polygonArea(p.outline),
    })),
    seams: seams.map((x) => {
      const d = presentSeam(x, x.panelA!, x.panelB!, tolerance);
      return {
        id: d.id,
        name: d.name,
        a: { panelId: d.a.panelId, from: d.a.from, to: d.a.to, direction: d.a.direction },
        b: { panelId: d.b.panelId, from: d.b.from, to: d.b.to, direction: d.b.direction },
        lengthAMm: d.lengthA,
        lengthBMm: d.lengthB,
        differenceMm: d.differenceMm,
        status: d.status,
        eased: d.eased,
        toleranceMm: d.effectiveToleranceMm,
      };
    }),
    fabrics: fabrics.map((f) => ({
      id: f.fabricId,
      name: f.name,
      construction: f.construction,
      fabricClass: f.fabricClass,
      fibreContent: f.fibreContent,
      widthMm: f.widthMm,
      simulation: f.values,
      tests: f.tests,
      retest: f.retest,
    })),
    photos: photos.map(({ sceneId: _sceneId, ...p }) => p),
    shots,
    measurements,
    notes: s.notes,
    meshTargetEdgeMm: s.meshEdgeMm,
  };
}

// ---------------------------------------------------------------------------------------------
// Drafts

/** Starts a draft for a change; choices not given are copied from the newest version, else default to everything but photos and measurements. */
export async function createPacketDraft(actor: Actor, input: CreatePacketInput): Promise<PacketDetailDto> {
  const id = await sequelize.transaction(async (transaction) => {
    const change = await findChange(actor.productionId, input.changeId, transaction);
    if (!change) throw ValidationError("changeId: no such change in this production", { changeId: "no such change in this production" });
    const open = await Packet.findOne({ where: { changeId: change.id, status: "draft" }, transaction });
    if (open)
      throw ConflictError("changeId: this change already has an open draft; edit or delete it first", {
        changeId: "already has an open draft",
      });
    const latest = await Packet.findOne({ where: { changeId: change.id, status: "published" }, order: [["version", "DESC"]], transaction });
    let base: PacketSelection;
    if (latest) base = normalizedSelection(latest);
    else {
      const garments = await garmentsOfChange(actor.productionId, change.id, transaction);
      const shots = await listVfxShots(actor.productionId, change.id, transaction);
      const members = await vfxMembers(actor.productionId, transaction);
      base = packetSelectionSchema.parse({
        garmentIds: garments.map((g) => g.id),
        appearanceIds: shots.map((x) => x.appearanceId),
        recipientUserIds: members.map((m) => m.userId),
      });
    }
    const { changeId: _c, ...rest } = input;
    const selection = packetSelectionSchema.parse({
      ...base,
      ...Object.fromEntries(Object.entries(rest).filter(([, v]) => v !== undefined)),
    });
    await validateSelection(actor.productionId, change, selection, transaction);
    const packet = await Packet.create(
      {
        productionId: actor.productionId,
        characterId: change.characterId,
        changeId: change.id,
        version: null,
        status: "draft",
        selection: { ...selection, includeMeasurements: false, notes: null },
        includeMeasurements: selection.includeMeasurements,
        notes: selection.notes,
        contents: null,
        preparedBy: actor.user.id,
        publishedBy: null,
        publishedAt: null,
        zipSha256: null,
        zipBytes: null,
        zipStorageKey: null,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "packet.create",
        entityType: "packet",
        entityId: packet.id,
        after: selection,
      },
      transaction,
    );
    return packet.id;
  });
  return getPacket(actor, id);
}

async function lockedPacket(actor: Actor, packetId: string, transaction: Transaction): Promise<Packet> {
  const packet = await Packet.findOne({
    where: { id: packetId, productionId: actor.productionId },
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (!packet) throw NotFoundError("Packet not found.");
  return packet;
}

const immutable = () =>
  ConflictError("A published version cannot change. Start a new draft to make the next version.", { status: "published" });

/** Edits a draft's choices; published versions answer 409. */
export async function updatePacketDraft(actor: Actor, packetId: string, input: UpdatePacketInput): Promise<PacketDetailDto> {
  await sequelize.transaction(async (transaction) => {
    const packet = await lockedPacket(actor, packetId, transaction);
    if (packet.status !== "draft") throw immutable();
    const change = await findChange(actor.productionId, packet.changeId, transaction);
    if (!change) throw NotFoundError("Change not found.");
    const selection = packetSelectionSchema.parse({
      ...normalizedSelection(packet),
      ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)),
    });
    await validateSelection(actor.productionId, change, selection, transaction);
    await packet.update(
      {
        selection: { ...selection, includeMeasurements: false, notes: null },
        includeMeasurements: selection.includeMeasurements,
        notes: selection.notes,
        preparedBy: actor.user.id,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "packet.update",
        entityType: "packet",
        entityId: packet.id,
        after: input,
      },
      transaction,
    );
  });
  return getPacket(actor, packetId);
}

/** Deletes a draft; published versions answer 409. */
export async function deletePacketDraft(actor: Actor, packetId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const packet = await lockedPacket(actor, packetId, transaction);
    if (packet.status !== "draft") throw immutable();
    await packet.destroy({ transaction });
    await recordAudit(
      { productionId: actor.productionId, actorId: actor.user.id, action: "packet.delete", entityType: "packet", entityId: packet.id },
      transaction,
    );
  });
}

// ---------------------------------------------------------------------------------------------
// Publishing, downloading, receiving

function describeDiff(d: PacketDiff | null): string | null {
  if (!d) return null;
  if (d.empty) return "nothing (re-issued)";
  const parts: string[] = [];
  const g = (label: string, x: { added: unknown[]; removed: unknown[]; changed: unknown[] }) => {
    const bits = [
      x.added.length && `${x.added.length} added`,
      x.removed.length && `${x.removed.length} removed`,
      x.changed.length && `${x.changed.length} changed`,
    ].filter(Boolean);
    if (bits.length) parts.push(`${label} ${bits.join(", ")}`);
  };
  g("panels", d.panels);
  g("seams", d.seams);
  g("fabrics", d.fabrics);
  g("shots", d.shots);
  g("photos", d.photos);
  if (d.measurements !== "unchanged") parts.push(`measurements ${d.measurements}`);
  return parts.join("; ");
}

/** Reads the photo files a packet copies in, keyed by storage key (the worker cannot reach storage). */
async function packetPhotos(contents: PacketContents, store: PacketFileStore): Promise<Record<string, Uint8Array>> {
  const out: Record<string, Uint8Array> = {};
  for (const p of contents.photos) if (p.storageKey && !out[p.storageKey]) out[p.storageKey] = await store.readBuffer(p.storageKey);
  return out;
}

/** Builds a packet's files and ZIP in the worker pool; returns the ZIP bytes and checksum. */
async function buildZipOffThread(
  contents: PacketContents,
  meta: { packetId: string; version: number; publishedAt: Date; publishedByName: string },
  onProgress?: (p: HeavyProgress) => void,
) {
  const photos = await packetPhotos(contents, packetStore());
  const built = await runHeavy("buildPacketZip", { contents, meta, photos }, { onProgress });
  return { zip: Buffer.from(built.zip.buffer, built.zip.byteOffset, built.zip.byteLength), sha256: built.sha256 };
}

/** Builds a version's ZIP from its frozen contents into storage; returns size and checksum. */
export async function writePacketZip(
  packet: { id: string; version: number },
  contents: PacketContents,
  meta: { publishedAt: Date; publishedByName: string },
  onProgress?: (p: HeavyProgress) => void,
): Promise<{ key: string; bytes: number; sha256: string }> {
  const { zip } = await buildZipOffThread(contents, { packetId: packet.id, version: packet.version, ...meta }, onProgress);
  const key = packetZipKey(packet.id, packet.version);
  const { bytes, sha256 } = await packetStore().write(key, Readable.from([zip]));
  return { key, bytes, sha256 };
}

/** How far the publishing of a packet has got (null when it is not being published). */
export async function publishProgress(actor: Actor, packetId: string): Promise<WorkProgressDto | null> {
  const packet = await Packet.findOne({ where: { id: packetId, productionId: actor.productionId }, attributes: ["id"] });
  if (!packet) throw NotFoundError("Packet not found.");
  return readProgress(actor.productionId, packetId, "packet_publish");
}

/**
 * Publishes a draft as the next numbered version: freezes the contents, writes the ZIP, records the
 * recipients and, after commit, e-mails them. Only drafts can be published.
 */
export async function publishPacket(actor: Actor, packetId: string): Promise<PacketDetailDto> {
  let writtenKey: string | null = null;
  let mail;
  const progress = progressRecorder(actor.productionId, packetId, "packet_publish");
  try {
    mail = await sequelize.transaction(async (transaction) => {
      const packet = await lockedPacket(actor, packetId, transaction);
      if (packet.status !== "draft") throw immutable();
      const change = await findChange(actor.productionId, packet.changeId, transaction);
      if (!change) throw NotFoundError("Change not found.");
      const selection = normalizedSelection(packet);
      await validateSelection(actor.productionId, change, selection, transaction);
      if (selection.recipientUserIds.length === 0)
        throw UnprocessableError("recipientUserIds: choose at least one vfx member to publish to", {
          recipientUserIds: "choose at least one recipient",
        });
      if (selection.garmentIds.length === 0)
        throw UnprocessableError("garmentIds: choose at least one garment", { garmentIds: "choose at least one garment" });
      const contents = await snapshotContents(actor.productionId, change.id, selection, transaction);
      if (contents.panels.length === 0)
        throw UnprocessableError("panelIds: the chosen garments have no panels yet", { panelIds: "no panels to hand off" });
      const max = (await Packet.max("version", { where: { changeId: change.id }, transaction })) as number | null;
      const version = (max ?? 0) + 1;
      const publishedAt = new Date(Math.floor(Date.now() / 1000) * 1000);
      progress.report({ stage: "snapshot", done: 1, total: 1 });
      const zip = await writePacketZip(
        { id: packet.id, version },
        contents,
        { publishedAt, publishedByName: actor.user.name },
        progress.report,
      );
      writtenKey = zip.key;
      const prev = await previousPublished(packet, transaction);
      await packet.update(
        {
          status: "published",
          version,
          contents,
          publishedBy: actor.user.id,
          publishedAt,
          zipSha256: zip.sha256,
          zipBytes: zip.bytes,
          zipStorageKey: zip.key,
        },
        { transaction },
      );
      for (const userId of selection.recipientUserIds) {
        await PacketRecipient.create(
          { productionId: actor.productionId, packetId: packet.id, userId, notifiedAt: null, downloadedAt: null, receivedAt: null },
          { transaction },
        );
      }
      await recordAudit(
        {
          productionId: actor.productionId,
          actorId: actor.user.id,
          action: "packet.publish",
          entityType: "packet",
          entityId: packet.id,
          after: { version, sha256: zip.sha256, bytes: zip.bytes, recipients: selection.recipientUserIds },
        },
        transaction,
      );
      const production = await Production.findByPk(actor.productionId, { transaction });
      return {
        version,
        recipients: selection.recipientUserIds,
        email: packetPublishedEmail({
          productionTitle: production?.title ?? "",
          characterName: change.characterName,
          changeNumber: change.number,
          version,
          publisherName: actor.user.name,
          url: `${config.APP_URL}/p/${actor.productionId}/doubles/packets/${packet.id}`,
          changed: describeDiff(prev?.contents ? diffPacketContents(prev.contents, contents) : null),
        }),
      };
    });
  } catch (err) {
    // The transaction rolled back: the ZIP it wrote belongs to no version.
    const orphan: string | null = writtenKey;
    if (orphan)
      await packetStore()
        .remove(orphan)
        .catch((e: unknown) => logger.warn({ err: e }, "could not remove an orphan packet zip"));
    throw err;
  } finally {
    await progress.finish();
  }
  // After commit: a failed send is logged and does not undo the publication.
  const users = await User.findAll({ where: { id: { [Op.in]: mail.recipients } } });
  for (const u of users) {
    if (await sendMail({ to: u.email, ...mail.email }, { kind: "packet_published", productionId: actor.productionId })) {
      await PacketRecipient.update({ notifiedAt: new Date() }, { where: { packetId, userId: u.id } });
    }
  }
  return getPacket(actor, packetId);
}

/** A packet ZIP to send: the stored version, or for a draft a preview built on the fly. */
export interface PacketDownload {
  stream: Readable;
  fileName: string;
  bytes: number | null;
  sha256: string | null;
}

/** Opens the ZIP of a packet the actor may see; a vfx download is recorded on their receipt. */
export async function downloadPacket(actor: Actor, packetId: string): Promise<PacketDownload> {
  const { packet } = await visiblePacket(actor, packetId);
  const base = `${(packet.contents?.character.name ?? "packet").replace(/[^A-Za-z0-9]+/g, "-")}`;
  if (packet.status === "published") {
    if (can(actor.role, "packet.receive"))
      await PacketRecipient.update(
        { downloadedAt: new Date() },
        { where: { packetId: packet.id, userId: actor.user.id, downloadedAt: null } },
      );
    const change = packet.contents!.change.number;
    return {
      stream: packetStore().read(packet.zipStorageKey!),
      fileName: `${base}-change-${change}-v${packet.version}.zip`,
      bytes: packet.zipBytes,
      sha256: packet.zipSha256,
    };
  }
  // A draft preview: streamed straight from archiver, nothing stored.
  const contents = await snapshotContents(actor.productionId, packet.changeId, normalizedSelection(packet));
  const now = new Date(Math.floor(Date.now() / 1000) * 1000);
  const { zip, sha256 } = await buildZipOffThread(contents, {
    packetId: packet.id,
    version: 0,
    publishedAt: now,
    publishedByName: `${actor.user.name} (draft preview)`,
  });
  return {
    stream: Readable.from([zip]),
    fileName: `${contents.character.name.replace(/[^A-Za-z0-9]+/g, "-")}-change-${contents.change.number}-draft.zip`,
    bytes: zip.length,
    sha256,
  };
}

/** Marks a published version received by the signed-in vfx recipient (idempotent). */
export async function markPacketReceived(actor: Actor, packetId: string): Promise<PacketDetailDto> {
  await sequelize.transaction(async (transaction) => {
    const packet = await Packet.findOne({ where: { id: packetId, productionId: actor.productionId }, transaction });
    if (!packet) throw NotFoundError("Packet not found.");
    const recipients = await recipientsOf([packet.id], transaction);
    if (
      !canReceivePacket(
        actor,
        packet,
        recipients.map((r) => r.userId),
      )
    )
      throw NotFoundError("Packet not found.");
    const mine = recipients.find((r) => r.userId === actor.user.id)!;
    if (!mine.receivedAt) {
      await PacketRecipient.update({ receivedAt: new Date() }, { where: { id: mine.id }, transaction });
      await recordAudit(
        {
          productionId: actor.productionId,
          actorId: actor.user.id,
          action: "packet.receive",
          entityType: "packet",
          entityId: packet.id,
          after: { version: packet.version },
        },
        transaction,
      );
    }
  });
  return getPacket(actor, packetId);
}
