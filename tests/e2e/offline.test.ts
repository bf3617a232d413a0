import { randomUUID } from "node:crypto";
import { describe, expect, inject, it } from "vitest";
import pg from "pg";
import sharp from "sharp";
import type { Page } from "playwright-core";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { characters } from "../../seeds/scenario.js";

const baseUrl = inject("baseUrl");
const databaseUrl = inject("databaseUrl");
const today = inject("today");
const browser = useBrowser();

/** Logs one entry on the continuity screen: scene button, first (or named) character, a photo, notes. */
async function capture(page: Page, scene: string, note: string, photo: Buffer, character?: string) {
  await page.getByRole("button", { name: `Sc ${scene}`, exact: true }).click();
  const picker = page.getByRole("group", { name: "Character" });
  await (character ? picker.getByRole("button", { name: new RegExp(character) }) : picker.getByRole("button").first()).click();
  await page.getByLabel("Take photo").setInputFiles({ name: "front.jpg", mimeType: "image/jpeg", buffer: photo });
  await page.getByRole("img", { name: /Front \(not saved yet\)/ }).waitFor();
  await page.getByLabel("Notes").fill(note);
  await page.getByRole("button", { name: /Save continuity/ }).click();
  await page.getByText("It is sent when the signal is back.").waitFor();
  await page.getByRole("button", { name: "Log another character" }).click();
}

/** The queued records in this page's IndexedDB (without photo bytes). */
const queuedIds = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<string[]>((resolve, reject) => {
        const open = indexedDB.open("seamscene-offline");
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const req = open.result.transaction("queue").objectStore("queue").getAll();
          req.onsuccess = () => {
            resolve((req.result as Array<{ clientId: string }>).map((r) => r.clientId));
            open.result.close();
          };
        };
      }),
  );

describe("continuity without a signal", () => {
  it("three entries with photos captured offline survive a reload and are stored once each when the signal is back", async () => {
    const db = new pg.Client({ connectionString: databaseUrl });
    await db.connect();
    const stamp = Date.now();
    const notes = [1, 2, 3].map((i) => `offline e2e ${stamp} #${i}`);
    // A scene on the first shoot day from today, deleted while its entry waits on the phone.
    const day = (
      await db.query<{ id: string }>("SELECT id FROM shoot_days WHERE production_id = $1 AND date >= $2 ORDER BY date LIMIT 1", [
        SALTMARSH_ID,
        today,
      ])
    ).rows[0]!;
    const firstScene = (
      await db.query<{ number: string }>(
        "SELECT s.number FROM shoot_day_scenes x JOIN scenes s ON s.id = x.scene_id WHERE x.shoot_day_id = $1 ORDER BY x.position LIMIT 1",
        [day.id],
      )
    ).rows[0]!.number;
    const doomed = randomUUID();
    await db.query("INSERT INTO scenes (id, production_id, number, story_order) VALUES ($1, $2, 'E2E9', 9999)", [doomed, SALTMARSH_ID]);
    await db.query("INSERT INTO appearances (id, production_id, scene_id, character_id) VALUES ($1, $2, $3, $4)", [
      randomUUID(),
      SALTMARSH_ID,
      doomed,
      characters.elias.id,
    ]);
    await db.query("INSERT INTO shoot_day_scenes (id, production_id, shoot_day_id, scene_id, position) VALUES ($1, $2, $3, $4, 999)", [
      randomUUID(),
      SALTMARSH_ID,
      day.id,
      doomed,
    ]);

    const context = await browser().newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    try {
      await signIn(page, baseUrl, "setcostumer@seamscene.test");
      await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
      await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/continuity`);
      // The next shoot days are on the phone, and the service worker holds the app shell.
      await page.getByText(/Saved for offline at \d\d:\d\d/).waitFor({ timeout: 30_000 });
      await page.waitForFunction(() => navigator.serviceWorker?.controller !== null, undefined, { timeout: 30_000 });

      await context.setOffline(true);
      const photo = await sharp({ create: { width: 3000, height: 4000, channels: 3, background: "#5A4A3E" } })
        .jpeg()
        .toBuffer();
      await capture(page, firstScene, notes[0]!, photo);
      await capture(page, firstScene, notes[1]!, photo);
      await capture(page, "E2E9", notes[2]!, photo, characters.elias.name);
      await expect.poll(() => page.getByTestId("queue-count").textContent()).toBe("3");
      // A fourth, cancelled from the badge's list: it leaves the phone and is never sent.
      const cancelled = `offline e2e ${stamp} cancelled`;
      await capture(page, firstScene, cancelled, photo);
      await expect.poll(() => page.getByTestId("queue-count").textContent()).toBe("4");
      await page.getByRole("button", { name: /waiting/ }).click();
      const queue = page.getByRole("region", { name: "Waiting to be sent" });
      await queue.getByRole("listitem").nth(3).waitFor();
      await page.screenshot({ path: ".data/e2e-offline-queue.png" });
      await queue
        .getByRole("button", { name: /^Cancel: / })
        .last()
        .click();
      await page.getByRole("dialog", { name: "Cancel this record?" }).getByRole("button", { name: "Cancel it" }).click();
      await expect.poll(() => page.getByTestId("queue-count").textContent()).toBe("3");
      expect((await db.query("SELECT 1 FROM continuity_entries WHERE notes = ANY($1)", [[...notes, cancelled]])).rowCount).toBe(0);

      // A reload without a signal: the shell comes from the service worker, the queue from IndexedDB.
      await page.reload();
      await expect.poll(() => page.getByTestId("queue-count").textContent()).toBe("3");
      const ids = await queuedIds(page);
      expect(ids.length).toBe(3);
      // Keep a copy of the first record, to send it a second time later.
      await page.evaluate(
        (id) =>
          new Promise<void>((resolve) => {
            const open = indexedDB.open("seamscene-offline");
            open.onsuccess = () => {
              const req = open.result.transaction("queue").objectStore("queue").index("byClientId").get(id);
              req.onsuccess = () => {
                (window as unknown as { keptCopy: unknown }).keptCopy = req.result;
                open.result.close();
                resolve();
              };
            };
          }),
        ids[0]!,
      );

      // The scene goes while its entry waits.
      await db.query("DELETE FROM scenes WHERE id = $1", [doomed]);

      await context.setOffline(false);
      await expect.poll(() => queuedIds(page), { timeout: 60_000 }).toEqual([]);
      expect((await db.query("SELECT 1 FROM continuity_entries WHERE notes = $1", [cancelled])).rowCount).toBe(0);
      const rows = (
        await db.query<{
          id: string;
          notes: string;
          scene_id: string | null;
          client_id: string;
          review_reasons: Array<{ code: string }>;
          photos: number;
        }>(
          `SELECT e.id, e.notes, e.scene_id, e.client_id, e.review_reasons,
                  (SELECT count(*)::int FROM photos p WHERE p.owner_type = 'continuity_entry' AND p.owner_id = e.id) AS photos
             FROM continuity_entries e WHERE e.notes = ANY($1) ORDER BY e.notes`,
          [notes],
        )
      ).rows;
      expect(rows.map((r) => r.notes)).toEqual(notes);
      expect(rows.map((r) => r.photos)).toEqual([1, 1, 1]);
      expect(new Set(rows.map((r) => r.client_id))).toEqual(new Set(ids));
      // The entry for the deleted scene is kept, without its scene, and marked for review.
      expect(rows[2]!.scene_id).toBeNull();
      expect(JSON.stringify(rows[2]!.review_reasons)).toContain("scene_deleted");
      expect(rows[0]!.review_reasons).toEqual([]);
      // The photo was reduced on the phone: long edge 2,400 px (the server records the size it received).
      const dims = (
        await db.query<{ width: number; height: number }>(
          "SELECT width, height FROM photos WHERE owner_type = 'continuity_entry' AND owner_id = $1",
          [rows[0]!.id],
        )
      ).rows;
      expect(dims).toEqual([{ width: 1800, height: 2400 }]);

      // The same queued record sent a second time: the server answers the stored entry, one row.
      await page.evaluate(
        () =>
          new Promise<void>((resolve, reject) => {
            const copy = { ...(window as unknown as { keptCopy: Record<string, unknown> }).keptCopy };
            delete copy.seq;
            const open = indexedDB.open("seamscene-offline");
            open.onsuccess = () => {
              const tx = open.result.transaction("queue", "readwrite");
              tx.objectStore("queue").add(copy);
              tx.oncomplete = () => {
                open.result.close();
                resolve();
              };
              tx.onerror = () => reject(tx.error);
            };
          }),
      );
      expect((await queuedIds(page)).length).toBe(1);
      await page.reload();
      await expect.poll(() => queuedIds(page), { timeout: 60_000 }).toEqual([]);
      expect((await db.query("SELECT 1 FROM continuity_entries WHERE client_id = $1", [ids[0]])).rowCount).toBe(1);
      await page.screenshot({ path: ".data/e2e-offline.png", fullPage: true });
    } finally {
      await context.close();
      await db.query("DELETE FROM scenes WHERE id = $1", [doomed]);
      await db.end();
    }
  });
});
