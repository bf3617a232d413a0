import { createApp } from "../../server/app.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";
import { buildFabric, buildGarment, buildPerformer } from "../factories.js";

// Validation runs after the permission check, so a bad body shows "allowed" as 400.
const p = (c: { productionId: string }) => `/api/productions/${c.productionId}`;
const cases: MatrixCase[] = [
  {
    name: "list garments",
    method: "get",
    path: (c) => `${p(c)}/garments`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "garment detail",
    method: "get",
    path: (c) => `${p(c)}/garments/${c.extra.garmentId}`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "garments CSV",
    method: "get",
    path: (c) => `${p(c)}/garments/export.csv`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "tag labels PDF",
    method: "get",
    path: (c) => `${p(c)}/garments/labels.pdf?ids=${c.extra.garmentId}`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "create garment",
    method: "post",
    path: (c) => `${p(c)}/garments`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "designer"], 400),
  },
  {
    name: "edit garment",
    method: "patch",
    path: (c) => `${p(c)}/garments/${c.extra.garmentId}`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "designer"], 400),
  },
  {
    name: "make copies",
    method: "post",
    path: (c) => `${p(c)}/garments/${c.extra.garmentId}/copies`,
    body: () => ({ count: 0 }),
    expect: only(["supervisor", "designer"], 400),
  },
  {
    name: "bulk status change",
    method: "post",
    path: (c) => `${p(c)}/garments/moves`,
    body: () => ({ garmentIds: [], status: "fitting" }),
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 400),
  },
  {
    name: "open check-outs",
    method: "get",
    path: (c) => `${p(c)}/garments/checkouts`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "check-out form options",
    method: "get",
    path: (c) => `${p(c)}/garments/checkout-options`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "tag label at a sheet position",
    method: "get",
    path: (c) => `${p(c)}/garments/labels.pdf?ids=${c.extra.garmentId}&start=7`,
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 200),
  },
  {
    name: "check out to a person",
    method: "post",
    path: (c) => `${p(c)}/garments/moves`,
    body: () => ({ garmentIds: [], status: "on_set", checkout: {} }),
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 400),
  },
  {
    name: "check in/out by tag",
    method: "post",
    path: (c) => `${p(c)}/garments/scan`,
    body: () => ({ tagCode: "nope", status: "on_set" }),
    expect: only(["supervisor", "designer", "set_costumer", "cutter"], 400),
  },
  { name: "list fabrics", method: "get", path: (c) => `${p(c)}/fabrics`, expect: only(["supervisor", "designer", "cutter"], 200) },
  {
    name: "fabric detail",
    method: "get",
    path: (c) => `${p(c)}/fabrics/${c.extra.fabricId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "create fabric",
    method: "post",
    path: (c) => `${p(c)}/fabrics`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "designer", "cutter"], 400),
  },
  {
    name: "edit fabric",
    method: "patch",
    path: (c) => `${p(c)}/fabrics/${c.extra.fabricId}`,
    body: () => ({ widthMm: -1 }),
    expect: only(["supervisor", "designer", "cutter"], 400),
  },
  {
    name: "record fabric test",
    method: "post",
    path: (c) => `${p(c)}/fabrics/${c.extra.fabricId}/tests`,
    body: () => ({ testedOn: "x" }),
    expect: only(["supervisor", "designer", "cutter"], 400),
  },
  {
    name: "delete fabric test",
    method: "delete",
    path: (c) => `${p(c)}/fabrics/${c.extra.fabricId}/tests/00000000-0000-4000-8000-000000000000`,
    expect: only(["supervisor", "designer", "cutter"], 404),
  },
  // Measurements are personal data: set costumer and vfx are refused.
  {
    name: "read measurements",
    method: "get",
    path: (c) => `${p(c)}/performers/${c.extra.performerId}/measurements`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "record measurements",
    method: "post",
    path: (c) => `${p(c)}/performers/${c.extra.performerId}/measurements`,
    body: () => ({ unit: "mm" }),
    expect: only(["supervisor", "designer", "cutter"], 400),
  },
  {
    name: "delete measurement set",
    method: "delete",
    path: (c) => `${p(c)}/performers/${c.extra.performerId}/measurements/00000000-0000-4000-8000-000000000000`,
    expect: only(["supervisor", "designer", "cutter"], 404),
  },
];

runRoleMatrix("wardrobe", createApp(), cases, async (c) => {
  const garment = await buildGarment({ production: c.production });
  const fabric = await buildFabric({ production: c.production });
  const performer = await buildPerformer({ production: c.production });
  return { garmentId: garment.id, fabricId: fabric.id, performerId: performer.id };
});
