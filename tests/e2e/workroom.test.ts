import { describe, expect, inject, it } from "vitest";
import { useBrowser, signIn } from "./browser.js";
import { format, parseISO } from "date-fns";
import { SALTMARSH_ID } from "../../seeds/accounts.js";
import { anchorDemo, shootDay } from "../../seeds/calendar.js";

const baseUrl = inject("baseUrl");
const today = inject("today");
anchorDemo(today);
const browser = useBrowser();

describe("the workroom as the demo cutter", () => {
  it("opens a fitting, raises a ticket, sees it planned on the calendar and marks it done", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });
    const workroom = `${baseUrl}/p/${SALTMARSH_ID}/workroom`;

    await signIn(page, baseUrl, "cutter@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.goto(workroom);
    await page
      .getByRole("list", { name: "Fittings" })
      .getByRole("link", { name: /Corwen Blakely/ })
      .first()
      .click();
    await page.getByRole("heading", { name: "Fitting: Corwen Blakely" }).waitFor();

    // One tap on the garment, then the ticket form.
    await page.getByRole("button", { name: "Raise ticket for 25M-K4G Hobnail boots" }).click();
    const form = page.getByRole("form", { name: /New alteration ticket for 25M-K4G/ });
    await form.getByLabel("Task 1").selectOption("repair");
    await form.getByLabel("Note", { exact: true }).fill("re-nail the left heel");
    await form.getByLabel("Estimated hours").fill("2");
    await form.getByRole("button", { name: "Raise ticket" }).click();
    const fromFitting = page.getByRole("list", { name: "Tickets from this fitting" });
    await fromFitting.getByText("25M-K4G Hobnail boots").waitFor();

    // The plan gives it a finish date; the calendar's day view for that date shows the work block.
    await page.goto(`${workroom}?tab=tickets`);
    const row = page.getByRole("row", { name: "Ticket 25M-K4G" });
    await row.waitFor();
    const finish = await row.locator("[data-planned-finish]").getAttribute("data-planned-finish");
    expect(finish).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    await page.goto(`${workroom}?tab=calendar&view=day&date=${finish}`);
    await page
      .getByRole("region", { name: "Workroom calendar" })
      .getByText(/25M-K4G Hobnail boots · 2 h/)
      .first()
      .waitFor();
    await page.screenshot({ path: ".data/e2e-workroom-calendar.png" });

    await page.goto(`${workroom}?tab=tickets`);
    await page.getByRole("row", { name: "Ticket 25M-K4G" }).getByRole("button", { name: "Mark done" }).click();
    await expect.poll(async () => (await page.getByRole("row", { name: "Ticket 25M-K4G" }).textContent()) ?? "").toContain("Check");
    expect(await page.getByRole("row", { name: "Ticket 25M-K4G" }).textContent()).toContain("done");
    await page.close();
  });

  it("shows the demo's late alteration with the snag explaining why", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 900 } });

    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    // The plan starts today (the server's pinned clock); the jacket is needed on shoot day 4.
    await page.goto(`${baseUrl}/p/${SALTMARSH_ID}/workroom?tab=tickets`);
    const snags = page.getByRole("region", { name: "Workroom snags" });
    await snags.getByText("97Y-JUG Keeper's jacket: alteration late by 1 working day").waitFor();

    expect(await snags.textContent()).toContain(
      `It would not be ready for the shoot on ${format(parseISO(shootDay(4)), "EEE d MMM yyyy")}`,
    );
    await page.close();
  });
});
