/** Debian's Chromium through playwright-core (never a browser download): the e2e tests and the benches. */
import { chromium, type Browser } from "playwright-core";

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--no-first-run",
      "--disable-dev-shm-usage",
    ],
  });
}
