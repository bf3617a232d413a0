/** axe-core (from npm) injected into a playwright-core page: the accessibility check of the e2e suite. */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import type { Page } from "playwright-core";

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve("axe-core/axe.min.js"), "utf8");

/** One violation as axe reports it, trimmed to what a failing test should print. */
export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; summary: string }[];
}

/** Runs axe-core (WCAG 2.0/2.1 A and AA rules plus best practices) on the page as it is now. */
export async function runAxe(page: Page): Promise<AxeViolation[]> {
  // Evaluated through the DevTools protocol, so the app's Content-Security-Policy (script-src 'self') stays as it is.
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(axeSource);
  return page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            opts: object,
          ) => Promise<{
            violations: Array<{
              id: string;
              impact: string | null;
              help: string;
              nodes: Array<{ target: string[]; failureSummary?: string }>;
            }>;
          }>;
        };
      }
    ).axe;
    const r = await axe.run(document, {
      resultTypes: ["violations"],
      runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "best-practice"] },
    });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.slice(0, 5).map((n) => ({ target: n.target.map(String), summary: (n.failureSummary ?? "").slice(0, 300) })),
    }));
  });
}

/** Moderate or minor rules the suite refuses too, once fixed: landmarks, heading order, empty table headers. */
const ALSO_REFUSED = new Set(["landmark-one-main", "region", "heading-order", "empty-table-header"]);

/** What the suite refuses: every serious and critical violation, and the rules in ALSO_REFUSED. */
export async function seriousViolations(page: Page): Promise<AxeViolation[]> {
  if (process.env.AXE_ALL) return runAxe(page);
  return (await runAxe(page)).filter((v) => v.impact === "serious" || v.impact === "critical" || ALSO_REFUSED.has(v.id));
}

/** A short, readable list for a failing expectation. */
export function describeViolations(vs: AxeViolation[]): string {
  return vs
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help}\n${v.nodes.map((n) => `  ${n.target.join(" ")} — ${n.summary.replace(/\s+/g, " ")}`).join("\n")}`,
    )
    .join("\n");
}
