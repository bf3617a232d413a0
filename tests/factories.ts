/** Test data builders: each creates any missing parent itself. */
import { randomUUID } from "node:crypto";
import {
  Appearance,
  Change,
  Character,
  Membership,
  Performer,
  Production,
  Scene,
  ShootDay,
  ShootDayScene,
  User,
} from "../server/models/index.js";
import { hashPassword } from "../server/auth/passwords.js";
import type { Role } from "../shared/permissions.js";
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

export async function buildProduction(
  overrides: Partial<{ title: string; kind: "film" | "series" | "stage"; units: "cm" | "in"; settings: object }> = {},
) {
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

/** A performer (creates a production unless given). */
export async function buildPerformer(opts: { production?: Production; name?: string } = {}) {
  const production = opts.production ?? (await buildProduction());
  return Performer.create({
    productionId: production.id,
    name: opts.name ?? `Performer ${randomUUID().slice(0, 6)}`,
    email: null,
    phone: null,
    agentContact: null,
    notes: null,
  });
}

/** A character played by a new performer. */
export async function buildCharacter(opts: { production?: Production; name?: string; sortOrder?: number } = {}) {
  const production = opts.production ?? (await buildProduction());
  const performer = await buildPerformer({ production });
  return Character.create({
    productionId: production.id,
    name: opts.name ?? `Character ${randomUUID().slice(0, 6)}`,
    performerId: performer.id,
    notes: null,
    sortOrder: opts.sortOrder ?? 0,
  });
}

let sceneCounter = 0;
/** A scene; number and story order default to a fresh counter. */
export async function buildScene(
  opts: {
    production?: Production;
    number?: string;
    storyDay?: number;
    storyOrder?: number;
    runningMinutes?: number | null;
    setName?: string;
  } = {},
) {
  const production = opts.production ?? (await buildProduction());
  sceneCounter += 1;
  return Scene.create({
    productionId: production.id,
    number: opts.number ?? String(sceneCounter),
    setName: opts.setName ?? "Harbour wall",
    intExt: "EXT",
    timeOfDay: "DAY",
    storyDay: opts.storyDay ?? 1,
    storyOrder: opts.storyOrder ?? sceneCounter,
    lengthEighths: 8,
    runningMinutes: opts.runningMinutes ?? null,
    synopsis: null,
  });
}

/** A shoot day with scenes in the given order. */
export async function buildShootDay(
  opts: { production?: Production; dayNumber?: number; date?: string; scenes?: Scene[]; kind?: "shoot" | "performance" } = {},
) {
  const production = opts.production ?? (await buildProduction());
  const day = await ShootDay.create({
    productionId: production.id,
    dayNumber: opts.dayNumber ?? 1,
    date: opts.date ?? "2026-12-01",
    kind: opts.kind ?? "shoot",
    startsAt: null,
    notes: null,
  });
  for (const [i, s] of (opts.scenes ?? []).entries())
    await ShootDayScene.create({ productionId: production.id, shootDayId: day.id, sceneId: s.id, position: i + 1 });
  return day;
}

/** A change of a character (next number). */
export async function buildChange(character: Character, opts: { number?: number; description?: string } = {}) {
  const n = opts.number ?? ((await Change.max<number, Change>("number", { where: { characterId: character.id } })) ?? 0) + 1;
  return Change.create({
    productionId: character.productionId,
    characterId: character.id,
    number: n,
    description: opts.description ?? `Change ${n}`,
    storyDayFrom: null,
    storyDayTo: null,
    approvedBy: null,
    approvedAt: null,
  });
}

/** A character in a scene wearing a change. */
export async function buildAppearance(
  scene: Scene,
  character: Character,
  change: Change | null,
  opts: Partial<{ distressStage: number; wet: boolean; stunt: boolean; changeHere: boolean }> = {},
) {
  return Appearance.create({
    productionId: scene.productionId,
    sceneId: scene.id,
    characterId: character.id,
    changeId: change?.id ?? null,
    notes: null,
    ...opts,
  });
}

// ---- Wardrobe builders ----

/** A fabric (woven wool by default). */
export async function buildFabric(
  overrides: Partial<{ production: Production; name: string; massPerAreaGsm: number | null; construction: "woven" | "knit" }> = {},
) {
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

/** A garment in stock with a fresh tag code (built, no cost, unless told). */
export async function buildGarment(
  overrides: Partial<{
    production: Production;
    name: string;
    status: Garment["status"];
    tagCode: string;
    category: string;
    source: Garment["source"];
    vendor: string | null;
    costCents: number | null;
    rentalDueOn: string | null;
    rentalCostPerWeekCents: number | null;
    wrapDisposition: Garment["wrapDisposition"];
  }> = {},
) {
  const production = overrides.production ?? (await buildProduction());
  return Garment.create({
    productionId: production.id,
    tagCode: overrides.tagCode ?? generateTagCode(randomInt),
    name: overrides.name ?? "Test jacket",
    category: overrides.category ?? "jacket",
    sizeLabel: null,
    fabricId: null,
    colour: null,
    source: overrides.source ?? "built",
    vendor: overrides.vendor ?? null,
    costCents: overrides.costCents ?? null,
    rentalDueOn: overrides.rentalDueOn ?? null,
    rentalCostPerWeekCents: overrides.rentalCostPerWeekCents ?? null,
    wrapDisposition: overrides.wrapDisposition ?? null,
    locationRack: "A1",
    locationBin: null,
    status: overrides.status ?? "in_stock",
    multiplesGroupId: null,
    copyNumber: null,
    notes: null,
  });
}

/** A measurement set in mm. */
export async function buildMeasurementSet(
  performerId: string,
  production: Production,
  valuesMm: Record<string, number>,
  takenOn = "2026-11-01",
) {
  return MeasurementSet.create({
    productionId: production.id,
    performerId,
    takenOn,
    takenBy: null,
    valuesMm,
    enteredUnit: "cm",
    notes: null,
  });
}
