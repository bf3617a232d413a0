// Lays markers off the main thread so the page stays responsive and can show progress: a first
// layout of every fabric, then a local search that shortens them within a time budget.
import { planYardage, type YardageGroup } from "@shared/domain/panels/yardage";

/** Time the search may take for all fabrics together, ms. */
const NESTING_TIME_BUDGET_MS = 10_000;

/** Message in: the groups and multiples. Messages out: progress (first layouts, then the search), then the result (or an error). */
self.onmessage = (e: MessageEvent<{ groups: YardageGroup[]; multiples: number; seed?: number }>) => {
  try {
    const result = planYardage(e.data.groups, e.data.multiples, (done, total) => self.postMessage({ type: "progress", done, total }), {
      seed: e.data.seed ?? 1,
      timeBudgetMs: NESTING_TIME_BUDGET_MS,
      now: () => performance.now(),
      onProgress: (p) => self.postMessage({ type: "search", fraction: p.fraction, fabricName: p.fabricName, bestLengthMm: p.bestLengthMm }),
    });
    self.postMessage({ type: "done", result });
  } catch (err) {
    self.postMessage({ type: "error", message: err instanceof Error ? err.message : String(err) });
  }
};
