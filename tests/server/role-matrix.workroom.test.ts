import { createApp } from "../../server/app.js";
import { WorkroomCapacity } from "../../server/models/index.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";
import { buildGarment, buildPerformer } from "../factories.workroom.js";
import { raiseTicket } from "../../server/services/alterations.service.js";
import { User } from "../../server/models/index.js";

const app = createApp();
const base = (c: { productionId: string }) => `/api/productions/${c.productionId}`;
const READERS = ["supervisor", "designer", "set_costumer", "cutter"] as const;
const EDITORS = ["supervisor", "designer", "cutter"] as const;
const missing = "00000000-0000-4000-8000-000000000000";

// Validation runs after the permission check, so a bad body shows "allowed" as 400.
const cases: MatrixCase[] = [
  { name: "list fittings", method: "get", path: (c) => `${base(c)}/fittings`, expect: only([...READERS], 200) },
  { name: "book a fitting", method: "post", path: (c) => `${base(c)}/fittings`, body: () => ({}), expect: only([...EDITORS], 400) },
  { name: "open a fitting", method: "get", path: (c) => `${base(c)}/fittings/${missing}`, expect: only([...READERS], 404) },
  {
    name: "link an item at a fitting",
    method: "post",
    path: (c) => `${base(c)}/fittings/${missing}/items/${missing}/garment`,
    body: () => ({}),
    expect: only(["supervisor", "designer", "cutter"], 400),
  },
  {
    name: "move a fitting",
    method: "patch",
    path: (c) => `${base(c)}/fittings/${missing}`,
    body: () => ({ durationMinutes: 1 }),
    expect: only([...EDITORS], 400),
  },
  { name: "list tickets", method: "get", path: (c) => `${base(c)}/alterations`, expect: only([...READERS], 200) },
  { name: "read a ticket", method: "get", path: (c) => `${base(c)}/alterations/${c.extra.ticketId}`, expect: only([...READERS], 200) },
  {
    name: "raise a ticket",
    method: "post",
    path: (c) => `${base(c)}/alterations`,
    body: () => ({ tasks: [] }),
    expect: only([...EDITORS], 400),
  },
  // Set costumers read tickets but cannot change estimates (nor anything else on a ticket).
  {
    name: "change an estimate",
    method: "patch",
    path: (c) => `${base(c)}/alterations/${c.extra.ticketId}`,
    body: () => ({ estimateHours: 3 }),
    expect: only([...EDITORS], 200),
  },
  {
    name: "move a ticket's status",
    method: "post",
    path: (c) => `${base(c)}/alterations/${c.extra.ticketId}/status`,
    body: () => ({ status: "nonsense" }),
    expect: only([...EDITORS], 400),
  },
  { name: "read the plan", method: "get", path: (c) => `${base(c)}/workroom/plan?from=2030-09-02`, expect: only([...READERS], 200) },
  { name: "form options", method: "get", path: (c) => `${base(c)}/workroom/options`, expect: only([...READERS], 200) },
  { name: "read capacity", method: "get", path: (c) => `${base(c)}/workroom/capacity`, expect: only([...READERS], 200) },
  {
    name: "set capacity",
    method: "put",
    path: (c) => `${base(c)}/workroom/capacity/${c.userIdOf.cutter}`,
    body: () => ({ hoursPerWeekday: { mon: 30 } }),
    expect: only(["supervisor", "cutter"], 400),
  },
  {
    name: "workroom settings",
    method: "patch",
    path: (c) => `${base(c)}/workroom/settings`,
    body: () => ({ bufferWorkingDays: -1 }),
    expect: only(["supervisor", "cutter"], 400),
  },
  { name: "failed e-mails", method: "get", path: (c) => `${base(c)}/workroom/email-jobs`, expect: only(["supervisor"], 200) },
  {
    name: "retry an e-mail",
    method: "post",
    path: (c) => `${base(c)}/workroom/email-jobs/${missing}/retry`,
    expect: only(["supervisor"], 404),
  },
];

runRoleMatrix("workroom", app, cases, async (c) => {
  const garmentId = await buildGarment(c.productionId);
  await buildPerformer(c.productionId);
  const user = (await User.findByPk(c.userIdOf.cutter))!;
  await WorkroomCapacity.create({
    productionId: c.productionId,
    userId: user.id,
    hoursPerWeekday: { mon: 8, tue: 8, wed: 8, thu: 8, fri: 8, sat: 0, sun: 0 },
    daysOff: [],
  });
  const ticket = await raiseTicket(
    { user, productionId: c.productionId, role: "cutter" },
    { garmentId, tasks: [{ kind: "shorten", amountMm: 30 }], estimateHours: 2 },
  );
  return { ticketId: ticket.id };
});
