// Per-request costs and caching headers: the session is re-saved at most every few minutes, JSON is
// compressed, hashed client assets are cached for a year.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import express from "express";
import request from "supertest";
import { QueryTypes } from "sequelize";
import { beforeEach, describe, expect, it } from "vitest";
import { createApp, serveBuiltClient } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { SESSION_TOUCH_INTERVAL_MS } from "../../server/middleware/session-touch.js";
import { buildGarment, buildMember } from "../factories.js";
import { resetDb, signedInAgent } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

async function sessionRow(): Promise<{ expire: Date; touchedAt: number | null }> {
  const rows = await sequelize.query<{ expire: Date; touched_at: string | null }>(
    `SELECT expire, sess->>'touchedAt' AS touched_at FROM session`,
    { type: QueryTypes.SELECT },
  );
  expect(rows).toHaveLength(1);
  return { expire: rows[0]!.expire, touchedAt: rows[0]!.touched_at === null ? null : Number(rows[0]!.touched_at) };
}

describe("session", () => {
  it("is neither re-saved nor its cookie re-sent on each request", async () => {
    const { user } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    const before = await sessionRow();

    const res = await agent.get("/api/auth/me").expect(200);
    await agent.get("/api/auth/me").expect(200);

    expect(res.headers["set-cookie"]).toBeUndefined();
    expect(await sessionRow()).toEqual(before);
  });

  it("moves its expiry forward once the last touch is older than the interval", async () => {
    const { user } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    const longAgo = Date.now() - SESSION_TOUCH_INTERVAL_MS - 1000;
    await sequelize.query(
      `UPDATE session SET sess = jsonb_set(sess::jsonb, '{touchedAt}', to_jsonb(:t::bigint))::json, expire = expire - interval '1 day'`,
      { replacements: { t: longAgo } },
    );
    const before = await sessionRow();

    const res = await agent.get("/api/auth/me").expect(200);

    const after = await sessionRow();
    expect(res.headers["set-cookie"]?.[0]).toMatch(/^seamscene\.sid=/);
    expect(after.touchedAt).toBeGreaterThan(longAgo);
    expect(after.expire.getTime()).toBeGreaterThan(before.expire.getTime());
  });
});

describe("compression", () => {
  it("sends a list as brotli or gzip when the client accepts it, and plain otherwise", async () => {
    const { user, production } = await buildMember("supervisor");
    for (let i = 0; i < 30; i++) await buildGarment({ production, name: `Waistcoat ${i}` });
    const agent = await signedInAgent(app, user.email);
    const url = `/api/productions/${production.id}/garments?pageSize=50`;

    const br = await agent.get(url).set("Accept-Encoding", "br").expect(200);
    const gz = await agent.get(url).set("Accept-Encoding", "gzip").expect(200);
    const plain = await agent.get(url).set("Accept-Encoding", "identity").expect(200);

    expect(br.headers["content-encoding"]).toBe("br");
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(plain.headers["content-encoding"]).toBeUndefined();
    // supertest decodes what it received: the same list whichever way it travelled.
    expect(gz.body).toEqual(plain.body);
    expect(plain.body.data).toHaveLength(30);
  });
});

describe("the built client", () => {
  it("caches hashed assets for a year and revalidates index.html", async () => {
    const dist = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-dist-"));
    fs.mkdirSync(path.join(dist, "assets"));
    fs.writeFileSync(path.join(dist, "index.html"), "<!doctype html><title>Seamscene</title>");
    fs.writeFileSync(path.join(dist, "assets", "index-Bx3f9aQ1.js"), "console.log('x');\n".repeat(200));
    fs.writeFileSync(path.join(dist, "favicon.svg"), "<svg xmlns='http://www.w3.org/2000/svg'/>");
    const web = express();
    serveBuiltClient(web, dist);

    const asset = await request(web).get("/assets/index-Bx3f9aQ1.js").expect(200);
    const page = await request(web).get("/p/some/screen").expect(200);
    const icon = await request(web).get("/favicon.svg").expect(200);

    expect(asset.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
    expect(page.headers["cache-control"]).toBe("no-cache");
    expect(page.text).toContain("<title>Seamscene</title>");
    expect(icon.headers["cache-control"]).toBe("no-cache");
    fs.rmSync(dist, { recursive: true, force: true });
  });
});
