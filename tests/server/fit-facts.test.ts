import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { buildMember } from "../factories.js";
import { buildChangeOnDays, buildFabric, buildGarment, buildMeasurementSet, buildPerformer } from "../factories.workroom.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { FittingDetailDto } from "../../shared/schemas/workroom.js";
import type { SnagListDto } from "../../shared/schemas/snags.js";

const app = createApp();

/** Points off, as "point:status", per garment, from the fitting view. */
function fittingVerdicts(d: FittingDetailDto): Record<string, string[]> {
  return Object.fromEntries(
    d.items
      .filter((i) => i.garmentId)
      .map((i) => [i.garmentId!, i.fit.filter((p) => p.status !== "fits").map((p) => `${p.point}:${p.status}`)]),
  );
}

/** Points off, as "point:status", per garment, from the Snags screen (a garment with no fit snag fits). */
function snagVerdicts(l: SnagListDto, garmentIds: string[]): Record<string, string[]> {
  const out: Record<string, string[]> = Object.fromEntries(garmentIds.map((g) => [g, []]));
  for (const s of l.snags) {
    const points = s.evidence.points as Array<{ point: string; status: string }>;
    out[s.garments[0]!.id] = points.map((p) => `${p.point}:${p.status}`);
  }
  return out;
}

describe("one garment, one verdict: fitting view and Snags screen", () => {
  let agent: TestAgent;
  let pid: string;

  beforeEach(async () => {
    await resetDb();
    clock.set("2030-09-02", { frozen: true });
    const m = await buildMember("supervisor");
    pid = m.production.id;
    agent = await signedInAgent(app, m.user.email);
  });
  afterEach(() => clock.reset());

  it("agree before and after the production's ease range is edited, and read a knit's warp stretch when the weft was not tested", async () => {
    const performerId = await buildPerformer(pid, { name: "Ines Varga" });
    await buildMeasurementSet(pid, performerId, { chest_girth: 900 });
    // Woven fitted jacket, 20 mm chest ease: the handbook's fitted range is 1½–2 in (38.1–50.8 mm).
    const jacket = await buildGarment(pid, {
      tagCode: "JKT-1",
      name: "Tweed jacket",
      category: "jacket",
      fitIntent: "fitted",
      finished: { chest: 920 },
    });
    // Knit top cut 40 mm under the chest; warp stretch 30 % only. R = 1.3 allows ease down to
    // −900·(1 − 1/1.3) ≈ −208 mm (finished ≥ body / R), so it fits; without the stretch it is tight.
    const jersey = await buildFabric(pid, { name: "Rib jersey", construction: "knit", stretchWarpPct: 30, stretchWeftPct: null });
    const top = await buildGarment(pid, {
      tagCode: "TOP-1",
      name: "Rib top",
      category: "knit top",
      fitIntent: "fitted",
      finished: { chest: 860 },
      fabricId: jersey,
    });
    const { changeId } = await buildChangeOnDays(pid, { performerId, garmentIds: [jacket, top], dates: ["2030-09-10"] });
    const booked = await agent
      .post(`/api/productions/${pid}/fittings`, { performerId, changeId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 30 })
      .expect(201);
    const fittingUrl = `/api/productions/${pid}/fittings/${booked.body.data.id}`;
    const both = async () => {
      const fitting = (await agent.get(fittingUrl).expect(200)).body.data as FittingDetailDto;
      const snags = (await agent.get(`/api/productions/${pid}/snags?kind=fit`).expect(200)).body.data as SnagListDto;
      return { fitting: fittingVerdicts(fitting), snags: snagVerdicts(snags, [jacket, top]) };
    };

    const before = await both();
    await agent
      .patch(`/api/productions/${pid}`, { settings: { easeOverrides: { jacket: { chest: { fitted: { min: 10, max: 30 } } } } } })
      .expect(200);
    const after = await both();

    expect(before.snags).toEqual({ [jacket]: ["chest:tight"], [top]: [] });
    expect(before.fitting).toEqual(before.snags);
    expect(after.snags).toEqual({ [jacket]: [], [top]: [] });
    expect(after.fitting).toEqual(after.snags);
  });
});
