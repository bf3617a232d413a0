/**
 * Table-driven role checks: every route × every role (plus signed out and a member of another
 * production) → expected status. Each feature has its own tests/server/role-matrix.<feature>.test.ts.
 */
import { beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import type { Express } from "express";
import { roles, type Role } from "../../shared/permissions.js";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "./http.js";
import type { Production } from "../../server/models/index.js";

export type Who = Role | "signed_out" | "outsider";
export interface MatrixCtx {
  production: Production;
  productionId: string;
  memberIdOf: Record<Role, string>;
  userIdOf: Record<Role, string>;
  /** Whatever the feature's `prepare` returned (ids of records the paths need). */
  extra: Record<string, string>;
}
export interface MatrixCase {
  name: string;
  method: "get" | "post" | "patch" | "put" | "delete";
  path: (c: MatrixCtx) => string;
  body?: (c: MatrixCtx) => object;
  /** Expected status per role; signed_out defaults to 401 and outsider to 404. */
  expect: Partial<Record<Who, number>> & Record<Role, number>;
}

export const all = (status: number): Record<Role, number> => ({
  supervisor: status,
  designer: status,
  set_costumer: status,
  cutter: status,
  vfx: status,
});
export const only = (allowed: Role[], ok: number, denied = 403): Record<Role, number> =>
  Object.fromEntries(roles.map((r) => [r, allowed.includes(r) ? ok : denied])) as Record<Role, number>;

/** Declares the describe block for one feature's matrix. */
export function runRoleMatrix(
  name: string,
  app: Express,
  cases: MatrixCase[],
  prepare?: (c: MatrixCtx) => Promise<Record<string, string>>,
) {
  const agents = {} as Record<Role | "outsider", TestAgent>;
  const ctx = { memberIdOf: {}, userIdOf: {}, extra: {} } as MatrixCtx;

  beforeAll(async () => {
    await resetDb();
    ctx.production = await buildProduction();
    ctx.productionId = ctx.production.id;
    for (const role of roles) {
      const { user, membership } = await buildMember(role, { production: ctx.production });
      ctx.memberIdOf[role] = membership.id;
      ctx.userIdOf[role] = user.id;
      agents[role] = await signedInAgent(app, user.email);
    }
    const { user: outsider } = await buildMember("supervisor");
    agents.outsider = await signedInAgent(app, outsider.email);
    if (prepare) ctx.extra = await prepare(ctx);
  });

  describe(`role matrix: ${name}`, () => {
    for (const c of cases) {
      const whos: Who[] = [...roles, "signed_out", "outsider"];
      for (const who of whos) {
        const expected = c.expect[who] ?? (who === "signed_out" ? 401 : 404);
        it(`${c.name}: ${who} → ${expected}`, async () => {
          let res: request.Response;
          if (who === "signed_out") {
            const anon = request.agent(app);
            const token = (await anon.get("/api/auth/csrf")).body.token as string;
            const r = anon[c.method](c.path(ctx)).set("X-CSRF-Token", token);
            res = await (c.body ? r.send(c.body(ctx)) : r);
          } else {
            const a = agents[who];
            res = await (c.method === "get"
              ? a.get(c.path(ctx))
              : c.method === "delete"
                ? a.delete(c.path(ctx))
                : a[c.method](c.path(ctx), c.body?.(ctx)));
          }
          expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(expected);
          // The error code each refusal must carry (style guide: one error shape, stable codes).
          const codes: Record<number, string> = { 401: "authentication_required", 403: "forbidden", 404: "not_found" };
          if (codes[expected]) expect(res.body.error.code).toBe(codes[expected]);
          else if (expected >= 400) expect(res.body.error.code).toMatch(/^[a-z]+(_[a-z]+)*$/);
        });
      }
    }
  });
}
