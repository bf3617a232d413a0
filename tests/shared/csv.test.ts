import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { escapeCsvFormula, unescapeCsvFormula, writeCsv, writeCsvRecords } from "@shared/csv";

describe("escapeCsvFormula", () => {
  // OWASP "CSV Injection": cells starting with = + - @ tab or carriage return are run as formulas.
  it.each([
    ['=HYPERLINK("http://x.invalid","click")', '\'=HYPERLINK("http://x.invalid","click")'],
    ["+1+cmd|' /C calc'!A0", "'+1+cmd|' /C calc'!A0"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1:A9)", "'@SUM(A1:A9)"],
    ["\t=1", "'\t=1"],
    ["\r=1", "'\r=1"],
    ["Harbour wall", "Harbour wall"],
    ["a=b", "a=b"],
    ["", ""],
  ])("text %j → %j", (cell, expected) => {
    expect(escapeCsvFormula(cell)).toBe(expected);
  });

  it("writes numbers as they are, negative ones included, and null/undefined as empty", () => {
    expect(escapeCsvFormula(-3.5)).toBe("-3.5");
    expect(escapeCsvFormula(0)).toBe("0");
    expect(escapeCsvFormula(null)).toBe("");
    expect(escapeCsvFormula(undefined)).toBe("");
  });

  it("is undone by unescapeCsvFormula, which leaves other apostrophes alone", () => {
    for (const cell of ["=1", "+x", "-y", "@z", "\tq", "plain", "'quoted'", "'=already", "''-twice"]) {
      expect(unescapeCsvFormula(escapeCsvFormula(cell))).toBe(cell);
    }
    expect(unescapeCsvFormula("'tis")).toBe("'tis");
  });
});

describe("writeCsv", () => {
  it("writes RFC 4180 text that papaparse reads back cell for cell, formulas inert", () => {
    const rows = [
      ["1", "Chapel, vestry", 'He says "no"', "line\nbreak"],
      ["2", "=1+1", "-", "@home"],
    ];

    const csv = writeCsv(["scene", "set", "synopsis", "notes"], rows);
    // Independent reader: papaparse's parser (RFC 4180 quoting).
    const back = Papa.parse<string[]>(csv, { newline: "\r\n", skipEmptyLines: true }).data;

    expect(csv.endsWith("\r\n")).toBe(true);
    expect(back[0]).toEqual(["scene", "set", "synopsis", "notes"]);
    expect(back[1]).toEqual(rows[0]);
    expect(back[2]).toEqual(["2", "'=1+1", "'-", "'@home"]);
  });

  it("writes records in the given column order, missing keys empty", () => {
    expect(writeCsvRecords(["a", "b", "c"] as const, [{ c: 3, a: "=x" }])).toBe("a,b,c\r\n'=x,,3\r\n");
  });

  it("writes only the header for no rows", () => {
    expect(writeCsv(["a", "b"], [])).toBe("a,b\r\n");
  });
});

describe("the one CSV writer", () => {
  it("is the only place that writes CSV text: no other server or shared module calls Papa.unparse", () => {
    const files = (dir: string): string[] =>
      fs
        .readdirSync(dir, { withFileTypes: true })
        .flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : /\.tsx?$/.test(e.name) ? [path.join(dir, e.name)] : []));
    const writers = [...files("server"), ...files("shared"), ...files("src")].filter((f) => /\.unparse\(/.test(fs.readFileSync(f, "utf8")));

    expect(writers).toEqual([path.join("shared", "csv.ts")]);
  });
});
