/** Debian's Chromium through playwright-core (never a browser download). */
import { afterAll, beforeAll } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser } from "../../scripts/lib/chromium.js";
import { DEMO_PASSWORD } from "../../seeds/accounts.js";

export { launchBrowser };

/** Signs in through the form as a demo account. */
export async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(`${baseUrl}/login`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** One browser per test file: launched before the file's tests, closed after. */
export function useBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error("The browser is not running yet");
    return browser;
  };
}
