import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { AuditEvent, SnagDismissal } from "../../server/models/index.js";
import { clock } from "../../server/lib/clock.js";
import { buildMember } from "../factories.js";
import { resetDb, signedInAgent, anonymousAgent, type TestAgent } from "../setup/http.js";
import { buildFilmScenario, snagFixtures } from "../setup/snag-fixtures.js";
import type { SnagDto, SnagListDto } from "../../shared/schemas/snags.js";

const app = createApp();
let agent: TestAgent;
let pid: string;
let sc: Awaited<ReturnType<typeof buildFilmScenario>>;

beforeEach(async () => {
  await resetDb();
  const { user, production } = await buildMember("supervisor");
  pid = production.id;
  sc = await buildFilmScenario(snagFixtures(pid));
  agent = await signedInAgent(app, user.email);
  clock.set("2027-01-10", { frozen: true });
});

afterEach(() => {
  clock.reset();
});

const fitKey = () => `fit:${sc.garments.jacket}:${sc.performers.pWren}`;

describe("GET /api/productions/:pid/snags", () => {
  it("answers 401 without a session", async () => {
    const anon = await anonymousAgent(app);

    const res = await anon.get(`/api/productions/${pid}/snags`);

    expect(res.status).toBe(401);
  });

  it("answers 400 naming the field for an unknown kind", async () => {
    const res = await agent.get(`/api/productions/${pid}/snags?kind=weather`);

    expect(res.status).toBe(400);
    expect(res.body.error.fields.kind).toBe(
      "Kind must be one of: fit, continuity, multiples, booking, rental, availability, quick_change, checkout_overdue, workroom_late, workroom_overbooked",
    );
  });

  it("answers 404 for a shoot day of no production", async () => {
    const res = await agent.get(`/api/productions/${pid}/snags?shootDayId=00000000-0000-4000-8000-000000000000`);

    expect(res.status).toBe(404);
  });

  it("lists snags with counts by severity and kind, filtered by severity", async () => {
    const all = await agent.get(`/api/productions/${pid}/snags`);
    const blocking = await agent.get(`/api/productions/${pid}/snags?severity=blocking`);

    const body = all.body.data as SnagListDto;
    expect(all.status).toBe(200);
    expect(body.counts.total).toBe(body.snags.length);
    expect(body.counts.byKind).toMatchObject({ fit: 1, multiples: 1, rental: 1, booking: 1, continuity: 1, quick_change: 0 });
    // Multiples short and a double booking block the day; fit (tight), continuity and rental warn.
    expect(body.counts.bySeverity).toEqual({ blocking: 2, warning: 3, note: 0 });
    expect((blocking.body.data as SnagListDto).snags.map((s: SnagDto) => s.kind).sort()).toEqual(["booking", "multiples"]);
    expect((blocking.body.data as SnagListDto).counts.total).toBe(5);
  });

  it("shootDayId=next gives the snags of the next shoot day from today", async () => {
    clock.set("2027-01-14", { frozen: true });

    const res = await agent.get(`/api/productions/${pid}/snags?shootDayId=next`);

    expect(res.body.data.nextShootDay.date).toBe("2027-01-14");
    expect(res.body.data.snags.map((s: SnagDto) => s.kind)).toEqual(["rental"]);
  });
});

describe("POST /api/productions/:pid/snags/dismissals", () => {
  it("answers 400 naming reason when it is missing, and writes nothing", async () => {
    const res = await agent.post(`/api/productions/${pid}/snags/dismissals`, { snagKey: fitKey() });

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_error");
    expect(res.body.error.fields.reason).toBe("Reason is required");
    expect(await SnagDismissal.count()).toBe(0);
    expect(await AuditEvent.count()).toBe(0);
  });

  it("answers 400 for a reason shorter than 3 or longer than 500 characters", async () => {
    const short = await agent.post(`/api/productions/${pid}/snags/dismissals`, { snagKey: fitKey(), reason: "ok" });
    const long = await agent.post(`/api/productions/${pid}/snags/dismissals`, { snagKey: fitKey(), reason: "x".repeat(501) });

    expect(short.status).toBe(400);
    expect(short.body.error.fields.reason).toContain("at least 3");
    expect(long.status).toBe(400);
    expect(long.body.error.fields.reason).toContain("at most 500");
    expect(await SnagDismissal.count()).toBe(0);
  });

  it("answers 404 for a snag that does not exist now", async () => {
    const res = await agent.post(`/api/productions/${pid}/snags/dismissals`, { snagKey: "fit:gone", reason: "fixed already" });

    expect(res.status).toBe(404);
    expect(await SnagDismissal.count()).toBe(0);
  });

  it("dismisses a snag, hides it from the list, and DELETE undoes it", async () => {
    const res = await agent.post(`/api/productions/${pid}/snags/dismissals`, {
      snagKey: fitKey(),
      reason: "  Jacket is worn open on camera  ",
    });
    const hidden = await agent.get(`/api/productions/${pid}/snags?kind=fit`);
    const shown = await agent.get(`/api/productions/${pid}/snags?kind=fit&includeDismissed=true`);
    const undo = await agent.delete(`/api/productions/${pid}/snags/dismissals/${res.body.data.id}`);
    const again = await agent.get(`/api/productions/${pid}/snags?kind=fit`);

    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ snagKey: fitKey(), reason: "Jacket is worn open on camera", dismissedByName: "Test supervisor" });
    expect(hidden.body.data.snags).toEqual([]);
    expect(hidden.body.data.counts.dismissed).toBe(1);
    expect(shown.body.data.snags[0].dismissal.reason).toBe("Jacket is worn open on camera");
    expect(undo.status).toBe(204);
    expect(again.body.data.snags.map((s: SnagDto) => s.key)).toEqual([fitKey()]);
    expect(await AuditEvent.count({ where: { action: "snag.undismiss" } })).toBe(1);
  });

  it("DELETE answers 404 for a dismissal of another production", async () => {
    const other = await buildMember("supervisor");
    const otherSc = await buildFilmScenario(snagFixtures(other.production.id));
    const otherAgent = await signedInAgent(app, other.user.email);
    const made = await otherAgent.post(`/api/productions/${other.production.id}/snags/dismissals`, {
      snagKey: `fit:${otherSc.garments.jacket}:${otherSc.performers.pWren}`,
      reason: "their call",
    });

    const res = await agent.delete(`/api/productions/${pid}/snags/dismissals/${made.body.data.id}`);

    expect(made.status).toBe(201);
    expect(res.status).toBe(404);
    expect(await SnagDismissal.count()).toBe(1);
  });
});

describe("GET /api/productions/:pid/snags/multiples/:groupId", () => {
  it("returns the copy plan: which copy goes into which scene", async () => {
    const res = await agent.get(`/api/productions/${pid}/snags/multiples/${sc.groups.oilskin}`);

    // Stages 2, 1, 0 in shoot order: a strictly falling chain, so one copy each (Dilworth's theorem).
    expect(res.status).toBe(200);
    expect(res.body.data.copiesNeeded).toBe(3);
    expect(res.body.data.copies.map((c: { copy: number; sceneNumbers: string[] }) => [c.copy, c.sceneNumbers])).toEqual([
      [1, ["4"]],
      [2, ["3"]],
      [3, ["2"]],
    ]);
  });

  it("answers 404 for a group of another production", async () => {
    const other = await buildMember("supervisor");
    const group = await snagFixtures(other.production.id).group({ name: "Not ours" });

    const res = await agent.get(`/api/productions/${pid}/snags/multiples/${group}`);

    expect(res.status).toBe(404);
  });
});
