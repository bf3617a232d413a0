// Which records may own photos, who may see and add them, and how to check the owner exists in
// the actor's production. Features register their owner types here; there is one upload pipeline.
import type { Transaction } from "sequelize";
import { QueryTypes } from "sequelize";
import type { Action } from "@shared/permissions.js";
import { sequelize } from "../db.js";

/** One owner type's rules. */
export interface PhotoOwnerType {
  /** Action needed to list and open the photos. */
  read: Action;
  /** Action needed to add or delete photos. */
  write: Action;
  /** Whether the owner record exists in the production. */
  exists(productionId: string, ownerId: string, transaction?: Transaction): Promise<boolean>;
}

const registry = new Map<string, PhotoOwnerType>();

/** Registers (or replaces) an owner type. */
export function registerPhotoOwner(type: string, def: PhotoOwnerType): void {
  registry.set(type, def);
}

/** The rules for an owner type, or undefined when nobody registered it. */
export function photoOwner(type: string): PhotoOwnerType | undefined {
  return registry.get(type);
}

/** Registered owner type names. */
export function photoOwnerTypes(): string[] {
  return [...registry.keys()];
}

/** An existence check for a production-owned table (table names are fixed strings, never input). */
export function rowExists(table: string) {
  return async (productionId: string, ownerId: string, transaction?: Transaction): Promise<boolean> => {
    const rows = await sequelize.query(`SELECT 1 FROM ${table} WHERE id = :ownerId AND production_id = :productionId LIMIT 1`, {
      replacements: { ownerId, productionId },
      type: QueryTypes.SELECT,
      transaction,
    });
    return rows.length > 0;
  };
}

registerPhotoOwner("continuity_entry", { read: "continuity.read", write: "continuity.log", exists: rowExists("continuity_entries") });
registerPhotoOwner("scene", { read: "breakdown.read", write: "breakdown.update", exists: rowExists("scenes") });
registerPhotoOwner("character", { read: "cast.read", write: "cast.update", exists: rowExists("characters") });
// Photos of a performer are personal data, kept to those who may read measurements.
registerPhotoOwner("performer", { read: "measurement.read", write: "measurement.update", exists: rowExists("performers") });
registerPhotoOwner("change", { read: "change.read", write: "change.update", exists: rowExists("changes") });
// Wardrobe: garment photos (set costumers and cutters see them; designers and supervisors add them).
registerPhotoOwner("garment", { read: "garment.read", write: "garment.update", exists: rowExists("garments") });
registerPhotoOwner("fabric", { read: "fabric.read", write: "fabric.update", exists: rowExists("fabrics") });
// A fabric test's own evidence: the flame-retardancy certificate, the washed specimen, the grey-scale reading.
registerPhotoOwner("fabric_test", { read: "fabric.read", write: "fabric.update", exists: rowExists("fabric_tests") });
// Workroom: turnarounds at a fitting, before/after photos of an alteration.
registerPhotoOwner("fitting", { read: "fitting.read", write: "fitting.update", exists: rowExists("fittings") });
registerPhotoOwner("alteration_ticket", { read: "alteration.read", write: "alteration.update", exists: rowExists("alteration_tickets") });
