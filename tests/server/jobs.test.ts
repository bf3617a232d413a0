import { describe, expect, it } from "vitest";
import { defineJob, enqueue, jobsRunning } from "../../server/lib/jobs.js";

describe("enqueue without a running queue", () => {
  it("runs the handler once and passes its failure to the caller", async () => {
    const seen: unknown[] = [];
    defineJob<{ n: number }>("test.inline-fails", { retryLimit: 3 }, async (data) => {
      seen.push(data.n);
      throw new Error("relay refused the message");
    });

    expect(jobsRunning()).toBe(false);
    await expect(enqueue("test.inline-fails", { n: 7 })).rejects.toThrow("relay refused the message");
    expect(seen).toEqual([7]);
  });

  it("resolves when the handler succeeds", async () => {
    const seen: unknown[] = [];
    defineJob<{ n: number }>("test.inline-ok", {}, async (data) => {
      seen.push(data.n);
    });

    await expect(enqueue("test.inline-ok", { n: 3 })).resolves.toBeUndefined();
    expect(seen).toEqual([3]);
  });
});
