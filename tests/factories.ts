/** Test data builders: each creates any missing parent itself. */
import { randomUUID } from "node:crypto";
import { Membership, Production, User } from "../server/models/index.js";
import { hashPassword } from "../server/auth/passwords.js";
import type { Role } from "../shared/permissions.js";

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
