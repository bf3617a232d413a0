import { createHash } from "node:crypto";
import { Op, type Transaction } from "sequelize";
import { Marker, Panel } from "../models/index.js";
import { recordAudit } from "./audit.service.js";
import { garmentsInScope, panelShape } from "./panels.service.js";
import { listFabrics, listFabricTests, fabricClassOf, fabricTestsFromRow } from "./doubles-records.js";
import type { Actor } from "../middleware/require-auth.js";
import type { FabricPhysicsDto, MarkerDto, MarkerFabricResultDto, MarkerInput } from "@shared/schemas/doubles.js";
import { planYardage, type YardageGroup } from "@shared/domain/panels/yardage.js";
import { fabricSimulationValues } from "@shared/domain/fabric-physics.js";
import { cantileverRetest } from "@shared/domain/cantilever.js";

/** Groups the panels of a garment or change by the fabric they are cut from. */
async function yardageGroups(
  productionId: string,
  input: Pick<MarkerInput, "scope" | "scopeId">,
  transaction?: Transaction,
): Promise<YardageGroup[]> {
  const garments = await garmentsInScope(
    { productionId },
    input.scope === "garment" ? { garmentId: input.scopeId } : { changeId: input.scopeId },
    transaction,
  );
  const garmentFabric = new Map(garments.map((g) => [g.id, g.fabricId]));
  const panels = await Panel.findAll({
    where: { productionId, garmentId: { [Op.in]: garments.map((g) => g.id) } },
    order: [
      ["garmentId", "ASC"],
      ["sortOrder", "ASC"],
      ["createdAt", "ASC"],
    ],
    transaction,
  });
  const fabrics = new Map((await listFabrics(productionId, undefined, transaction)).map((f) => [f.id, f]));
  const groups = new Map<string, YardageGroup>();
  for (const p of panels) {
    const fabricId = p.fabricId ?? garmentFabric.get(p.garmentId) ?? null;
    const key = fabricId ?? "none";
    let g = groups.get(key);
    if (!g) {
      const f = fabricId ? fabrics.get(fabricId) : undefined;
      g = { fabricId, fabricName: f?.name ?? "No fabric set", clothWidthMm: f?.widthMm ?? null, panels: [] };
      groups.set(key, g);
    }
    g.panels.push(panelShape(p));
  }
  return [...groups.values()].sort((a, b) => a.fabricName.localeCompare(b.fabricName));
}

function hashGroups(groups: YardageGroup[], multiples: number): string {
  return createHash("sha256").update(JSON.stringify({ groups, multiples })).digest("hex");
}

function presentMarker(m: Marker, current: boolean): MarkerDto {
  return {
    id: m.id,
    scope: m.scope,
    scopeId: m.scopeId,
    multiples: m.multiples,
    fabrics: m.result.fabrics,
    createdAt: m.createdAt.toISOString(),
    current,
  };
}

/** Lays the marker(s) for a garment or change and caches the result (the seed calls this inside its transaction). */
export async function layMarker(
  productionId: string,
  input: MarkerInput,
  createdBy: string | null,
  transaction?: Transaction,
): Promise<Marker> {
  const groups = await yardageGroups(productionId, input, transaction);
  const results = planYardage(groups, input.multiples);
  const fabrics: MarkerFabricResultDto[] = results.map((r) => ({
    fabricId: r.fabricId,
    fabricName: r.fabricName,
    usableWidthMm: r.usableWidthMm,
    markerLengthMm: r.markerLengthMm,
    lowerBoundMm: r.lowerBoundMm,
    efficiency: r.efficiency,
    pieceAreaMm2: r.pieceAreaMm2,
    copies: r.copies,
    placements: r.placements,
    unplaced: r.unplaced,
  }));
  const inputHash = hashGroups(groups, input.multiples);
  const [marker] = await Marker.upsert(
    { productionId, scope: input.scope, scopeId: input.scopeId, multiples: input.multiples, inputHash, result: { fabrics }, createdBy },
    { conflictFields: ["production_id", "scope", "scope_id", "multiples"] as never, transaction },
  );
  return marker;
}

/** Lays the marker(s) for a garment or change on the server and caches the result. */
export async function computeMarker(actor: Actor, input: MarkerInput): Promise<MarkerDto> {
  const marker = await layMarker(actor.productionId, input, actor.user.id);
  const fabrics = marker.result.fabrics;
  await recordAudit({
    productionId: actor.productionId,
    actorId: actor.user.id,
    action: "marker.compute",
    entityType: "marker",
    entityId: marker.id,
    after: { scope: input.scope, multiples: input.multiples, lengthsMm: fabrics.map((f) => Math.round(f.markerLengthMm)) },
  });
  return presentMarker(marker, true);
}

/** The cached marker for a scope and multiples, or null; `current` is false when the panels changed since. */
export async function getMarker(actor: Actor, input: MarkerInput): Promise<MarkerDto | null> {
  const m = await Marker.findOne({
    where: { productionId: actor.productionId, scope: input.scope, scopeId: input.scopeId, multiples: input.multiples },
  });
  if (!m) {
    await garmentsInScope(actor, input.scope === "garment" ? { garmentId: input.scopeId } : { changeId: input.scopeId });
    return null;
  }
  const groups = await yardageGroups(actor.productionId, input);
  return presentMarker(m, hashGroups(groups, input.multiples) === m.inputHash);
}

/** Simulation values for the given fabrics, from their recorded tests (measured) or class defaults (assumed). */
export async function physicsForFabrics(productionId: string, fabricIds: string[], transaction?: Transaction): Promise<FabricPhysicsDto[]> {
  const fabrics = await listFabrics(productionId, [...new Set(fabricIds)], transaction);
  const tests = await listFabricTests(
    productionId,
    fabrics.map((f) => f.id),
    transaction,
  );
  return fabrics.map((f) => {
    const rows = tests.filter((t) => t.fabricId === f.id);
    const fabricClass = fabricClassOf(f.construction, f.massPerAreaGsm);
    const recorded = rows.flatMap(fabricTestsFromRow);
    const values = fabricSimulationValues({ fabricClass, declaredMassPerAreaGsm: f.massPerAreaGsm ?? undefined, tests: recorded });
    // A thickness on the fabric record beats the class default when no thickness test exists.
    if (values.thickness.basis === "assumed" && f.thicknessMm) {
      values.thickness = {
        value: f.thicknessMm / 1000,
        unit: "m",
        basis: "assumed",
        note: `thickness ${f.thicknessMm} mm from the fabric record, not tested`,
      };
    }
    return {
      fabricId: f.id,
      name: f.name,
      construction: f.construction,
      fabricClass,
      fibreContent: f.fibreContent,
      widthMm: f.widthMm,
      values,
      tests: rows.map((t) => ({ id: t.id, kind: t.kind, direction: t.direction, testedOn: t.testedOn })),
      retest: cantileverRetest(values, recorded),
    };
  });
}

/** Physics of every fabric the panels of a garment or change are cut from (and the garments' own fabrics). */
export async function fabricPhysics(actor: Actor, scope: { garmentId?: string; changeId?: string }): Promise<FabricPhysicsDto[]> {
  const garments = await garmentsInScope(actor, scope);
  const panels = await Panel.findAll({
    where: { productionId: actor.productionId, garmentId: { [Op.in]: garments.map((g) => g.id) } },
    attributes: ["fabricId"],
  });
  const ids = [...garments.map((g) => g.fabricId), ...panels.map((p) => p.fabricId)].filter((x): x is string => Boolean(x));
  return physicsForFabrics(actor.productionId, ids);
}
