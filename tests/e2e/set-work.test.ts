// Set work on a phone and at the desk: check-out to a person, tag labels, copies, the phone header and
// menu, wide screens at 390 px, the side-by-side comparison, sign-out, snag undo, recent changes and
// a stage production's wording. Dates come from the app (the demo is anchored to the week it is seeded in).
import { describe, expect, inject, it } from "vitest";
import pg from "pg";
import type { Page } from "playwright-core";
import { useBrowser, signIn } from "./browser.js";
import { GLASS_ORCHARD_ID, SALTMARSH_ID } from "../../seeds/accounts.js";
import { keyGarments, performers } from "../../seeds/scenario.js";
import { formatDate } from "../../shared/format.js";

const baseUrl = inject("baseUrl");
const databaseUrl = inject("databaseUrl");
const browser = useBrowser();
const P = `${baseUrl}/p/${SALTMARSH_ID}`;

let spareCount = 0;
/** A garment in stock that no other e2e test or planned demo conflict relies on (a different one per call). */
async function spareGarment(): Promise<{ id: string; tagCode: string; name: string }> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const { rows } = await client.query<{ id: string; tag_code: string; name: string }>(
      `SELECT id, tag_code, name FROM garments
        WHERE production_id = $1 AND status = 'in_stock' AND multiples_group_id IS NULL AND id <> ALL($2::uuid[])
          AND NOT EXISTS (SELECT 1 FROM garment_checkouts c WHERE c.garment_id = garments.id)
          AND NOT EXISTS (SELECT 1 FROM alteration_tickets t WHERE t.garment_id = garments.id)
        ORDER BY tag_code OFFSET $3 LIMIT 1`,
      [SALTMARSH_ID, Object.values(keyGarments), spareCount++],
    );
    return { id: rows[0]!.id, tagCode: rows[0]!.tag_code, name: rows[0]!.name };
  } finally {
    await client.end();
  }
}

async function box(page: Page, selector: ReturnType<Page["locator"]>) {
  const b = await selector.boundingBox();
  if (!b) throw new Error("element not visible");
  return b;
}

describe("check-out to a person", () => {
  it("on a phone, checks a garment out to a performer for a day and scene; the garment page and the wardrobe list show who has it", async () => {
    const g = await spareGarment();
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${P}/wardrobe/scan`);
    await page.getByRole("group", { name: "Move to" }).getByRole("button", { name: "On set" }).click();
    const toWhom = page.getByLabel("To whom");
    const kit = await toWhom.locator("option", { hasText: performers.jory.name }).getAttribute("value");
    await toWhom.selectOption(kit!);
    const day = page.getByLabel("Shoot day");
    await day.selectOption({ index: 1 });
    const scene = page.getByLabel("Scene");
    await scene.selectOption({ index: 1 });
    const sceneText = (await scene.locator("option:checked").textContent())!.trim();
    const due = await page.getByLabel("Due back").inputValue();
    expect(due).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    await page.getByLabel("Tag code").fill(g.tagCode);
    await page.getByRole("button", { name: "Check out (On set)" }).click();
    const line = page.getByRole("list", { name: "Scanned garments" }).getByRole("listitem").filter({ hasText: g.tagCode });
    await line.getByText(`With ${performers.jory.name}`, { exact: false }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

    await page.goto(`${P}/wardrobe/garments/${g.id}`);
    const who = page.getByRole("group", { name: "Who has it" });
    await who.waitFor();
    expect(await who.textContent()).toContain(`With ${performers.jory.name}`);
    expect(await who.textContent()).toContain(`${sceneText.toLowerCase()}`);
    expect(await who.textContent()).toContain(`due back ${formatDate(due)}`);
    await page.getByRole("table", { name: "Check-outs" }).getByText(performers.jory.name).waitFor();

    await page.goto(`${P}/wardrobe?q=${encodeURIComponent(g.tagCode)}&out=out`);
    const row = page.getByRole("table", { name: "Garments" }).getByRole("row").filter({ hasText: g.tagCode });
    await row.waitFor();
    expect(await row.textContent()).toContain(`With ${performers.jory.name}`);
    await page.screenshot({ path: ".data/e2e-checkout.png", fullPage: true });
    await page.close();
  });
});

describe("the garment page", () => {
  it("prints its own tag label in one click at a chosen sheet position, and Make copies says what it made, clears its field and records it", async () => {
    const g = await spareGarment();
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "designer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/wardrobe/garments/${g.id}`);

    await page.getByLabel("Start at label").selectOption("5");
    const link = page.getByRole("link", { name: "Print tag label (PDF)" });
    const href = (await link.getAttribute("href"))!;
    expect(href).toContain(`ids=${g.id}`);
    expect(href).toContain("start=5");
    const pdf = await page.request.get(`${baseUrl}${href}`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()["content-type"]).toBe("application/pdf");
    expect((await pdf.body()).subarray(0, 5).toString()).toBe("%PDF-");

    const field = page.getByLabel("Make copies");
    await field.fill("2");
    await page.getByRole("button", { name: "Make 2 copies" }).click();
    const made = page.getByRole("status").filter({ hasText: "Made 2 copies" });
    await made.waitFor();
    expect(await made.textContent()).toContain("now #1 of");
    expect(await field.inputValue()).toBe("");
    const history = page.getByRole("table", { name: "Status history" });
    await history.getByText("Copy #2 made").waitFor();
    await history.getByText("Copy #3 made").waitFor();
    await page.close();
  });
});

describe("phone layout at 390 px", () => {
  it("the header stays one row, the menu opens below it with 44 px items, and Today can be tapped", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/team`);
    await page.getByRole("heading", { name: "Team" }).waitFor();

    const header = await box(page, page.locator("header"));
    expect(header.height).toBeLessThanOrEqual(56);
    await page.getByRole("button", { name: "Menu" }).click();
    const nav = page.getByRole("navigation", { name: "Screens" });
    const links = nav.getByRole("link");
    const n = await links.count();
    expect(n).toBeGreaterThan(5);
    for (let i = 0; i < n; i++) {
      const b = await box(page, links.nth(i));
      expect(b.height).toBeGreaterThanOrEqual(44);
      expect(b.y).toBeGreaterThanOrEqual(header.y + header.height);
    }
    const today = await box(page, nav.getByRole("link", { name: "Today" }));
    // What is really on top at Today's centre is Today itself, not the header.
    const onTop = await page.evaluate(
      ([x, y]) => document.elementFromPoint(x!, y!)?.closest("a")?.textContent ?? null,
      [today.x + today.width / 2, today.y + today.height / 2],
    );
    expect(onTop).toBe("Today");
    await nav.getByRole("link", { name: "Today" }).click();
    await page.waitForURL(/\/today$/);
    await page.close();
  });

  it("Team and Digital doubles fit the screen without horizontal scrolling", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${P}/team`);
    await page.getByRole("table", { name: "Members" }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.goto(`${P}/doubles`);
    await page.getByRole("tablist", { name: "Doubles sections" }).waitFor();
    await page.getByRole("table").first().waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.close();
  });

  it("the side-by-side comparison opens where the person is in a long timeline", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/continuity`);
    await page.getByRole("heading", { name: "Timelines" }).waitFor();
    await page.getByRole("link", { name: "Maud Penhallow" }).click();
    const boxes = page.getByRole("checkbox", { name: "Compare" });
    await boxes.first().waitFor();
    const n = await boxes.count();
    expect(n).toBeGreaterThan(8);

    await boxes.nth(n - 2).scrollIntoViewIfNeeded();
    await boxes.nth(n - 2).check();
    await boxes.nth(n - 1).check();
    const dialog = page.getByRole("dialog", { name: "Side by side" });
    await dialog.waitFor();
    const scrolled = await page.evaluate(() => window.scrollY);
    expect(scrolled).toBeGreaterThan(1000);
    const d = await box(page, dialog);
    expect(d.y).toBeGreaterThanOrEqual(0);
    expect(d.y).toBeLessThan(844);
    await dialog.getByRole("button", { name: "Close" }).click();
    expect(await page.evaluate(() => window.scrollY)).toBe(scrolled);
    await page.getByRole("region", { name: "Scenes to compare" }).getByRole("button", { name: "Side by side" }).click();
    await dialog.waitFor();
    await page.close();
  });
});

describe("sign-out", () => {
  it("lands on the plain sign-in page (no redirect back to itself)", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/workroom`);
    await page.getByRole("heading", { name: "Workroom" }).waitFor();

    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(`${baseUrl}/login`);
    await page.getByRole("button", { name: "Sign in" }).waitFor();
    await page.waitForTimeout(500); // any late 401 redirect would have landed by now

    expect(page.url()).toBe(`${baseUrl}/login`);
    await page.close();
  });
});

describe("snags", () => {
  it("after dismissing, an inline Undo appears where the card was and brings the card back", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "designer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/snags`);
    const list = page.getByRole("region", { name: "All snags" });
    const jacket = list.getByRole("article", { name: /Keeper's jacket on Corwen Blakely: tight at chest/ });
    await jacket.waitFor();
    // Position within the list (the page may scroll while the dialog is open).
    const before = (await box(page, jacket)).y - (await box(page, list)).y;

    await jacket.getByRole("button", { name: "Dismiss…" }).click();
    await page.getByLabel("Reason").fill("Let out at the next fitting; accepted for the rehearsal.");
    await page.getByRole("button", { name: "Dismiss snag" }).click();
    const undoLine = list.getByRole("status").filter({ hasText: /Dismissed: .*Keeper's jacket on Corwen Blakely/ });
    await undoLine.waitFor();
    await jacket.waitFor({ state: "detached" });
    const where = (await box(page, undoLine)).y - (await box(page, list)).y;
    expect(Math.abs(where - before)).toBeLessThan(4);

    await undoLine.getByRole("button", { name: "Undo" }).click();
    await jacket.waitFor();
    expect(await undoLine.count()).toBe(0);
    await page.close();
  });

  it("a ticket link opens the Workroom's ticket list on that ticket", async () => {
    const client = new pg.Client({ connectionString: databaseUrl });
    await client.connect();
    const { rows } = await client.query<{ id: string; tag_code: string }>(
      `SELECT t.id, g.tag_code FROM alteration_tickets t JOIN garments g ON g.id = t.garment_id WHERE t.production_id = $1 AND t.status <> 'checked' ORDER BY t.raised_on DESC, t.id LIMIT 1`,
      [SALTMARSH_ID],
    );
    await client.end();
    const ticket = rows[0]!;
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${P}/workroom?tab=tickets&ticket=${ticket.id}`);
    const row = page.locator(`tr[aria-current="true"]`);
    await row.waitFor();

    expect(await row.getAttribute("aria-label")).toBe(`Ticket ${ticket.tag_code}`);
    expect(await page.evaluate(() => document.activeElement?.getAttribute("aria-current"))).toBe("true");
    const b = await box(page, row);
    expect(b.y).toBeGreaterThanOrEqual(0);
    expect(b.y).toBeLessThan(844);
    await page.close();
  });
});

describe("Team's recent changes", () => {
  it("names the record that changed and links to it", async () => {
    const g = await spareGarment();
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${P}/wardrobe/garments/${g.id}`);
    await page.getByLabel("Status", { exact: true }).selectOption("cleaning");
    await page.getByRole("button", { name: "Move" }).click();
    await page.getByRole("table", { name: "Status history" }).getByText("Cleaning").first().waitFor();

    await page.goto(`${P}/team`);
    const link = page
      .getByRole("list", { name: "Recent changes" })
      .getByRole("link", { name: `${g.tagCode} ${g.name}` })
      .first();
    await link.waitFor();
    await link.click();

    await page.waitForURL(`${P}/wardrobe/garments/${g.id}`);
    await page.getByText(g.tagCode, { exact: true }).first().waitFor();
    await page.close();
  });
});

describe("a stage production", () => {
  it("says performance, not shoot day, on its Snags and Workroom screens", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${baseUrl}/p/${GLASS_ORCHARD_ID}/snags`);
    await page.getByLabel("Performance").waitFor();
    expect(await page.locator("main").textContent()).not.toMatch(/shoot day/i);
    await page.goto(`${baseUrl}/p/${GLASS_ORCHARD_ID}/workroom`);
    await page.getByRole("heading", { name: "Workroom" }).waitFor();
    expect(await page.locator("main").textContent()).toMatch(/before which performance/);
    expect(await page.locator("main").textContent()).not.toMatch(/shoot day/i);
    await page.close();
  });
});

describe("fabric tests before cutting", () => {
  it("records shrinkage, colour fastness and a flame-retardancy treatment from the form, with field messages and the fire caution", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    const fabrics = (await (await page.request.get(`${baseUrl}/api/productions/${SALTMARSH_ID}/fabrics`)).json()) as {
      data: Array<{ id: string; name: string }>;
    };
    const fabric = fabrics.data[0]!;
    const made: string[] = [];
    page.on("response", async (r) => {
      if (r.request().method() === "POST" && /\/fabrics\/[^/]+\/tests$/.test(r.url()) && r.status() === 201)
        made.push(((await r.json()) as { data: { id: string } }).data.id);
    });
    try {
      await page.goto(`${P}/fabrics/${fabric.id}`);
      const form = page.getByRole("form", { name: "Record a test" });
      const tests = page.getByRole("table", { name: "Fabric tests" });

      // Shrinkage after washing: ISO 5077 change per pair, (after − before) / before × 100, mean per direction.
      // 350 → 339, 340, 341 mm is a mean of −10/350 = −2.857 %, shown to one decimal; 350 → 352 is +0.571 %.
      await form.getByLabel("Test", { exact: true }).selectOption({ label: "Shrinkage after washing or dry-cleaning (ISO 5077)" });
      const length = form.getByRole("group", { name: "Length (warp / wales)" });
      const width = form.getByRole("group", { name: "Width (weft / courses)" });
      await length.getByLabel("After, pair 1 (mm)").fill("339");
      await length.getByLabel("After, pair 2 (mm)").fill("340");
      await length.getByLabel("After, pair 3 (mm)").fill("341");
      await width.getByLabel("After, pair 1 (mm)").fill("0");
      await form.getByRole("button", { name: "Record test" }).click();
      // A bad reading is named in plain words beside its field, and nothing is recorded.
      await width.getByText("Width pair 1: after must be greater than 0").waitFor();
      await width.getByLabel("After, pair 1 (mm)").fill("352");
      await form.getByRole("button", { name: "Record test" }).click();
      await tests.getByText("length −2.9 %, width +0.6 %", { exact: false }).waitFor();

      // Colour fastness: grade 4-5 on the change-in-colour scale is the pair 0.8 ± 0.2 CIELAB units apart (ISO 105-A02 §2.4).
      await form.getByLabel("Test", { exact: true }).selectOption({ label: "Colour fastness (ISO 105 grey scales)" });
      await form.getByLabel("Change in colour (grade)").selectOption({ label: "4-5" });
      await form.getByLabel("Staining (grade)").selectOption({ label: "3-4" });
      await form.getByRole("button", { name: "Record test" }).click();
      await tests.getByText("change 4-5 (the scale's pair is ΔE*ab 0.8 ± 0.2), staining 3-4", { exact: false }).waitFor();

      // Flame retardancy: the caution is shown first; a blank treatment is refused by name; saving opens the certificate photos.
      await form.getByLabel("Test", { exact: true }).selectOption({ label: "Flame-retardancy treatment" });
      await form.getByText("Local fire codes, the venue and its fire officer decide", { exact: false }).waitFor();
      await form.getByRole("button", { name: "Record test" }).click();
      await form.getByText("Treatment is required").waitFor();
      await form.getByLabel("Treatment (product, applied by)").fill("Invented FR spray, workroom");
      await form.getByLabel("Certificate number").fill("FR-0192");
      await form.getByRole("button", { name: "Record test" }).click();
      await tests.getByText("certificate FR-0192", { exact: false }).waitFor();
      await page.getByText("Certificate: Invented FR spray", { exact: false }).first().waitFor();
      expect(made).toHaveLength(3);
      await page.screenshot({ path: ".data/e2e-care-tests.png", fullPage: true });
    } finally {
      const csrf = ((await (await page.request.get(`${baseUrl}/api/auth/csrf`)).json()) as { token: string }).token;
      for (const id of made)
        await page.request.delete(`${baseUrl}/api/productions/${SALTMARSH_ID}/fabrics/${fabric.id}/tests/${id}`, {
          headers: { "X-CSRF-Token": csrf },
        });
      await page.close();
    }
  });
});
