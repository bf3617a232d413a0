/** Test data builders: each creates any missing parent itself. */
import { randomUUID } from "node:crypto";
import { Membership, Production, User } from "../server/models/index.js";
import { hashPassword } from "../server/auth/passwords.js";
import type { Role } from "../shared/permissions.js";
import { sequelize } from "../server/db.js";
import { Fabric, Garment, MeasurementSet } from "../server/models/index.js";
import { generateTagCode } from "../shared/domain/tag-codes.js";
import { randomInt } from "node:crypto";

export const TEST_PASSWORD = "correct-horse-battery";
let cachedHash: string | undefined;

export async function buildUser(overrides: Partial<{ email: string; name: string; password: string; isActive: boolean }> = {}) {
  const passwordHash = overrides.password ? await hashPassword(overrides.password) : (cachedHash ??= await hashPassword(TEST_PASSWORD));
  return User.create({
    email: overrides.email ?? `user-${randomUUID().slice(0, 8)}@test.invalid`,
    name: overrides.name ?? "Test Person",
    passwordHash,
    isActive: overrides.isActive ?? true,
    lastProductionId: null,
  });
}

export async function buildProduction(overrides: Partial<{ title: string; kind: "film" | "series" | "stage"; units: "cm" | "in"; settings: object }> = {}) {
  return Production.create({
    title: overrides.title ?? `Production ${randomUUID().slice(0, 6)}`,
    kind: overrides.kind ?? "film",
    startsOn: "2026-11-01",
    endsOn: "2027-02-01",
    units: overrides.units ?? "cm",
    settings: overrides.settings ?? {},
    createdBy: null,
  });
}

/** A user with a role in a production (both created unless given). */
export async function buildMember(role: Role, opts: { production?: Production; user?: User } = {}) {
  const production = opts.production ?? (await buildProduction());
  const user = opts.user ?? (await buildUser({ name: `Test ${role}` }));
  const membership = await Membership.create({ productionId: production.id, userId: user.id, role });
  return { user, production, membership };
}

// ---- Wardrobe builders ----

/** A performer row (the Breakdown feature owns the model; tests insert the row directly). */
export async function buildPerformer(overrides: Partial<{ production: Production; name: string }> = {}) {
  const production = overrides.production ?? (await buildProduction());
  const id = randomUUID();
  const name = overrides.name ?? `Performer ${id.slice(0, 4)}`;
  await sequelize.query(`INSERT INTO performers (id, production_id, name) VALUES (:id, :pid, :name)`, { replacements: { id, pid: production.id, name } });
  return { id, name, production };
}

/** A fabric (woven wool by default). */
export async function buildFabric(overrides: Partial<{ production: Production; name: string; massPerAreaGsm: number | null; construction: "woven" | "knit" }> = {}) {
  const production = overrides.production ?? (await buildProduction());
  return Fabric.create({
    productionId: production.id,
    name: overrides.name ?? "Wool suiting",
    supplier: null,
    fibreContent: [{ fibre: "wool", percent: 100 }],
    construction: overrides.construction ?? "woven",
    widthMm: 1500,
    massPerAreaGsm: overrides.massPerAreaGsm === undefined ? 280 : overrides.massPerAreaGsm,
    thicknessMm: null,
    stretchWarpPct: null,
    stretchWeftPct: null,
    colour: null,
    careNotes: null,
  });
}

/** A garment in stock with a fresh tag code. */
export async function buildGarment(overrides: Partial<{ production: Production; name: string; status: Garment["status"]; tagCode: string; category: string }> = {}) {
  const production = overrides.production ?? (await buildProduction());
  return Garment.create({
    productionId: production.id,
    tagCode: overrides.tagCode ?? generateTagCode(randomInt),
    name: overrides.name ?? "Test jacket",
    category: overrides.category ?? "jacket",
    sizeLabel: null,
    fabricId: null,
    colour: null,
    source: "built",
    vendor: null,
    costCents: null,
    rentalDueOn: null,
    locationRack: "A1",
    locationBin: null,
    status: overrides.status ?? "in_stock",
    multiplesGroupId: null,
    copyNumber: null,
    notes: null,
  });
}

/** A measurement set in mm. */
export async function buildMeasurementSet(performerId: string, production: Production, valuesMm: Record<string, number>, takenOn = "2026-11-01") {
  return MeasurementSet.create({ productionId: production.id, performerId, takenOn, takenBy: null, valuesMm, enteredUnit: "cm", notes: null });
}
