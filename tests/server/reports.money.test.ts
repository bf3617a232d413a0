import { afterEach, beforeEach, describe, expect, it } from "vitest";
import ExcelJS from "exceljs";
import Papa from "papaparse";
import { QueryTypes } from "sequelize";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { sequelize } from "../../server/db.js";
import type { Production } from "../../server/models/index.js";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import { snagFixtures } from "../setup/snag-fixtures.js";
import type { BudgetDto, ReturnsDto } from "../../shared/schemas/reports.js";

const app = createApp();
const binaryGet = (agent: TestAgent, url: string) =>
  agent.agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });

/**
 * Today is 10 Sep 2030; the production runs 1 Sep – 15 Oct 2030, so hires are counted from 1 Sep.
 * Hire house A: R-1 (on set, due 8 Sep: 2 days overdue; £45/week + £10 flat), R-2 (due 30 Sep,
 * £12.50/week). Hire house B: R-3 (no due date: to the end, £20/week), R-4 (returned 5 Sep, £30/week).
 * Owned: J-1 £420 built, B-1 £180 bought boots shared by Wren and Moss, L-1 £25 lost on 7 Sep,
 * S-1 £60 to sell, K-1 £300 to keep (at the cleaners since 9 Sep), N-1 no cost, with a name a
 * spreadsheet would run as a formula.
 */
async function scenario(production: Production, actorId: string) {
  const f = snagFixtures(production.id);
  const g = async (o: Parameters<typeof f.garment>[0], set: Record<string, unknown>) => {
    const id = await f.garment(o);
    if (Object.keys(set).length) await f.update("garments", id, set);
    return id;
  };
  const ids = {
    j1: await g({ tagCode: "J-1", name: "Keeper jacket", category: "jacket" }, { cost_cents: 42000 }),
    b1: await g({ tagCode: "B-1", name: "Hobnail boots", category: "boots", source: "bought" }, { cost_cents: 18000, vendor: "Cobbles" }),
    r1: await g(
      { tagCode: "R-1", name: "Frock coat", category: "coat", source: "rented", rentalDueOn: "2030-09-08", status: "on_set" },
      { cost_cents: 1000, rental_cost_per_week_cents: 4500, vendor: "Hire House A" },
    ),
    r2: await g(
      { tagCode: "R-2", name: "Shovel hat", category: "hat", source: "rented", rentalDueOn: "2030-09-30" },
      { rental_cost_per_week_cents: 1250, vendor: "Hire House A" },
    ),
    r3: await g(
      { tagCode: "R-3", name: "Cassock", category: "coat", source: "rented" },
      { rental_cost_per_week_cents: 2000, vendor: "Hire House B" },
    ),
    r4: await g(
      { tagCode: "R-4", name: "Tailcoat", category: "coat", source: "rented", rentalDueOn: "2030-09-20", status: "returned" },
      { rental_cost_per_week_cents: 3000, vendor: "Hire House B" },
    ),
    l1: await g({ tagCode: "L-1", name: "Paisley shawl", category: "shawl", status: "lost" }, { cost_cents: 2500 }),
    s1: await g(
      { tagCode: "S-1", name: "Moleskin waistcoat", category: "waistcoat", source: "bought" },
      { cost_cents: 6000, wrap_disposition: "sell" },
    ),
    k1: await g(
      { tagCode: "K-1", name: "Sunday overcoat", category: "coat", status: "cleaning" },
      { cost_cents: 30000, wrap_disposition: "keep" },
    ),
    n1: await g({ tagCode: "N-1", name: "=2+3 trick", category: "accessory" }, {}),
  };
  const event = (garmentId: string, to: string, at: string) =>
    sequelize.query(
      `INSERT INTO garment_status_events (id, production_id, garment_id, from_status, to_status, actor_id, created_at, updated_at) VALUES (gen_random_uuid(), :pid, :gid, 'in_stock', :to, :actor, :at, :at)`,
      { replacements: { pid: production.id, gid: garmentId, to, actor: actorId, at } },
    );
  await event(ids.r4, "returned", "2030-09-05T10:00:00Z");
  await event(ids.l1, "lost", "2030-09-07T10:00:00Z");
  await event(ids.k1, "cleaning", "2030-09-09T10:00:00Z");
  await event(ids.r1, "on_set", "2030-09-03T07:00:00Z");
  const wren = await f.character({ name: "Wren Tallack" });
  const moss = await f.character({ name: "Moss Keverne" });
  const w1 = await f.change({ characterId: wren, number: 1 });
  const m1 = await f.change({ characterId: moss, number: 1 });
  await f.changeItem({ changeId: w1, garmentId: ids.j1 });
  await f.changeItem({ changeId: w1, garmentId: ids.b1 });
  await f.changeItem({ changeId: m1, garmentId: ids.b1 });
  await f.changeItem({ changeId: m1, garmentId: ids.r1 });
  return { ...ids, wren, moss, w1, m1 };
}

/**
 * The budget total computed in SQL on its own, as a cross-check of the app's arithmetic: flat costs
 * plus weekly rate × started weeks from the production's start to the return, due or end date
 * (at least one week).
 */
async function sqlBudgetTotalCents(productionId: string): Promise<number> {
  const [row] = await sequelize.query<{ total: string }>(
    `SELECT COALESCE(SUM(COALESCE(g.cost_cents, 0)), 0)
          + COALESCE(SUM(CASE WHEN g.source = 'rented' AND COALESCE(g.rental_cost_per_week_cents, 0) > 0 THEN
              g.rental_cost_per_week_cents * GREATEST(1, CEIL((GREATEST(COALESCE(
                (SELECT max(e.created_at)::date FROM garment_status_events e WHERE e.garment_id = g.id AND e.to_status = 'returned'),
                g.rental_due_on, p.ends_on), p.starts_on) - p.starts_on) / 7.0))
            ELSE 0 END), 0) AS total
       FROM garments g JOIN productions p ON p.id = g.production_id
      WHERE g.production_id = :pid`,
    { replacements: { pid: productionId }, type: QueryTypes.SELECT },
  );
  return Number(row!.total);
}

describe("returns and wrap", () => {
  let production: Production;
  let agent: TestAgent;
  let ids: Awaited<ReturnType<typeof scenario>>;
  const base = () => `/api/productions/${production.id}/reports`;

  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-10", { frozen: true });
    production = await buildProduction({ title: "Harbour Lights" });
    await production.update({ startsOn: "2030-09-01", endsOn: "2030-10-15", settings: { currency: "GBP" } });
    const { user } = await buildMember("set_costumer", { production });
    agent = await signedInAgent(app, user.email);
    ids = await scenario(production, user.id);
  });
  afterEach(() => clock.reset());

  it("lists hires by hire house with the overdue first, lost items, garments out and the wrap plan", async () => {
    const res = await agent.get(`${base()}/returns`);

    expect(res.status).toBe(200);
    const r = res.body.data as ReturnsDto;
    expect(r).toMatchObject({ today: "2030-09-10", currency: "GBP" });
    expect(
      r.rentals.map((v) => [
        v.vendor,
        v.overdue,
        v.hireCents,
        v.lines.map((l) => [l.tagCode, l.dueOn, l.daysOverdue, l.weeks, l.hireCents]),
      ]),
    ).toEqual([
      // 1–8 Sep: 7 days, one week: 45 + 10 flat. 1–30 Sep: 29 days, five started weeks: 5 × 12.50.
      [
        "Hire House A",
        1,
        11750,
        [
          ["R-1", "2030-09-08", 2, 1, 5500],
          ["R-2", "2030-09-30", -20, 5, 6250],
        ],
      ],
      // No due date: counted to the production's last day, 1 Sep – 15 Oct = 44 days, seven weeks.
      ["Hire House B", 0, 14000, [["R-3", null, null, 7, 14000]]],
    ]);
    expect(r.lost).toEqual([
      { garmentId: ids.l1, tagCode: "L-1", name: "Paisley shawl", source: "built", vendor: null, lostOn: "2030-09-07", costCents: 2500 },
    ]);
    expect(r.out.map((o) => [o.tagCode, o.status, o.since, o.movedBy, o.holder])).toEqual([
      ["R-1", "on_set", "2030-09-03", "Test set_costumer", null],
      ["K-1", "cleaning", "2030-09-09", "Test set_costumer", null],
    ]);
    expect(r.wrap.map((w) => [w.action, w.tagCode])).toEqual([
      ["return", "R-3"],
      ["return", "R-1"],
      ["return", "R-2"],
      ["sell", "S-1"],
      ["keep", "K-1"],
      ["undecided", "B-1"],
      ["undecided", "J-1"],
      ["undecided", "N-1"],
    ]);
    expect(r.wrapCounts).toEqual({ return: 3, sell: 1, keep: 1, undecided: 3 });
  });

  it("exports each section as CSV with numbers as numbers and formula-looking text escaped", async () => {
    const rentals = await agent.get(`${base()}/returns.csv?section=rentals`);
    const wrap = await agent.get(`${base()}/returns.csv?section=wrap`);

    expect(rentals.status).toBe(200);
    expect(rentals.headers["content-type"]).toBe("text/csv; charset=utf-8");
    const rows = Papa.parse<string[]>(rentals.text.replace(/^\uFEFF/, ""), { dynamicTyping: true }).data.filter((r) => r.length > 1);
    expect(rows[0]).toEqual([
      "Hire house",
      "Tag code",
      "Garment",
      "Category",
      "Status",
      "Where",
      "Due back",
      "Days overdue",
      "Weekly rate (GBP)",
      "Weeks",
      "Hire cost (GBP)",
    ]);
    expect(rows[1]).toEqual(["Hire House A", "R-1", "Frock coat", "coat", "On set", null, "2030-09-08", 2, 45, 1, 55]);
    expect(rows.at(-1)).toEqual(["Total", null, null, null, null, null, null, null, 77.5, null, 257.5]);
    // Numbers are written bare, never quoted.
    expect(rentals.text).toContain(",2,45,1,55\r\n");
    // OWASP "CSV Injection": a cell starting with "=" gets a leading apostrophe (one writer, shared/csv.ts).
    expect(Papa.parse<string[]>(wrap.text.replace(/^\uFEFF/, "")).data.flat()).toContain("'=2+3 trick");
    expect((await agent.get(`${base()}/returns.csv?section=nope`)).status).toBe(400);
  });

  it("exports a workbook whose sheets read back with the hire totals of the database", async () => {
    const res = await binaryGet(agent, `${base()}/returns.xlsx`);

    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    // ExcelJS types its Buffer parameter against an older @types/node.
    await wb.xlsx.load(res.body as never);
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Rentals", "Lost", "Out", "Wrap"]);
    const sheet = wb.getWorksheet("Rentals")!;
    const costs: number[] = [];
    sheet.eachRow((row, n) => {
      if (n === 1 || row.getCell(1).value === "Total") return;
      const v = row.getCell(11).value;
      expect(typeof v).toBe("number");
      costs.push(v as number);
    });
    const [sql] = await sequelize.query<{ n: string }>(
      `SELECT count(*) AS n FROM garments WHERE production_id = :pid AND source = 'rented' AND status <> 'returned'`,
      { replacements: { pid: production.id }, type: QueryTypes.SELECT },
    );
    expect(costs).toHaveLength(Number(sql!.n));
    expect(costs.reduce((a, b) => a + b, 0)).toBeCloseTo(257.5, 2);
    const total = sheet.getRow(sheet.rowCount).getCell(11).value as { formula: string; result: number };
    expect(total).toMatchObject({ formula: `SUM(K2:K${sheet.rowCount - 1})`, result: 257.5 });
  });
});

describe("budget", () => {
  let production: Production;
  let agent: TestAgent;
  let ids: Awaited<ReturnType<typeof scenario>>;
  const base = () => `/api/productions/${production.id}/reports`;

  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-10", { frozen: true });
    production = await buildProduction({ title: "Harbour Lights" });
    await production.update({ startsOn: "2030-09-01", endsOn: "2030-10-15", settings: { currency: "EUR" } });
    const { user } = await buildMember("designer", { production });
    agent = await signedInAgent(app, user.email);
    ids = await scenario(production, user.id);
  });
  afterEach(() => clock.reset());

  it("sums costs by category, character, change and source, each grouping adding up to the total", async () => {
    const res = await agent.get(`${base()}/budget`);

    expect(res.status).toBe(200);
    const b = res.body.data as BudgetDto;
    expect(b).toMatchObject({ currency: "EUR", hireFrom: "2030-09-01", hireTo: "2030-10-15" });
    const sql = await sqlBudgetTotalCents(production.id);
    expect(sql).toBe(127250);
    expect(b.totalCents).toBe(sql);
    for (const grouping of ["category", "character", "change", "source"] as const) {
      expect(
        b.groupings[grouping].reduce((s, r) => s + r.cents, 0),
        grouping,
      ).toBe(sql);
    }
    expect(b.groupings.source.map((r) => [r.label, r.cents, r.garments])).toEqual([
      ["Built", 74500, 4],
      ["Rented", 28750, 4],
      ["Bought", 24000, 2],
    ]);
    // The boots are shared by Wren and Moss, so each carries half (1 garment counted as ½ + ½).
    const character = Object.fromEntries(b.groupings.character.map((r) => [r.label, [r.cents, r.garments]]));
    expect(character).toEqual({ "Wren Tallack": [51000, 1.5], "Moss Keverne": [14500, 1.5], "Not in any change": [61750, 7] });
    expect(b.groupings.change.find((r) => r.key === ids.m1)).toMatchObject({ label: "Moss Keverne · change 1", cents: 14500 });
    expect(b.groupings.category[0]).toMatchObject({ label: "coat", cents: 5500 + 14000 + 3000 + 30000 });
  });

  it("gives the rental cost per week over the shoot, adding up to the weekly part of the hires", async () => {
    const b = (await agent.get(`${base()}/budget`)).body.data as BudgetDto;

    expect(b.rentalWeeks.map((w) => [w.week, w.starts, w.cents, w.garments])).toEqual([
      [1, "2030-09-01", 4500 + 1250 + 2000 + 3000, 4],
      [2, "2030-09-08", 3250, 2],
      [3, "2030-09-15", 3250, 2],
      [4, "2030-09-22", 3250, 2],
      [5, "2030-09-29", 3250, 2],
      [6, "2030-10-06", 2000, 1],
      [7, "2030-10-13", 2000, 1],
    ]);
    const weekly = b.garments.reduce((s, g) => s + g.weeklyCents * g.weeks, 0);
    expect(b.rentalWeeks.reduce((s, w) => s + w.cents, 0)).toBe(weekly);
  });

  it("exports a workbook with numbers as numbers whose sums match the SQL total on every sheet", async () => {
    const res = await binaryGet(agent, `${base()}/budget.xlsx`);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
    const wb = new ExcelJS.Workbook();
    // ExcelJS types its Buffer parameter against an older @types/node.
    await wb.xlsx.load(res.body as never);
    const sql = (await sqlBudgetTotalCents(production.id)) / 100;
    const sumColumn = (name: string, header: string) => {
      const ws = wb.getWorksheet(name)!;
      const col = (ws.getRow(1).values as unknown[]).indexOf(header);
      expect(col, `${name}: ${header}`).toBeGreaterThan(0);
      let sum = 0;
      let total: { formula: string; result: number } | undefined;
      ws.eachRow((row, n) => {
        if (n === 1) return;
        const v = row.getCell(col).value;
        if (row.getCell(1).value === "Total") total = v as typeof total;
        else {
          expect(typeof v, `${name} row ${n}`).toBe("number");
          sum += v as number;
        }
      });
      return { sum, total };
    };
    for (const [sheet, header] of [
      ["Garments", "Total (EUR)"],
      ["By category", "Total (EUR)"],
      ["By character", "Total (EUR)"],
      ["By change", "Total (EUR)"],
      ["By source", "Total (EUR)"],
    ] as const) {
      const { sum, total } = sumColumn(sheet, header);
      expect(sum, sheet).toBeCloseTo(sql, 2);
      expect(total?.result, sheet).toBeCloseTo(sql, 2);
      expect(total?.formula).toMatch(/^SUM\([A-Z]+2:[A-Z]+\d+\)$/);
    }
    expect(sumColumn("Rental per week", "Hire this week (EUR)").sum).toBeCloseTo(277.5, 2);
    expect(wb.getWorksheet("Garments")!.getColumn(10).numFmt).toBe("#,##0.00");
  });

  it("exports each grouping as CSV", async () => {
    const res = await agent.get(`${base()}/budget.csv?by=source`);

    expect(res.status).toBe(200);
    const rows = Papa.parse<unknown[]>(res.text.replace(/^\uFEFF/, ""), { dynamicTyping: true, skipEmptyLines: true }).data;
    expect(rows).toEqual([
      ["Source", "Garments", "Total (EUR)"],
      ["Built", 4, 745],
      ["Rented", 4, 287.5],
      ["Bought", 2, 240],
      ["Total", 10, 1272.5],
    ]);
  });
});

describe("production settings for reports", () => {
  beforeEach(resetDb);

  it("takes a currency code and a paper size, and refuses codes that are not currencies", async () => {
    const production = await buildProduction();
    const { user } = await buildMember("supervisor", { production });
    const agent = await signedInAgent(app, user.email);
    const url = `/api/productions/${production.id}`;

    const ok = await agent.patch(url, { settings: { currency: "eur", paperSize: "Letter" } });
    expect(ok.status).toBe(200);
    expect(ok.body.data.settings).toMatchObject({ currency: "EUR", paperSize: "Letter" });

    // ISO 4217 has no "XYZ"; "A5" is not one of the report papers.
    const bad = await agent.patch(url, { settings: { currency: "XYZ" } });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error.fields)).toMatch(/currency/);
    expect((await agent.patch(url, { settings: { paperSize: "A5" } })).status).toBe(400);
  });
});
