import { describe, expect, inject, it } from "vitest";
import { useBrowser, signIn } from "./browser.js";
import { demoAccounts } from "../../seeds/accounts.js";
import { workroomMembers } from "../../seeds/workroom.js";

const baseUrl = inject("baseUrl");
const browser = useBrowser();

describe("signing in as the demo supervisor", () => {
  it("shows Today, then the Team table with the demo members", async () => {
    const page = await browser().newPage({ viewport: { width: 1280, height: 800 } });

    await signIn(page, baseUrl, "supervisor@seamscene.test");
    await page.getByRole("heading", { name: "Today", exact: true }).waitFor();
    await page.getByRole("link", { name: "Team" }).click();
    const table = page.getByRole("table", { name: "Members" });
    await table.waitFor();

    const rows = await table.locator("tbody tr").count();
    // One account per role, plus the workroom step's two invented stitchers.
    expect(rows).toBe(demoAccounts.length + workroomMembers.length);
    expect(await table.textContent()).toContain("designer@seamscene.test");
    await page.screenshot({ path: ".data/e2e-team.png" });
    await page.close();
  });

  it("the vfx user sees only Digital doubles in the navigation", async () => {
    const page = await browser().newPage({ viewport: { width: 390, height: 844 } });

    await signIn(page, baseUrl, "vfx@seamscene.test");
    await page.getByRole("button", { name: "Menu" }).click();
    const nav = page.getByRole("navigation", { name: "Screens" });
    await nav.getByRole("link").first().waitFor();

    const links = await nav.getByRole("link").allTextContents();
    expect(links).toEqual(["Digital doubles"]);
    await page.close();
  });

  it("a wrong password shows a clear message", async () => {
    const page = await browser().newPage();

    await page.goto(`${baseUrl}/login`);
    await page.getByLabel("E-mail").fill("supervisor@seamscene.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();

    await expect(page.getByRole("alert").textContent()).resolves.toContain("do not match");
    await page.close();
  });
});
