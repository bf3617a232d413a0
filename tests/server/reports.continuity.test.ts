import { afterEach, beforeEach, describe, expect, it } from "vitest";
import unzipper from "unzipper";
import { createApp } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { Limits } from "../../shared/constants.js";
import { clock } from "../../server/lib/clock.js";
import { renderSwatch } from "../../server/lib/images.js";
import { storeImage } from "../../server/services/photos.service.js";
import { Photo, Production, ReportRun } from "../../server/models/index.js";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import { snagFixtures } from "../setup/snag-fixtures.js";
import { pdfImageList, pdfInfo, pdfPagesText } from "../setup/pdf-tools.js";
import type { PhotoView } from "../../shared/schemas/photos.js";

const app = createApp();

/** A binary response body as a Buffer. */
const binary = (res: { body: unknown }) => res.body as Buffer;
const getPdf = (agent: TestAgent, url: string) =>
  agent.agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });

/** A continuity photo of an entry: a generated 900 × 1200 image through the real photo pipeline. */
async function photo(productionId: string, entryId: string, view: PhotoView, label: string) {
  const stored = await storeImage(await renderSwatch({ width: 900, height: 1200, background: "#2B3A67", label, sublabel: view }));
  return Photo.create({
    productionId,
    ownerType: "continuity_entry",
    ownerId: entryId,
    view,
    caption: null,
    contentHash: stored.contentHash,
    originalName: `${label}.jpg`,
    width: stored.width,
    height: stored.height,
    bytes: stored.bytes,
    variants: stored.variants,
    uploadedBy: null,
  });
}

/**
 * Wren plays scenes 1, 2, 3 (story order) shot as 3, 1, 2; change 1 (jacket J-1 and an oilskin from a
 * group of two); scene 2 is wet, scene 3 stunt and blood. Logged: scene 1 (two photos, copy O-2 worn)
 * and scene 3 (three photos). Wren's performer has measurements that must never be printed.
 */
async function scenario(production: Production) {
  const f = snagFixtures(production.id);
  const performer = await f.performer({ name: "Ada Tresize" });
  await f.measurements(performer, { chest_girth: 987, waist_girth: 765, hip_girth: 1043 });
  const wren = await f.character({ name: "Wren Tallack", performerId: performer });
  const moss = await f.character({ name: "Moss Keverne" });
  const s1 = await f.scene({ number: "1", storyDay: 1 });
  const s2 = await f.scene({ number: "2", storyDay: 1 });
  const s3 = await f.scene({ number: "3A", storyDay: 2 });
  const d1 = await f.shootDay({ date: "2030-09-02", sceneIds: [s3] });
  const d2 = await f.shootDay({ date: "2030-09-03", sceneIds: [s1, s2] });
  const jacket = await f.garment({ tagCode: "J-1", name: "Keeper jacket", category: "jacket" });
  const group = await f.group({ name: "Storm oilskin" });
  await f.garment({ tagCode: "O-1", name: "Oilskin", category: "coat", groupId: group, copyNumber: 1 });
  const o2 = await f.garment({ tagCode: "O-2", name: "Oilskin", category: "coat", groupId: group, copyNumber: 2 });
  const c1 = await f.change({ characterId: wren, number: 1 });
  await f.update("changes", c1, { description: "Harbour work clothes" });
  const c2 = await f.change({ characterId: wren, number: 2 });
  const mossChange = await f.change({ characterId: moss, number: 1 });
  await f.changeItem({ changeId: c1, garmentId: jacket, label: "jacket" });
  await f.changeItem({ changeId: c1, groupId: group, label: "oilskin" });
  await f.appearance({ sceneId: s1, characterId: wren, changeId: c1 });
  const a2 = await f.appearance({ sceneId: s2, characterId: wren, changeId: c1, wet: true, distressStage: 1 });
  await f.update("appearances", a2, { notes: "Soaked to the knee after the slip." });
  const a3 = await f.appearance({ sceneId: s3, characterId: wren, changeId: c2, stunt: true });
  await f.update("appearances", a3, { blood: true });
  await f.appearance({ sceneId: s1, characterId: moss, changeId: mossChange });
  const e1 = await f.continuityEntry({ sceneId: s1, characterId: wren, shootDayId: d2, distressStage: 0, garmentIds: [jacket, o2] });
  await f.update("continuity_entries", e1, { notes: "Collar open, left cuff rolled twice." });
  const e3 = await f.continuityEntry({ sceneId: s3, characterId: wren, shootDayId: d1, distressStage: 2, garmentIds: [] });
  await photo(production.id, e1, "back", "s1-back");
  await photo(production.id, e1, "front", "s1-front");
  await photo(production.id, e3, "detail", "s3-detail");
  await photo(production.id, e3, "front", "s3-front");
  await photo(production.id, e3, "left", "s3-left");
  return { wren, moss, c1, c2, s1, s2, s3 };
}

describe("continuity book PDF", () => {
  let production: Production;
  let agent: TestAgent;
  let ids: Awaited<ReturnType<typeof scenario>>;
  const base = () => `/api/productions/${production.id}/reports`;

  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-01", { frozen: true });
    production = await buildProduction({ title: "Harbour Lights" });
    const { user } = await buildMember("set_costumer", { production });
    agent = await signedInAgent(app, user.email);
    ids = await scenario(production);
  });
  afterEach(() => clock.reset());

  it("prints every scene in story order with shoot day, change, garments, stage, flags, notes and a contents page", async () => {
    const res = await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf`);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/pdf");
    const pages = await pdfPagesText(binary(res));
    const all = pages.join("\n");
    // Contents (page 1): the three scenes in story order, with the shoot day of each.
    expect(pages[0]).toContain("Continuity book");
    expect(pages[0]).toContain("Wren Tallack");
    expect(pages[0]).toMatch(
      /^\s*1\s+1\s+2 · Tue 3 Sep 2030\s+1 Harbour work clothes\s+\d+\s*\n\s*2\s+1\s+2 · Tue 3 Sep 2030\s+1 Harbour work clothes\s+\d+\s*\n\s*3A\s+2\s+1 · Mon 2 Sep 2030\s+2\s+\d+\s*$/m,
    );
    expect(pages[0]).toContain("printed Sun 1 Sep 2030");
    // Body: story order 1, 2, 3A whatever the shoot order (3A was shot first).
    const body = pages.slice(1).join("\n");
    const at = (s: string) => body.indexOf(s);
    expect(at("Scene 1")).toBeGreaterThan(-1);
    expect(at("Scene 1")).toBeLessThan(at("Scene 2"));
    expect(at("Scene 2")).toBeLessThan(at("Scene 3A"));
    expect(body).toContain("Shoot day 2, Tue 3 Sep 2030");
    expect(body).toContain("Shoot day 1, Mon 2 Sep 2030");
    expect(body).toContain("Change 1 – Harbour work clothes");
    // Logged garments with copy numbers (scene 1: O-2 was worn); planned ones from the copy plan elsewhere.
    expect(body).toMatch(/Garments worn:\s+J-1\s+Keeper jacket\s+O-2\s+Oilskin #2 of 2/);
    expect(body).toMatch(/Garments \(planned; not logged yet\):\s+J-1\s+Keeper jacket\s+O-1\s+Oilskin #1 of 2/);
    expect(body).toMatch(/Distress stage 1 · WET/);
    expect(body).toMatch(/Distress stage 0 \(logged on set: 2\) · STUNT · BLOOD/);
    expect(body).toContain("Breakdown: Soaked to the knee after the slip.");
    expect(body).toContain("Collar open, left cuff rolled twice.");
    // The contents page gives the page each scene starts on.
    const pageOf = (scene: string) => pages.findIndex((p, i) => i > 0 && p.includes(`Scene ${scene}`)) + 1;
    const contentsRow = (scene: string) => new RegExp(`^\\s*${scene}\\s+.*\\s(\\d+)\\s*$`, "m").exec(pages[0]!)?.[1];
    for (const s of ["1", "2", "3A"]) expect(Number(contentsRow(s))).toBe(pageOf(s));
    // Running header and page number on every page; no other character's scenes.
    pages.forEach((p, i) => {
      expect(p).toContain("Harbour Lights · Wren Tallack");
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
    });
    expect(all).not.toContain("Moss Keverne");
    // Personal data: the performer's measurements (987, 765, 1043 mm) never appear, in any unit.
    for (const n of ["987", "98.7", "765", "76.5", "1043", "104.3"]) expect(all).not.toContain(n);
    expect(all.toLowerCase()).not.toContain("girth");
  });

  it("places each scene's photos on that scene's page, thumbnails only, in view order", async () => {
    const res = await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf`);
    const pdf = binary(res);

    const [pages, images] = await Promise.all([pdfPagesText(pdf), pdfImageList(pdf)]);
    const photosOfScene: Record<string, number> = { "1": 2, "2": 0, "3A": 3 };
    pages.forEach((text, i) => {
      const expected = Object.entries(photosOfScene)
        .filter(([s]) => new RegExp(`Scene ${s}\\b`).test(text) && i > 0)
        .reduce((n, [, c]) => n + c, 0);
      expect(images.filter((im) => im.page === i + 1).length, `page ${i + 1}`).toBe(expected);
    });
    expect(images).toHaveLength(5);
    // Never the 900 × 1200 original: thumbnails are at most 320 px on the long edge.
    for (const im of images) expect(Math.max(im.width, im.height)).toBeLessThanOrEqual(320);
    // Views by the fixed order front, back, sides, detail.
    const s1 = pages.find((p) => p.includes("Scene 1 "))!;
    expect(s1.indexOf("Front")).toBeLessThan(s1.indexOf("Back"));
    const s3 = pages.find((p) => /Scene 3A/.test(p) && p.includes("Detail"))!;
    expect(s3.indexOf("Front")).toBeLessThan(s3.indexOf("Left side"));
    expect(s3.indexOf("Left side")).toBeLessThan(s3.indexOf("Detail"));
  });

  it("uses display-size images (the stored print size, at most 660 px) when asked, still never the originals", async () => {
    const res = await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf?photos=display`);

    const images = await pdfImageList(binary(res));
    expect(images).toHaveLength(5);
    for (const im of images) {
      expect(Math.max(im.width, im.height)).toBeLessThanOrEqual(Limits.photoPrintPx);
      expect(Math.max(im.width, im.height)).toBeGreaterThan(320);
    }
  });

  it("prints photos stored before the print size existed from their display size, scaled down to it", async () => {
    await sequelize.query(`UPDATE photos SET variants = variants - 'print' WHERE production_id = :pid`, {
      replacements: { pid: production.id },
    });

    const res = await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf?photos=display`);

    const images = await pdfImageList(binary(res));
    expect(images).toHaveLength(5);
    for (const im of images) {
      expect(Math.max(im.width, im.height)).toBeLessThanOrEqual(Limits.photoPrintPx);
      expect(Math.max(im.width, im.height)).toBeGreaterThan(320);
    }
  });

  it("makes a book of one change, and prints on the production's paper (A4 or US Letter)", async () => {
    await production.update({ settings: { paperSize: "Letter" } });

    const res = await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf?changeId=${ids.c2}`);

    const pdf = binary(res);
    const text = (await pdfPagesText(pdf)).join("\n");
    expect(text).toContain("Change 2");
    expect(text).toContain("Scene 3A");
    expect(text).not.toMatch(/Scene 1\b/);
    // US Letter is 8.5 × 11 in = 612 × 792 pt (ANSI/ASME Y14.1 size A); A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216).
    expect(await pdfInfo(pdf)).toMatchObject({ width: 612, height: 792 });
    await production.update({ settings: { paperSize: "A4" } });
    const a4 = await pdfInfo(binary(await getPdf(agent, `${base()}/continuity/${ids.wren}.pdf`)));
    expect(a4.width).toBeCloseTo(595.28, 1);
    expect(a4.height).toBeCloseTo(841.89, 1);
  });

  it("answers 404 for a character of another production and for a change of another character", async () => {
    const other = await snagFixtures((await buildProduction()).id).character({ name: "Elsewhere" });

    expect((await agent.get(`${base()}/continuity/${other}.pdf`)).status).toBe(404);
    const mossChange = (await agent.get(`${base()}/continuity`)).body.data.characters.find(
      (c: { name: string }) => c.name === "Moss Keverne",
    ).changes[0].id;
    const res = await agent.get(`${base()}/continuity/${ids.wren}.pdf?changeId=${mossChange}`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/change/i);
  });

  it("lists characters with scene, photo and change counts for the screen", async () => {
    const res = await agent.get(`${base()}/continuity`);

    expect(res.status).toBe(200);
    const wren = res.body.data.characters.find((c: { id: string }) => c.id === ids.wren);
    expect(wren).toMatchObject({ name: "Wren Tallack", scenes: 3, photos: 5 });
    expect(wren.changes.map((c: { number: number; scenes: number }) => [c.number, c.scenes])).toEqual([
      [1, 2],
      [2, 1],
    ]);
    expect(res.body.data.paperSize).toBe("A4");
    expect(res.body.data.latestRun).toBeNull();
  });
});

describe("every continuity book in one ZIP", () => {
  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-01", { frozen: true });
  });
  afterEach(() => clock.reset());

  it("writes one PDF per character who plays a scene, counting progress to the end", async () => {
    const production = await buildProduction({ title: "Harbour Lights" });
    const { user } = await buildMember("designer", { production });
    const agent = await signedInAgent(app, user.email);
    const ids = await scenario(production);
    await snagFixtures(production.id).character({ name: "Nobody On Stage" });
    const base = `/api/productions/${production.id}/reports`;

    // Without a running queue the job runs inline, so the run is finished when the request returns.
    const start = await agent.post(`${base}/continuity/books`, {});

    expect(start.status).toBe(202);
    const run = await agent.get(`${base}/runs/${start.body.data.id}`);
    expect(run.body.data).toMatchObject({ status: "done", done: 2, total: 2, error: null });
    const file = await getPdf(agent, run.body.data.fileUrl);
    expect(file.status).toBe(200);
    expect(file.headers["content-type"]).toBe("application/zip");
    const zip = await unzipper.Open.buffer(binary(file));
    // Cast order, then name (both characters have the default order).
    expect(zip.files.map((f) => f.path)).toEqual(["01-continuity-moss-keverne.pdf", "02-continuity-wren-tallack.pdf"]);
    const wrenText = (await pdfPagesText(await zip.files[1]!.buffer())).join("\n");
    expect(wrenText).toContain("Wren Tallack");
    expect(wrenText).toContain("Scene 3A");
    expect(Number(run.body.data.bytes)).toBe(binary(file).length);
    // The screen's index shows the newest run.
    const index = await agent.get(`${base}/continuity`);
    expect(index.body.data.latestRun.id).toBe(start.body.data.id);
    expect(ids.wren).toBeTruthy();
  });

  it("marks a run that stopped moving as failed so the screen offers to start again", async () => {
    const production = await buildProduction();
    const { user } = await buildMember("supervisor", { production });
    const agent = await signedInAgent(app, user.email);
    const stuck = await ReportRun.create({
      productionId: production.id,
      kind: "continuity_books",
      status: "running",
      done: 1,
      total: 4,
      storageKey: null,
      bytes: null,
      error: null,
      requestedBy: null,
      finishedAt: null,
    });
    await ReportRun.sequelize!.query(`UPDATE report_runs SET updated_at = now() - interval '11 minutes' WHERE id = :id`, {
      replacements: { id: stuck.id },
    });

    const res = await agent.get(`/api/productions/${production.id}/reports/runs/${stuck.id}`);

    expect(res.body.data.status).toBe("failed");
    expect(res.body.data.fileUrl).toBeNull();
  });
});
