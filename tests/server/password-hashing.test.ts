import { describe, expect, it } from "vitest";
import { hashConcurrency, hashPassword, hashQueue, verifyPassword } from "../../server/auth/passwords.js";

describe("password hashing queue", () => {
  it("runs at most hashConcurrency() hashes at once; the rest wait, and every hash still verifies", async () => {
    const limit = hashConcurrency();
    let maxActive = 0;
    let sawWaiting = false;
    const sample = () => {
      const q = hashQueue();
      maxActive = Math.max(maxActive, q.active);
      if (q.pending > 0) sawWaiting = true;
    };
    const timer = setInterval(sample, 1);

    const hashes = Promise.all(Array.from({ length: limit + 4 }, (_, i) => hashPassword(`a-long-password-${i}`)));
    sample();
    const done = await hashes;
    clearInterval(timer);

    expect(sawWaiting).toBe(true);
    expect(maxActive).toBeGreaterThanOrEqual(1);
    expect(maxActive).toBeLessThanOrEqual(limit);
    expect(hashQueue()).toEqual({ active: 0, pending: 0 });
    expect(await verifyPassword("a-long-password-0", done[0]!)).toBe(true);
    expect(await verifyPassword("a-long-password-1", done[0]!)).toBe(false);
  });
});
