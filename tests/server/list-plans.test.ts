// The main lists on a 10× production (4,000 scenes, 900 shoot days, 30,000 garments): every query a
// page of a list runs can be served by indexes — no sequential scan of a table and no sort of a whole
// production for one page. The planner is asked with sequential scans discouraged: here the 10×
// production is nearly all of each table, where reading all of it in sequence is the cheaper honest
// choice; in a studio's database of many productions it is a small part, and only an index serves it.
import { beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../server/db.js";
import { User } from "../../server/models/index.js";
import { listGarments } from "../../server/services/garments.service.js";
import { listScenes } from "../../server/services/scenes.service.js";
import { listShootDays } from "../../server/services/shoot-days.service.js";
import { listAuditEvents } from "../../server/services/audit-log.service.js";
import type { Actor } from "../../server/middleware/require-auth.js";
import { seedAccounts } from "../../seeds/accounts.js";
import { anchorDemo } from "../../seeds/calendar.js";
import { scaledProductionId, seedScaledProduction } from "../../seeds/scaled.js";
import { listGarmentsQuerySchema } from "../../shared/schemas/garments.js";
import { listScenesQuerySchema } from "../../shared/schemas/breakdown.js";
import { resetDb } from "../setup/http.js";
import { testToday } from "../setup/test-clock.js";

let actor: Actor;
let characterId: string;
let shootDayId: string;

beforeAll(async () => {
  await resetDb();
  anchorDemo(testToday());
  await sequelize.transaction((t) => seedAccounts(t));
  // Only the tables the lists read (no continuity or measurements), so this stays quick.
  await seedScaledProduction(10, { listsOnly: true });
  const user = (await User.findOne({ where: { email: "supervisor@seamscene.test" } }))!;
  actor = { user, productionId: scaledProductionId(10), role: "supervisor" };
  const [c] = await sequelize.query<{ id: string }>(
    `SELECT id FROM characters WHERE production_id = :pid ORDER BY sort_order LIMIT 1 OFFSET 7`,
    { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT },
  );
  const [d] = await sequelize.query<{ id: string }>(
    `SELECT id FROM shoot_days WHERE production_id = :pid ORDER BY day_number LIMIT 1 OFFSET 400`,
    { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT },
  );
  characterId = c!.id;
  shootDayId = d!.id;
}, 180_000);

interface PlanNode {
  "Node Type": string;
  "Relation Name"?: string;
  "Plan Rows": number;
  Plans?: PlanNode[];
}

/** A page sorts at most this many rows; more means the sort key had no index. */
const MAX_SORTED_ROWS = 1000;

/** Runs a list and returns what EXPLAIN of each SELECT it sent finds: tables read in sequence, large sorts. */
async function sequentialScansOf(run: () => Promise<unknown>): Promise<{ queries: number; seqScans: string[] }> {
  const sent: string[] = [];
  // Sequelize reads its logging option on every query; its type declarations do not list `options`.
  const options = (sequelize as unknown as { options: { logging: unknown } }).options;
  const previous = options.logging;
  options.logging = (sql: string) => sent.push(sql.replace(/^Executing \([^)]*\): /, ""));
  try {
    await run();
  } finally {
    options.logging = previous;
  }
  const seqScans: string[] = [];
  const selects = sent.filter((s) => /^\s*SELECT/i.test(s));
  for (const sql of selects) {
    const row = await sequelize.transaction(async (transaction) => {
      await sequelize.query(`SET LOCAL enable_seqscan = off`, { transaction });
      const [r] = await sequelize.query<{ "QUERY PLAN": Array<{ Plan: PlanNode }> }>(`EXPLAIN (FORMAT JSON) ${sql}`, {
        type: QueryTypes.SELECT,
        transaction,
      });
      return r;
    });
    const walk = (n: PlanNode) => {
      if (n["Node Type"] === "Seq Scan") seqScans.push(n["Relation Name"] ?? "?");
      if (n["Node Type"] === "Sort" && n["Plan Rows"] > MAX_SORTED_ROWS) seqScans.push(`sort of ${n["Plan Rows"]} rows`);
      n.Plans?.forEach(walk);
    };
    walk(row!["QUERY PLAN"][0]!.Plan);
  }
  return { queries: selects.length, seqScans };
}

describe("list plans on a 10× production", () => {
  it("has the data of a 10× production", async () => {
    const [n] = await sequelize.query<{ scenes: number; days: number; garments: number }>(
      `SELECT (SELECT count(*) FROM scenes WHERE production_id = :pid)::int AS scenes, (SELECT count(*) FROM shoot_days WHERE production_id = :pid)::int AS days,
              (SELECT count(*) FROM garments WHERE production_id = :pid)::int AS garments`,
      { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT },
    );
    expect(n).toEqual({ scenes: 4000, days: 900, garments: 30_000 });
  });

  const garmentCases: Array<[string, Record<string, string>]> = [
    ["by tag code", {}],
    ["by name", { sort: "name" }],
    ["by category", { sort: "category" }],
    ["by status", { sort: "status" }],
    ["by rental due date", { sort: "rentalDueOn" }],
    ["by rack", { sort: "locationRack" }],
    ["most recently changed first", { sort: "updatedAt", dir: "desc" }],
    ["by name, Z to A", { sort: "name", dir: "desc" }],
    ["on set only", { status: "on_set" }],
    ["jackets only", { category: "jacket" }],
    ["searching for a name", { q: "waistcoat 12" }],
    ["a character's garments", { characterId: "CHARACTER" }],
    ["page 40", { page: "40" }],
  ];
  it.each(garmentCases)("garments %s", async (_name, params) => {
    const q = listGarmentsQuerySchema.parse({ ...params, ...(params.characterId ? { characterId } : {}) });

    const { queries, seqScans } = await sequentialScansOf(() => listGarments(actor, q));

    expect(queries).toBeGreaterThan(0);
    expect(seqScans).toEqual([]);
  });

  const sceneCases: Array<[string, Record<string, string | number>]> = [
    ["in story order", {}],
    ["of one story day", { storyDay: 120 }],
    ["of one set", { setName: "Quay steps" }],
    ["of one shoot day", { shootDayId: "DAY" }],
    ["of one character", { characterId: "CHARACTER" }],
    ["page 30", { page: 30 }],
  ];
  it.each(sceneCases)("scenes %s", async (_name, params) => {
    const q = listScenesQuerySchema.parse({
      ...params,
      ...(params.shootDayId ? { shootDayId } : {}),
      ...(params.characterId ? { characterId } : {}),
    });

    const { queries, seqScans } = await sequentialScansOf(() => listScenes(actor, q));

    expect(queries).toBe(1);
    expect(seqScans).toEqual([]);
  });

  it("shoot days, a page at a time", async () => {
    const { seqScans } = await sequentialScansOf(() => listShootDays(actor, { page: 3, pageSize: 50 }));

    expect(seqScans).toEqual([]);
  });

  it("the audit trail", async () => {
    const { seqScans } = await sequentialScansOf(() => listAuditEvents(actor, { page: 1, pageSize: 50 }));

    expect(seqScans).toEqual([]);
  });
});
