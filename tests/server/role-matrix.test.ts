/**
 * Every API route × every role (plus signed out and a member of another production) → expected
 * status. Later features append their routes to `matrix` below.
 */
import { beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app.js";
import { roles, type Role } from "../../shared/permissions.js";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";

type Who = Role | "signed_out" | "outsider";
interface Ctx {
  productionId: string;
  memberIdOf: Record<Role, string>;
}
interface Case {
  name: string;
  method: "get" | "post" | "patch" | "delete";
  path: (c: Ctx) => string;
  body?: (c: Ctx) => object;
  /** Expected status for each role; signed_out is always 401 and outsider 404 unless given. */
  expect: Partial<Record<Who, number>> & Record<Role, number>;
}

const all = (status: number): Record<Role, number> => ({ supervisor: status, designer: status, set_costumer: status, cutter: status, vfx: status });
const only = (allowed: Role[], ok: number, denied = 403): Record<Role, number> =>
  Object.fromEntries(roles.map((r) => [r, allowed.includes(r) ? ok : denied])) as Record<Role, number>;

// Validation runs after the permission check, so an empty body shows "allowed" as 400.
const matrix: Case[] = [
  { name: "read production", method: "get", path: (c) => `/api/productions/${c.productionId}`, expect: all(200) },
  { name: "update production", method: "patch", path: (c) => `/api/productions/${c.productionId}`, body: () => ({ title: 12 }), expect: only(["supervisor"], 400) },
  { name: "list members", method: "get", path: (c) => `/api/productions/${c.productionId}/members`, expect: only(["supervisor"], 200) },
  { name: "change a role", method: "patch", path: (c) => `/api/productions/${c.productionId}/members/${c.memberIdOf.designer}`, body: () => ({ role: "nobody" }), expect: only(["supervisor"], 400) },
  { name: "remove a member", method: "delete", path: (c) => `/api/productions/${c.productionId}/members/00000000-0000-4000-8000-000000000000`, expect: only(["supervisor"], 404) },
  { name: "list invitations", method: "get", path: (c) => `/api/productions/${c.productionId}/invitations`, expect: only(["supervisor"], 200) },
  { name: "invite", method: "post", path: (c) => `/api/productions/${c.productionId}/invitations`, body: () => ({ email: "bad" }), expect: only(["supervisor"], 400) },
  { name: "outbox", method: "get", path: (c) => `/api/productions/${c.productionId}/outbox`, expect: only(["supervisor"], 200) },
];

const app = createApp();
const agents = {} as Record<Role | "outsider", TestAgent>;
const ctx = { memberIdOf: {} } as Ctx;

beforeAll(async () => {
  await resetDb();
  const production = await buildProduction();
  ctx.productionId = production.id;
  for (const role of roles) {
    const { user, membership } = await buildMember(role, { production });
    ctx.memberIdOf[role] = membership.id;
    agents[role] = await signedInAgent(app, user.email);
  }
  const { user: outsider } = await buildMember("supervisor");
  agents.outsider = await signedInAgent(app, outsider.email);
});

describe("role matrix", () => {
  for (const c of matrix) {
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
          res = await (c.method === "get" ? a.get(c.path(ctx)) : c.method === "delete" ? a.delete(c.path(ctx)) : a[c.method](c.path(ctx), c.body?.(ctx)));
        }
        expect(res.status).toBe(expected);
        if (expected >= 400) expect(res.body.error.code).toEqual(expect.any(String));
      });
    }
  }
});
