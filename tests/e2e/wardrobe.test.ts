import { describe, expect, inject, it } from "vitest";
import pg from "pg";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { keyGarments, performers } from "../../seeds/scenario.js";
import { anchorDemo, demoDaysFromToday } from "../../seeds/calendar.js";
import { formatDate } from "../../shared/format.js";

const baseUrl = inject("baseUrl");
anchorDemo(inject("today"));
const databaseUrl = inject("databaseUrl");
const browser = useBrowser();

describe("measurements as the demo cutter", () => {
  it("records a set in inches and sees it in cm on the performer page, with the size designation", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/cast/performers/${performers.jory.id}/measurements`);
    await page.getByRole("heading", { name: performers.jory.name }).waitFor();
    const form = page.getByRole("form", { name: "New measurement set" });
    // A set taken later than any seeded one, so it becomes the current set.
    const takenOn = demoDaysFromToday(28);
    await form.getByRole("radio", { name: "Inches" }).click();
    await form.getByLabel("Taken on").fill(takenOn);
    await form.getByLabel("Chest girth (in)").fill("40");
    await form.getByLabel("Waist girth (in)").fill("32 1/2");
    await form.getByLabel("Height (in)").fill("70");
    await form.getByRole("button", { name: "Save measurements" }).click();
    await form.getByText("Saved.").waitFor();

    const history = page.getByRole("table", { name: "Measurement history" });
    await history.getByText(`${formatDate(takenOn)} (current)`).waitFor();
    const chestRow = history.getByRole("row", { name: /Chest girth/ });
    // 40 in × 25.4 = 1016 mm exactly → 101.6 cm in the production's unit.
    expect(await chestRow.locator("td").first().textContent()).toContain("101.6 cm");
    // 32 1/2 in = 825.5 mm → 82.6 cm (rounded half away from zero).
    expect(
      await history
        .getByRole("row", { name: /Waist girth/ })
        .locator("td")
        .first()
        .textContent(),
    ).toContain("82.6 cm");
    const sizes = page.getByLabel("Sizes");
    // Men's chest 101.6 cm: grid point 102, whose letter is L ([102, 110) cm, edge → larger; the letter follows
    // the designated value so the two agree); height 177.8 cm → 176 on the 6 cm grid.
    await expect(sizes.textContent()).resolves.toContain("102-176");
    await expect(sizes.textContent()).resolves.toMatch(/102-176\s*L/);
    await page.screenshot({ path: ".data/e2e-measurements.png", fullPage: true });
    await page.close();
  });
});

describe("check in / out as the demo set costumer", () => {
  it("typing a tag code moves the garment to the chosen status in one action", async () => {
    const client = new pg.Client({ connectionString: databaseUrl });
    await client.connect();
    const { rows } = await client.query<{ tag_code: string }>("SELECT tag_code FROM garments WHERE id = $1", [keyGarments.maudShawl]);
    const tag = rows[0]!.tag_code;
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });
    await signIn(page, baseUrl, "setcostumer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/wardrobe/scan`);
    await page.getByRole("button", { name: "Cleaning" }).click();
    await page.getByLabel("Tag code").fill(tag.replace("-", "").toLowerCase());
    await page.keyboard.press("Enter");

    await page.getByRole("list", { name: "Scanned garments" }).getByText("Knitted shawl → Cleaning").waitFor();
    const after = await client.query<{ status: string; n: string }>(
      "SELECT g.status, (SELECT count(*) FROM garment_status_events e WHERE e.garment_id = g.id AND e.to_status = 'cleaning') AS n FROM garments g WHERE g.id = $1",
      [keyGarments.maudShawl],
    );
    expect(after.rows[0]).toEqual({ status: "cleaning", n: "1" });
    await client.end();
    await page.close();
  });
});
