import path from "node:path";
import { beforeEach, describe, expect, it } from "vitest";
import { polygonArea as d3PolygonArea } from "d3-polygon";
import { createApp } from "../../server/app.js";
import { Panel, Seam } from "../../server/models/index.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import { buildMember } from "../factories.js";
import { buildChangeWithGarments, buildFabric, buildPanel } from "../setup/doubles-fixtures.js";

const app = createApp();
const fixture = (name: string) => path.resolve("tests/fixtures/doubles", name);

let cutter: TestAgent;
let productionId: string;
let garmentIds: string[];
let changeId: string;
let fabricId: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("cutter");
  productionId = m.production.id;
  cutter = await signedInAgent(app, m.user.email);
  fabricId = (await buildFabric(productionId, { name: "Wool melton", widthMm: 1500 })).id;
  ({ garmentIds, changeId } = await buildChangeWithGarments(productionId, { garments: 2, fabricId }));
});

const base = () => `/api/productions/${productionId}`;

describe("POST /panels", () => {
  it("400 names the outline field for a self-crossing outline and writes nothing", async () => {
    const res = await cutter.post(`${base()}/panels`, {
      garmentId: garmentIds[0],
      name: "Bow tie",
      outline: [
        [0, 0],
        [100, 100],
        [100, 0],
        [0, 100],
      ],
    });

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_error");
    expect(res.body.error.fields.outline).toMatch(/cross/);
    expect(await Panel.count()).toBe(0);
  });

  it("400 for a notch on an edge the outline does not have", async () => {
    const res = await cutter.post(`${base()}/panels`, {
      garmentId: garmentIds[0],
      name: "Cuff",
      outline: [
        [0, 0],
        [260, 0],
        [260, 70],
        [0, 70],
      ],
      notches: [{ point: [0, 35], edge: 7 }],
    });

    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("notches.0.edge");
    expect(await Panel.count()).toBe(0);
  });

  it("400 for a garment of another production", async () => {
    const other = await buildMember("cutter");
    const { garmentIds: foreign } = await buildChangeWithGarments(other.production.id);

    const res = await cutter.post(`${base()}/panels`, {
      garmentId: foreign[0],
      name: "Front",
      outline: [
        [0, 0],
        [10, 0],
        [0, 10],
      ],
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.garmentId).toBe("Garment: no such garment in this production");
    expect(await Panel.count()).toBe(0);
  });

  it("creates a panel and reports the shoelace area of the worked example", async () => {
    // Trapezoid (0,0),(60,0),(50,70),(10,70) cm: (60 + 40) / 2 × 70 = 3500 cm² = 350 000 mm² (trapezoid area, by hand).
    const res = await cutter.post(`${base()}/panels`, {
      garmentId: garmentIds[0],
      name: "Skirt front",
      outline: [
        [0, 0],
        [600, 0],
        [500, 700],
        [100, 700],
      ],
      seamAllowanceMm: 15,
      cutCount: 2,
      mirrored: true,
    });

    expect(res.status).toBe(201);
    expect(res.body.data.areaMm2).toBeCloseTo(350_000, 6);
    expect(res.body.data.effectiveFabricId).toBe(fabricId);
    // The cut line encloses the sew line: its area is larger, by at least perimeter × allowance (Steiner, convex piece).
    expect(res.body.data.cutAreaMm2).toBeGreaterThanOrEqual(350_000 + res.body.data.perimeterMm * 15 - 1e-6);
  });
});

describe("GET /panels/:panelId", () => {
  it("gives no cut area when the cut line cannot be drawn, rather than the sew-line area", async () => {
    // A stored piece a few tenths of a micrometre across: clipper works in whole micrometres, so the outline
    // collapses to one point and offsetting it yields no cut line.
    const p = await buildPanel(productionId, garmentIds[0], {
      name: "Speck",
      outline: [
        [0, 0],
        [0.0004, 0],
        [0, 0.0004],
      ],
      seamAllowanceMm: 10,
    });

    const res = await cutter.get(`${base()}/panels/${p.id}`);

    expect(res.status).toBe(200);
    expect(res.body.data.areaMm2).toBeCloseTo((0.0004 * 0.0004) / 2, 12);
    expect(res.body.data.cutAreaMm2).toBeNull();
  });
});

describe("PATCH /panels/:panelId", () => {
  it("changes only the fields sent", async () => {
    const p = await buildPanel(productionId, garmentIds[0], { seamAllowanceMm: 15 });

    const res = await cutter.patch(`${base()}/panels/${p.id}`, { cutCount: 3 });

    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      cutCount: 3,
      seamAllowanceMm: 15,
      grainline: [
        [100, 50],
        [100, 250],
      ],
      name: "Piece",
    });
  });

  it("refuses an outline that drops a vertex a seam uses", async () => {
    const a = await buildPanel(productionId, garmentIds[0], {
      outline: [
        [0, 0],
        [100, 0],
        [100, 100],
        [50, 150],
        [0, 100],
      ],
    });
    const b = await buildPanel(productionId, garmentIds[1]);
    await Seam.create({
      productionId,
      name: "S",
      panelAId: a.id,
      aFrom: 3,
      aTo: 4,
      aDirection: "forward",
      panelBId: b.id,
      bFrom: 0,
      bTo: 1,
      bDirection: "forward",
      toleranceMm: null,
      eased: false,
      easeMinMm: null,
      easeMaxMm: null,
    });

    const res = await cutter.patch(`${base()}/panels/${a.id}`, {
      outline: [
        [0, 0],
        [100, 0],
        [100, 100],
      ],
    });

    expect(res.status).toBe(422);
    expect(res.body.error.fields.outline).toBe("Outline: a seam uses vertex or edge 4");
    expect((await Panel.findByPk(a.id))!.outline).toHaveLength(5);
  });

  it("404 for a panel of another production", async () => {
    const other = await buildMember("cutter");
    const { garmentIds: foreign } = await buildChangeWithGarments(other.production.id);
    const p = await buildPanel(other.production.id, foreign[0]);

    const res = await cutter.patch(`${base()}/panels/${p.id}`, { name: "Mine now" });

    expect(res.status).toBe(404);
    expect((await Panel.findByPk(p.id))!.name).toBe("Piece");
  });
});

describe("POST /panels/dxf-import", () => {
  it("imports the pieces of an uploaded DXF file written by hand (LWPOLYLINE, mm)", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .field("seamAllowanceMm", "12")
      .attach("file", fixture("two-pieces-mm.dxf"));

    expect(res.status).toBe(201);
    const [back, yoke] = res.body.data.panels;
    expect(back.name).toBe("Back");
    expect(back.cutCount).toBe(2);
    expect(back.mirrored).toBe(true);
    expect(back.areaMm2).toBeCloseTo(250 * 400, 6);
    expect(back.grainline).toEqual([
      [125, 50],
      [125, 350],
    ]);
    expect(back.notches).toEqual([{ point: [0, 200], edge: 3 }]);
    expect(back.seamAllowanceMm).toBe(12);
    // Right triangle with legs 300 and 400 (hypotenuse 500): area ½·300·400, perimeter 1200.
    expect(yoke.areaMm2).toBeCloseTo(60_000, 6);
    expect(yoke.perimeterMm).toBeCloseTo(1200, 9);
    expect(await Panel.count({ where: { garmentId: garmentIds[0], source: "dxf" } })).toBe(2);
  });

  it("converts drawing units: the worked-example skirt drawn in centimetres", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", fixture("skirt-cm.dxf"));

    expect(res.status).toBe(201);
    // Trapezoid area by hand: 3500 cm²; an independent polygon library (d3-polygon) agrees on the imported outline.
    const outline = res.body.data.panels[0].outline as [number, number][];
    expect(res.body.data.panels[0].areaMm2).toBeCloseTo(350_000, 6);
    // d3-polygon's area is signed for a y-down frame: compare absolute values.
    expect(Math.abs(d3PolygonArea(outline))).toBeCloseTo(350_000, 6);
  });

  it("422 for a file that is not a drawing, nothing written", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", fixture("not-a-drawing.dxf"));

    expect(res.status).toBe(422);
    expect(res.body.error.fields.file).toBe("File is not a readable DXF file");
    expect(await Panel.count()).toBe(0);
  });

  it("415 names the file field when the upload is not .dxf", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", Buffer.from("x"), "piece.txt");

    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe("unsupported_media_type");
    expect(res.body.error.fields).toEqual({ file: "Choose a .dxf file" });
    expect(await Panel.count()).toBe(0);
  });

  it("preview parses without writing and says what it recognised", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-preview`)
      .set("X-CSRF-Token", cutter.csrf)
      .attach("file", fixture("two-pieces-mm.dxf"));

    expect(res.status).toBe(200);
    expect(res.body.data.pieces.map((p: { name: string }) => p.name)).toEqual(["Back", "Yoke"]);
    expect(res.body.data.pieces[0].recognised.join("; ")).toMatch(/grain line/);
    expect(res.body.data.units).toMatchObject({ unit: "mm" });
    expect(await Panel.count()).toBe(0);
  });

  it("imports an ezdxf-written file of ASTM D6673 blocks: sew lines, measured seam allowances, rotated and mirrored INSERT", async () => {
    // Written by ezdxf through tests/fixtures/doubles/make-dxf-fixtures.py; figures from its expected.json.
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .field("seamAllowanceMm", "5")
      .attach("file", fixture("ezdxf/astm-pieces.dxf"));

    expect(res.status).toBe(201);
    const [back, facing] = res.body.data.panels;
    expect(back).toMatchObject({ name: "Back", cutCount: 2, mirrored: true, seamAllowanceMm: 10, source: "dxf" });
    expect(back.areaMm2).toBeCloseTo(100_000, 6);
    expect(facing).toMatchObject({ name: "Facing", cutCount: 1, seamAllowanceMm: 15 });
    expect(facing.areaMm2).toBeCloseTo(225_000, 4);
  });

  it("closed SPLINE outlines import (defect: 'no closed piece outline found')", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", fixture("ezdxf/curves.dxf"));

    expect(res.status).toBe(201);
    expect(res.body.data.panels).toHaveLength(5);
  });

  it("a file that does not say its units imports in the units chosen in the preview", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .field("units", "in")
      .attach("file", fixture("ezdxf/unitless-inches.dxf"));

    expect(res.status).toBe(201);
    // 6 × 7 in, 1 in = 25.4 mm exactly (NIST SP 811, B.8).
    expect(res.body.data.panels[0].areaMm2).toBeCloseTo(42 * 25.4 * 25.4, 6);
  });

  it("422 says why no piece was found: lines that stop 2 mm short of closing", async () => {
    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", fixture("ezdxf/open-outline.dxf"));

    expect(res.status).toBe(422);
    expect(res.body.error.fields.file).toMatch(/no closed piece outline found: 4 × LINE on layer 0: .*2 mm apart/);
    expect(await Panel.count()).toBe(0);
  });

  it("413 names the file when a piece has more points than the limit; nothing written", async () => {
    const n = 6000;
    const pts = Array.from(
      { length: n },
      (_, i) => `10\n${300 * Math.cos((2 * Math.PI * i) / n)}\n20\n${300 * Math.sin((2 * Math.PI * i) / n)}`,
    ).join("\n");
    const file = `0\nSECTION\n2\nENTITIES\n0\nLWPOLYLINE\n8\n0\n90\n${n}\n70\n1\n${pts}\n0\nENDSEC\n0\nEOF\n`;

    const res = await cutter.agent
      .post(`${base()}/panels/dxf-import`)
      .set("X-CSRF-Token", cutter.csrf)
      .field("garmentId", garmentIds[0])
      .attach("file", Buffer.from(file), "circle.dxf");

    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe("payload_too_large");
    expect(res.body.error.fields.file).toMatch(/6,000 points.*at most 5,000/);
    expect(await Panel.count()).toBe(0);
  });
});

describe("one upload must not stall the server: outline checks and caps", () => {
  /** A 2,000-point outline of zigzag teeth crossing back over themselves about a million times. */
  function crossedOutline(): [number, number][] {
    const pts: [number, number][] = [];
    for (let i = 0; i < 1000; i++) pts.push([i * 5, i % 2 ? 500 : 0]);
    for (let i = 999; i >= 0; i--) pts.push([i * 5 + 2.5, i % 2 ? 0 : 500]);
    return pts;
  }

  it("a 2,000-point self-crossing outline gets a short 400 listing at most 20 crossings", async () => {
    const res = await cutter.post(`${base()}/panels`, { garmentId: garmentIds[0], name: "Zigzag", outline: crossedOutline() });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.outline).toMatch(/first 20 crossings are listed/);
    expect(res.body.error.fields.outline.match(/cross at/g)).toHaveLength(20);
    // The whole answer stays small (it was 274 MB when every crossing was listed).
    expect(JSON.stringify(res.body).length).toBeLessThan(10_000);
    expect(await Panel.count()).toBe(0);
  });

  it("an outline over 5,000 points answers 400 naming the outline field", async () => {
    const n = 5001;
    const outline = Array.from({ length: n }, (_, i) => [
      Math.round(3000 * Math.cos((2 * Math.PI * i) / n) * 1000) / 1000,
      Math.round(3000 * Math.sin((2 * Math.PI * i) / n) * 1000) / 1000,
    ]);

    const res = await cutter.post(`${base()}/panels`, { garmentId: garmentIds[0], name: "Circle skirt", outline });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.outline).toMatch(/more than 5,000 points/);
  });
});

describe("seams", () => {
  // Hand-worked lengths: 3-4-5 right triangles scaled (Pythagoras), so every length is exact.
  it("reports both lengths, the difference and flags a mismatch beyond 3 mm", async () => {
    const a = await buildPanel(productionId, garmentIds[0], {
      name: "Back",
      outline: [
        [0, 0],
        [200, 0],
        [200, 300],
        [0, 300],
      ],
    });
    // Edge 0 runs (0,0)→(180,240): 3-4-5 × 60 = 300 mm.
    const b = await buildPanel(productionId, garmentIds[0], {
      name: "Side",
      outline: [
        [0, 0],
        [180, 240],
        [-50, 240],
        [-50, 0],
      ],
    });
    // Edge 0 runs (0,0)→(144,270): 8-15-17 × 18 = 306 mm.
    const c = await buildPanel(productionId, garmentIds[1], {
      name: "Long side",
      outline: [
        [0, 0],
        [144, 270],
        [-50, 270],
        [-50, 0],
      ],
    });

    const ok = await cutter.post(`${base()}/seams`, {
      name: "Side seam",
      a: { panelId: a.id, from: 1, to: 2 },
      b: { panelId: b.id, from: 0, to: 1 },
    });
    const bad = await cutter.post(`${base()}/seams`, {
      name: "Other side",
      a: { panelId: a.id, from: 1, to: 2 },
      b: { panelId: c.id, from: 0, to: 1 },
    });

    expect(ok.status).toBe(201);
    expect(ok.body.data).toMatchObject({ status: "ok", effectiveToleranceMm: 3 });
    expect(ok.body.data.lengthA).toBeCloseTo(300, 9);
    expect(ok.body.data.lengthB).toBeCloseTo(300, 9);
    expect(bad.body.data.status).toBe("mismatch");
    expect(bad.body.data.differenceMm).toBeCloseTo(-6, 9);
    const list = await cutter.get(`${base()}/seams?changeId=${changeId}`);
    expect(list.body.data.map((s: { status: string }) => s.status).sort()).toEqual(["mismatch", "ok"]);
  });

  it("an eased sleeve cap within its range is not a mismatch", async () => {
    // Cap run: (0,0)→(90,120)→(180,0), two 3-4-5 × 30 edges = 300 mm; armhole edge 280 mm.
    const sleeve = await buildPanel(productionId, garmentIds[0], {
      name: "Sleeve",
      outline: [
        [0, 0],
        [90, 120],
        [180, 0],
        [180, -400],
        [0, -400],
      ],
    });
    const body = await buildPanel(productionId, garmentIds[0], {
      name: "Body",
      outline: [
        [0, 0],
        [280, 0],
        [280, 500],
        [0, 500],
      ],
    });

    const res = await cutter.post(`${base()}/seams`, {
      name: "Sleeve head",
      a: { panelId: sleeve.id, from: 0, to: 2 },
      b: { panelId: body.id, from: 0, to: 1 },
      eased: { minMm: 10, maxMm: 30 },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.status).toBe("eased_within_range");
    expect(res.body.data.differenceMm).toBeCloseTo(20, 9);
  });

  it("400 names the run end that is off the panel, nothing written", async () => {
    const a = await buildPanel(productionId, garmentIds[0]);
    const b = await buildPanel(productionId, garmentIds[0]);

    const res = await cutter.post(`${base()}/seams`, {
      name: "S",
      a: { panelId: a.id, from: 1, to: 9 },
      b: { panelId: b.id, from: 0, to: 1 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["a.to"]).toBe("To: the panel has 4 points (0–3)");
    expect(await Seam.count()).toBe(0);
  });

  it("400 for an ease range whose minimum exceeds its maximum", async () => {
    const a = await buildPanel(productionId, garmentIds[0]);

    const res = await cutter.post(`${base()}/seams`, {
      name: "S",
      a: { panelId: a.id, from: 0, to: 1 },
      b: { panelId: a.id, from: 2, to: 3 },
      eased: { minMm: 20, maxMm: 5 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["eased.maxMm"]).toBe("Ease to: minimum must not exceed maximum");
    expect(await Seam.count()).toBe(0);
  });
});

describe("yardage and fabric physics", () => {
  it("lays a marker for the change: efficiency = piece area / marker area, never below the lower bound", async () => {
    // No seam allowance, so the marker lays the sew lines and their areas are worked by hand:
    // Front (shoelace): ½·(300·600 + 280·620) = 176 800 mm²; Sleeve (trapezoid): ½·(250 + 350)·500 = 150 000 mm².
    await buildPanel(productionId, garmentIds[0], {
      name: "Front",
      outline: [
        [0, 0],
        [300, 0],
        [280, 600],
        [0, 620],
      ],
      cutCount: 2,
      seamAllowanceMm: 0,
    });
    await buildPanel(productionId, garmentIds[1], {
      name: "Sleeve",
      outline: [
        [0, 0],
        [250, 0],
        [300, 500],
        [-50, 500],
      ],
      cutCount: 2,
      seamAllowanceMm: 0,
    });
    // 2 cut × 2 multiples = 4 copies of each: 4 × 176 800 + 4 × 150 000 = 1 307 200 mm².
    const pieces = 1_307_200;

    const res = await cutter.post(`${base()}/doubles/markers`, { scope: "change", scopeId: changeId, multiples: 2 });

    expect(res.status).toBe(201);
    const [f] = res.body.data.fabrics;
    expect(f.usableWidthMm).toBe(1450); // 1500 mm cloth less 25 mm selvage each side (common practice, no source)
    expect(f.copies).toBe(8);
    // Marker efficiency = Σ piece area / (marker length × usable width); no layout is shorter than Σ area / width
    // (area argument; common practice in marker making, no source). Area and width are the hand-worked ones above.
    expect(f.pieceAreaMm2).toBeCloseTo(pieces, 6);
    expect(f.lowerBoundMm).toBeCloseTo(pieces / 1450, 9);
    expect(f.efficiency).toBeCloseTo(pieces / (f.markerLengthMm * 1450), 12);
    expect(f.markerLengthMm).toBeGreaterThanOrEqual(pieces / 1450 - 1e-9);
    const cached = await cutter.get(`${base()}/doubles/markers?scope=change&scopeId=${changeId}&multiples=2`);
    expect(cached.body.data.current).toBe(true);
  });

  it("marks values measured from tests and assumed from class defaults", async () => {
    const { id } = await buildFabric(productionId, { name: "Tested wool", gsm: 180 }, [
      // ASTM D3776: 2.00 g on 100 × 100 mm → 200 g/m² (ASTM D3776/D3776M-20 formula).
      { kind: "mass", readings: { massG: 2, lengthMm: 100, widthMm: 100 } },
      // ASTM D1388: overhang 40 mm → c = 20 mm; G = 9.80665e-6 × 200 × 20³ µN·m = 15.69064 µN·m (ASTM D1388-18).
      { kind: "cantilever", direction: "warp", readings: { overhangMm: 40 } },
      // Strip: 10 N over 50 mm at 4 mm on 200 mm → 10 000 N/m (strip test, Hooke's law per unit width).
      { kind: "strip", direction: "warp", readings: { loadN: 10, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 } },
    ]);
    const g = await buildChangeWithGarments(productionId, { fabricId: id });

    const res = await cutter.get(`${base()}/doubles/physics?garmentId=${g.garmentIds[0]}`);

    expect(res.status).toBe(200);
    const v = res.body.data[0].values;
    expect(v.massPerArea).toMatchObject({ basis: "measured", unit: "kg/m²" });
    expect(v.massPerArea.value).toBeCloseTo(0.2, 12);
    expect(v.bendingStiffness.warp.basis).toBe("measured");
    expect(v.bendingStiffness.warp.value * 1e6).toBeCloseTo(15.69064, 5);
    expect(v.stretchStiffness.warp.value).toBeCloseTo(10_000, 6);
    expect(v.bendingStiffness.weft.basis).toBe("assumed");
    expect(v.stretchStiffness.weft.basis).toBe("assumed");
  });
});
