import { describe, expect, inject, it } from "vitest";
import { useBrowser, signIn } from "./browser.js";
import { GLASS_ORCHARD_ID, SALTMARSH_ID } from "../../seeds/accounts.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();

// The demo data is built to contain one conflict of each kind (seeds/scenario.ts plannedConflicts).
// Fit, multiples, continuity and the quick change do not depend on today's date.
describe("Snags screen for the demo supervisor", () => {
  it("shows the demo's planned conflicts, each explained with its numbers", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });

    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.getByRole("button", { name: "Menu" }).click();
    await page.getByRole("navigation", { name: "Screens" }).getByRole("link", { name: "Snags" }).click();
    await page.getByRole("heading", { name: "Snags" }).waitFor();
    // The Snags screen's own list: Today's short list can hold the same card, without the numbers.
    const list = page.getByRole("region", { name: "All snags" });
    const jacket = list.getByRole("article", { name: /Keeper's jacket on Corwen Blakely: tight at chest/ });
    await jacket.waitFor();

    expect(await jacket.textContent()).toMatch(/Chest ease is 25 mm; a fitted jacket needs 38–51 mm: tight by 13 mm/);
    expect(await list.getByRole("article", { name: /Silas's storm oilskin.*2 copies, 3 needed/ }).count()).toBe(1);
    expect(await list.getByRole("article", { name: /Maud Penhallow: change 2 → 3 within story day 4/ }).count()).toBe(1);
    await page.screenshot({ path: ".data/e2e-snags.png", fullPage: true });
    await page.close();
  });

  it("dismisses a snag with a reason, hides it, and the undo brings it back", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "designer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/snags`);
    const maud = page
      .getByRole("region", { name: "All snags" })
      .getByRole("article", { name: /Maud Penhallow: change 2 → 3 within story day 4/ });
    await maud.waitFor();

    await maud.getByRole("button", { name: "Dismiss…" }).click();
    await page.getByRole("button", { name: "Dismiss snag" }).click();
    await page.getByText("is required", { exact: false }).or(page.getByRole("alert")).first().waitFor();
    await page.getByLabel("Reason").fill("Scene 19 is after the storm: the script has her change off camera.");
    await page.getByRole("button", { name: "Dismiss snag" }).click();
    await maud.waitFor({ state: "detached" });
    await page.getByLabel("Show dismissed").click();
    const dismissed = page.getByRole("article", { name: /Maud Penhallow: change 2 → 3/ });
    await dismissed.getByText("dismissed", { exact: true }).waitFor();
    await dismissed.getByRole("button", { name: "Undo dismissal" }).click();
    await dismissed.getByRole("button", { name: "Dismiss…" }).waitFor();

    expect(await dismissed.textContent()).not.toContain("Dismissed by");
    await page.close();
  });

  it("the stage demo flags Nell's quick change under the production's threshold", async () => {
    const page = await browser().newPage();
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    const res = await page.request.get(`${baseUrl}/api/productions/${GLASS_ORCHARD_ID}/snags`);
    const snags = ((await res.json()) as { data: { snags: Array<{ kind: string; title: string }> } }).data.snags;

    expect(snags.map((s) => s.kind)).toEqual(["quick_change"]);
    expect(snags[0]!.title).toMatch(/Nell Ashby: 1.5 min/);
    await page.close();
  });
});
