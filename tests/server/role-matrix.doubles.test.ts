import { createApp } from "../../server/app.js";
import { User } from "../../server/models/index.js";
import { createPacketDraft, publishPacket } from "../../server/services/packets.service.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";
import { buildChangeWithGarments, buildFabric, buildPanel, buildSeam } from "../setup/doubles-fixtures.js";

// Validation runs after the permission check, so a bad body shows "allowed" as 400.
const NONE = "00000000-0000-4000-8000-000000000000";
const p = (c: { productionId: string }) => `/api/productions/${c.productionId}`;
const cases: MatrixCase[] = [
  {
    name: "list changes for doubles",
    method: "get",
    path: (c) => `${p(c)}/doubles/changes`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "list fabrics for panels",
    method: "get",
    path: (c) => `${p(c)}/doubles/fabrics`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "fabric physics",
    method: "get",
    path: (c) => `${p(c)}/doubles/physics?changeId=${c.extra.changeId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "read a marker",
    method: "get",
    path: (c) => `${p(c)}/doubles/markers?scope=change&scopeId=${c.extra.changeId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "lay a marker",
    method: "post",
    path: (c) => `${p(c)}/doubles/markers`,
    body: () => ({ scope: "bolt" }),
    expect: only(["supervisor", "cutter"], 400),
  },
  {
    name: "list panels",
    method: "get",
    path: (c) => `${p(c)}/panels?changeId=${c.extra.changeId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "create a panel",
    method: "post",
    path: (c) => `${p(c)}/panels`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "cutter"], 400),
  },
  {
    name: "read a panel",
    method: "get",
    path: (c) => `${p(c)}/panels/${c.extra.panelId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "edit a panel",
    method: "patch",
    path: (c) => `${p(c)}/panels/${c.extra.panelId}`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "cutter"], 400),
  },
  { name: "delete a panel", method: "delete", path: (c) => `${p(c)}/panels/${NONE}`, expect: only(["supervisor", "cutter"], 404) },
  { name: "DXF preview", method: "post", path: (c) => `${p(c)}/panels/dxf-preview`, expect: only(["supervisor", "cutter"], 400) },
  { name: "DXF import", method: "post", path: (c) => `${p(c)}/panels/dxf-import`, expect: only(["supervisor", "cutter"], 400) },
  {
    name: "list seams",
    method: "get",
    path: (c) => `${p(c)}/seams?changeId=${c.extra.changeId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  { name: "create a seam", method: "post", path: (c) => `${p(c)}/seams`, body: () => ({}), expect: only(["supervisor", "cutter"], 400) },
  {
    name: "edit a seam",
    method: "patch",
    path: (c) => `${p(c)}/seams/${c.extra.seamId}`,
    body: () => ({ name: "" }),
    expect: only(["supervisor", "cutter"], 400),
  },
  { name: "delete a seam", method: "delete", path: (c) => `${p(c)}/seams/${NONE}`, expect: only(["supervisor", "cutter"], 404) },
  { name: "list packets", method: "get", path: (c) => `${p(c)}/packets`, expect: only(["supervisor", "cutter", "vfx"], 200) },
  {
    name: "packet builder options",
    method: "get",
    path: (c) => `${p(c)}/packets/options?changeId=${c.extra.changeId}`,
    expect: only(["supervisor", "cutter"], 200),
  },
  { name: "start a draft", method: "post", path: (c) => `${p(c)}/packets`, body: () => ({}), expect: only(["supervisor", "cutter"], 400) },
  {
    name: "read a published packet",
    method: "get",
    path: (c) => `${p(c)}/packets/${c.extra.packetId}`,
    expect: only(["supervisor", "cutter", "vfx"], 200),
  },
  {
    name: "edit a published packet",
    method: "patch",
    path: (c) => `${p(c)}/packets/${c.extra.packetId}`,
    body: () => ({}),
    expect: only(["supervisor", "cutter"], 409),
  },
  { name: "delete a draft", method: "delete", path: (c) => `${p(c)}/packets/${NONE}`, expect: only(["supervisor", "cutter"], 404) },
  { name: "publish", method: "post", path: (c) => `${p(c)}/packets/${c.extra.packetId}/publish`, expect: only(["supervisor"], 409) },
  {
    name: "publishing progress",
    method: "get",
    path: (c) => `${p(c)}/packets/${c.extra.packetId}/publish-progress`,
    expect: only(["supervisor"], 200),
  },
  { name: "mark received", method: "post", path: (c) => `${p(c)}/packets/${c.extra.packetId}/received`, expect: only(["vfx"], 200) },
  {
    name: "download",
    method: "get",
    path: (c) => `${p(c)}/packets/${c.extra.packetId}/download`,
    expect: only(["supervisor", "cutter", "vfx"], 200),
  },
];

runRoleMatrix("doubles", createApp(), cases, async (c) => {
  const { id: fabricId } = await buildFabric(c.productionId);
  const g = await buildChangeWithGarments(c.productionId, { fabricId, garments: 1 });
  const a = await buildPanel(c.productionId, g.garmentIds[0], { name: "Front" });
  const b = await buildPanel(c.productionId, g.garmentIds[0], { name: "Back" });
  const seam = await buildSeam(c.productionId, { panelId: a.id, from: 1, to: 2 }, { panelId: b.id, from: 3, to: 0 });
  const actor = { user: (await User.findByPk(c.userIdOf.supervisor))!, productionId: c.productionId, role: "supervisor" as const };
  const draft = await createPacketDraft(actor, { changeId: g.changeId, recipientUserIds: [c.userIdOf.vfx] });
  await publishPacket(actor, draft.id);
  return { changeId: g.changeId, panelId: a.id, seamId: seam.id, packetId: draft.id };
});
