/**
 * Walks every screen a role can open — each tab of each tab list, the calendar's views, and the first record
 * page of each kind reachable from a list — and runs axe-core on each. Pages are found by following the app's
 * own links, so the walk does not depend on the demo's dates or ids.
 */
import type { Page } from "playwright-core";
import { seriousViolations, type AxeViolation } from "./axe.js";

export interface PageResult {
  /** What was checked: "supervisor · Workroom › Calendar › Month". */
  name: string;
  violations: AxeViolation[];
}

/** Waits until the page's requests are done and no spinner is showing. */
export async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("networkidle").catch(() => undefined);
  await page
    .locator('[role="status"][aria-busy="true"], .animate-spin')
    .first()
    .waitFor({ state: "detached", timeout: 10_000 })
    .catch(() => undefined);
  // Colour transitions (a button turning primary) must end before contrast is measured.
  await page
    .waitForFunction(() => document.getAnimations().every((a) => a.playState !== "running"), undefined, { timeout: 5_000 })
    .catch(() => undefined);
  await page.waitForTimeout(100);
}

async function check(page: Page, name: string, out: PageResult[]): Promise<void> {
  await settle(page);
  out.push({ name, violations: await seriousViolations(page) });
}

/** Every tab of every tab list in the main content, checked in turn (tab lists that appear later included once). */
async function walkTabs(page: Page, base: string, out: PageResult[]): Promise<void> {
  const seen = new Set<string>();
  // Clicking a tab may add or remove tab lists below it, so the lists are looked up afresh after every click.
  for (let guard = 0; guard < 40; guard++) {
    const next = await page.locator('main [role="tablist"]').evaluateAll((lists) => {
      for (const [i, list] of lists.entries()) {
        const name = list.getAttribute("aria-label") ?? `tabs ${i + 1}`;
        if (name === "Garments") continue; // one per garment: the selected one stands for all
        for (const tab of list.querySelectorAll('[role="tab"]')) {
          const label = (tab.textContent ?? "").trim();
          if (!(window as unknown as { __seenTabs?: string[] }).__seenTabs?.includes(`${name}›${label}`)) return { name, label, i };
        }
      }
      return null;
    });
    if (!next || seen.has(`${next.name}›${next.label}`)) break;
    seen.add(`${next.name}›${next.label}`);
    await page.evaluate((k) => {
      const w = window as unknown as { __seenTabs?: string[] };
      (w.__seenTabs ??= []).push(k);
    }, `${next.name}›${next.label}`);
    await page.locator('main [role="tablist"]').nth(next.i).getByRole("tab", { name: next.label, exact: true }).click();
    await check(page, `${base} › ${next.label}`, out);
    if (next.label === "Calendar") await walkCalendar(page, `${base} › Calendar`, out);
  }
}

/** The workroom calendar's views, switched with its own toolbar. */
async function walkCalendar(page: Page, base: string, out: PageResult[]): Promise<void> {
  const toolbar = page.getByRole("toolbar", { name: "Calendar" });
  if (!(await toolbar.count())) return;
  for (const view of ["Month", "Week", "One day"]) {
    await toolbar.getByRole("button", { name: view, exact: true }).click();
    await check(page, `${base} › ${view}`, out);
  }
}

/** Opens the first link whose address matches, checks that page, and comes back. */
async function firstRecord(page: Page, screenUrl: string, hrefPart: RegExp, name: string, out: PageResult[]): Promise<void> {
  await page.goto(screenUrl);
  await settle(page);
  const hrefs = await page.locator("main a[href]").evaluateAll((as) => as.map((a) => a.getAttribute("href") ?? ""));
  const href = hrefs.find((h) => hrefPart.test(h));
  if (!href) return;
  await page.goto(new URL(href, screenUrl).toString());
  await check(page, name, out);
  await walkTabs(page, name, out);
}

const RECORD_PAGES: Array<{ screen: string; href: RegExp; name: string }> = [
  { screen: "breakdown", href: /\/breakdown\/scenes\/[^/]+$/, name: "Breakdown › a scene" },
  { screen: "cast", href: /\/cast\/characters\/[^/]+$/, name: "Cast › a character" },
  { screen: "cast", href: /\/cast\/performers\/[^/]+$/, name: "Cast › a performer" },
  { screen: "wardrobe", href: /\/wardrobe\/garments\/[^/]+$/, name: "Wardrobe › a garment" },
  { screen: "wardrobe", href: /\/wardrobe\/new$/, name: "Wardrobe › new garment" },
  { screen: "continuity", href: /\/continuity\/timeline\/[^/]+$/, name: "Continuity › a timeline" },
  { screen: "workroom", href: /\/workroom\/fittings\/[^/]+$/, name: "Workroom › a fitting" },
  { screen: "snags", href: /\/snags\/multiples\/[^/]+$/, name: "Snags › a copy plan" },
  { screen: "fabrics", href: /\/fabrics\/[0-9a-f-]{36}$/, name: "Fabrics › a fabric" },
];

/**
 * Every screen in the role's menu with its tabs, then record pages reachable from those screens.
 * @param who label for the results ("supervisor")
 */
export async function walkRole(page: Page, baseUrl: string, who: string): Promise<PageResult[]> {
  const out: PageResult[] = [];
  await settle(page);
  const nav = page.getByRole("navigation", { name: "Screens" });
  const links = await nav
    .locator("a[href]")
    .evaluateAll((as) => as.map((a) => ({ href: a.getAttribute("href") ?? "", label: (a.textContent ?? "").trim() })));
  for (const l of links) {
    const url = new URL(l.href, baseUrl).toString();
    await page.goto(url);
    await check(page, `${who} · ${l.label}`, out);
    await walkTabs(page, `${who} · ${l.label}`, out);
  }
  const screens = new Map(links.map((l) => [l.href.split("/").pop()!, new URL(l.href, baseUrl).toString()]));
  for (const r of RECORD_PAGES) {
    const url = screens.get(r.screen);
    if (url) await firstRecord(page, url, r.href, `${who} · ${r.name}`, out);
  }
  return out;
}
