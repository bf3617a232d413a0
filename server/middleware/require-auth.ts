import type { RequestHandler, Request } from "express";
import { AuthenticationError, ForbiddenError, NotFoundError } from "../errors.js";
import { can, type Action } from "@shared/permissions.js";
import { productionParamsSchema } from "@shared/schemas/common.js";
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { Membership, Production } from "../models/index.js";
import type { User } from "../models/User.js";

/** 401 unless signed in. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.isAuthenticated?.() || !req.user) return next(AuthenticationError());
  next();
};

/**
 * Loads the production named in the path and the caller's membership. A user who is not a member
 * gets 404, so production ids cannot be probed.
 */
export const loadProduction: RequestHandler = async (req, _res, next) => {
  try {
    if (!req.user) return next(AuthenticationError());
    const parsed = productionParamsSchema.safeParse(req.params);
    if (!parsed.success) return next(NotFoundError("Production not found."));
    // Plain SQL mapped onto the models, side by side: this runs on every production request, and
    // building the query through findOne + include cost more than the query itself.
    const replacements = { pid: parsed.data.productionId, uid: req.user.id };
    const [[membership], [production]] = await Promise.all([
      sequelize.query<Membership>(`SELECT * FROM memberships WHERE production_id = :pid AND user_id = :uid`, {
        replacements,
        type: QueryTypes.SELECT,
        model: Membership,
        mapToModel: true,
      }),
      sequelize.query<Production>(`SELECT * FROM productions WHERE id = :pid`, {
        replacements,
        type: QueryTypes.SELECT,
        model: Production,
        mapToModel: true,
      }),
    ]);
    if (!membership || !production) return next(NotFoundError("Production not found."));
    membership.production = production;
    req.membership = membership;
    req.production = production;
    next();
  } catch (err) {
    next(err);
  }
};

/** 403 unless the caller's role in the loaded production allows the action. */
export const authorize =
  (action: Action): RequestHandler =>
  (req, _res, next) => {
    if (!req.membership) return next(NotFoundError("Production not found."));
    if (!can(req.membership.role, action)) return next(ForbiddenError());
    next();
  };

/** The acting user, production and role, as services receive them. */
export interface Actor {
  user: User;
  productionId: string;
  role: Membership["role"];
}

/** Builds the actor for a production-scoped request (after loadProduction). */
export function actorOf(req: Request): Actor {
  if (!req.user || !req.membership) throw AuthenticationError();
  return { user: req.user, productionId: req.membership.productionId, role: req.membership.role };
}
