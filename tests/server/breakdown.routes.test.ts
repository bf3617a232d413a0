import path from "node:path";
import fs from "node:fs";
import os from "node:os";
import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { Appearance, Change, ContinuityEntry, Photo, Scene } from "../../server/models/index.js";
import { createDiskStorage, setStorage } from "../../server/lib/storage.js";
import {
  buildAppearance,
  buildChange,
  buildCharacter,
  buildMember,
  buildPerformer,
  buildProduction,
  buildScene,
  buildShootDay,
} from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, type TestAgent } from "../setup/http.js";

const app = createApp();
const fixture = path.resolve("tests/fixtures/gps-rotated.jpg");
const storageDir = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-bd-"));

describe("breakdown routes", () => {
  let agent: TestAgent;
  let pid: string;
  let production: Awaited<ReturnType<typeof buildProduction>>;

  beforeEach(async () => {
    await resetDb();
    setStorage(createDiskStorage(storageDir));
    const m = await buildMember("supervisor");
    production = m.production;
    pid = production.id;
    agent = await signedInAgent(app, m.user.email);
  });

  describe("POST /scenes", () => {
    it("401 without a session", async () => {
      const anon = await anonymousAgent(app);

      const res = await anon.post(`/api/productions/${pid}/scenes`, { number: "1" });

      expect(res.status).toBe(401);
      expect(await Scene.count()).toBe(0);
    });

    it("400 naming the field for a bad scene number, nothing written", async () => {
      const res = await agent.post(`/api/productions/${pid}/scenes`, { number: "forty-two" });

      expect(res.status).toBe(400);
      expect(res.body.error.fields).toHaveProperty("number");
      expect(await Scene.count()).toBe(0);
    });

    it("409 for a scene number already used", async () => {
      await agent.post(`/api/productions/${pid}/scenes`, { number: "42A" }).expect(201);

      const res = await agent.post(`/api/productions/${pid}/scenes`, { number: "42a" });

      expect(res.status).toBe(409);
    });

    it("creates scenes appended in story order and lists them with filters", async () => {
      const a = await agent.post(`/api/productions/${pid}/scenes`, { number: "1", storyDay: 1, setName: "Quay", lengthEighths: 11 });
      const b = await agent.post(`/api/productions/${pid}/scenes`, { number: "2", storyDay: 2, setName: "Chapel" });

      const all = await agent.get(`/api/productions/${pid}/scenes?pageSize=5000`);
      const day2 = await agent.get(`/api/productions/${pid}/scenes?storyDay=2`);

      expect(a.body.data.storyOrder).toBe(1);
      expect(b.body.data.storyOrder).toBe(2);
      expect(all.body.pagination.total).toBe(2);
      expect(day2.body.data.map((s: { number: string }) => s.number)).toEqual(["2"]);
    });
  });

  describe("appearances and character pages", () => {
    it("refuses a change of another character (400) and lists story and shoot order", async () => {
      const maud = await buildCharacter({ production, name: "Maud" });
      const jory = await buildCharacter({ production, name: "Jory" });
      const joryChange = await buildChange(jory);
      const maud1 = await buildChange(maud);
      const s1 = await buildScene({ production, number: "1", storyOrder: 1 });
      const s2 = await buildScene({ production, number: "2", storyOrder: 2 });
      await buildShootDay({ production, dayNumber: 1, date: "2026-12-01", scenes: [s2, s1] });

      const wrong = await agent.post(`/api/productions/${pid}/appearances`, {
        sceneId: s1.id,
        characterId: maud.id,
        changeId: joryChange.id,
      });
      await agent
        .post(`/api/productions/${pid}/appearances`, { sceneId: s1.id, characterId: maud.id, changeId: maud1.id, distressStage: 0 })
        .expect(201);
      await agent
        .post(`/api/productions/${pid}/appearances`, {
          sceneId: s2.id,
          characterId: maud.id,
          changeId: maud1.id,
          distressStage: 1,
          wet: true,
        })
        .expect(201);
      const schedule = await agent.get(`/api/productions/${pid}/characters/${maud.id}/schedule`);
      const scene = await agent.get(`/api/productions/${pid}/scenes/${s2.id}`);

      expect(wrong.status).toBe(400);
      expect(wrong.body.error.fields).toHaveProperty("changeId");
      expect(schedule.body.data.storyOrder.map((r: { sceneNumber: string }) => r.sceneNumber)).toEqual(["1", "2"]);
      expect(schedule.body.data.shootOrder.map((r: { sceneNumber: string }) => r.sceneNumber)).toEqual(["2", "1"]);
      expect(scene.body.data.appearances[0]).toMatchObject({ characterName: "Maud", wet: true, distressStage: 1, change: { number: 1 } });
    });

    it("rejects a distress stage outside 0–10 naming the field", async () => {
      const c = await buildCharacter({ production });
      const s = await buildScene({ production });

      const res = await agent.post(`/api/productions/${pid}/appearances`, { sceneId: s.id, characterId: c.id, distressStage: 11 });

      expect(res.status).toBe(400);
      expect(res.body.error.fields).toHaveProperty("distressStage");
      expect(await Appearance.count()).toBe(0);
    });

    it("stage: each appearance knows the running time since the character's previous exit", async () => {
      const stage = await buildProduction({ kind: "stage" });
      const { user } = await buildMember("designer", { production: stage });
      const a2 = await signedInAgent(app, user.email);
      const nell = await buildCharacter({ production: stage, name: "Nell" });
      const c1 = await buildChange(nell);
      const c2 = await buildChange(nell);
      const minutes = [6, 1, 0.5, 4];
      const scenes = [];
      for (const [i, m] of minutes.entries())
        scenes.push(await buildScene({ production: stage, number: String(i + 1), storyOrder: i + 1, runningMinutes: m }));
      await buildAppearance(scenes[0]!, nell, c1);
      await buildAppearance(scenes[3]!, nell, c2);

      const res = await a2.get(`/api/productions/${stage.id}/characters/${nell.id}/schedule`);

      // By hand: scenes 2 and 3 play between the exit and the entrance: 1 + 0.5 = 1.5 minutes.
      expect(res.body.data.storyOrder.map((r: { minutesSincePreviousExit: number | null }) => r.minutesSincePreviousExit)).toEqual([
        null,
        1.5,
      ]);
    });
  });

  describe("changes", () => {
    it("numbers changes per character, validates item targets and approves", async () => {
      const c = await buildCharacter({ production });

      const first = await agent.post(`/api/productions/${pid}/changes`, {
        characterId: c.id,
        description: "Work clothes",
        storyDayFrom: 1,
        storyDayTo: 3,
        items: [{ label: "Jacket" }, { label: "Boots" }],
      });
      const missingGarment = await agent.post(`/api/productions/${pid}/changes`, {
        characterId: c.id,
        items: [{ label: "Coat", garmentId: "00000000-0000-4000-8000-000000000001" }],
      });
      const badSpan = await agent.post(`/api/productions/${pid}/changes`, { characterId: c.id, storyDayFrom: 4, storyDayTo: 2 });
      const approved = await agent.put(`/api/productions/${pid}/changes/${first.body.data.id}/approval`, { approval: "approved" });
      const edited = await agent.patch(`/api/productions/${pid}/changes/${first.body.data.id}`, { description: "Work clothes, patched" });

      expect(first.status).toBe(201);
      expect(first.body.data).toMatchObject({
        number: 1,
        approval: "draft",
        items: [
          { label: "Jacket", sortOrder: 1 },
          { label: "Boots", sortOrder: 2 },
        ],
      });
      expect(missingGarment.status).toBe(400);
      expect(missingGarment.body.error.fields).toHaveProperty("items.0.garmentId");
      expect(badSpan.status).toBe(400);
      expect(badSpan.body.error.fields).toHaveProperty("storyDayTo");
      expect(approved.body.data.approval).toBe("approved");
      // An edit after approval sends the change back to draft.
      expect(edited.body.data.approval).toBe("draft");
      expect(await Change.count()).toBe(1);
    });
  });

  describe("continuity", () => {
    it("logs an entry with photos in one request and shows it on the timeline", async () => {
      const c = await buildCharacter({ production });
      const ch = await buildChange(c);
      const s = await buildScene({ production, number: "18", storyDay: 4 });
      const day = await buildShootDay({ production, scenes: [s] });
      await buildAppearance(s, c, ch, { distressStage: 1 });

      const res = await agent.agent
        .post(`/api/productions/${pid}/continuity`)
        .set("X-CSRF-Token", agent.csrf)
        .field("shootDayId", day.id)
        .field("sceneId", s.id)
        .field("characterId", c.id)
        .field("notes", "collar open, left cuff rolled twice")
        .field("distressStage", "1")
        .field("views", "front")
        .attach("photos", fixture, { filename: "front.jpg", contentType: "image/jpeg" });
      const timeline = await agent.get(`/api/productions/${pid}/continuity/timeline/${c.id}`);

      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.data).toMatchObject({ notes: "collar open, left cuff rolled twice", distressStage: 1, photos: [{ view: "front" }] });
      expect(timeline.body.data.scenes[0]).toMatchObject({ number: "18", change: { number: 1 }, entries: [{ id: res.body.data.id }] });
    });

    it("a bad photo refuses the whole entry: no entry, no photo row, no file", async () => {
      const c = await buildCharacter({ production });
      const s = await buildScene({ production });

      const res = await agent.agent
        .post(`/api/productions/${pid}/continuity`)
        .set("X-CSRF-Token", agent.csrf)
        .field("sceneId", s.id)
        .field("characterId", c.id)
        .field("views", "front")
        .field("views", "back")
        .attach("photos", fixture, { filename: "front.jpg", contentType: "image/jpeg" })
        .attach("photos", Buffer.from("not a photo"), { filename: "back.jpg", contentType: "image/jpeg" });

      expect(res.status).toBe(400);
      expect(await ContinuityEntry.count()).toBe(0);
      expect(await Photo.count()).toBe(0);
      const files = fs.existsSync(path.join(storageDir, "photos"))
        ? (fs.readdirSync(path.join(storageDir, "photos"), { recursive: true }) as string[]).filter(
            (f) => f.endsWith(".jpg") || f.endsWith(".webp"),
          )
        : [];
      expect(files).toEqual([]);
    });

    it("deleting an entry removes its photos and files", async () => {
      const c = await buildCharacter({ production });
      const s = await buildScene({ production });
      const res = await agent.agent
        .post(`/api/productions/${pid}/continuity`)
        .set("X-CSRF-Token", agent.csrf)
        .field("sceneId", s.id)
        .field("characterId", c.id)
        .attach("photos", fixture, { filename: "x.jpg", contentType: "image/jpeg" });

      await agent.delete(`/api/productions/${pid}/continuity/${res.body.data.id}`).expect(204);

      expect(await Photo.count()).toBe(0);
      const hash = res.body.data.photos[0].contentHash as string;
      expect(fs.existsSync(path.join(storageDir, "photos", hash.slice(0, 2), hash))).toBe(false);
    });
  });

  describe("performers", () => {
    it("keeps name, contact and notes; refuses a bad e-mail naming the field", async () => {
      const bad = await agent.post(`/api/productions/${pid}/performers`, { name: "Ada Trenoweth", email: "not-an-email" });
      const ok = await agent.post(`/api/productions/${pid}/performers`, {
        name: "Ada Trenoweth",
        email: "ada@example.invalid",
        phone: "01632 960000",
      });
      const p2 = await buildPerformer({ production, name: "Stunt Person" });
      const ch = await agent.post(`/api/productions/${pid}/characters`, {
        name: "Ada's role",
        performerId: ok.body.data.id,
        doubles: [{ performerId: p2.id, kind: "stunt" }],
      });
      const list = await agent.get(`/api/productions/${pid}/performers`);

      expect(bad.status).toBe(400);
      expect(bad.body.error.fields).toHaveProperty("email");
      expect(ch.body.data.doubles).toEqual([{ id: expect.any(String), kind: "stunt", performer: { id: p2.id, name: "Stunt Person" } }]);
      expect(list.body.data.find((p: { id: string }) => p.id === p2.id).roles).toEqual([
        { characterId: ch.body.data.id, characterName: "Ada's role", as: "stunt" },
      ]);
    });
  });
});
