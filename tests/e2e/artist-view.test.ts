import { describe, expect, inject, it } from "vitest";
import { useBrowser, signIn } from "./browser.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();

describe("the artist's view of a packet", () => {
  it("shows a vfx artist the panels, fabrics with the re-test, shots and what changed since their last receipt, at tablet width", async () => {
    // The supervisor publishes a new version that adds the performer's measurements.
    const sup = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(sup, baseUrl, "supervisor@seamscene.test");
    await sup.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await sup.goto(`${baseUrl}/p/${SALTMARSH_ID}/doubles?tab=packets`);
    await sup.getByRole("link", { name: "Version 1" }).waitFor();
    await sup.getByRole("button", { name: "New draft" }).click();
    await sup.getByRole("heading", { name: /draft packet/ }).waitFor();
    await sup.getByLabel(/Include the performer's measurements/).check();
    const edge = sup.getByLabel(/target edge length/);
    await edge.fill("2");
    await sup.getByRole("button", { name: "Save draft" }).click();
    // Bad input is refused with the field named, and the draft keeps its other choices.
    await sup.getByText(/at least 5 mm/).waitFor();
    await edge.fill("12");
    await sup.getByRole("button", { name: "Save draft" }).click();
    await sup.getByRole("button", { name: "Publish version" }).and(sup.locator(":not([disabled])")).waitFor();
    await sup.getByRole("button", { name: "Publish version" }).click();
    await sup.getByRole("dialog").getByRole("button", { name: "Publish" }).click();
    const heading = await sup.getByRole("heading", { name: /: version \d+/ }).textContent();
    const version = Number(/version (\d+)/.exec(heading ?? "")![1]);
    await sup.close();

    const vfx = await browser().newPage({ viewport: { width: 768, height: 1024 } });
    await signIn(vfx, baseUrl, "vfx@seamscene.test");
    await vfx.getByRole("heading", { name: "Digital doubles" }).waitFor();
    await vfx.getByRole("link", { name: new RegExp(`version ${version}$`) }).click();
    await vfx.getByRole("heading", { name: "What changed for you" }).waitFor();

    // What changed since the newest earlier version this artist marked received (the demo's version 1, or a later one).
    const changes = vfx.locator("section", { has: vfx.getByRole("heading", { name: "What changed for you" }) });
    expect(await changes.textContent()).toMatch(/Since version \d+, which you marked received/);
    expect(await changes.textContent()).toContain("Performer measurements: added");

    // Every panel drawn, with its seams numbered; three garments.
    const panels = vfx.locator("section", { has: vfx.getByRole("heading", { name: "Panels" }) });
    expect(await panels.getByRole("img").count()).toBe(16);
    await panels
      .getByRole("img", { name: /Keeper's jacket|jacket/i })
      .first()
      .waitFor();
    expect(await panels.getByRole("list", { name: "Seams" }).getByRole("listitem").count()).toBe(11);

    // Fabrics with measured / assumed marks and the cantilever re-test within 1 %.
    const fabrics = vfx.getByRole("table", { name: "Fabrics in this packet" });
    const text = (await fabrics.textContent()) ?? "";
    expect(text).toContain("measured");
    const percents = [...text.matchAll(/([+−])(\d+\.\d+) %/g)].map((m) => Number(m[2]));
    expect(percents.length).toBeGreaterThan(0);
    for (const p of percents) expect(p).toBeLessThanOrEqual(1);

    // The effects shots.
    expect(await vfx.getByRole("table", { name: "Effects shots" }).getByRole("row").count()).toBeGreaterThan(1);

    // Tablet width: nothing runs off the side of the page.
    const overflow = await vfx.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await vfx.screenshot({ path: ".data/e2e-artist-view-768.png", fullPage: true });
    await vfx.setViewportSize({ width: 390, height: 844 });
    await vfx.screenshot({ path: ".data/e2e-artist-view-390.png", fullPage: true });
    await vfx.close();
  });
});
