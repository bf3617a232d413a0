import { describe, expect, inject, it } from "vitest";
import { useBrowser, signIn } from "./browser.js";
import { settle, walkRole, type PageResult } from "./a11y-walk.js";
import { describeViolations, seriousViolations } from "./axe.js";
import { GLASS_ORCHARD_ID, SALTMARSH_ID } from "../../seeds/accounts.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();

/** "page: violations" for every page that has any, or "" when all are clean. */
function failures(results: PageResult[]): string {
  return results
    .filter((r) => r.violations.length)
    .map((r) => `${r.name}\n${describeViolations(r.violations)}`)
    .join("\n\n");
}

describe("axe-core over every page and tab (no serious or critical violations)", () => {
  it("sign-in, password and invitation pages", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    const results: PageResult[] = [];
    for (const path of ["/login", "/forgot-password", "/reset-password/not-a-token", "/invitations/not-a-token"]) {
      await page.goto(`${baseUrl}${path}`);
      await settle(page);
      results.push({ name: path, violations: await seriousViolations(page) });
    }
    expect(failures(results)).toBe("");
    expect(await page.getByRole("main").count()).toBe(1);
    await page.close();
  });

  it.each([
    ["supervisor", "supervisor@seamscene.test"],
    ["designer", "designer@seamscene.test"],
    ["set costumer", "setcostumer@seamscene.test"],
    ["cutter", "cutter@seamscene.test"],
    ["digital-double artist", "vfx@seamscene.test"],
  ])(
    "every screen, tab and record page of the %s",
    async (who, email) => {
      const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
      await signIn(page, baseUrl, email);
      await page.waitForURL(/\/p\//);

      const results = await walkRole(page, baseUrl, who);

      expect(results.length).toBeGreaterThan(0);
      expect(failures(results)).toBe("");
      await page.close();
    },
    300_000,
  );

  it("the stage production's screens as its supervisor", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.waitForURL(/\/p\//);
    await page.goto(`${baseUrl}/p/${GLASS_ORCHARD_ID}/today`);

    const results = await walkRole(page, baseUrl, "stage supervisor");

    expect(failures(results)).toBe("");
    await page.close();
  }, 300_000);
});

describe("keyboard", () => {
  it("the first Tab reaches a skip link that moves focus to the screen's content", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "designer@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.keyboard.press("Tab");
    const skip = page.getByRole("link", { name: "Skip to content" });
    expect(await skip.evaluate((el) => el === document.activeElement)).toBe(true);
    expect((await skip.boundingBox())!.width).toBeGreaterThan(20);
    await page.keyboard.press("Enter");

    expect(await page.evaluate(() => document.activeElement?.id)).toBe("main-content");
    await page.close();
  });

  it("arrow keys on the production switcher do not switch until Enter, Escape stays, and focus is visible", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/today`);
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    const switcher = page.getByLabel("Production", { exact: true });

    // Keyboard focus (Tab from the skip link) shows a ring of at least 2 px.
    await page.keyboard.press("Tab");
    await page.keyboard.press("Tab");
    if (!(await switcher.evaluate((el) => el === document.activeElement))) await switcher.focus();
    const outline = await switcher.evaluate((el) => ({
      style: getComputedStyle(el).outlineStyle,
      width: parseFloat(getComputedStyle(el).outlineWidth),
    }));
    expect(outline.style).not.toBe("none");
    expect(outline.width).toBeGreaterThanOrEqual(2);

    await page.keyboard.press("ArrowDown");
    await page.waitForTimeout(300);
    expect(page.url()).toContain(`/p/${SALTMARSH_ID}/`);
    await page.getByRole("button", { name: "Open" }).waitFor();

    await page.keyboard.press("Escape");
    expect(await switcher.inputValue()).toBe(SALTMARSH_ID);
    expect(await page.getByRole("button", { name: "Open" }).count()).toBe(0);

    await page.keyboard.press("ArrowDown");
    const chosen = await switcher.inputValue();
    expect(chosen).not.toBe(SALTMARSH_ID);
    await page.keyboard.press("Enter");
    await page.waitForURL((u) => !u.pathname.includes(SALTMARSH_ID));
    await page.close();
  });

  it("the Workroom's tabs are a tab list that arrow keys move through", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/workroom`);
    const tabs = page.getByRole("tablist", { name: "Workroom sections" });

    await tabs.getByRole("tab", { name: "Fittings" }).focus();
    await page.keyboard.press("ArrowRight");

    // The tab changes through the router's search params, which settle after the key press returns.
    await expect.poll(() => tabs.getByRole("tab", { name: "Tickets" }).getAttribute("aria-selected")).toBe("true");
    await expect.poll(() => tabs.getByRole("tab", { name: "Tickets" }).evaluate((el) => el === document.activeElement)).toBe(true);
    await page.close();
  });
});
