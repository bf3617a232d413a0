import { sequelize } from "../db.js";
import { Membership, Production } from "../models/index.js";
import type { CreateProductionInput, UpdateProductionInput } from "@shared/schemas/productions.js";
import type { User } from "../models/User.js";
import { recordAudit } from "./audit.service.js";
import { NotFoundError } from "../errors.js";
import { productionToday } from "../lib/clock.js";
import type { Transaction } from "sequelize";
import type { Actor } from "../middleware/require-auth.js";

/** The productions a user belongs to, with their role in each. */
export async function listProductionsForUser(user: User): Promise<Membership[]> {
  return Membership.findAll({
    where: { userId: user.id },
    include: [{ model: Production, as: "production" }],
    order: [[{ model: Production, as: "production" }, "title", "ASC"]],
  });
}

/** Creates a production; its creator becomes its supervisor. */
export async function createProduction(user: User, input: CreateProductionInput): Promise<Membership> {
  return sequelize.transaction(async (transaction) => {
    const production = await Production.create(
      {
        title: input.title,
        kind: input.kind,
        startsOn: input.startsOn ?? null,
        endsOn: input.endsOn ?? null,
        units: input.units,
        createdBy: user.id,
      },
      { transaction },
    );
    const membership = await Membership.create({ productionId: production.id, userId: user.id, role: "supervisor" }, { transaction });
    await user.update({ lastProductionId: production.id }, { transaction });
    await recordAudit(
      {
        productionId: production.id,
        actorId: user.id,
        action: "production.create",
        entityType: "production",
        entityId: production.id,
        after: production.toJSON(),
      },
      transaction,
    );
    membership.production = production;
    return membership;
  });
}

/** Updates title, dates, units or settings. */
export async function updateProduction(actor: Actor, input: UpdateProductionInput): Promise<Production> {
  return sequelize.transaction(async (transaction) => {
    const production = await Production.findByPk(actor.productionId, { transaction, lock: transaction.LOCK.UPDATE, rejectOnEmpty: true });
    const before = production.toJSON();
    const { settings, ...rest } = input;
    production.set(rest);
    if (settings) production.settings = { ...production.settings, ...settings };
    await production.save({ transaction });
    await recordAudit(
      {
        productionId: production.id,
        actorId: actor.user.id,
        action: "production.update",
        entityType: "production",
        entityId: production.id,
        before,
        after: production.toJSON(),
      },
      transaction,
    );
    return production;
  });
}

/** Remembers which production the user last opened (the switcher's default). */
export async function rememberProduction(user: User, productionId: string): Promise<void> {
  if (user.lastProductionId !== productionId) await user.update({ lastProductionId: productionId });
}

/** Today's date in the production's time zone, from the server's one clock. */
export async function todayForProduction(productionId: string, transaction?: Transaction): Promise<string> {
  const p = await Production.findByPk(productionId, { attributes: ["id", "settings"], transaction });
  if (!p) throw NotFoundError("Production not found.");
  return productionToday(p);
}
