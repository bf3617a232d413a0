import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";

// The queue is replaced by a recorder: the request's own work is what this file checks.
vi.mock("../../server/lib/jobs.js", async (importOriginal) => {
  const real = await importOriginal<typeof import("../../server/lib/jobs.js")>();
  return { ...real, enqueue: vi.fn(async () => undefined) };
});

const { enqueue } = await import("../../server/lib/jobs.js");
const { createApp } = await import("../../server/app.js");
const { OutboxMessage, PasswordReset, User } = await import("../../server/models/index.js");
const { PASSWORD_RESET_JOB } = await import("../../server/services/auth.service.js");
const { buildUser } = await import("../factories.js");
const { anonymousAgent, resetDb } = await import("../setup/http.js");

const app = createApp();

beforeEach(async () => {
  await resetDb();
  vi.mocked(enqueue).mockClear();
});

afterEach(() => {
  vi.restoreAllMocks();
});

describe("POST /api/auth/password-reset", () => {
  it("does the same work for an address with an account and one without: it only queues the address", async () => {
    await buildUser({ email: "known@test.invalid" });
    const anon = await anonymousAgent(app);
    const lookups = vi.spyOn(User, "findOne");

    const known = await anon.post("/api/auth/password-reset", { email: "known@test.invalid" });
    const unknown = await anon.post("/api/auth/password-reset", { email: "nobody@test.invalid" });

    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    // One identical call each; nothing that depends on the account ran inside the request.
    expect(vi.mocked(enqueue).mock.calls).toEqual([
      [PASSWORD_RESET_JOB, { email: "known@test.invalid" }, { inlineInBackground: true }],
      [PASSWORD_RESET_JOB, { email: "nobody@test.invalid" }, { inlineInBackground: true }],
    ]);
    expect(lookups).not.toHaveBeenCalled();
    expect(await PasswordReset.count()).toBe(0);
    expect(await OutboxMessage.count()).toBe(0);
  });

  it("queues the normalised address", async () => {
    const anon = await anonymousAgent(app);

    await anon.post("/api/auth/password-reset", { email: "  Known@Test.Invalid " }).expect(202);

    expect(vi.mocked(enqueue).mock.calls[0]?.[1]).toEqual({ email: "known@test.invalid" });
  });
});
