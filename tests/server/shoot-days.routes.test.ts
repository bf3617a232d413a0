import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { AuditEvent, ChangeItem, ShootDay, ShootDayScene } from "../../server/models/index.js";
import {
  buildAppearance,
  buildChange,
  buildCharacter,
  buildGarment,
  buildMember,
  buildProduction,
  buildScene,
  buildShootDay,
} from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { ShootDayDto } from "../../shared/schemas/breakdown.js";
import type { SnagDto } from "../../shared/schemas/snags.js";

const app = createApp();

describe("shoot-day editor routes", () => {
  let agent: TestAgent;
  let pid: string;
  let production: Awaited<ReturnType<typeof buildProduction>>;

  beforeEach(async () => {
    await resetDb();
    const m = await buildMember("designer");
    production = m.production;
    pid = production.id;
    agent = await signedInAgent(app, m.user.email);
  });

  const numbers = (d: ShootDayDto) => d.scenes.map((s) => s.number);

  describe("POST /shoot-days", () => {
    it("401 without a session, nothing written", async () => {
      const anon = await anonymousAgent(app);

      const res = await anon.post(`/api/productions/${pid}/shoot-days`, { dayNumber: 1, date: "2030-09-02" });

      expect(res.status).toBe(401);
      expect(await ShootDay.count()).toBe(0);
    });

    it("400 naming the date when it is not a date", async () => {
      const res = await agent.post(`/api/productions/${pid}/shoot-days`, { dayNumber: 1, date: "2.9.2030" });

      expect(res.status).toBe(400);
      expect(res.body.error.fields).toHaveProperty("date");
    });

    it("409 naming the day number when that day exists", async () => {
      await buildShootDay({ production, dayNumber: 3, date: "2030-09-04" });

      const res = await agent.post(`/api/productions/${pid}/shoot-days`, { dayNumber: 3, date: "2030-09-09" });

      expect(res.status).toBe(409);
      expect(res.body.error.fields.dayNumber).toBe("Day 3 already exists (2030-09-04)");
      expect(await ShootDay.count()).toBe(1);
    });

    it("adds a dated day with its scenes in order", async () => {
      const a = await buildScene({ production, number: "12" });
      const b = await buildScene({ production, number: "4" });

      const res = await agent.post(`/api/productions/${pid}/shoot-days`, {
        dayNumber: 1,
        date: "2030-09-02",
        startsAt: "07:30",
        sceneIds: [a.id, b.id],
      });

      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ dayNumber: 1, date: "2030-09-02", kind: "shoot", startsAt: "07:30" });
      expect(numbers(res.body.data)).toEqual(["12", "4"]);
    });
  });

  describe("PATCH /shoot-days/:id", () => {
    it("redates a day, and reorders, adds and takes off scenes through sceneIds", async () => {
      const [s1, s2, s3] = [
        await buildScene({ production, number: "1" }),
        await buildScene({ production, number: "2" }),
        await buildScene({ production, number: "3" }),
      ];
      const day = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02", scenes: [s1, s2] });

      const res = await agent.patch(`/api/productions/${pid}/shoot-days/${day.id}`, { date: "2030-09-03", sceneIds: [s3.id, s2.id] });

      expect(res.status).toBe(200);
      expect(res.body.data.date).toBe("2030-09-03");
      expect(numbers(res.body.data)).toEqual(["3", "2"]);
      expect(res.body.data.scenes.map((s: { position: number }) => s.position)).toEqual([1, 2]);
    });

    it("409 when renumbering onto another day's number, day unchanged", async () => {
      await buildShootDay({ production, dayNumber: 1, date: "2030-09-02" });
      const day2 = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03" });

      const res = await agent.patch(`/api/productions/${pid}/shoot-days/${day2.id}`, { dayNumber: 1 });

      expect(res.status).toBe(409);
      expect((await ShootDay.findByPk(day2.id))!.dayNumber).toBe(2);
    });
  });

  describe("POST /shoot-days/:id/move-scene", () => {
    it("moves a scene to a place on another day in one step; both days renumber", async () => {
      const [s1, s2, s3, s4] = await Promise.all(["1", "2", "3", "4"].map((number) => buildScene({ production, number })));
      const from = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02", scenes: [s1!, s2!, s3!] });
      const to = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03", scenes: [s4!] });

      const res = await agent.post(`/api/productions/${pid}/shoot-days/${from.id}/move-scene`, {
        sceneId: s2!.id,
        toShootDayId: to.id,
        position: 1,
      });

      expect(res.status).toBe(200);
      expect(numbers(res.body.data.from)).toEqual(["1", "3"]);
      expect(numbers(res.body.data.to)).toEqual(["2", "4"]);
      expect(res.body.data.from.scenes.map((s: { position: number }) => s.position)).toEqual([1, 2]);
      expect(await AuditEvent.count({ where: { action: "shoot_day.move_scene" } })).toBe(1);
    });

    it("409 when the scene is already on the other day; nothing moves", async () => {
      const s1 = await buildScene({ production, number: "1" });
      const from = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02", scenes: [s1] });
      const to = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03", scenes: [s1] });

      const res = await agent.post(`/api/productions/${pid}/shoot-days/${from.id}/move-scene`, { sceneId: s1.id, toShootDayId: to.id });

      expect(res.status).toBe(409);
      expect(await ShootDayScene.count({ where: { sceneId: s1.id } })).toBe(2);
    });

    it("400 when the scene is not on the day it moves from", async () => {
      const s1 = await buildScene({ production, number: "1" });
      const from = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02" });
      const to = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03" });

      const res = await agent.post(`/api/productions/${pid}/shoot-days/${from.id}/move-scene`, { sceneId: s1.id, toShootDayId: to.id });

      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ sceneId: "Scene is not on day 1" });
    });

    it("404 for a day of another production", async () => {
      const other = await buildProduction();
      const s1 = await buildScene({ production: other, number: "1" });
      const from = await buildShootDay({ production: other, dayNumber: 1, date: "2030-09-02", scenes: [s1] });
      const to = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03" });

      const res = await agent.post(`/api/productions/${pid}/shoot-days/${from.id}/move-scene`, { sceneId: s1.id, toShootDayId: to.id });

      expect(res.status).toBe(404);
    });
  });

  describe("DELETE /shoot-days/:id", () => {
    it("deletes the day and its scene slots; the scenes stay", async () => {
      const s1 = await buildScene({ production, number: "1" });
      const day = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02", scenes: [s1] });

      const res = await agent.delete(`/api/productions/${pid}/shoot-days/${day.id}`);

      expect(res.status).toBe(204);
      expect(await ShootDay.count()).toBe(0);
      expect(await ShootDayScene.count()).toBe(0);
      expect((await agent.get(`/api/productions/${pid}/scenes/${s1.id}`)).status).toBe(200);
    });
  });

  describe("a change in the schedule changes the snag list", () => {
    it("moving a scene onto the day another character wears the same garment raises a double booking; moving it back clears it", async () => {
      // One garment in two characters' changes: a double booking exists only when both scenes share a day
      // (the booking rule of the snag engine, shared/domain/snags/bookings.ts).
      const garment = await buildGarment({ production, name: "Oilskin smock" });
      const wren = await buildCharacter({ production, name: "Wren" });
      const moss = await buildCharacter({ production, name: "Moss" });
      const cw = await buildChange(wren);
      const cm = await buildChange(moss);
      await ChangeItem.create({
        productionId: pid,
        changeId: cw.id,
        label: "smock",
        garmentId: garment.id,
        multiplesGroupId: null,
        sortOrder: 1,
      });
      await ChangeItem.create({
        productionId: pid,
        changeId: cm.id,
        label: "smock",
        garmentId: garment.id,
        multiplesGroupId: null,
        sortOrder: 1,
      });
      const s1 = await buildScene({ production, number: "1" });
      const s2 = await buildScene({ production, number: "2" });
      await buildAppearance(s1, wren, cw);
      await buildAppearance(s2, moss, cm);
      const day1 = await buildShootDay({ production, dayNumber: 1, date: "2030-09-02", scenes: [s1] });
      const day2 = await buildShootDay({ production, dayNumber: 2, date: "2030-09-03", scenes: [s2] });
      const bookings = async () =>
        ((await agent.get(`/api/productions/${pid}/snags?kind=booking`)).body.data.snags as SnagDto[]).map((s) =>
          s.shootDays.map((d) => d.id),
        );

      const before = await bookings();
      await agent.post(`/api/productions/${pid}/shoot-days/${day2.id}/move-scene`, { sceneId: s2.id, toShootDayId: day1.id }).expect(200);
      const together = await bookings();
      await agent.patch(`/api/productions/${pid}/shoot-days/${day1.id}`, { sceneIds: [s1.id] }).expect(200);
      const apart = await bookings();

      expect(before).toEqual([]);
      expect(together).toEqual([[day1.id]]);
      expect(apart).toEqual([]);
    });
  });
});
