import type { GarmentDto, GarmentStatusEventDto } from "@shared/schemas/garments.js";
import type { Garment, GarmentStatusEvent } from "../models/index.js";

/** What the presenter reads: a model instance, or a list's plain row with the same fields. */
type GarmentFields = Omit<Garment["_attributes"], "fabric" | "multiplesGroup"> & {
  fabric?: { name: string | null } | null;
  multiplesGroup?: { name: string | null } | null;
};

/** Garment → wire shape (fabric and group names when they were loaded). */
export function presentGarment(g: GarmentFields): GarmentDto {
  return {
    id: g.id,
    tagCode: g.tagCode,
    name: g.name,
    category: g.category,
    sizeLabel: g.sizeLabel,
    fitIntent: g.fitIntent,
    finishedMeasurements: g.finishedMeasurements ?? {},
    fabricId: g.fabricId,
    fabricName: g.fabric?.name ?? null,
    colour: g.colour,
    source: g.source,
    vendor: g.vendor,
    costCents: g.costCents,
    rentalDueOn: g.rentalDueOn,
    rentalCostPerWeekCents: g.rentalCostPerWeekCents ?? null,
    wrapDisposition: g.wrapDisposition ?? null,
    locationRack: g.locationRack,
    locationBin: g.locationBin,
    status: g.status,
    distressStage: g.distressStage,
    multiplesGroupId: g.multiplesGroupId,
    multiplesGroupName: g.multiplesGroup?.name ?? null,
    copyNumber: g.copyNumber,
    notes: g.notes,
    updatedAt: g.updatedAt.toISOString(),
  };
}

/** Status history row → wire shape. */
export function presentGarmentEvent(e: GarmentStatusEvent): GarmentStatusEventDto {
  return {
    id: e.id,
    fromStatus: e.fromStatus,
    toStatus: e.toStatus,
    fromLocation: e.fromLocation,
    toLocation: e.toLocation,
    note: e.note,
    actorId: e.actorId,
    actorName: e.actor?.name ?? null,
    at: e.createdAt.toISOString(),
  };
}
