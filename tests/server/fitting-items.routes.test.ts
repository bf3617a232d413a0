import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { AuditEvent, ChangeItem, Garment } from "../../server/models/index.js";
import { sequelize } from "../../server/db.js";
import { buildMember } from "../factories.js";
import { buildChangeOnDays, buildGarment } from "../factories.workroom.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { FittingDetailDto } from "../../shared/schemas/workroom.js";

const app = createApp();

/** A fitting for a change with one item that has no garment yet ("Knitted muffler"). */
async function fittingWithUnlinkedItem(agent: TestAgent, productionId: string) {
  const { performerId, changeId } = await buildChangeOnDays(productionId, { dates: ["2030-09-10"] });
  const item = await ChangeItem.create({
    productionId,
    changeId,
    label: "Knitted muffler",
    garmentId: null,
    multiplesGroupId: null,
    sortOrder: 5,
  });
  const res = await agent
    .post(`/api/productions/${productionId}/fittings`, { performerId, changeId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 30 })
    .expect(201);
  return { fittingId: res.body.data.id as string, itemId: item.id, changeId };
}

describe("POST /api/productions/:pid/fittings/:id/items/:itemId/garment", () => {
  let agent: TestAgent;
  let pid: string;

  beforeEach(async () => {
    await resetDb();
    const m = await buildMember("cutter");
    pid = m.production.id;
    agent = await signedInAgent(app, m.user.email);
  });

  it("the fitting shows the unlinked item with no garment", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);

    const res = await agent.get(`/api/productions/${pid}/fittings/${fittingId}`);

    expect((res.body.data as FittingDetailDto).items.find((i) => i.changeItemId === itemId)).toMatchObject({
      label: "Knitted muffler",
      garmentId: null,
    });
  });

  it("the cutter links the item to a garment from stock, then raises a ticket for it", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);
    const garmentId = await buildGarment(pid, { tagCode: "MUF-01", name: "Grey muffler", category: "scarf" });

    const res = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, { garmentId });
    const ticket = await agent.post(`/api/productions/${pid}/alterations`, {
      garmentId,
      fittingId,
      tasks: [{ kind: "shorten", amountMm: 80 }],
      estimateHours: 1,
    });

    expect(res.status).toBe(200);
    expect((res.body.data as FittingDetailDto).items.find((i) => i.changeItemId === itemId)).toMatchObject({
      garmentId,
      tagCode: "MUF-01",
      garmentName: "Grey muffler",
    });
    expect((await ChangeItem.findByPk(itemId))!.garmentId).toBe(garmentId);
    expect(ticket.status, JSON.stringify(ticket.body)).toBe(201);
    expect(await AuditEvent.count({ where: { action: "change_item.link_garment", entityId: itemId } })).toBe(1);
  });

  it("adds a new garment to stock at the fitting and links it, with its first history row", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);

    const res = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, {
      newGarment: { name: "Hand-knitted muffler", category: "Scarf", sizeLabel: "one size" },
    });

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const g = await Garment.findOne({ where: { productionId: pid, name: "Hand-knitted muffler" } });
    expect(g).toMatchObject({ category: "scarf", source: "built", status: "in_stock" });
    expect(g!.tagCode).toMatch(/\S/);
    expect((await ChangeItem.findByPk(itemId))!.garmentId).toBe(g!.id);
    const [[events]] = (await sequelize.query(`SELECT COUNT(*)::int AS n FROM garment_status_events WHERE garment_id = :id`, {
      replacements: { id: g!.id },
    })) as [Array<{ n: number }>, unknown];
    expect(events!.n).toBe(1);
  });

  it("400 naming the field when a new garment has no name; nothing written", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);

    const res = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, {
      newGarment: { name: " ", category: "scarf" },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("newGarment.name");
    expect(await Garment.count({ where: { productionId: pid } })).toBe(0);
  });

  it("400 when both or neither of garmentId and newGarment are given", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);

    const neither = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, {});

    expect(neither.status).toBe(400);
    expect(neither.body.error.fields).toEqual({ garmentId: "Choose a garment from stock or describe a new one" });
  });

  it("409 for an item that already has a garment; the link stays", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);
    const first = await buildGarment(pid, { name: "First" });
    const second = await buildGarment(pid, { name: "Second" });
    await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, { garmentId: first }).expect(200);

    const res = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, { garmentId: second });

    expect(res.status).toBe(409);
    expect((await ChangeItem.findByPk(itemId))!.garmentId).toBe(first);
  });

  it("404 for an item of another change; a garment of another production is refused", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);
    const other = await buildChangeOnDays(pid, { dates: ["2030-09-11"] });
    const foreignItem = await ChangeItem.create({
      productionId: pid,
      changeId: other.changeId,
      label: "Belt",
      garmentId: null,
      multiplesGroupId: null,
      sortOrder: 1,
    });
    const elsewhere = await buildMember("supervisor");
    const foreignGarment = await buildGarment(elsewhere.production.id, { name: "Not ours" });

    const wrongItem = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${foreignItem.id}/garment`, {
      newGarment: { name: "Belt", category: "belt" },
    });
    const wrongGarment = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, {
      garmentId: foreignGarment,
    });

    expect(wrongItem.status).toBe(404);
    expect(wrongGarment.status).toBe(400);
    expect(await Garment.count({ where: { productionId: pid } })).toBe(0);
    expect((await ChangeItem.findByPk(itemId))!.garmentId).toBeNull();
  });

  it("409 on a cancelled fitting", async () => {
    const { fittingId, itemId } = await fittingWithUnlinkedItem(agent, pid);
    await agent.patch(`/api/productions/${pid}/fittings/${fittingId}`, { status: "cancelled" }).expect(200);

    const res = await agent.post(`/api/productions/${pid}/fittings/${fittingId}/items/${itemId}/garment`, {
      newGarment: { name: "Muffler", category: "scarf" },
    });

    expect(res.status).toBe(409);
  });
});
