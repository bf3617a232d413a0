import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { config } from "../../server/config.js";
import type { Production } from "../../server/models/index.js";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import { snagFixtures } from "../setup/snag-fixtures.js";
import { decodeQrColumn, pdfPagePng, pdfPagesText } from "../setup/pdf-tools.js";
import type { RackGarmentDto, RackListDto } from "../../shared/schemas/reports.js";

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
 * Today is Mon 2 Sep 2030 (shoot day 1). Tomorrow, shoot day 2, shoots scene 5 (Wren, wet, stage 1)
 * then scene 2 (Moss and Wren, stage 0). Wren's oilskin group holds O-1..O-3; today's scene 9 uses a
 * copy at stage 2, so by the copy plan (distress never goes back; a wet copy is out for the day)
 * tomorrow takes #2 for scene 5 and #3 for scene 2, and #1 is the spare. Wren's jacket is in the
 * workroom. Moss's hired coat was due back yesterday, his hat is lost, and his boots item names no
 * garment. Moss comes first in cast order but is called second.
 */
async function scenario(production: Production) {
  const f = snagFixtures(production.id);
  const moss = await f.character({ name: "Moss Keverne" });
  const wren = await f.character({ name: "Wren Tallack" });
  await f.update("characters", moss, { sort_order: 1 });
  await f.update("characters", wren, { sort_order: 2 });
  const s2 = await f.scene({ number: "2", storyDay: 1 });
  const s5 = await f.scene({ number: "5", storyDay: 2 });
  const s9 = await f.scene({ number: "9", storyDay: 3 });
  const today = await f.shootDay({ date: "2030-09-02", sceneIds: [s9] });
  const tomorrow = await f.shootDay({ date: "2030-09-03", sceneIds: [s5, s2] });
  const later = await f.shootDay({ date: "2030-09-05", sceneIds: [s9] });
  const jacket = await f.garment({ tagCode: "J-1", name: "Keeper jacket", category: "jacket", status: "workroom" });
  await f.update("garments", jacket, { location_rack: "A2", location_bin: "7" });
  const group = await f.group({ name: "Storm oilskin" });
  const o = [] as string[];
  for (const n of [1, 2, 3]) {
    o.push(await f.garment({ tagCode: `O-${n}`, name: "Oilskin", category: "coat", groupId: group, copyNumber: n }));
    await f.update("garments", o[n - 1]!, { location_rack: "B1", location_bin: String(n) });
  }
  const coat = await f.garment({ tagCode: "R-1", name: "Frock coat", category: "coat", source: "rented", rentalDueOn: "2030-09-01" });
  const hat = await f.garment({ tagCode: "H-1", name: "Bowler", category: "hat", status: "lost" });
  const wren1 = await f.change({ characterId: wren, number: 1 });
  await f.update("changes", wren1, { description: "Storm gear" });
  const moss1 = await f.change({ characterId: moss, number: 1 });
  const items = {
    jacket: await f.changeItem({ changeId: wren1, garmentId: jacket, label: "jacket" }),
    oilskin: await f.changeItem({ changeId: wren1, groupId: group, label: "oilskin" }),
    coat: await f.changeItem({ changeId: moss1, garmentId: coat, label: "coat" }),
    hat: await f.changeItem({ changeId: moss1, garmentId: hat, label: "hat" }),
    boots: await f.changeItem({ changeId: moss1, label: "boots" }),
  };
  await f.update("change_items", items.oilskin, { sort_order: 1 });
  await f.update("change_items", items.jacket, { sort_order: 2 });
  await f.appearance({ sceneId: s9, characterId: wren, changeId: wren1, distressStage: 2 });
  await f.appearance({ sceneId: s5, characterId: wren, changeId: wren1, distressStage: 1, wet: true });
  await f.appearance({ sceneId: s2, characterId: wren, changeId: wren1, distressStage: 0 });
  await f.appearance({ sceneId: s2, characterId: moss, changeId: moss1 });
  return { wren, moss, today, tomorrow, later, o };
}

describe("tomorrow's rack list", () => {
  let production: Production;
  let agent: TestAgent;
  let ids: Awaited<ReturnType<typeof scenario>>;
  const base = () => `/api/productions/${production.id}/reports`;

  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-02T16:00:00Z", { frozen: true });
    production = await buildProduction({ title: "Harbour Lights" });
    const { user } = await buildMember("set_costumer", { production });
    agent = await signedInAgent(app, user.email);
    ids = await scenario(production);
  });
  afterEach(() => clock.reset());

  it("is for the next shoot day after today, characters in call order, with copies from the copy plan", async () => {
    const res = await agent.get(`${base()}/rack-list`);

    expect(res.status).toBe(200);
    const list = res.body.data as RackListDto;
    expect(list.today).toBe("2030-09-02");
    expect(list.day).toMatchObject({ id: ids.tomorrow, date: "2030-09-03", dayNumber: 2, kind: "shoot" });
    expect(list.upcoming.map((d) => d.date)).toEqual(["2030-09-03", "2030-09-05"]);
    // Wren is needed first (scene 5 opens the day) although Moss comes first in cast order.
    expect(list.characters.map((c) => [c.callOrder, c.name, c.sceneNumbers])).toEqual([
      [1, "Wren Tallack", ["5", "2"]],
      [2, "Moss Keverne", ["2"]],
    ]);
    const wren = list.characters[0]!.changes[0]!;
    expect(wren).toMatchObject({ number: 1, description: "Storm gear", sceneNumbers: ["5", "2"] });
    const line = (tag: string) => wren.garments.find((g) => g.tagCode === tag)!;
    // Copy plan (Dilworth / patience sorting over stages 2 | 1 wet, 0 in shoot order): #1 today, #2 and #3 tomorrow.
    expect(wren.garments.map((g) => [g.label, g.tagCode, g.copyNumber, g.copiesHeld, g.sceneNumbers])).toEqual([
      ["oilskin", "O-2", 2, 3, ["5"]],
      ["oilskin", "O-3", 3, 3, ["2"]],
      ["jacket", "J-1", null, null, ["5", "2"]],
    ]);
    expect(line("O-2")).toMatchObject({
      wet: true,
      bringSpare: true,
      spare: { tagCode: "O-1", copyNumber: 1 },
      distressStage: 1,
      rack: "B1",
      bin: "2",
      status: "in_stock",
      warnings: [],
    });
    expect(line("O-3")).toMatchObject({ wet: false, bringSpare: false, spare: null, distressStage: 0 });
    expect(line("J-1")).toMatchObject({ status: "workroom", rack: "A2", bin: "7", wet: true, bringSpare: true, spare: null });
    expect(line("J-1").warnings).toEqual([{ level: "warning", message: "Not in stock: workroom" }]);
    expect(line("O-2").checkOutPath).toBe(`/p/${production.id}/wardrobe/scan?tag=O-2&to=on_set`);
  });

  it("warns about anything not in stock, hires due back before the day and items with no garment", async () => {
    const list = (await agent.get(`${base()}/rack-list`)).body.data as RackListDto;

    const moss = list.characters.find((c) => c.name === "Moss Keverne")!.changes[0]!.garments;
    const byLabel = (l: string) => moss.find((g) => g.label === l) as RackGarmentDto;
    expect(byLabel("coat").warnings).toEqual([{ level: "warning", message: "Hire due back 2030-09-01, before this day" }]);
    expect(byLabel("hat").warnings).toEqual([{ level: "blocking", message: "Not in stock: lost" }]);
    expect(byLabel("boots")).toMatchObject({
      garmentId: null,
      tagCode: null,
      checkOutPath: null,
      warnings: [{ level: "blocking", message: "No garment is linked to this item of the change" }],
    });
    expect(list.counts).toEqual({ characters: 2, garments: 6, warnings: 4, blocking: 2 });
  });

  it("shows another day when asked, 404 for an unknown day, and nothing when no day is left", async () => {
    const later = (await agent.get(`${base()}/rack-list?shootDayId=${ids.later}`)).body.data as RackListDto;
    expect(later.day?.date).toBe("2030-09-05");
    expect(later.characters.map((c) => c.name)).toEqual(["Wren Tallack"]);

    expect((await agent.get(`${base()}/rack-list?shootDayId=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await agent.get(`${base()}/rack-list?shootDayId=nope`)).status).toBe(400);

    clock.set("2030-09-06", { frozen: true });
    const none = (await agent.get(`${base()}/rack-list`)).body.data as RackListDto;
    expect(none).toMatchObject({ day: null, characters: [], upcoming: [] });
  });

  it("takes 'tomorrow' in the production's time zone", async () => {
    // 23:30 UTC on 2 Sep is already 3 Sep in Auckland, so the next day after today there is 5 Sep.
    clock.set("2030-09-02T23:30:00Z", { frozen: true });
    await production.update({ settings: { timeZone: "Pacific/Auckland" } });

    const list = (await agent.get(`${base()}/rack-list`)).body.data as RackListDto;

    expect(list.today).toBe("2030-09-03");
    expect(list.day?.date).toBe("2030-09-05");
  });

  it("prints the list with a QR code per garment that holds the check-out address", async () => {
    const res = await binaryGet(agent, `${base()}/rack-list.pdf`);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/pdf");
    const pdf = res.body as Buffer;
    const text = (await pdfPagesText(pdf)).join("\n");
    // Drawing order, so a wrapped warning reads as one line.
    const flat = (await pdfPagesText(pdf, "raw")).join(" ").replace(/\s+/g, " ");
    expect(text).toContain("Rack list for the next shoot day");
    expect(text).toContain("Shoot day 2 · Tue 3 Sep 2030");
    expect(text.indexOf("1. Wren Tallack")).toBeLessThan(text.indexOf("2. Moss Keverne"));
    expect(text).toMatch(/O-2\s+oilskin: Oilskin\s+Rack B1\s+In stock/);
    expect(text).toContain("copy #2 of 3");
    expect(flat).toContain("bring spare copy O-1 (#1)");
    expect(flat).toContain("! Not in stock: workroom");
    expect(flat).toContain("! Hire due back 2030-09-01, before this day");
    expect(flat).toContain("! No garment is linked to this item of the change");
    expect(text).toMatch(/Page 1 of \d+/);
    // Read the codes as a phone would: render the page, cut the QR column, decode each code.
    const png = await pdfPagePng(pdf, 1, 200);
    const codes = await decodeQrColumn(png, { dpi: 200, fromMm: 14, toMm: 36, codeMm: 20 });
    const url = (tag: string) => new URL(`/p/${production.id}/wardrobe/scan?tag=${tag}&to=on_set`, config.APP_URL).toString();
    expect(codes.slice(0, 3)).toEqual([url("O-2"), url("O-3"), url("J-1")]);
    expect(codes).toContain(url("R-1"));
  });

  it("is for the next performance in a stage production, which plays the whole running order", async () => {
    const stage = await buildProduction({ title: "Glass Orchard", kind: "stage" });
    const { user } = await buildMember("designer", { production: stage });
    const a = await signedInAgent(app, user.email);
    const f = snagFixtures(stage.id);
    const nell = await f.character({ name: "Nell" });
    const s1 = await f.scene({ number: "1" });
    const s2 = await f.scene({ number: "2" });
    const dress = await f.garment({ tagCode: "D-1", name: "Orchard dress", category: "dress" });
    const c = await f.change({ characterId: nell, number: 1 });
    await f.changeItem({ changeId: c, garmentId: dress, label: "dress" });
    await f.appearance({ sceneId: s1, characterId: nell, changeId: c });
    await f.appearance({ sceneId: s2, characterId: nell, changeId: c });
    await f.shootDay({ date: "2030-09-02", kind: "performance", startsAt: "19:30" });
    await f.shootDay({ date: "2030-09-04", kind: "performance", startsAt: "14:30" });

    const list = (await a.get(`/api/productions/${stage.id}/reports/rack-list`)).body.data as RackListDto;

    expect(list.day).toMatchObject({ date: "2030-09-04", kind: "performance", startsAt: "14:30" });
    expect(list.characters[0]!.changes[0]!.garments.map((g) => [g.tagCode, g.sceneNumbers])).toEqual([["D-1", ["1", "2"]]]);
    const pdf = (await binaryGet(a, `/api/productions/${stage.id}/reports/rack-list.pdf`)).body as Buffer;
    expect((await pdfPagesText(pdf)).join("\n")).toContain("Rack list for the next performance");
  });
});
