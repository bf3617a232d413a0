// The shoot-day editor, the scene form, the merge import with its preview and the fitting with an
// unlinked item. Demo dates move with the week the demo is seeded in, so every date and id here is
// read from the API or the page, never written into the test. Each test puts back what it changed.
import { describe, expect, inject, it } from "vitest";
import type { APIRequestContext, Page } from "playwright-core";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { formatDate } from "../../shared/format.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();
const api = `${baseUrl}/api/productions/${SALTMARSH_ID}`;

/** JSON from the API with the page's session (and its CSRF token for writes). */
async function call<T>(page: Page, method: "GET" | "POST" | "PATCH" | "DELETE", url: string, body?: unknown): Promise<T> {
  const req: APIRequestContext = page.request;
  const headers: Record<string, string> = {};
  if (method !== "GET") headers["X-CSRF-Token"] = ((await (await req.get(`${baseUrl}/api/auth/csrf`)).json()) as { token: string }).token;
  const res = await req.fetch(url, { method, headers, data: body });
  expect(res.ok(), `${method} ${url}: ${res.status()} ${await res.text()}`).toBe(true);
  return res.status() === 204 ? (undefined as T) : ((await res.json()) as { data: T }).data;
}

interface Day {
  id: string;
  dayNumber: number;
  date: string;
  kind: string;
  scenes: Array<{ id: string; number: string }>;
}
interface Snag {
  kind: string;
  title: string;
  shootDays: Array<{ id: string; date: string }>;
}

async function signedIn(email: string, width = 1280) {
  const page = await browser().newPage({ viewport: { width, height: 900 } });
  await signIn(page, baseUrl, email);
  await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
  return page;
}

describe("the shoot-day editor", () => {
  it("reorders a day by keyboard and by dragging, and the day's multiples snag goes and comes back", async () => {
    const page = await signedIn("supervisor@seamscene.test");
    // The demo's multiples conflict: on one day the oilskin's scenes are shot in falling distress order.
    const before = await call<{ snags: Snag[] }>(page, "GET", `${api}/snags?kind=multiples`);
    const snag = before.snags.find((s) => s.shootDays.length === 1)!;
    expect(snag, "the demo has a multiples snag on one shoot day").toBeTruthy();
    const day = await call<Day>(page, "GET", `${api}/shoot-days/${snag.shootDays[0]!.id}`);
    const original = day.scenes.map((s) => s.number);
    const last = original.at(-1)!;
    try {
      await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/breakdown`);
      await page.getByRole("tab", { name: "Shoot days" }).click();
      await page
        .getByRole("navigation", { name: "Shoot days" })
        .getByRole("button", { name: new RegExp(`^Day ${day.dayNumber} · ${formatDate(day.date)}`) })
        .click();
      const list = page.getByRole("list", { name: `Scenes of Day ${day.dayNumber}` });
      await list.waitFor();
      const panel = page.getByRole("region", { name: `Snags for ${formatDate(day.date)}` });
      await panel.getByText(snag.title).waitFor();
      const order = async () => (await list.getByRole("link").allTextContents()).map((t) => t.replace("Scene ", ""));

      // Keyboard: lift the last scene, move it up to the top, drop it.
      const handle = list.getByRole("button", { name: new RegExp(`^Reorder scene ${last} `) });
      await handle.focus();
      await page.keyboard.press("Space");
      await page.waitForTimeout(300);
      for (let i = 1; i < original.length; i++) {
        await page.keyboard.press("ArrowUp");
        await page.waitForTimeout(500);
      }
      await page.keyboard.press("Space");
      await expect.poll(order).toEqual([last, ...original.slice(0, -1)]);
      await expect.poll(async () => panel.getByText(snag.title).count(), { timeout: 10_000 }).toBe(0);
      await page.screenshot({ path: ".data/e2e-shoot-day-reordered.png", fullPage: true });

      // Mouse: drag that scene from the top back to the bottom; the snag is back.
      const from = await list.getByRole("button", { name: new RegExp(`^Reorder scene ${last} `) }).boundingBox();
      const to = await list.getByRole("button", { name: new RegExp(`^Reorder scene ${original.at(-2)} `) }).boundingBox();
      await page.mouse.move(from!.x + from!.width / 2, from!.y + from!.height / 2);
      await page.mouse.down();
      await page.mouse.move(from!.x + from!.width / 2, from!.y + from!.height / 2 + 10, { steps: 3 });
      await page.mouse.move(to!.x + to!.width / 2, to!.y + to!.height / 2 + 12, { steps: 12 });
      await page.mouse.up();
      await expect.poll(order).toEqual(original);
      await panel.getByText(snag.title).waitFor({ timeout: 10_000 });
      expect((await call<Day>(page, "GET", `${api}/shoot-days/${day.id}`)).scenes.map((s) => s.number)).toEqual(original);
    } finally {
      // Whatever happened, the demo day gets its order back for the other tests.
      await call(page, "PATCH", `${api}/shoot-days/${day.id}`, { sceneIds: day.scenes.map((s) => s.id) });
      await page.close();
    }
  });

  it("adds and dates a day, puts scenes on it, moves one to another day with undo, takes one off, and deletes the day after asking", async () => {
    const page = await signedIn("designer@seamscene.test");
    const days = await call<Day[]>(page, "GET", `${api}/shoot-days?pageSize=500`);
    const lastDay = [...days].sort((a, b) => a.date.localeCompare(b.date)).at(-1)!;
    const number = Math.max(...days.map((d) => d.dayNumber)) + 1;
    // A date after every shoot day, from the data: a fortnight past the last one.
    const date = new Date(Date.parse(`${lastDay.date}T00:00:00Z`) + 14 * 86_400_000).toISOString().slice(0, 10);
    const candidates = lastDay.scenes.slice(0, 2).map((s) => s.number);

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/breakdown`);
    await page.getByRole("tab", { name: "Shoot days" }).click();
    const add = page.getByRole("form", { name: "Add a shoot day" });
    await add.getByRole("button", { name: "Add shoot day" }).click();
    await add.getByText("Choose the date.").waitFor();
    await add.getByLabel("Date").fill(date);
    await add.getByRole("button", { name: "Add shoot day" }).click();
    const section = page.getByRole("region", { name: `Day ${number}, ${formatDate(date)}` });
    await section.getByText("No scenes on this day yet.").waitFor();

    for (const n of candidates) {
      const select = section.getByLabel("Put a scene on this day");
      const value = await select
        .locator("option", { hasText: new RegExp(`^${n} `) })
        .first()
        .getAttribute("value");
      await select.selectOption(value!);
      await section.getByRole("button", { name: "Add to day" }).click();
      await section.getByRole("link", { name: `Scene ${n}` }).waitFor();
    }
    const list = section.getByRole("list", { name: `Scenes of Day ${number}` });
    expect((await list.getByRole("link").allTextContents()).map((t) => t.replace("Scene ", ""))).toEqual(candidates);

    // Move the first scene to the last demo day, then undo.
    const moveSelect = section.getByLabel(`Move scene ${candidates[0]} to`);
    const target = await moveSelect
      .locator("option", { hasText: `Day ${lastDay.dayNumber} · ${formatDate(lastDay.date)}` })
      .getAttribute("value");
    const lastBefore = (await call<Day>(page, "GET", `${api}/shoot-days/${lastDay.id}`)).scenes.map((s) => s.number);
    // It is already on that day (we copied it from there), so the server refuses and nothing changes.
    await moveSelect.selectOption(target!);
    await section.getByRole("button", { name: "Move", exact: true }).first().click();
    await section.getByRole("alert").getByText(`is already on day ${lastDay.dayNumber}`).waitFor();
    // A day that does not have it: the day before the last.
    const other = [...days]
      .sort((a, b) => a.date.localeCompare(b.date))
      .reverse()
      .find((d) => d.kind === "shoot" && !d.scenes.some((s) => s.number === candidates[0]))!;
    const otherValue = await moveSelect
      .locator("option", { hasText: `Day ${other.dayNumber} · ${formatDate(other.date)}` })
      .getAttribute("value");
    await moveSelect.selectOption(otherValue!);
    await section.getByRole("button", { name: "Move", exact: true }).first().click();
    await section.getByRole("status").getByText(`Scene ${candidates[0]} moved to Day ${other.dayNumber}`).waitFor();
    expect((await call<Day>(page, "GET", `${api}/shoot-days/${other.id}`)).scenes.map((s) => s.number)).toContain(candidates[0]);
    await section.getByRole("button", { name: "Undo" }).click();
    await list.getByRole("link", { name: `Scene ${candidates[0]}` }).waitFor();
    expect((await call<Day>(page, "GET", `${api}/shoot-days/${other.id}`)).scenes.map((s) => s.number)).not.toContain(candidates[0]);
    expect((await call<Day>(page, "GET", `${api}/shoot-days/${lastDay.id}`)).scenes.map((s) => s.number)).toEqual(lastBefore);

    // Take one off; it is gone from the day, and Undo is offered.
    await section.getByRole("button", { name: `Take off scene ${candidates[1]}` }).click();
    await section.getByRole("status").getByText(`Scene ${candidates[1]} taken off Day ${number}.`).waitFor();
    expect(await list.getByRole("link", { name: `Scene ${candidates[1]}` }).count()).toBe(0);

    // Redate it, then delete: Cancel keeps it; confirming deletes it.
    const later = new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    const details = section.getByRole("form", { name: `Details of Day ${number}` });
    await details.getByLabel("Date").fill(later);
    await details.getByRole("button", { name: "Save day" }).click();
    const redated = page.getByRole("region", { name: `Day ${number}, ${formatDate(later)}` });
    await redated.waitFor();
    await page.screenshot({ path: ".data/e2e-shoot-day-editor.png", fullPage: true });
    await redated.getByRole("button", { name: "Delete shoot day" }).click();
    const dialog = page.getByRole("dialog", { name: `Delete Day ${number} (${formatDate(later)})?` });
    await dialog.getByRole("button", { name: "Cancel" }).click();
    expect((await call<Day[]>(page, "GET", `${api}/shoot-days?pageSize=500`)).some((d) => d.dayNumber === number)).toBe(true);
    await redated.getByRole("button", { name: "Delete shoot day" }).click();
    await dialog.getByRole("button", { name: `Delete day ${number}` }).click();
    await expect
      .poll(async () => (await call<Day[]>(page, "GET", `${api}/shoot-days?pageSize=500`)).some((d) => d.dayNumber === number))
      .toBe(false);
    await page.close();
  });

  it("edits a scene in the form and refuses a page length that is not in eighths", async () => {
    const page = await signedIn("designer@seamscene.test");
    const scenes = await call<Array<{ id: string; number: string; synopsis: string | null; setName: string | null }>>(
      page,
      "GET",
      `${api}/scenes?pageSize=5000`,
    );
    const scene = scenes[0]!;

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/breakdown/scenes/${scene.id}`);
    await page.getByRole("button", { name: "Edit scene" }).click();
    const form = page.getByRole("form", { name: `Edit scene ${scene.number}` });
    await form.getByLabel("Pages").fill("1.5");
    await form.getByLabel("Synopsis").fill("Edited in the end-to-end test");
    await form.getByRole("button", { name: "Save scene" }).click();
    await form.getByText("Write the length in eighths of a page").waitFor();
    await form.getByLabel("Pages").fill("1 4/8");
    await form.getByRole("button", { name: "Save scene" }).click();
    await form.getByText("Saved.").waitFor();

    const saved = await call<{ synopsis: string; lengthEighths: number; setName: string | null }>(page, "GET", `${api}/scenes/${scene.id}`);
    expect(saved).toMatchObject({ synopsis: "Edited in the end-to-end test", lengthEighths: 12, setName: scene.setName });
    await call(page, "PATCH", `${api}/scenes/${scene.id}`, { synopsis: scene.synopsis });
    await page.close();
  });
});

describe("the breakdown import merges and shows old → new first", () => {
  it("a file with only scene and synopsis shows the change per field, imports it and keeps every other field", async () => {
    const page = await signedIn("designer@seamscene.test");
    const scenes = await call<
      Array<{
        id: string;
        number: string;
        synopsis: string | null;
        setName: string | null;
        intExt: string | null;
        storyDay: number | null;
        lengthEighths: number | null;
      }>
    >(page, "GET", `${api}/scenes?pageSize=5000`);
    const scene = scenes.find((s) => s.synopsis && s.setName)!;
    const csv = `scene,synopsis\r\n${scene.number},"Merged by the end-to-end test"\r\n`;

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/breakdown`);
    await page.getByRole("tab", { name: "Import / export" }).click();
    await page.getByText("Columns and what each accepts").click();
    await page.getByText("(clear)").first().waitFor();
    const template = await page.request.get(`${api}/imports/breakdown/template`);
    expect(await template.text()).toContain("# shoot_position:");
    await page.getByLabel("Import a CSV file").setInputFiles({ name: "synopsis.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    const preview = page.getByRole("region", { name: "Import preview" });
    const row = preview
      .getByRole("table", { name: "Changes per row" })
      .getByRole("row")
      .filter({ hasText: "Merged by the end-to-end test" });
    await row.waitFor();
    const cells = (await row.getByRole("cell").allTextContents()).map((t) => t.replace(/\s+/g, " ").trim());
    expect(cells.slice(0, 3)).toEqual(["2", scene.number, "changed"]);
    expect(cells[3]).toBe(`synopsis: ${scene.synopsis} → becomes Merged by the end-to-end test`.replace(/\s+/g, " "));
    // Nothing is written by the preview.
    expect((await call<{ synopsis: string }>(page, "GET", `${api}/scenes/${scene.id}`)).synopsis).toBe(scene.synopsis);
    await page.screenshot({ path: ".data/e2e-import-preview.png", fullPage: true });

    await preview.getByRole("button", { name: "Import 1 row" }).click();
    await preview.getByText(/Imported: 0 new and 1 changed scenes/).waitFor();
    const after = await call<typeof scene>(page, "GET", `${api}/scenes/${scene.id}`);
    expect(after).toMatchObject({
      synopsis: "Merged by the end-to-end test",
      setName: scene.setName,
      intExt: scene.intExt,
      storyDay: scene.storyDay,
      lengthEighths: scene.lengthEighths,
    });
    await call(page, "PATCH", `${api}/scenes/${scene.id}`, { synopsis: scene.synopsis });
    await page.close();
  });
});

describe("a fitting with a change item that has no garment", () => {
  it("the cutter adds the garment at the fitting, raises the ticket, and cancelling the fitting asks first", async () => {
    const supervisor = await signedIn("supervisor@seamscene.test");
    const changes = await call<
      Array<{ id: string; characterId: string; items: Array<{ label: string; garmentId: string | null; multiplesGroupId: string | null }> }>
    >(supervisor, "GET", `${api}/changes`);
    const characters = await call<Array<{ id: string; performer: { id: string } | null }>>(supervisor, "GET", `${api}/characters`);
    const performerOf = (c: { characterId: string }) => characters.find((x) => x.id === c.characterId)?.performer?.id;
    const change = changes.filter((c) => c.items.some((i) => !i.garmentId && !i.multiplesGroupId) && performerOf(c)).at(-1)!;
    expect(change, "the demo has a change with an unlinked item").toBeTruthy();
    const item = change.items.find((i) => !i.garmentId && !i.multiplesGroupId)!;
    const performerId = performerOf(change)!;
    const today = (await call<{ today: string }>(supervisor, "GET", `${baseUrl}/api/productions/${SALTMARSH_ID}`)).today;
    const fitting = await call<{ id: string; performerName: string }>(supervisor, "POST", `${api}/fittings`, {
      performerId,
      changeId: change.id,
      startsAt: `${today}T15:00:00Z`,
      durationMinutes: 30,
      room: "E2E room",
    });
    await supervisor.close();

    const page = await signedIn("cutter@seamscene.test", 820);
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/workroom/fittings/${fitting.id}`);
    await page.getByRole("heading", { name: `Fitting: ${fitting.performerName}` }).waitFor();
    await page.getByRole("button", { name: `Link a garment to ${item.label}` }).click();
    const box = page.getByRole("group", { name: `Link a garment to ${item.label}` });
    await box.getByLabel("Tag code or name").fill("zzqx");
    await box.getByText("Nothing in stock matches").waitFor();
    await box.getByRole("button", { name: "Add a new garment" }).click();
    const form = box.getByRole("form", { name: "New garment" });
    await form.getByRole("button", { name: "Add to stock and link" }).click();
    await form.getByText("Give a category, such as scarf or jacket.").waitFor();
    await form.getByLabel("Category").fill("scarf");
    await form.getByLabel("Size").fill("one size");
    await form.getByRole("button", { name: "Add to stock and link" }).click();

    // Linked: the ticket form opens for the new garment.
    const ticket = page.getByRole("form", { name: /New alteration ticket for/ });
    await ticket.waitFor();
    await ticket.getByLabel("Task 1").selectOption("repair");
    await ticket.getByLabel("Estimated hours").fill("1");
    await ticket.getByRole("button", { name: "Raise ticket" }).click();
    await page.getByRole("list", { name: "Tickets from this fitting" }).getByText(item.label).waitFor();
    const detail = await call<{ tickets: Array<{ id: string }>; items: Array<{ label: string; garmentId: string | null }> }>(
      page,
      "GET",
      `${api}/fittings/${fitting.id}`,
    );
    expect(detail.items.find((i) => i.label === item.label)?.garmentId).toBeTruthy();
    await page.screenshot({ path: ".data/e2e-fitting-linked.png", fullPage: true });

    // Cancel fitting asks first; "Cancel" in the dialog keeps the booking.
    await page.getByRole("button", { name: "Cancel fitting…" }).click();
    const dialog = page.getByRole("dialog", { name: `Cancel the fitting with ${fitting.performerName}?` });
    await dialog.getByText(/e-mailed a cancellation|no e-mail address/).waitFor();
    await dialog.getByRole("button", { name: "Cancel", exact: true }).click();
    expect((await call<{ status: string }>(page, "GET", `${api}/fittings/${fitting.id}`)).status).toBe("booked");
    await page.getByRole("button", { name: "Cancel fitting…" }).click();
    await dialog.getByRole("button", { name: "Cancel fitting and e-mail" }).click();
    await expect.poll(async () => (await call<{ status: string }>(page, "GET", `${api}/fittings/${fitting.id}`)).status).toBe("cancelled");
    // Put the workroom's hours back for the other tests: the ticket is finished.
    for (const t of detail.tickets)
      for (const status of ["in_progress", "done"]) await call(page, "POST", `${api}/alterations/${t.id}/status`, { status });
    await page.close();
  });
});
