import type { GarmentCheckoutDto, GarmentDto, GarmentStatusEventDto, OpenCheckoutDto } from "@shared/schemas/garments.js";
import { checkoutPastDue } from "@shared/domain/snags/checkouts.js";
import type { Garment, GarmentCheckout, GarmentStatusEvent } from "../models/index.js";

/**
 * Check-out → wire shape.
 * @param today the production's today (server clock), against which "past due" is judged
 */
export function presentCheckout(c: GarmentCheckout, today: string): GarmentCheckoutDto {
  return {
    id: c.id,
    garmentId: c.garmentId,
    to: { kind: c.toKind, id: c.toKind === "member" ? c.toUserId : c.toPerformerId, name: c.toName },
    shootDay: c.shootDay ? { id: c.shootDay.id, date: c.shootDay.date, kind: c.shootDay.kind, dayNumber: c.shootDay.dayNumber } : null,
    scene: c.scene ? { id: c.scene.id, number: c.scene.number } : null,
    dueBackOn: c.dueBackOn,
    pastDue: c.returnedAt === null && checkoutPastDue(c.dueBackOn, today),
    checkedOutAt: c.checkedOutAt.toISOString(),
    checkedOutByName: c.checkedOutByUser?.name ?? null,
    returnedAt: c.returnedAt ? c.returnedAt.toISOString() : null,
  };
}

/** Open check-out with its garment → wire shape. */
export function presentOpenCheckout(c: GarmentCheckout, today: string): OpenCheckoutDto {
  const g = c.garment;
  return {
    ...presentCheckout(c, today),
    garment: { id: c.garmentId, tagCode: g?.tagCode ?? "", name: g?.name ?? "", status: g?.status ?? "on_set" },
  };
}

/** What the presenter reads: a model instance, or a list's plain row with the same fields. */
type GarmentFields = Omit<Garment["_attributes"], "fabric" | "multiplesGroup" | "openCheckout"> & {
  fabric?: { name: string | null } | null;
  multiplesGroup?: { name: string | null } | null;
  openCheckout?: GarmentCheckout | null;
};

/**
 * Garment → wire shape (fabric and group names and the open check-out when they were loaded).
 * @param today the production's today, for the check-out's "past due"
 */
export function presentGarment(g: GarmentFields, today: string): GarmentDto {
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
    checkout: g.openCheckout ? presentCheckout(g.openCheckout, today) : null,
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
