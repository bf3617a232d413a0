import { beforeEach, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app.js";
import { AuditEvent } from "../../server/models/index.js";
import { auditRecordTypes } from "../../server/services/audit-log.service.js";
import { buildGarment, buildMember, buildScene } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let p: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("supervisor");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  p = `/api/productions/${production.id}`;
});

type Ev = { action: string; record: { type: string; label: string; href: string | null; gone: boolean } | null };

describe("GET /audit names the record that changed and links to it", () => {
  it("a garment, a fabric and a scene are named as people know them, with the path of their page", async () => {
    const g = await buildGarment({ production, name: "Oilskin" });
    const scene = await buildScene({ production, number: "42A" });
    await agent.patch(`${p}/garments/${g.id}`, { colour: "ochre" });
    const fabric = (
      await agent.post(`${p}/fabrics`, { name: "Waxed cotton", fibreContent: [{ fibre: "cotton", percent: 100 }], construction: "woven" })
    ).body.data;
    await agent.patch(`${p}/scenes/${scene.id}`, { synopsis: "Storm on the quay" });

    const res = await agent.get(`${p}/audit`);

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const byAction = Object.fromEntries((res.body.data as Ev[]).map((e) => [e.action, e.record]));
    expect(byAction["garment.update"]).toEqual({
      type: "garment",
      label: `${g.tagCode} Oilskin`,
      href: `/p/${production.id}/wardrobe/garments/${g.id}`,
      gone: false,
    });
    expect(byAction["fabric.create"]).toEqual({
      type: "fabric",
      label: "Waxed cotton",
      href: `/p/${production.id}/fabrics/${fabric.id}`,
      gone: false,
    });
    expect(byAction["scene.update"]).toMatchObject({ label: "Scene 42A", href: `/p/${production.id}/breakdown/scenes/${scene.id}` });
  });

  it("a deleted record keeps its name from the event and has no link", async () => {
    const fabric = (
      await agent.post(`${p}/fabrics`, { name: "Moleskin", fibreContent: [{ fibre: "cotton", percent: 100 }], construction: "woven" })
    ).body.data;
    await agent.delete(`${p}/fabrics/${fabric.id}`);

    const res = await agent.get(`${p}/audit`);

    const del = (res.body.data as Ev[]).find((e) => e.action === "fabric.delete")!;
    expect(del.record).toEqual({ type: "fabric", label: "Moleskin", href: null, gone: true });
  });

  it("every kind of record it names has a working lookup (each kind's query runs; a missing record reads as gone)", async () => {
    for (const type of auditRecordTypes) {
      const entityType = type === "user_capacity" ? "workroom_capacity" : type;
      await AuditEvent.create({
        productionId: production.id,
        actorId: null,
        action: `${type}.test`,
        entityType,
        entityId: randomUUID(),
        before: null,
        after: type === "user_capacity" ? { userId: randomUUID() } : null,
      });
    }

    const res = await agent.get(`${p}/audit?pageSize=100`);

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const tested = (res.body.data as Ev[]).filter((e) => e.action.endsWith(".test"));
    expect(tested).toHaveLength(auditRecordTypes.length);
    for (const e of tested) expect(e.record, e.action).toMatchObject({ href: null, gone: true });
  });
});
