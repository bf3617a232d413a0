import { createApp } from "../../server/app.js";
import { ReportRun } from "../../server/models/index.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";
import { buildCharacter } from "../factories.js";

// Continuity books, rack list and returns: set costumer and up; the budget: supervisor and designer.
const setAndUp = ["supervisor", "designer", "set_costumer"] as const;
const p = (c: { productionId: string }) => `/api/productions/${c.productionId}/reports`;
const cases: MatrixCase[] = [
  { name: "continuity books index", method: "get", path: (c) => `${p(c)}/continuity`, expect: only([...setAndUp], 200) },
  {
    name: "continuity book PDF",
    method: "get",
    path: (c) => `${p(c)}/continuity/${c.extra.characterId}.pdf`,
    expect: only([...setAndUp], 200),
  },
  // Validation runs after the permission check, so a bad body shows "allowed" as 400.
  {
    name: "start every book as a ZIP",
    method: "post",
    path: (c) => `${p(c)}/continuity/books`,
    body: () => ({ photos: "original" }),
    expect: only([...setAndUp], 400),
  },
  { name: "export progress", method: "get", path: (c) => `${p(c)}/runs/${c.extra.runId}`, expect: only([...setAndUp], 200) },
  {
    name: "export file (not finished: 404)",
    method: "get",
    path: (c) => `${p(c)}/runs/${c.extra.runId}/file`,
    expect: only([...setAndUp], 404),
  },
  { name: "rack list", method: "get", path: (c) => `${p(c)}/rack-list`, expect: only([...setAndUp], 200) },
  { name: "rack list PDF", method: "get", path: (c) => `${p(c)}/rack-list.pdf`, expect: only([...setAndUp], 200) },
  { name: "returns and wrap", method: "get", path: (c) => `${p(c)}/returns`, expect: only([...setAndUp], 200) },
  { name: "returns CSV", method: "get", path: (c) => `${p(c)}/returns.csv?section=lost`, expect: only([...setAndUp], 200) },
  { name: "returns XLSX", method: "get", path: (c) => `${p(c)}/returns.xlsx`, expect: only([...setAndUp], 200) },
  { name: "budget", method: "get", path: (c) => `${p(c)}/budget`, expect: only(["supervisor", "designer"], 200) },
  { name: "budget CSV", method: "get", path: (c) => `${p(c)}/budget.csv?by=category`, expect: only(["supervisor", "designer"], 200) },
  { name: "budget XLSX", method: "get", path: (c) => `${p(c)}/budget.xlsx`, expect: only(["supervisor", "designer"], 200) },
];

runRoleMatrix("reports", createApp(), cases, async (c) => {
  const character = await buildCharacter({ production: c.production });
  const run = await ReportRun.create({
    productionId: c.productionId,
    kind: "continuity_books",
    status: "running",
    done: 0,
    total: 1,
    storageKey: null,
    bytes: null,
    error: null,
    requestedBy: null,
    finishedAt: null,
  });
  return { characterId: character.id, runId: run.id };
});
