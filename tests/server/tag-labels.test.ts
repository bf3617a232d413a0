// Tag-label sheets: the first label of a partly used sheet lands on the chosen position. Positions
// are read back from the PDF with poppler's `pdftotext -bbox` (an independent PDF reader).
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { labelSlotOrigin } from "../../server/lib/tag-labels.js";
import { buildGarment, buildMember } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Garment, Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let base: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("set_costumer");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  base = `/api/productions/${production.id}/garments`;
});

const MM = 72 / 25.4;

async function pdf(url: string): Promise<{ status: number; body: Buffer; json?: { error: { fields: Record<string, string> } } }> {
  const res = await agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });
  const body = res.body as Buffer;
  return { status: res.status, body, json: res.status === 200 ? undefined : JSON.parse(body.toString()) };
}

/** Words with their boxes (points from the page's top left), per page, as poppler reads them. */
function words(buf: Buffer): Array<{ page: number; text: string; xMin: number; yMin: number }> {
  const dir = mkdtempSync(path.join(tmpdir(), "labels-"));
  try {
    const file = path.join(dir, "labels.pdf");
    writeFileSync(file, buf);
    const html = execFileSync("pdftotext", ["-bbox", file, "-"], { encoding: "utf8" });
    const out: Array<{ page: number; text: string; xMin: number; yMin: number }> = [];
    let page = 0;
    for (const line of html.split("\n")) {
      if (line.includes("<page ")) page++;
      const m = /<word xMin="([\d.]+)" yMin="([\d.]+)"[^>]*>([^<]*)<\/word>/.exec(line);
      if (m) out.push({ page, text: m[3]!, xMin: Number(m[1]), yMin: Number(m[2]) });
    }
    return out;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The slot (0-based) whose box contains a point. */
function slotAt(x: number, y: number): number {
  for (let slot = 0; slot < 24; slot++) {
    const o = labelSlotOrigin(slot);
    if (x >= o.x && x < o.x + 70 * MM && y >= o.y && y < o.y + 37 * MM) return slot;
  }
  return -1;
}

describe("GET /garments/labels.pdf?start=", () => {
  it("puts the first label on the chosen position of a partly used sheet (position 5 = row 2, column 2)", async () => {
    const g = await buildGarment({ production, name: "Oilskin" });

    const res = await pdf(`${base}/labels.pdf?ids=${g.id}&start=5`);

    expect(res.status).toBe(200);
    const code = words(res.body).find((w) => w.text === g.tagCode);
    expect(code).toBeDefined();
    expect(slotAt(code!.xMin, code!.yMin)).toBe(4);
    // The slot grid itself, against the A4 sheet (210 × 297 mm) of 3 × 8 labels of 70 × 37 mm, centred vertically:
    // row 2 starts 1 × 37 mm below the top margin of (297 − 8 × 37) / 2 = 0.5 mm.
    expect(labelSlotOrigin(4).x / MM).toBeCloseTo(70, 6);
    expect(labelSlotOrigin(4).y / MM).toBeCloseTo(0.5 + 37, 6);
  });

  it("without a start, the first label is top left; labels past the end of the first sheet go on to a new page at its top left", async () => {
    const made: Garment[] = [];
    for (let i = 0; i < 3; i++) made.push(await buildGarment({ production, name: `G${i}` }));
    const ids = made.map((g) => g.id).join(",");

    const first = await pdf(`${base}/labels.pdf?ids=${ids}`);
    const last = await pdf(`${base}/labels.pdf?ids=${ids}&start=23`);

    const codes = [...made].sort((a, b) => (a.tagCode < b.tagCode ? -1 : 1)).map((g) => g.tagCode);
    const w1 = words(first.body);
    expect(slotAt(w1.find((w) => w.text === codes[0])!.xMin, w1.find((w) => w.text === codes[0])!.yMin)).toBe(0);
    const w2 = words(last.body);
    const at = (code: string) => {
      const w = w2.find((x) => x.text === code)!;
      return [w.page, slotAt(w.xMin, w.yMin)];
    };
    expect(codes.map(at)).toEqual([
      [1, 22],
      [1, 23],
      [2, 0],
    ]);
  });

  it("400 naming start for a position off the sheet", async () => {
    const g = await buildGarment({ production });

    const res = await pdf(`${base}/labels.pdf?ids=${g.id}&start=25`);

    expect(res.status).toBe(400);
    expect(res.json!.error.fields.start).toMatch(/24 or less/);
  });
});
