// Lays markers off the main thread so the page stays responsive and can show progress.
import { planYardage, type YardageGroup } from "@shared/domain/panels/yardage";

/** Message in: the groups and multiples. Messages out: progress, then the result (or an error). */
self.onmessage = (e: MessageEvent<{ groups: YardageGroup[]; multiples: number }>) => {
  try {
    const result = planYardage(e.data.groups, e.data.multiples, (done, total) => self.postMessage({ type: "progress", done, total }));
    self.postMessage({ type: "done", result });
  } catch (err) {
    self.postMessage({ type: "error", message: err instanceof Error ? err.message : String(err) });
  }
};
