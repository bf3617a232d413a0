import { beforeEach, describe, expect, it } from "vitest";
import Papa from "papaparse";
import { createApp } from "../../server/app.js";
import { buildMember } from "../factories.js";
import { resetDb, signedInAgent } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

// OWASP "CSV Injection": a cell starting with = + - @ (or tab / carriage return) runs as a formula when
// the file is opened in a spreadsheet; every export writes such cells with a leading apostrophe.
// (Tab and carriage return are trimmed from names on input; tests/shared/csv.test.ts covers them.)
const formulas = ['=HYPERLINK("http://x.invalid","Open")', "+1+1", "-2-2", "@SUM(A1:A3)", "=cmd|' /C calc'!A0"];

/** Cells of a CSV response, read by papaparse (an independent RFC 4180 reader). */
function cells(text: string): string[][] {
  return Papa.parse<string[]>(text, { newline: "\r\n", skipEmptyLines: true }).data;
}

describe("GET /api/productions/:productionId/scenes/export (breakdown CSV)", () => {
  it("writes formula-looking set names and synopses inert, and the rest unchanged", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    for (const [i, f] of formulas.entries()) {
      await agent
        .post(`/api/productions/${production.id}/scenes`, { number: String(i + 1), storyOrder: i + 1, setName: f, synopsis: f })
        .expect(201);
    }
    await agent
      .post(`/api/productions/${production.id}/scenes`, {
        number: "9",
        storyOrder: 9,
        setName: "Harbour wall",
        synopsis: "Rain, then wind",
      })
      .expect(201);

    const res = await agent.get(`/api/productions/${production.id}/scenes/export`);

    expect(res.status).toBe(200);
    const rows = cells(res.text);
    const setCol = rows[0]!.indexOf("set");
    const synopsisCol = rows[0]!.indexOf("synopsis");
    for (const [i, f] of formulas.entries()) {
      expect(rows[i + 1]![setCol]).toBe(`'${f}`);
      expect(rows[i + 1]![synopsisCol]).toBe(`'${f}`);
    }
    expect(rows[6]![setCol]).toBe("Harbour wall");
    expect(rows[6]![synopsisCol]).toBe("Rain, then wind");
    for (const row of rows) for (const cell of row) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });
});

describe("GET /api/productions/:productionId/garments/export.csv", () => {
  it("writes formula-looking names inert with the same writer", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    for (const f of formulas.slice(0, 4)) {
      await agent
        .post(`/api/productions/${production.id}/garments`, {
          name: f,
          category: "jacket",
          source: "built",
          fitIntent: "fitted",
          vendor: f,
        })
        .expect(201);
    }

    const res = await agent.get(`/api/productions/${production.id}/garments/export.csv`);

    const rows = cells(res.text);
    const names = rows.slice(1).map((r) => r[rows[0]!.indexOf("name")]);
    expect(names.sort()).toEqual(
      formulas
        .slice(0, 4)
        .map((f) => `'${f}`)
        .sort(),
    );
    for (const row of rows) for (const cell of row) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    expect(res.text.endsWith("\r\n")).toBe(true);
  });
});
