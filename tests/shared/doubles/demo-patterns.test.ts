import { describe, expect, it } from "vitest";
import { demoPanels, demoSeams } from "../../../seeds/doubles-patterns";
import { checkSeam } from "@shared/domain/panels/seams";
import { validatePolygon } from "@shared/domain/panels/geometry";

// The demo double's patterns must be usable: simple outlines, and every seam matching (plain seams
// within the 3 mm default tolerance — common practice, no source — eased seams inside their range).
describe("demo patterns for Elias Marr's change", () => {
  it.each(demoPanels.map((p) => [p.key, p] as const))("%s is a simple closed outline", (_key, p) => {
    expect(validatePolygon(p.outline).issues).toEqual([]);
  });

  const byKey = new Map(demoPanels.map((p) => [p.key, p]));
  it.each(demoSeams.map((s) => [s.key, s] as const))("seam %s matches", (_key, s) => {
    const side = (x: typeof s.a) => ({ outline: byKey.get(x.panel)!.outline, from: x.from, to: x.to, direction: x.direction });

    const r = checkSeam({ a: side(s.a), b: side(s.b), eased: s.eased });

    expect(r.status).toBe(s.eased ? "eased_within_range" : "ok");
    expect(r.lengthA).toBeGreaterThan(50);
  });
});
