// Entries captured without a signal: stored once per production however often they arrive, and
// kept with review marks when their scene, character or garment changed or went meanwhile.
import { randomUUID } from "node:crypto";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import sharp from "sharp";
import { createApp } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { clock } from "../../server/lib/clock.js";
import { getStorage } from "../../server/lib/storage.js";
import { ContinuityEntry, Garment, MultiplesGroup, Photo, Scene, type Production } from "../../server/models/index.js";
import { buildAppearance, buildChange, buildCharacter, buildGarment, buildMember, buildScene, buildShootDay } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";

const app = createApp();

async function jpeg(colour: string): Promise<Buffer> {
  return sharp({ create: { width: 120, height: 90, channels: 3, background: colour } })
    .jpeg()
    .toBuffer();
}

let agent: TestAgent;
let production: Production;
let pid: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("set_costumer");
  production = m.production;
  pid = production.id;
  agent = await signedInAgent(app, m.user.email);
});
afterEach(() => clock.reset());

interface Sent {
  clientId?: string;
  sceneId: string;
  characterId: string;
  shootDayId?: string;
  notes?: string;
  garmentIds?: string[];
  capturedAs?: object;
  photos?: Buffer[];
}

/** Sends an entry the way the phone's queue does: multipart with the fields and photos. */
function send(e: Sent) {
  let r = agent.agent
    .post(`/api/productions/${pid}/continuity`)
    .set("X-CSRF-Token", agent.csrf)
    .field("sceneId", e.sceneId)
    .field("characterId", e.characterId);
  if (e.clientId) r = r.field("clientId", e.clientId);
  if (e.shootDayId) r = r.field("shootDayId", e.shootDayId);
  if (e.notes) r = r.field("notes", e.notes);
  for (const g of e.garmentIds ?? []) r = r.field("garmentIds", g);
  if (e.capturedAs) r = r.field("capturedAs", JSON.stringify(e.capturedAs));
  for (const [i, p] of (e.photos ?? []).entries())
    r = r.field("views", "front").attach("photos", p, { filename: `p${i}.jpg`, contentType: "image/jpeg" });
  return r;
}

async function sceneWithCharacter() {
  const character = await buildCharacter({ production, name: "Maud Penhallow" });
  const change = await buildChange(character, { number: 2 });
  const scene = await buildScene({ production, number: "12" });
  const day = await buildShootDay({ production, dayNumber: 4, scenes: [scene] });
  await buildAppearance(scene, character, change, { distressStage: 1 });
  return { character, change, scene, day };
}

describe("POST /continuity with a client id", () => {
  it("answers a repeat with the stored entry (200) and stores it once, photos included", async () => {
    const { character, scene } = await sceneWithCharacter();
    const entry: Sent = {
      clientId: randomUUID(),
      sceneId: scene.id,
      characterId: character.id,
      notes: "collar open",
      photos: [await jpeg("#3E5C4A")],
    };

    const first = await send(entry);
    const again = await send(entry);

    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(again.status, JSON.stringify(again.body)).toBe(200);
    expect(again.body.data).toEqual(first.body.data);
    expect(first.body.data.clientId).toBe(entry.clientId);
    expect(await ContinuityEntry.count()).toBe(1);
    expect(await Photo.count()).toBe(1);
    expect(first.body.data.review).toEqual({ reasons: [], open: false, resolvedAt: null, resolvedByName: null });
  });

  it("stores one entry when two copies arrive at the same moment, and keeps the photo files", async () => {
    const { character, scene } = await sceneWithCharacter();
    const entry: Sent = {
      clientId: randomUUID(),
      sceneId: scene.id,
      characterId: character.id,
      notes: "sleeves rolled",
      photos: [await jpeg("#8A5A2B"), await jpeg("#2B3A67")],
    };

    const [a, b] = await Promise.all([send(entry), send(entry)]);

    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body.data.id).toBe(b.body.data.id);
    expect(await ContinuityEntry.count()).toBe(1);
    expect(await Photo.count()).toBe(2);
    // The copy that lost removed only files no row refers to: the stored entry's files are all there.
    for (const p of a.body.data.photos as Array<{ contentHash: string }>) {
      for (const f of ["full.jpg", "display.webp", "print.jpg", "thumb.webp"])
        expect(await getStorage().exists(`photos/${p.contentHash.slice(0, 2)}/${p.contentHash}/${f}`), f).toBe(true);
    }
  });

  it("refuses the same id with a different entry (422) and stores nothing new", async () => {
    const { character, scene } = await sceneWithCharacter();
    const clientId = randomUUID();
    await send({ clientId, sceneId: scene.id, characterId: character.id, notes: "hat on" }).expect(201);

    const res = await send({ clientId, sceneId: scene.id, characterId: character.id, notes: "hat off" });

    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: "client_id_reused", fields: { clientId: expect.any(String) } });
    expect(await ContinuityEntry.count()).toBe(1);
    expect((await ContinuityEntry.findOne())!.notes).toBe("hat on");
  });

  it("keeps the key unique within a production in the database itself, not across productions", async () => {
    const { character, scene } = await sceneWithCharacter();
    const other = await buildMember("set_costumer");
    const otherCharacter = await buildCharacter({ production: other.production });
    const otherScene = await buildScene({ production: other.production });
    const clientId = randomUUID();
    const row = (p: string, s: string, c: string) => ({
      productionId: p,
      sceneId: s,
      characterId: c,
      shootDayId: null,
      distressStage: null,
      notes: null,
      loggedBy: null,
      clientId,
      requestHash: null,
      capturedAs: null,
      reviewResolvedAt: null,
      reviewResolvedBy: null,
    });

    await ContinuityEntry.create(row(pid, scene.id, character.id));

    await expect(ContinuityEntry.create(row(pid, scene.id, character.id))).rejects.toMatchObject({
      name: "SequelizeUniqueConstraintError",
      parent: { constraint: "continuity_entries_client_id_key" },
    });
    await expect(ContinuityEntry.create(row(other.production.id, otherScene.id, otherCharacter.id))).resolves.toBeTruthy();
  });

  it("without a client id, an unknown scene is still refused with 400", async () => {
    const { character } = await sceneWithCharacter();

    const res = await send({ sceneId: randomUUID(), characterId: character.id, notes: "x" });

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("sceneId");
    expect(await ContinuityEntry.count()).toBe(0);
  });

  it("refuses capturedAs that is not JSON with 400 naming the field", async () => {
    const { character, scene } = await sceneWithCharacter();

    const res = await agent.agent
      .post(`/api/productions/${pid}/continuity`)
      .set("X-CSRF-Token", agent.csrf)
      .field("sceneId", scene.id)
      .field("characterId", character.id)
      .field("clientId", randomUUID())
      .field("capturedAs", "{not json");

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("capturedAs");
  });
});

describe("entries that arrive after the records changed", () => {
  it("keeps an entry whose scene was deleted meanwhile, without a scene, marked for review", async () => {
    const { character, scene, day } = await sceneWithCharacter();
    const clientId = randomUUID();
    const captured = { sceneNumber: "12", characterName: "Maud Penhallow", shootDayNumber: 4, changeNumber: 2 };
    await Scene.destroy({ where: { id: scene.id } });

    const res = await send({
      clientId,
      sceneId: scene.id,
      characterId: character.id,
      shootDayId: day.id,
      notes: "shawl pinned",
      capturedAs: captured,
      photos: [await jpeg("#B5452E")],
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data).toMatchObject({
      sceneId: null,
      sceneNumber: "12",
      characterId: character.id,
      shootDayId: day.id,
      notes: "shawl pinned",
    });
    expect(res.body.data.photos).toHaveLength(1);
    expect(res.body.data.review.open).toBe(true);
    expect(res.body.data.review.reasons).toEqual([{ code: "scene_deleted", message: expect.stringContaining("Scene 12 was deleted") }]);
    const open = await agent.get(`/api/productions/${pid}/continuity?review=open`).expect(200);
    expect(open.body.data.map((e: { id: string }) => e.id)).toEqual([res.body.data.id]);
    const timeline = await agent.get(`/api/productions/${pid}/continuity/timeline/${character.id}`).expect(200);
    expect(timeline.body.data.unplaced.map((e: { id: string }) => e.id)).toEqual([res.body.data.id]);
    // Conflict rules read only placed entries; the snags still compute.
    await agent.get(`/api/productions/${pid}/snags`).expect(200);
  });

  it("marks a renumbered scene, another change, another required state and a deleted garment; links only the garments left", async () => {
    const { character, change, scene, day } = await sceneWithCharacter();
    const kept = await buildGarment({ production, name: "Shawl" });
    const gone = await buildGarment({ production, name: "Apron" });
    const newChange = await buildChange(character, { number: 3 });
    const captured = {
      sceneNumber: "12",
      characterName: "Maud Penhallow",
      shootDayNumber: 4,
      changeId: change.id,
      changeNumber: 2,
      requiredDistress: 1,
      garments: [
        { id: kept.id, tagCode: kept.tagCode },
        { id: gone.id, tagCode: gone.tagCode },
      ],
    };
    await scene.update({ number: "12A" });
    await sequelize.query(`UPDATE appearances SET change_id = :c, distress_stage = 2 WHERE scene_id = :s`, {
      replacements: { c: newChange.id, s: scene.id },
    });
    await Garment.destroy({ where: { id: gone.id } });

    const res = await send({
      clientId: randomUUID(),
      sceneId: scene.id,
      characterId: character.id,
      shootDayId: day.id,
      garmentIds: [kept.id, gone.id],
      capturedAs: captured,
      notes: "as shot",
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.sceneId).toBe(scene.id);
    expect(res.body.data.garmentIds).toEqual([kept.id]);
    const reasons = res.body.data.review.reasons as Array<{ code: string; message: string }>;
    expect(reasons.map((r) => r.code).sort()).toEqual(["change_differs", "garment_deleted", "scene_renumbered", "state_differs"]);
    expect(reasons.find((r) => r.code === "scene_renumbered")!.message).toBe("Scene 12 is now scene 12A.");
    expect(reasons.find((r) => r.code === "change_differs")!.message).toBe(
      "Scene 12A now has Maud Penhallow in change 3 (the phone showed change 2).",
    );
    expect(reasons.find((r) => r.code === "garment_deleted")!.message).toContain(gone.tagCode);
  });

  it("settles the marks and files an unplaced entry under a scene", async () => {
    const { character, scene } = await sceneWithCharacter();
    const other = await buildScene({ production, number: "13" });
    await Scene.destroy({ where: { id: scene.id } });
    const sent = await send({
      clientId: randomUUID(),
      sceneId: scene.id,
      characterId: character.id,
      notes: "x",
      capturedAs: { sceneNumber: "12" },
    }).expect(201);

    const res = await agent.patch(`/api/productions/${pid}/continuity/${sent.body.data.id}`, { sceneId: other.id, reviewed: true });

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ sceneId: other.id, sceneNumber: "13" });
    expect(res.body.data.review).toMatchObject({ open: false, resolvedByName: expect.any(String), resolvedAt: expect.any(String) });
    expect(res.body.data.review.reasons).toHaveLength(1);
    const open = await agent.get(`/api/productions/${pid}/continuity?review=open`).expect(200);
    expect(open.body.data).toEqual([]);
  });
});

describe("GET /offline-pack", () => {
  it("holds the next two shoot days from the production's today with their scenes, characters, changes, garments and latest entries", async () => {
    clock.set("2030-09-02T08:00:00Z", { frozen: true });
    const maud = await buildCharacter({ production, name: "Maud" });
    const elias = await buildCharacter({ production, name: "Elias" });
    const outsider = await buildCharacter({ production, name: "Not on these days" });
    const change = await buildChange(maud);
    const [past, s1, s2, later] = await Promise.all(["1", "2", "3", "4"].map((n) => buildScene({ production, number: n })));
    await buildShootDay({ production, dayNumber: 1, date: "2030-09-01", scenes: [past!] });
    await buildShootDay({ production, dayNumber: 2, date: "2030-09-02", scenes: [s1!] });
    await buildShootDay({ production, dayNumber: 3, date: "2030-09-03", scenes: [s2!] });
    await buildShootDay({ production, dayNumber: 4, date: "2030-09-04", scenes: [later!] });
    await buildAppearance(s1!, maud, change);
    await buildAppearance(s2!, elias, null);
    await buildAppearance(later!, outsider, null);
    const group = await MultiplesGroup.create({ productionId: pid, name: "Shawl", notes: null });
    const copies = [await buildGarment({ production, name: "Shawl #1" }), await buildGarment({ production, name: "Shawl #2" })];
    for (const [i, g] of copies.entries()) await g.update({ multiplesGroupId: group.id, copyNumber: i + 1 });
    const boots = await buildGarment({ production, name: "Boots" });
    await buildGarment({ production, name: "Not in these changes" });
    await sequelize.query(
      `INSERT INTO change_items (id, production_id, change_id, label, garment_id, multiples_group_id, sort_order, created_at, updated_at) VALUES (gen_random_uuid(), :p, :c, 'boots', :g, NULL, 1, now(), now()), (gen_random_uuid(), :p, :c, 'shawl', NULL, :m, 2, now(), now())`,
      { replacements: { p: pid, c: change.id, g: boots.id, m: group.id } },
    );
    const withPhoto = await send({
      clientId: randomUUID(),
      sceneId: past!.id,
      characterId: maud.id,
      notes: "reference",
      photos: [await jpeg("#C98B2B")],
    }).expect(201);
    await send({ clientId: randomUUID(), sceneId: past!.id, characterId: maud.id, notes: "no photo" }).expect(201);

    const res = await agent.get(`/api/productions/${pid}/offline-pack`);

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.headers["cache-control"]).toBe("no-store");
    const pack = res.body.data;
    expect(pack.savedAt).toBe("2030-09-02T08:00:00.000Z");
    expect(pack.production).toMatchObject({ id: pid, today: "2030-09-02" });
    expect(pack.shootDays.map((d: { date: string }) => d.date)).toEqual(["2030-09-02", "2030-09-03"]);
    expect(pack.scenes.map((s: { number: string }) => s.number).sort()).toEqual(["2", "3"]);
    expect(pack.characters.map((c: { name: string }) => c.name).sort()).toEqual(["Elias", "Maud"]);
    expect(pack.changes.map((c: { id: string }) => c.id)).toEqual([change.id]);
    expect(pack.garments.map((g: { name: string }) => g.name).sort()).toEqual(["Boots", "Shawl #1", "Shawl #2"]);
    expect(pack.continuity.map((e: { id: string }) => e.id)).toEqual([withPhoto.body.data.id]);
  });
});
