import { createHash, randomUUID } from "node:crypto";
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { beforeEach, describe, expect, it } from "vitest";
import unzipper from "unzipper";
import { Readable } from "node:stream";
import { createApp } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { Packet, PacketRecipient, Panel } from "../../server/models/index.js";
import { SUMMARY_FIGURES } from "../../server/services/packet-summary.js";
import { progressRecorder } from "../../server/services/work-progress.service.js";
import { printedHalfUnit } from "@shared/domain/number-format.js";
import { readDxfPieces } from "@shared/domain/panels/dxf.js";
import { packetStore } from "../../server/services/packet-storage.js";
import { buildPacketFiles, zipPacketFiles } from "../../server/services/packet-zip.js";
import { packetManifestSchema, stitchesFileSchema } from "@shared/schemas/packet-manifest.js";
import { pointSegmentDistance } from "@shared/domain/panels/geometry.js";
import { resetDb, signedInAgent, waitForMail, type TestAgent } from "../setup/http.js";
import { buildMember, buildUser } from "../factories.js";
import {
  buildChangeWithGarments,
  buildFabric,
  buildMeasurementSet,
  buildPanel,
  buildPhotoRow,
  buildSeam,
  buildShot,
} from "../setup/doubles-fixtures.js";
import type { Production, User } from "../../server/models/index.js";

const app = createApp();

let production: Production;
let supervisor: TestAgent;
let cutter: TestAgent;
let vfx: TestAgent;
let otherVfx: TestAgent;
let vfxUser: User;
let otherVfxUser: User;
let ids: {
  changeId: string;
  garmentIds: string[];
  characterId: string;
  performerId: string;
  panelIds: string[];
  shots: string[];
  hiddenShot: string;
  photoId: string;
};

const base = () => `/api/productions/${production.id}`;

/** Downloads a packet and returns its entries by path. */
async function download(
  agent: TestAgent,
  packetId: string,
): Promise<{ res: { status: number; headers: Record<string, string> }; files: Map<string, Buffer> }> {
  const res = await agent.agent
    .get(`${base()}/packets/${packetId}/download`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });
  const files = new Map<string, Buffer>();
  if (res.status === 200) {
    const dir = await unzipper.Open.buffer(res.body as Buffer);
    for (const f of dir.files) files.set(f.path, await f.buffer());
  }
  return { res: { status: res.status, headers: res.headers as Record<string, string> }, files };
}

const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");

beforeEach(async () => {
  await resetDb();
  const s = await buildMember("supervisor");
  production = s.production;
  const c = await buildMember("cutter", { production });
  vfxUser = await buildUser({ name: "Vee Effects", email: `vfx-${randomUUID().slice(0, 6)}@test.invalid` });
  otherVfxUser = await buildUser({ name: "Other Studio" });
  await buildMember("vfx", { production, user: vfxUser });
  await buildMember("vfx", { production, user: otherVfxUser });
  supervisor = await signedInAgent(app, s.user.email);
  cutter = await signedInAgent(app, c.user.email);
  vfx = await signedInAgent(app, vfxUser.email);
  otherVfx = await signedInAgent(app, otherVfxUser.email);

  const { id: fabricId } = await buildFabric(production.id, { name: "Keeper wool" }, [
    { kind: "mass", readings: { massG: 2, lengthMm: 100, widthMm: 100 } },
    { kind: "cantilever", direction: "warp", readings: { overhangMm: 40 } },
    // 28 N on a 50 mm strip at 4 mm over a 200 mm gauge: 560 N/m ÷ 0.02 = 28,000 N/m (and 22,000 weft).
    { kind: "strip", direction: "warp", readings: { loadN: 28, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 } },
    { kind: "strip", direction: "weft", readings: { loadN: 22, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 } },
  ]);
  const g = await buildChangeWithGarments(production.id, { garments: 2, fabricId, name: "Elias Test" });
  const front = await buildPanel(production.id, g.garmentIds[0], {
    name: "Front",
    outline: [
      [0, 0],
      [300, 0],
      [300, 600],
      [0, 600],
    ],
    cutCount: 2,
  });
  const back = await buildPanel(production.id, g.garmentIds[0], {
    name: "Back",
    outline: [
      [0, 0],
      [320, 0],
      [320, 600],
      [0, 600],
    ],
  });
  const sleeve = await buildPanel(production.id, g.garmentIds[1], {
    name: "Sleeve",
    outline: [
      [0, 0],
      [250, 0],
      [250, 550],
      [0, 550],
    ],
    cutCount: 2,
  });
  await buildSeam(production.id, { panelId: front.id, from: 1, to: 2 }, { panelId: back.id, from: 3, to: 0 }, "Side seam");
  const s1 = await buildShot(production.id, g.characterId, g.changeId, { number: "41", storyOrder: 41, distressStage: 1 });
  const s2 = await buildShot(production.id, g.characterId, g.changeId, { number: "52", storyOrder: 52, distressStage: 2 });
  const hidden = await buildShot(production.id, g.characterId, g.changeId, { number: "60", storyOrder: 60, vfxShot: false });
  await buildMeasurementSet(production.id, g.performerId, { chest_girth: 1010, waist_girth: 880, height: 1820 });
  const photoBytes = Buffer.from("not really a webp, but bytes to checksum");
  const key = `photos/${randomUUID()}/display.webp`;
  await packetStore().write(key, Readable.from([photoBytes]));
  const photoId = await buildPhotoRow(production.id, "garment", g.garmentIds[0], key, photoBytes.length, sha(photoBytes));
  ids = {
    ...g,
    panelIds: [front.id, back.id, sleeve.id],
    shots: [s1.appearanceId, s2.appearanceId],
    hiddenShot: hidden.appearanceId,
    photoId,
  };
});

async function publishedV1(): Promise<string> {
  const draft = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, photoIds: [ids.photoId], recipientUserIds: [vfxUser.id] });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const pub = await supervisor.post(`${base()}/packets/${draft.body.data.id}/publish`);
  expect(pub.status, JSON.stringify(pub.body)).toBe(200);
  return draft.body.data.id as string;
}

describe("preparing and publishing", () => {
  it("a cutter prepares a draft (effects shots only, measurements off by default) but cannot publish", async () => {
    const draft = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [vfxUser.id] });

    expect(draft.status).toBe(201);
    expect(draft.body.data.status).toBe("draft");
    expect(draft.body.data.includeMeasurements).toBe(false);
    expect(draft.body.data.contents.measurements).toBeNull();
    expect(draft.body.data.contents.shots.map((s: { sceneNumber: string }) => s.sceneNumber)).toEqual(["41", "52"]);
    const res = await cutter.post(`${base()}/packets/${draft.body.data.id}/publish`);
    expect(res.status).toBe(403);
  });

  it("400 names the field when a chosen photo or shot is not of this change, and writes nothing", async () => {
    const res = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, appearanceIds: [ids.hiddenShot] });
    const res2 = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [randomUUID()] });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.appearanceIds).toBe("Effects shots contains an id that is not an effects shot of this change");
    expect(res2.status).toBe(400);
    expect(res2.body.error.fields.recipientUserIds).toBe("Recipients contains an id that is not a vfx member of this production");
    expect(await Packet.count()).toBe(0);
  });

  it("422 when publishing to nobody, and the draft stays a draft", async () => {
    const draft = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [] });

    const res = await supervisor.post(`${base()}/packets/${draft.body.data.id}/publish`);

    expect(res.status).toBe(422);
    expect(res.body.error.fields.recipientUserIds).toBe("Choose at least one recipient");
    expect((await Packet.findByPk(draft.body.data.id))!.status).toBe("draft");
  });

  it("publishing makes version 1, stores the ZIP checksum and e-mails the chosen vfx member", async () => {
    const id = await publishedV1();

    const packet = (await Packet.findByPk(id))!;
    expect(packet.version).toBe(1);
    expect(packet.status).toBe("published");
    const mail = await waitForMail((m) => m.recipients.includes(vfxUser.email) && m.subject.includes("version 1"));
    expect(mail.textBody).toContain("Elias Test");
    const stored = await packetStore().readBuffer(packet.zipStorageKey!);
    expect(sha(stored)).toBe(packet.zipSha256);
    expect(stored.length).toBe(packet.zipBytes);
    expect((await PacketRecipient.findAll({ where: { packetId: id } })).map((r) => r.userId)).toEqual([vfxUser.id]);
  });
});

describe("the ZIP", () => {
  it("every file's checksum in SHA256SUMS verifies, the manifest follows its schema, and measurements are absent unless chosen", async () => {
    const id = await publishedV1();

    const { res, files } = await download(vfx, id);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/zip");
    const sums = files.get("SHA256SUMS")!.toString("utf8").trim().split("\n");
    const listed = new Map(sums.map((l) => [l.slice(66), l.slice(0, 64)]));
    // Every file but SHA256SUMS itself is listed, and every listed hash matches (sha256sum -c).
    expect([...listed.keys()].sort()).toEqual([...files.keys()].filter((p) => p !== "SHA256SUMS").sort());
    for (const [p, h] of listed) expect(sha(files.get(p)!), p).toBe(h);
    for (const name of [
      "manifest.json",
      "manifest.schema.json",
      "panels.json",
      "panels.svg",
      "panels.dxf",
      "dxf/01-garment-1-front.dxf",
      "panels.obj",
      "seams.json",
      "fabrics.json",
      "shots.json",
      "summary.pdf",
    ]) {
      expect(files.has(name), name).toBe(true);
    }
    expect(files.has("measurements.json")).toBe(false);
    const manifest = packetManifestSchema.parse(JSON.parse(files.get("manifest.json")!.toString("utf8")));
    expect(manifest).toMatchObject({
      version: 1,
      character: { name: "Elias Test" },
      contents: { panelCount: 3, measurementsIncluded: false, shotCount: 2, photoCount: 1 },
    });
    const schema = JSON.parse(files.get("manifest.schema.json")!.toString("utf8"));
    expect(schema.required).toEqual(expect.arrayContaining(["units", "production", "character", "change", "version", "dates", "contents"]));
    // The photo went in byte for byte.
    const photo = [...files.keys()].find((p) => p.startsWith("photos/"))!;
    expect(files.get(photo)!.toString("utf8")).toBe("not really a webp, but bytes to checksum");
    // One OBJ group per piece; the seam map names OBJ vertex runs of equal length (the seam matches).
    const obj = files.get("panels.obj")!.toString("utf8");
    expect(obj.split("\n").filter((l) => l.startsWith("g ")).length).toBe(3);
    expect(files.get("summary.pdf")!.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const fabrics = JSON.parse(files.get("fabrics.json")!.toString("utf8"));
    expect(fabrics.fabrics[0].simulation.massPerArea).toMatchObject({ basis: "measured", value: 0.2 });
  });

  it("includes measurements (in metres) only when chosen", async () => {
    const draft = await cutter.post(`${base()}/packets`, {
      changeId: ids.changeId,
      recipientUserIds: [vfxUser.id],
      includeMeasurements: true,
    });
    await supervisor.post(`${base()}/packets/${draft.body.data.id}/publish`);

    const { files } = await download(vfx, draft.body.data.id);

    const m = JSON.parse(files.get("measurements.json")!.toString("utf8"));
    expect(m.units).toBe("m");
    expect(m.valuesM.chest_girth).toBeCloseTo(1.01, 12);
  });
});

describe("simulation meshes, stitches and the cantilever re-test", () => {
  /** Vertex positions (mm, from the vt lines) and triangles of an OBJ written by the packet. */
  const parseObj = (text: string) => {
    const lines = text.split("\n");
    const uv = lines.filter((l) => l.startsWith("vt ")).map((l) => l.split(" ").slice(1, 3).map(Number) as [number, number]);
    const faces = lines
      .filter((l) => l.startsWith("f "))
      .map((l) =>
        l
          .split(" ")
          .slice(1)
          .map((x) => Number(x.split("/")[0]) - 1),
      );
    return { uv, faces };
  };

  it("holds one mesh per panel and stitches the side seam with equal counts on the seam runs", async () => {
    const id = await publishedV1();

    const { files } = await download(vfx, id);

    const manifest = packetManifestSchema.parse(JSON.parse(files.get("manifest.json")!.toString("utf8")));
    expect(manifest.simulation).toMatchObject({ targetEdgeMm: 10, minAngleTargetDeg: 20, units: { positions: "m", uv: "mm" } });
    expect(manifest.simulation!.meshes.map((m) => m.cutCount)).toEqual([2, 1, 2]);
    for (const m of manifest.simulation!.meshes) {
      const { uv, faces } = parseObj(files.get(m.path)!.toString("utf8"));
      expect(uv).toHaveLength(m.vertexCount);
      expect(faces).toHaveLength(m.triangleCount);
      // The triangles tile the panel: 0.3 × 0.6 m, 0.32 × 0.6 m and 0.25 × 0.55 m within 0.01 %.
      const area = faces.reduce(
        (s, [a, b, c]) => s + ((uv[b][0] - uv[a][0]) * (uv[c][1] - uv[a][1]) - (uv[b][1] - uv[a][1]) * (uv[c][0] - uv[a][0])) / 2,
        0,
      );
      expect(area / 1e6 / m.areaM2).toBeCloseTo(1, 4);
      expect(m.minAngleDeg).toBeGreaterThanOrEqual(20);
    }
    const stitches = stitchesFileSchema.parse(JSON.parse(files.get("stitches.json")!.toString("utf8")));
    expect(stitches.seams).toHaveLength(1);
    const seam = stitches.seams[0];
    expect(seam.name).toBe("Side seam");
    // 600 mm at a 10 mm target: 61 pairs from end to end.
    expect(seam.pairs).toHaveLength(61);
    const a = parseObj(files.get(seam.a.mesh)!.toString("utf8")).uv;
    const b = parseObj(files.get(seam.b.mesh)!.toString("utf8")).uv;
    for (const [ia, ib] of seam.pairs) {
      // Front run: vertex 1 → 2 (x = 300); back run: vertex 3 → 0 (x = 0); paired at equal heights.
      expect(pointSegmentDistance(a[ia], [300, 0], [300, 600]).distance).toBeLessThan(1e-6);
      expect(pointSegmentDistance(b[ib], [0, 600], [0, 0]).distance).toBeLessThan(1e-6);
      expect(a[ia][1]).toBeCloseTo(600 - b[ib][1], 6);
    }
    const schema = JSON.parse(files.get("manifest.schema.json")!.toString("utf8"));
    expect(Object.keys(schema.$defs.stitchesFile.properties)).toEqual(expect.arrayContaining(["indexBase", "seams", "skipped"]));
    expect(Object.keys(schema.properties)).toContain("simulation");
  });

  it("uses the mesh edge length chosen when publishing, and 400 names the field when it is out of range", async () => {
    const bad = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [vfxUser.id], meshEdgeMm: 2 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.meshEdgeMm).toBeDefined();
    const draft = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [vfxUser.id], meshEdgeMm: 25 });
    await supervisor.post(`${base()}/packets/${draft.body.data.id}/publish`);

    const { files } = await download(vfx, draft.body.data.id);

    const stitches = stitchesFileSchema.parse(JSON.parse(files.get("stitches.json")!.toString("utf8")));
    expect(stitches.targetEdgeMm).toBe(25);
    expect(stitches.seams[0].pairs).toHaveLength(25);
  });

  it("carries the re-test overhang next to the measured one in fabrics.json (ASTM D1388: c = O/2 → O = 40 mm)", async () => {
    const id = await publishedV1();

    const { files } = await download(vfx, id);

    const fabrics = JSON.parse(files.get("fabrics.json")!.toString("utf8"));
    const retest = fabrics.fabrics[0].cantileverRetest;
    expect(retest.directions).toHaveLength(1);
    expect(retest.directions[0]).toMatchObject({ direction: "warp", angleDeg: 41.5, measuredOverhangMm: 40 });
    expect(Math.abs(retest.directions[0].simulatedOverhangMm - 40) / 40).toBeLessThan(0.01);
  });

  it("the Fabric physics tab's data carries the re-test", async () => {
    const res = await cutter.get(`${base()}/doubles/physics?changeId=${ids.changeId}`);

    expect(res.status).toBe(200);
    expect(res.body.data[0].retest.directions[0]).toMatchObject({ direction: "warp", measuredOverhangMm: 40 });
  });
});

describe("summary.pdf and the DXF files", () => {
  /** The PDF's text as poppler's pdftotext extracts it (Debian package poppler-utils). */
  function pdfText(pdf: Buffer): string {
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-pdf-")), "summary.pdf");
    fs.writeFileSync(file, pdf);
    try {
      return execFileSync("pdftotext", ["-layout", "-enc", "UTF-8", file, "-"], { encoding: "utf8" });
    } finally {
      fs.rmSync(path.dirname(file), { recursive: true, force: true });
    }
  }
  /** "28,000" → 28000. */
  const parse = (s: string) => Number(s.replace(/,/g, ""));
  /** A printed figure agrees with the JSON value to the precision it is printed with. */
  function expectPrinted(printed: string, jsonValue: number, kind: keyof typeof SUMMARY_FIGURES) {
    const f = SUMMARY_FIGURES[kind];
    const want = jsonValue * f.factor;
    expect(Math.abs(parse(printed) - want), `${kind}: printed ${printed}, JSON gives ${want}`).toBeLessThanOrEqual(
      printedHalfUnit(want, f.precision) * (1 + 1e-9),
    );
  }

  it("prints every fabric and panel figure as fabrics.json and panels.json hold it (defect: 28,000 N/m printed as 28)", async () => {
    const id = await publishedV1();
    const { files } = await download(vfx, id);
    const text = pdfText(files.get("summary.pdf")!);
    const panels = JSON.parse(files.get("panels.json")!.toString("utf8")).panels as Array<{
      id: string;
      name: string;
      garmentId: string;
      areaMm2: number;
      seamAllowanceMm: number;
      cutCount: number;
    }>;
    const fabrics = JSON.parse(files.get("fabrics.json")!.toString("utf8")).fabrics as Array<{
      name: string;
      simulation: Record<string, { value: number } & Record<string, { value: number }>>;
    }>;
    const lines = text.split("\n").map((l) => l.trim());

    expect(text).toContain("stretch stiffness warp 28,000 N/m (M), weft 22,000 N/m (M)");
    expect(panels).toHaveLength(3);
    for (const p of panels) {
      // panels.json names pieces "<garment> - <piece>"; the summary lists them under their garment.
      const piece = p.name.split(" - ").slice(1).join(" - ");
      const line = lines.find((l) => l.startsWith(`• ${piece}: cut ${p.cutCount}`));
      expect(line, piece).toBeDefined();
      const m = /area ([\d,.]+) cm²; seam allowance ([\d,.]+) mm/.exec(line!)!;
      expectPrinted(m[1], p.areaMm2, "panelArea");
      expectPrinted(m[2], p.seamAllowanceMm, "seamAllowance");
    }
    expect(fabrics).toHaveLength(1);
    for (const f of fabrics) {
      const s = f.simulation;
      const at = lines.indexOf(f.name);
      const block = lines.slice(at, at + 5).join("\n");
      const grab = (re: RegExp) => re.exec(block)!;
      expectPrinted(grab(/mass per area ([\d,.]+) g\/m²/)[1], s.massPerArea.value, "massPerArea");
      expectPrinted(grab(/thickness ([\d,.]+) mm/)[1], s.thickness.value, "thickness");
      const bending = grab(/bending stiffness warp ([\d,.]+) µN·m \(\w\), weft ([\d,.]+) µN·m/);
      expectPrinted(bending[1], s.bendingStiffness.warp.value, "bendingStiffness");
      expectPrinted(bending[2], s.bendingStiffness.weft.value, "bendingStiffness");
      const stretch = grab(/stretch stiffness warp ([\d,.]+) N\/m \(\w\), weft ([\d,.]+) N\/m/);
      expectPrinted(stretch[1], s.stretchStiffness.warp.value, "stretchStiffness");
      expectPrinted(stretch[2], s.stretchStiffness.weft.value, "stretchStiffness");
    }
  });

  it("holds one DXF per piece with cut and sew lines; Seamscene's reader and ezdxf read back the same pieces", async () => {
    const id = await publishedV1();
    const { files } = await download(vfx, id);
    const panels = JSON.parse(files.get("panels.json")!.toString("utf8")).panels as Array<{
      name: string;
      outline: [number, number][];
      seamAllowanceMm: number;
      cutCount: number;
      areaMm2: number;
    }>;
    const dxfs = [...files.keys()].filter((p) => p.startsWith("dxf/")).sort();

    expect(dxfs).toHaveLength(panels.length);
    dxfs.forEach((p, i) => {
      const back = readDxfPieces(files.get(p)!.toString("utf8"));
      expect(back.pieces).toHaveLength(1);
      expect(back.pieces[0]).toMatchObject({
        name: panels[i].name,
        cutCount: panels[i].cutCount,
        seamAllowanceMm: panels[i].seamAllowanceMm,
        seamAllowanceFrom: "file",
      });
      expect(back.pieces[0].outline).toEqual(panels[i].outline);
      expect(back.pieces[0].cutLine).not.toBeNull();
    });

    // ezdxf (Debian's python3-ezdxf, installed by .ci/run) audits each file and measures its layers.
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-dxf-"));
    const paths = dxfs.map((p, i) => {
      const f = path.join(dir, `${i}.dxf`);
      fs.writeFileSync(f, files.get(p)!);
      return f;
    });
    const script = [
      "import json, sys, ezdxf",
      "from ezdxf.math import area",
      "out = []",
      "for path in sys.argv[1:]:",
      "    doc = ezdxf.readfile(path)",
      "    errors = len(doc.audit().errors)",
      "    blocks = [b for b in doc.blocks if b.name.startswith('PIECE_')]",
      "    b = blocks[0]",
      "    polys = {e.dxf.layer: e for e in b if e.dxftype() == 'POLYLINE'}",
      "    texts = [e.dxf.text for e in b if e.dxftype() == 'TEXT']",
      "    out.append({'units': doc.header.get('$INSUNITS'), 'errors': errors, 'blocks': len(blocks), 'inserts': len(doc.modelspace().query('INSERT')),",
      "                'sew': area([v.dxf.location for v in polys['14'].vertices]), 'cut': area([v.dxf.location for v in polys['1'].vertices]), 'texts': texts})",
      "print(json.dumps(out))",
    ].join("\n");
    let seen: Array<{ units: number; errors: number; blocks: number; inserts: number; sew: number; cut: number; texts: string[] }>;
    try {
      seen = JSON.parse(execFileSync("/usr/bin/python3", ["-c", script, ...paths], { encoding: "utf8" }));
    } catch (err) {
      throw new Error(`reading the DXF files back with ezdxf failed (apt-get install python3-ezdxf): ${(err as Error).message}`);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
    seen.forEach((e, i) => {
      expect(e).toMatchObject({ units: 4, errors: 0, blocks: 1, inserts: 1 });
      expect(Math.abs(e.sew - panels[i].areaMm2)).toBeLessThan(1e-6 * panels[i].areaMm2);
      expect(e.cut).toBeGreaterThan(e.sew);
      expect(e.texts).toEqual(expect.arrayContaining([`Piece Name: ${panels[i].name}`, `Quantity: ${panels[i].cutCount}`]));
    });
  });

  it("400 names panelIds when the chosen garments hold more than 200 panels; nothing written", async () => {
    await Panel.bulkCreate(
      Array.from({ length: 199 }, (_, i) => ({
        productionId: production.id,
        garmentId: ids.garmentIds[1],
        name: `Scrap ${i}`,
        outline: [
          [0, 0],
          [50, 0],
          [50, 50],
        ] as [number, number][],
        grainline: null,
        notches: [],
        seamAllowanceMm: 10,
        cutCount: 1,
        mirrored: false,
        grainMode: "straight" as const,
        fabricId: null,
        source: "drawn" as const,
        sortOrder: i + 10,
      })),
    );

    const res = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [vfxUser.id] });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.panelIds).toMatch(/at most 200 panels; this choice has 202/);
    expect(await Packet.count()).toBe(0);
  });

  it("reports publishing progress only while it runs", async () => {
    const id = await publishedV1();
    const after = await supervisor.get(`${base()}/packets/${id}/publish-progress`);
    const recorder = progressRecorder(production.id, id, "packet_publish");

    recorder.report({ stage: "zip", done: 3, total: 12 });
    await recorder.flushed();
    const during = await supervisor.get(`${base()}/packets/${id}/publish-progress`);
    await recorder.finish();
    const done = await supervisor.get(`${base()}/packets/${id}/publish-progress`);

    expect(after.body.data).toBeNull();
    expect(during.body.data).toMatchObject({ stage: "zip", done: 3, total: 12 });
    expect(done.body.data).toBeNull();
  });
});

describe("immutability and versions", () => {
  it("a published version cannot change, through the API or in the database", async () => {
    const id = await publishedV1();

    const patch = await supervisor.patch(`${base()}/packets/${id}`, { includeMeasurements: true });
    const del = await supervisor.delete(`${base()}/packets/${id}`);
    const again = await supervisor.post(`${base()}/packets/${id}/publish`);

    expect(patch.status).toBe(409);
    expect(del.status).toBe(409);
    expect(again.status).toBe(409);
    await expect(
      sequelize.query(`UPDATE packets SET include_measurements = true WHERE id = :id`, { replacements: { id } }),
    ).rejects.toThrow(/cannot change/);
    expect((await Packet.findByPk(id))!.includeMeasurements).toBe(false);
  });

  it("rebuilding a version's ZIP from its stored snapshot reproduces the stored checksum", async () => {
    const id = await publishedV1();
    const packet = (await Packet.findByPk(id))!;
    const s = await supervisor.get(`${base()}/packets/${id}`);

    const files = await buildPacketFiles(
      packet.contents!,
      { packetId: id, version: 1, publishedAt: packet.publishedAt!, publishedByName: s.body.data.publishedByName },
      (k) => packetStore().readBuffer(k),
    );
    const chunks: Buffer[] = [];
    for await (const c of zipPacketFiles(files, { date: packet.publishedAt! })) chunks.push(c as Buffer);

    expect(sha(Buffer.concat(chunks))).toBe(packet.zipSha256);
  });

  it("a new draft after a change becomes version 2 and shows what changed since version 1", async () => {
    const v1 = await publishedV1();
    await cutter.patch(`${base()}/panels/${ids.panelIds[2]}`, { cutCount: 4 });
    const draft = await cutter.post(`${base()}/packets`, {
      changeId: ids.changeId,
      includeMeasurements: true,
      appearanceIds: [ids.shots[0]],
    });
    expect(draft.body.data.selection.photoIds).toEqual([ids.photoId]); // copied from version 1

    const pub = await supervisor.post(`${base()}/packets/${draft.body.data.id}/publish`);

    expect(pub.body.data.version).toBe(2);
    expect(pub.body.data.previousVersion).toBe(1);
    expect(pub.body.data.diff.panels.changed).toEqual([expect.objectContaining({ id: ids.panelIds[2], fields: ["cutCount"] })]);
    expect(pub.body.data.diff.shots.removed.map((s: { name: string }) => s.name)).toEqual(["Scene 52"]);
    expect(pub.body.data.diff.measurements).toBe("added");
    // Version 1 still holds what it held.
    const old = await supervisor.get(`${base()}/packets/${v1}`);
    expect(old.body.data.contents.panels.find((p: { id: string }) => p.id === ids.panelIds[2]).cutCount).toBe(2);
  });
});

describe("what a vfx user sees", () => {
  it("only packets published to them; 404 for the rest and 403 for the production's other records", async () => {
    const id = await publishedV1();
    const draft = await cutter.post(`${base()}/packets`, { changeId: ids.changeId, recipientUserIds: [vfxUser.id] });

    const mine = await vfx.get(`${base()}/packets`);
    const theirs = await otherVfx.get(`${base()}/packets`);

    expect(mine.body.data.map((p: { id: string }) => p.id)).toEqual([id]);
    expect(theirs.body.data).toEqual([]);
    expect((await otherVfx.get(`${base()}/packets/${id}`)).status).toBe(404);
    expect((await download(otherVfx, id)).res.status).toBe(404);
    expect((await otherVfx.post(`${base()}/packets/${id}/received`)).status).toBe(404);
    expect((await vfx.get(`${base()}/packets/${draft.body.data.id}`)).status).toBe(404);
    expect((await vfx.get(`${base()}/panels?changeId=${ids.changeId}`)).status).toBe(403);
    expect((await vfx.get(`${base()}/doubles/physics?changeId=${ids.changeId}`)).status).toBe(403);
    expect((await vfx.get(`${base()}/packets/options?changeId=${ids.changeId}`)).status).toBe(403);
  });

  it("shows a recipient what changed since the version they last marked received, skipping versions they did not", async () => {
    const v1 = await publishedV1();
    await vfx.post(`${base()}/packets/${v1}/received`);
    const publishNext = async () => {
      const d = await cutter.post(`${base()}/packets`, { changeId: ids.changeId });
      const p = await supervisor.post(`${base()}/packets/${d.body.data.id}/publish`);
      expect(p.status, JSON.stringify(p.body)).toBe(200);
      return d.body.data.id as string;
    };
    await cutter.patch(`${base()}/panels/${ids.panelIds[2]}`, { cutCount: 4 });
    await publishNext();
    await cutter.patch(`${base()}/panels/${ids.panelIds[0]}`, { name: "Front left" });
    const v3 = await publishNext();

    const seen = await vfx.get(`${base()}/packets/${v3}`);
    const first = await vfx.get(`${base()}/packets/${v1}`);
    const staff = await supervisor.get(`${base()}/packets/${v3}`);

    // Version 2 was never marked received: the comparison goes back to version 1 and holds both edits.
    expect(seen.body.data.previousVersion).toBe(2);
    expect(seen.body.data.sinceReceived).toMatchObject({ version: 1 });
    expect(seen.body.data.sinceReceived.diff.panels.changed.map((c: { id: string }) => c.id).sort()).toEqual(
      [ids.panelIds[0], ids.panelIds[2]].sort(),
    );
    expect(first.body.data.sinceReceived).toBeNull();
    expect(staff.body.data.sinceReceived).toBeNull();
  });

  it("marks received; the supervisor sees who received which version", async () => {
    const id = await publishedV1();
    await download(vfx, id);

    const res = await vfx.post(`${base()}/packets/${id}/received`);

    expect(res.status).toBe(200);
    expect(res.body.data.recipients).toHaveLength(1);
    const seen = await supervisor.get(`${base()}/packets`);
    const r = seen.body.data[0].recipients[0];
    expect(r).toMatchObject({ userId: vfxUser.id, name: "Vee Effects" });
    expect(r.receivedAt).not.toBeNull();
    expect(r.downloadedAt).not.toBeNull();
  });
});
