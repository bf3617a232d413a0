import { describe, expect, inject, it } from "vitest";
import { parseISO, subWeeks } from "date-fns";
import { useBrowser, signIn } from "./browser.js";
import { settle } from "./a11y-walk.js";
import { describeViolations, seriousViolations } from "./axe.js";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { formatDate, formatDateRange, formatMonth } from "../../shared/format.js";
import { startOfWeek, endOfWeek } from "date-fns";

const baseUrl = inject("baseUrl");
const browser = useBrowser();
const weekOf = (d: Date) => formatDateRange(startOfWeek(d, { weekStartsOn: 1 }), endOfWeek(d, { weekStartsOn: 1 }));

describe("the workroom calendar in Seamscene's words", () => {
  it("opens on the production's today, switches views with our labels, and passes axe-core in each", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    // "Today" is the production's, from the server's clock: read it as the client does, never from this machine.
    const production = (await (await page.request.get(`${baseUrl}/api/productions/${SALTMARSH_ID}`)).json()).data as {
      today: string;
      timeZone: string;
    };
    const today = parseISO(production.today);

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/workroom`);
    await page.getByRole("tablist", { name: "Workroom sections" }).getByRole("tab", { name: "Calendar" }).click();
    const toolbar = page.getByRole("toolbar", { name: "Calendar" });
    const region = page.getByRole("region", { name: "Workroom calendar" });
    await toolbar.waitFor();

    // Week: the default view, on today's week; the stock labels are gone.
    expect(await toolbar.getByRole("button").allTextContents()).toEqual(["Earlier", "This week", "Later", "Month", "Week", "One day"]);
    await expect.poll(() => toolbar.getByRole("heading").textContent()).toBe(weekOf(today));
    expect(await region.textContent()).not.toMatch(/\bBack\b|\bNext\b|Agenda/);
    await expect.poll(async () => describeViolations(await seriousViolations(page))).toBe("");

    // Our palette: the production's today column in chalk-ochre, Merriweather Sans throughout.
    const todayBg = await region
      .locator(".rbc-day-slot.rbc-today, .rbc-day-bg.rbc-today")
      .first()
      .evaluate((el) => getComputedStyle(el).backgroundColor);
    expect(todayBg).toBe("rgb(249, 240, 224)");
    expect(await region.locator(".rbc-calendar").evaluate((el) => getComputedStyle(el).fontFamily)).toContain("Merriweather Sans");

    await toolbar.getByRole("button", { name: "Earlier" }).click();
    await settle(page);
    await expect.poll(() => toolbar.getByRole("heading").textContent()).toBe(weekOf(subWeeks(today, 1)));
    await toolbar.getByRole("button", { name: "This week" }).click();
    await settle(page);
    await expect.poll(() => toolbar.getByRole("heading").textContent()).toBe(weekOf(today));

    await toolbar.getByRole("button", { name: "Month", exact: true }).click();
    await toolbar.getByRole("button", { name: "This month" }).waitFor();
    expect(await toolbar.getByRole("button", { name: "Month", exact: true }).getAttribute("aria-pressed")).toBe("true");
    await expect.poll(() => toolbar.getByRole("heading").textContent()).toBe(formatMonth(today));
    await settle(page);
    expect(describeViolations(await seriousViolations(page))).toBe("");

    await toolbar.getByRole("button", { name: "One day", exact: true }).click();
    await toolbar.getByRole("button", { name: "Today" }).waitFor();
    await expect.poll(() => toolbar.getByRole("heading").textContent()).toBe(formatDate(today));
    await settle(page);
    expect(describeViolations(await seriousViolations(page))).toBe("");
    // The current-time line is madder (drawn only when the day shown is today).
    expect(
      await region
        .locator(".rbc-current-time-indicator")
        .first()
        .evaluate((el) => getComputedStyle(el).backgroundColor),
    ).toBe("rgb(181, 69, 46)");
    await page.screenshot({ path: ".data/e2e-calendar-day.png" });
    await page.close();
  });

  it("keeps the week view on a 768 px tablet and the day view on a 390 px phone inside the screen", async () => {
    const page = await browser().newPage({ viewport: { width: 768, height: 1024 } });
    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();

    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/workroom?tab=calendar&view=week`);
    const toolbar = page.getByRole("toolbar", { name: "Calendar" });
    await toolbar.waitFor();
    await settle(page);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(768);
    for (const name of ["Earlier", "This week", "Later", "Month", "Week", "One day"])
      expect(await toolbar.getByRole("button", { name, exact: true }).isVisible()).toBe(true);
    expect(describeViolations(await seriousViolations(page))).toBe("");
    await page.screenshot({ path: ".data/e2e-calendar-week-768.png" });

    await page.setViewportSize({ width: 390, height: 844 });
    await toolbar.getByRole("button", { name: "One day", exact: true }).click();
    await toolbar.getByRole("button", { name: "Today" }).waitFor();
    await settle(page);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    const grid = await page.locator(".workroom-calendar .rbc-time-view").boundingBox();
    expect(grid!.x).toBeGreaterThanOrEqual(0);
    expect(grid!.x + grid!.width).toBeLessThanOrEqual(390);
    expect(describeViolations(await seriousViolations(page))).toBe("");
    await page.screenshot({ path: ".data/e2e-calendar-day-390.png", fullPage: true });
    await page.close();
  });
});
