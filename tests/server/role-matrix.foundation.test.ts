import { createApp } from "../../server/app.js";
import { all, only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";

// Validation runs after the permission check, so a bad body shows "allowed" as 400.
const cases: MatrixCase[] = [
  { name: "read production", method: "get", path: (c) => `/api/productions/${c.productionId}`, expect: all(200) },
  {
    name: "update production",
    method: "patch",
    path: (c) => `/api/productions/${c.productionId}`,
    body: () => ({ title: 12 }),
    expect: only(["supervisor"], 400),
  },
  { name: "list members", method: "get", path: (c) => `/api/productions/${c.productionId}/members`, expect: only(["supervisor"], 200) },
  {
    name: "change a role",
    method: "patch",
    path: (c) => `/api/productions/${c.productionId}/members/${c.memberIdOf.designer}`,
    body: () => ({ role: "nobody" }),
    expect: only(["supervisor"], 400),
  },
  {
    name: "remove a member",
    method: "delete",
    path: (c) => `/api/productions/${c.productionId}/members/00000000-0000-4000-8000-000000000000`,
    expect: only(["supervisor"], 404),
  },
  {
    name: "list invitations",
    method: "get",
    path: (c) => `/api/productions/${c.productionId}/invitations`,
    expect: only(["supervisor"], 200),
  },
  {
    name: "invite",
    method: "post",
    path: (c) => `/api/productions/${c.productionId}/invitations`,
    body: () => ({ email: "bad" }),
    expect: only(["supervisor"], 400),
  },
  { name: "audit trail", method: "get", path: (c) => `/api/productions/${c.productionId}/audit`, expect: only(["supervisor"], 200) },
  { name: "outbox", method: "get", path: (c) => `/api/productions/${c.productionId}/outbox`, expect: only(["supervisor"], 200) },
];

runRoleMatrix("foundation", createApp(), cases);
