import { describe, expect, inject, it } from "vitest";
import sharp from "sharp";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { characters } from "../../seeds/scenario.js";
import { anchorDemo, shootDay } from "../../seeds/calendar.js";
import { formatDate } from "../../shared/format.js";

const baseUrl = inject("baseUrl");
// The demo is anchored to the day the server's clock reads (seeds/calendar.ts).
anchorDemo(inject("today"));
const browser = useBrowser();

describe("continuity on a phone", () => {
  it("the set costumer logs a photo for a scene of a shoot day and sees it on the timeline", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    const note = `Cap pushed back, scarf knotted left (e2e ${Date.now()})`;
    const photo = await sharp({ create: { width: 300, height: 400, channels: 3, background: "#3E5C4A" } })
      .jpeg()
      .toBuffer();

    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/continuity`);
    const daySelect = page.getByLabel("Shoot day");
    await daySelect.waitFor();
    const value = await daySelect.locator("option", { hasText: `Day 2 · ${formatDate(shootDay(2))}` }).getAttribute("value");
    await daySelect.selectOption(value!);
    await page.getByRole("button", { name: "Sc 1", exact: true }).click();
    const character = page.getByRole("button", { name: new RegExp(characters.elias.name) });
    await character.click();
    await page.getByLabel("Take photo").setInputFiles({ name: "front.jpg", mimeType: "image/jpeg", buffer: photo });
    await page.getByRole("img", { name: /Front \(not saved yet\)/ }).waitFor();
    await page.getByLabel("Notes").fill(note);
    await page.getByRole("button", { name: /Save continuity/ }).click();
    await page.getByText("Saved.").waitFor();
    await page.getByRole("link", { name: "See the timeline" }).click();
    await page.getByRole("heading", { name: `${characters.elias.name}: continuity` }).waitFor();

    const entry = page.getByText(note);
    await entry.waitFor();
    const card = page.locator("li", { has: page.getByText(note) });
    const thumbs = card.getByRole("img", { name: /Front view/ });
    expect(await thumbs.count()).toBeGreaterThanOrEqual(1);
    // The thumbnail is served through the authenticated route and decodes in the browser.
    await expect
      .poll(async () => thumbs.first().evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 10_000 })
      .toBe(true);
    await page.screenshot({ path: ".data/e2e-continuity.png" });
    await page.close();
  });

  it("the set costumer reads the breakdown but is offered no editing", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });

    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/breakdown`);
    await page.getByRole("table", { name: "Breakdown" }).waitFor();

    expect(await page.getByText("60 of 60 scenes").count()).toBe(1);
    expect(await page.getByRole("button", { name: "Add scene" }).count()).toBe(0);
    await page.close();
  });
});
