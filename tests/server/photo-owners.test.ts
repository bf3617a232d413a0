import { beforeEach, describe, expect, it } from "vitest";
import sharp from "sharp";
import { createApp } from "../../server/app.js";
import { Photo } from "../../server/models/index.js";
import { buildFabric, buildGarment, buildMember, buildProduction } from "../factories.js";
import { resetDb, signedInAgent } from "../setup/http.js";

const app = createApp();
const png = () =>
  sharp({ create: { width: 40, height: 30, channels: 3, background: { r: 181, g: 69, b: 46 } } })
    .png()
    .toBuffer();

beforeEach(async () => {
  await resetDb();
});

async function upload(email: string, pid: string, ownerType: string, ownerId: string) {
  const agent = await signedInAgent(app, email);
  return agent.agent
    .post(`/api/productions/${pid}/photos`)
    .set("X-CSRF-Token", agent.csrf)
    .field("ownerType", ownerType)
    .field("ownerId", ownerId)
    .field("view", "front")
    .attach("file", await png(), { filename: "swatch.png", contentType: "image/png" });
}

describe("photos of wardrobe records", () => {
  it("a designer adds a garment photo; a set costumer may see it but not add one", async () => {
    const { user: designer, production } = await buildMember("designer");
    const { user: setCostumer } = await buildMember("set_costumer", { production });
    const garment = await buildGarment({ production });

    const added = await upload(designer.email, production.id, "garment", garment.id);
    const refused = await upload(setCostumer.email, production.id, "garment", garment.id);
    const list = await (
      await signedInAgent(app, setCostumer.email)
    ).get(`/api/productions/${production.id}/photos?ownerType=garment&ownerId=${garment.id}`);

    expect(added.status).toBe(201);
    expect(refused.status).toBe(403);
    expect(list.body.data).toHaveLength(1);
  });

  it("refuses a fabric of another production with 404 and stores nothing", async () => {
    const { user, production } = await buildMember("cutter");
    const elsewhere = await buildFabric({ production: await buildProduction() });

    const res = await upload(user.email, production.id, "fabric", elsewhere.id);

    expect(res.status).toBe(404);
    expect(await Photo.count()).toBe(0);
  });
});

describe("before and after photos of an alteration", () => {
  it("the cutter adds one to a ticket; the set costumer, who only reads tickets, may not", async () => {
    const { user: cutter, production } = await buildMember("cutter");
    const { user: setCostumer } = await buildMember("set_costumer", { production });
    const garment = await buildGarment({ production });
    const agent = await signedInAgent(app, cutter.email);
    const ticket = await agent.post(`/api/productions/${production.id}/alterations`, {
      garmentId: garment.id,
      tasks: [{ kind: "repair", note: "torn pocket" }],
      estimateHours: 1,
    });
    expect(ticket.status).toBe(201);

    const before = await upload(cutter.email, production.id, "alteration_ticket", ticket.body.data.id);
    const refused = await upload(setCostumer.email, production.id, "alteration_ticket", ticket.body.data.id);

    expect(before.status).toBe(201);
    expect(refused.status).toBe(403);
    expect(await Photo.count({ where: { ownerType: "alteration_ticket" } })).toBe(1);
  });
});
