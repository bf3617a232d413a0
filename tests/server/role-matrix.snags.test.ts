import { createApp } from "../../server/app.js";
import { buildFilmScenario, snagFixtures } from "../setup/snag-fixtures.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";

// Everyone but vfx reads snags; only the supervisor and the designer dismiss. Bodies that pass the
// permission check are deliberately invalid or name no snag, so no case depends on another.
const readers = ["supervisor", "designer", "set_costumer", "cutter"] as const;
const dismissers = ["supervisor", "designer"] as const;

const cases: MatrixCase[] = [
  { name: "list snags", method: "get", path: (c) => `/api/productions/${c.productionId}/snags`, expect: only([...readers], 200) },
  {
    name: "next day's snags",
    method: "get",
    path: (c) => `/api/productions/${c.productionId}/snags?shootDayId=next`,
    expect: only([...readers], 200),
  },
  {
    name: "multiples plan",
    method: "get",
    path: (c) => `/api/productions/${c.productionId}/snags/multiples/${c.extra.groupId}`,
    expect: only([...readers], 200),
  },
  {
    name: "dismiss (missing reason)",
    method: "post",
    path: (c) => `/api/productions/${c.productionId}/snags/dismissals`,
    body: (c) => ({ snagKey: c.extra.fitKey }),
    expect: only([...dismissers], 400),
  },
  {
    name: "dismiss (no such snag)",
    method: "post",
    path: (c) => `/api/productions/${c.productionId}/snags/dismissals`,
    body: () => ({ snagKey: "fit:none", reason: "nothing to see" }),
    expect: only([...dismissers], 404),
  },
  {
    name: "undo a dismissal",
    method: "delete",
    path: (c) => `/api/productions/${c.productionId}/snags/dismissals/00000000-0000-4000-8000-000000000000`,
    expect: only([...dismissers], 404),
  },
];

runRoleMatrix("snags", createApp(), cases, async (c) => {
  const sc = await buildFilmScenario(snagFixtures(c.productionId));
  return { groupId: sc.groups.oilskin, fitKey: `fit:${sc.garments.jacket}:${sc.performers.pWren}` };
});
