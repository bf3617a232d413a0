import { Op, type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import { Panel, Seam } from "../models/index.js";
import { NotFoundError, PayloadTooLargeError, UnprocessableError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { findChange, findGarment, garmentsOfChange, listChanges, listFabrics, type GarmentRow } from "./doubles-records.js";
import type { Actor } from "../middleware/require-auth.js";
import type {
  CreatePanelInput,
  DoublesChangeDto,
  DoublesFabricOptionDto,
  DxfImportFields,
  DxfPreviewFields,
  UpdatePanelInput,
} from "@shared/schemas/doubles.js";
import { noPieceReason, type DxfImport, type DxfPiece } from "@shared/domain/panels/dxf.js";
import { Limits } from "@shared/constants.js";
import { nameFromFile } from "@shared/schemas/common.js";
import type { PanelShape } from "@shared/domain/panels/geometry.js";
import { runHeavy } from "../lib/worker-pool.js";
import { rememberCutArea } from "./panel-cut-area.js";

/** Changes of the production with their garments and panel counts, for the doubles screen's picker. */
export async function listDoublesChanges(actor: Actor): Promise<DoublesChangeDto[]> {
  const changes = await listChanges(actor.productionId);
  const counts = new Map<string, number>();
  const rows = (await sequelize.query(
    `SELECT garment_id AS "garmentId", count(*)::int AS n FROM panels WHERE production_id = :pid GROUP BY garment_id`,
    {
      replacements: { pid: actor.productionId },
      type: "SELECT",
    },
  )) as Array<{ garmentId: string; n: number }>;
  for (const r of rows) counts.set(r.garmentId, r.n);
  const out: DoublesChangeDto[] = [];
  for (const c of changes) {
    const garments = await garmentsOfChange(actor.productionId, c.id);
    out.push({
      id: c.id,
      number: c.number,
      description: c.description,
      characterId: c.characterId,
      characterName: c.characterName,
      garments: garments.map((g) => ({
        id: g.id,
        name: g.name,
        category: g.category,
        tagCode: g.tagCode,
        fabricId: g.fabricId,
        fabricName: g.fabricName,
        panelCount: counts.get(g.id) ?? 0,
      })),
    });
  }
  return out;
}

/** Fabrics to choose from in panel forms. */
export async function listFabricOptions(actor: Actor): Promise<DoublesFabricOptionDto[]> {
  const rows = await listFabrics(actor.productionId);
  return rows.map((f) => ({ id: f.id, name: f.name, construction: f.construction, widthMm: f.widthMm }));
}

/** The garments in scope: one garment, or every garment of a change. 404 when it is not in this production. */
export async function garmentsInScope(
  actor: Pick<Actor, "productionId">,
  scope: { garmentId?: string; changeId?: string },
  transaction?: Transaction,
): Promise<GarmentRow[]> {
  if (scope.garmentId) {
    const g = await findGarment(actor.productionId, scope.garmentId, transaction);
    if (!g) throw NotFoundError("Garment not found.");
    return [g];
  }
  if (scope.changeId) {
    const c = await findChange(actor.productionId, scope.changeId, transaction);
    if (!c) throw NotFoundError("Change not found.");
    return garmentsOfChange(actor.productionId, c.id, transaction);
  }
  throw ValidationError("garmentId: give a garment or a change", { garmentId: "give a garment or a change" });
}

/** Panels of a garment or a change, in garment then sort order; with each garment's fabric for the effective fabric. */
export async function listPanels(
  actor: Actor,
  scope: { garmentId?: string; changeId?: string },
): Promise<{ panels: Panel[]; garmentFabric: Map<string, string | null> }> {
  const garments = await garmentsInScope(actor, scope);
  const panels = await Panel.findAll({
    where: { productionId: actor.productionId, garmentId: { [Op.in]: garments.map((g) => g.id) } },
    order: [
      ["sortOrder", "ASC"],
      ["createdAt", "ASC"],
    ],
  });
  const order = new Map(garments.map((g, i) => [g.id, i]));
  panels.sort((a, b) => order.get(a.garmentId)! - order.get(b.garmentId)!);
  return { panels, garmentFabric: new Map(garments.map((g) => [g.id, g.fabricId])) };
}

/** One panel of the production, or 404. */
export async function getPanel(actor: Actor, panelId: string, transaction?: Transaction): Promise<Panel> {
  const p = await Panel.findOne({ where: { id: panelId, productionId: actor.productionId }, transaction });
  if (!p) throw NotFoundError("Panel not found.");
  return p;
}

/** The garment's fabric, for presenting one panel. */
export async function garmentFabricOf(actor: Actor, garmentId: string): Promise<string | null> {
  return (await findGarment(actor.productionId, garmentId))?.fabricId ?? null;
}

async function assertFabric(actor: Actor, fabricId: string | null | undefined, transaction: Transaction) {
  if (!fabricId) return;
  const [f] = await listFabrics(actor.productionId, [fabricId], transaction);
  if (!f) throw ValidationError("fabricId: no such fabric in this production", { fabricId: "no such fabric in this production" });
}

async function nextSortOrder(garmentId: string, transaction: Transaction): Promise<number> {
  const max = (await Panel.max("sortOrder", { where: { garmentId }, transaction })) as number | null;
  return (max ?? -1) + 1;
}

/** Creates a panel on a garment of this production. */
export async function createPanel(actor: Actor, input: CreatePanelInput): Promise<Panel> {
  return sequelize.transaction(async (transaction) => {
    const garment = await findGarment(actor.productionId, input.garmentId, transaction);
    if (!garment)
      throw ValidationError("garmentId: no such garment in this production", { garmentId: "no such garment in this production" });
    await assertFabric(actor, input.fabricId, transaction);
    const panel = await Panel.create(
      {
        productionId: actor.productionId,
        garmentId: garment.id,
        name: input.name,
        outline: input.outline as [number, number][],
        grainline: (input.grainline as [[number, number], [number, number]] | null) ?? null,
        notches: input.notches as { point: [number, number]; edge: number }[],
        seamAllowanceMm: input.seamAllowanceMm,
        cutCount: input.cutCount,
        mirrored: input.mirrored,
        grainMode: input.grainMode,
        fabricId: input.fabricId ?? null,
        sortOrder: await nextSortOrder(garment.id, transaction),
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "panel.create",
        entityType: "panel",
        entityId: panel.id,
        after: { name: panel.name, garmentId: garment.id },
      },
      transaction,
    );
    return panel;
  });
}

/**
 * Updates a panel. Seams keep vertex indices, so an outline with fewer points than a seam on it
 * refers to is refused (move or delete the seam first).
 */
export async function updatePanel(actor: Actor, panelId: string, input: UpdatePanelInput): Promise<Panel> {
  return sequelize.transaction(async (transaction) => {
    const panel = await Panel.findOne({
      where: { id: panelId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!panel) throw NotFoundError("Panel not found.");
    await assertFabric(actor, input.fabricId, transaction);
    if (input.outline) {
      const n = input.outline.length;
      if (input.notches === undefined && panel.notches.some((x) => x.edge >= n)) {
        throw ValidationError("notches: a notch sits on an edge the new outline no longer has", {
          notches: "a notch sits on an edge the new outline no longer has",
        });
      }
      const seams = await Seam.findAll({ where: { [Op.or]: [{ panelAId: panel.id }, { panelBId: panel.id }] }, transaction });
      const maxRef = Math.max(
        -1,
        ...seams.flatMap((s) => {
          const ends = s.panelAId === panel.id ? [s.aFrom, s.aTo] : [s.bFrom, s.bTo];
          if (s.panelAId === panel.id && s.panelBId === panel.id) ends.push(s.bFrom, s.bTo);
          return ends.map((e) => (typeof e === "number" ? e : e.edge));
        }),
      );
      if (maxRef >= n) {
        throw UnprocessableError(`outline: a seam uses vertex or edge ${maxRef}; the new outline has only ${n} points`, {
          outline: `a seam uses vertex or edge ${maxRef}`,
        });
      }
    }
    const before = { name: panel.name, outline: panel.outline, cutCount: panel.cutCount, seamAllowanceMm: panel.seamAllowanceMm };
    const patch: Partial<Panel> = {};
    if (input.name !== undefined) patch.name = input.name;
    if (input.outline !== undefined) patch.outline = input.outline as [number, number][];
    if (input.grainline !== undefined) patch.grainline = input.grainline as [[number, number], [number, number]] | null;
    if (input.notches !== undefined) patch.notches = input.notches as { point: [number, number]; edge: number }[];
    if (input.seamAllowanceMm !== undefined) patch.seamAllowanceMm = input.seamAllowanceMm;
    if (input.cutCount !== undefined) patch.cutCount = input.cutCount;
    if (input.mirrored !== undefined) patch.mirrored = input.mirrored;
    if (input.grainMode !== undefined) patch.grainMode = input.grainMode;
    if (input.fabricId !== undefined) patch.fabricId = input.fabricId;
    await panel.update(patch, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "panel.update",
        entityType: "panel",
        entityId: panel.id,
        before,
        after: patch,
      },
      transaction,
    );
    return panel;
  });
}

/** Deletes a panel (its seams go with it). */
export async function deletePanel(actor: Actor, panelId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const panel = await Panel.findOne({
      where: { id: panelId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!panel) throw NotFoundError("Panel not found.");
    await panel.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "panel.delete",
        entityType: "panel",
        entityId: panel.id,
        before: { name: panel.name, garmentId: panel.garmentId },
      },
      transaction,
    );
  });
}

/** Largest DXF accepted, bytes. */
export const DXF_MAX_BYTES = Limits.dxfMaxBytes;

/**
 * Reads an uploaded DXF file in the worker pool (parsing, curve flattening and outline checks are CPU
 * work that would otherwise hold up every other request). 422 for a file that is not readable DXF,
 * 413 naming the limit for a drawing beyond the caps.
 */
export async function readDxfUpload(buffer: Buffer, fields: DxfPreviewFields): Promise<DxfImport> {
  // A copy the worker can own: multer's buffer may share a pooled ArrayBuffer with other data.
  const bytes = new Uint8Array(buffer.byteLength);
  bytes.set(buffer);
  const result = await runHeavy(
    "readDxf",
    { bytes, options: { units: fields.units, seamAllowanceMm: fields.seamAllowanceMm } },
    { transfer: [bytes.buffer] },
  );
  if (!result.ok && result.kind === "limit") throw PayloadTooLargeError(`file: ${result.message}`, { file: result.message });
  if (!result.ok) throw UnprocessableError(`file: is not a readable DXF file (${result.message})`, { file: "is not a readable DXF file" });
  return result.value;
}

/** The pieces of a read file that can be imported; 422 with the reason when there are none. */
function importablePieces(read: DxfImport): DxfPiece[] {
  if (read.pieces.length === 0) {
    const reason = noPieceReason(read);
    throw UnprocessableError(`file: ${reason}`, { file: reason });
  }
  const ok = read.pieces.filter((p) => p.importable);
  if (ok.length === 0) {
    const first = read.pieces[0];
    const why = `no piece can be imported: "${first.name}" ${first.problems.slice(0, 3).join("; ")}${read.pieces.length > 1 ? ` (and ${read.pieces.length - 1} more with problems)` : ""}`;
    throw UnprocessableError(`file: ${why}`, { file: why });
  }
  return ok;
}

/** Imports every importable piece of a DXF file onto a garment, in one transaction. */
export async function importDxfPanels(
  actor: Actor,
  input: DxfImportFields,
  buffer: Buffer,
): Promise<{ panels: Panel[]; warnings: string[]; skipped: string[] }> {
  const read = await readDxfUpload(buffer, input);
  const pieces = importablePieces(read);
  const skipped = read.pieces.filter((p) => !p.importable).map((p) => `${p.name}: ${p.problems.slice(0, 3).join("; ")}`);
  return sequelize.transaction(async (transaction) => {
    const garment = await findGarment(actor.productionId, input.garmentId, transaction);
    if (!garment)
      throw ValidationError("garmentId: no such garment in this production", { garmentId: "no such garment in this production" });
    await assertFabric(actor, input.fabricId, transaction);
    let order = await nextSortOrder(garment.id, transaction);
    const created: Panel[] = [];
    for (const p of pieces) {
      const panel = await Panel.create(
        {
          productionId: actor.productionId,
          garmentId: garment.id,
          name: nameFromFile(p.name, 120, "Piece"),
          outline: p.outline.map(([x, y]) => [x, y] as [number, number]),
          grainline: p.grainline
            ? [
                [p.grainline[0][0], p.grainline[0][1]],
                [p.grainline[1][0], p.grainline[1][1]],
              ]
            : null,
          notches: (p.notches ?? []).map((n) => ({ point: [n.point[0], n.point[1]] as [number, number], edge: n.edge })),
          seamAllowanceMm: Math.min(100, Math.max(0, p.seamAllowanceMm)),
          cutCount: Math.min(99, Math.max(1, p.cutCount)),
          mirrored: Boolean(p.mirrored),
          grainMode: "straight",
          fabricId: input.fabricId,
          source: "dxf",
          sortOrder: order++,
        },
        { transaction },
      );
      // The worker already offset the outline; the response then needs no clipper work on this thread.
      if (panel.seamAllowanceMm === p.seamAllowanceMm) rememberCutArea(panel, p.cutAreaMm2);
      created.push(panel);
    }
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "panel.import_dxf",
        entityType: "garment",
        entityId: garment.id,
        after: { pieces: created.map((c) => c.name), units: read.units.unit, convention: read.convention },
      },
      transaction,
    );
    return { panels: created, warnings: read.warnings, skipped };
  });
}

/** A panel as the shared geometry code takes it. */
export function panelShape(
  p: Pick<Panel, "id" | "name" | "outline" | "grainline" | "notches" | "seamAllowanceMm" | "cutCount" | "mirrored" | "grainMode">,
): PanelShape {
  return {
    id: p.id,
    name: p.name,
    outline: p.outline,
    grainline: p.grainline,
    notches: p.notches,
    seamAllowanceMm: p.seamAllowanceMm,
    cutCount: p.cutCount,
    mirrored: p.mirrored,
    grainMode: p.grainMode,
  };
}
