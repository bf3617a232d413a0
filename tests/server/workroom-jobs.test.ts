import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { startJobs, stopJobs, jobsRunning } from "../../server/lib/jobs.js";
import { WorkroomEmailJob } from "../../server/models/index.js";
import "../../server/services/workroom-mail.service.js";
import { buildMember, buildProduction } from "../factories.js";
import { buildPerformer } from "../factories.workroom.js";
import { resetDb, signedInAgent, waitForMail } from "../setup/http.js";

// The one test that runs the real queue (pg-boss in this process); the others call handlers directly.
describe("the job queue delivers fitting invitations", () => {
  beforeAll(async () => {
    await resetDb();
    await startJobs();
  });
  afterAll(async () => {
    await stopJobs();
  });

  it("a booked fitting's invitation goes through pg-boss to the SMTP fake and is marked sent", async () => {
    const production = await buildProduction();
    const { user } = await buildMember("supervisor", { production });
    const performerId = await buildPerformer(production.id, { email: "queue.check@test.invalid" });
    const agent = await signedInAgent(createApp(), user.email);

    expect(jobsRunning()).toBe(true);
    await agent
      .post(`/api/productions/${production.id}/fittings`, { performerId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 30 })
      .expect(201);

    await waitForMail((m) => m.recipients.includes("queue.check@test.invalid"), 20_000);
    await expect
      .poll(async () => (await WorkroomEmailJob.findOne({ where: { recipient: "queue.check@test.invalid" } }))?.status, { timeout: 10_000 })
      .toBe("sent");
  });
});
