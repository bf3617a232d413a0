// The phone's queue of records captured without a signal (IndexedDB through fake-indexeddb).
import "fake-indexeddb/auto";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { ApiError } from "@/lib/api-client";
import { closeOfflineDb, OFFLINE_DB_NAME } from "@/lib/offline/db";
import { enqueue, listQueue, removeQueued, retryQueued, type NewQueuedItem } from "@/lib/offline/queue";
import { classifyFailure, sendWaiting, type Transport } from "@/lib/offline/sender";
import { retryDelayMs, RETRY_BASE_MS, RETRY_CAP_MS } from "@/lib/offline/backoff";
import { fitLongEdge } from "@/lib/offline/reduce-photo";
import { forgetAccount, getPack, putPack, rememberAccount } from "@/lib/offline/store";
import type { OfflinePackDto } from "@shared/schemas/offline";
import type { MeDto } from "@shared/schemas/auth";

const U = "user-a";
let n = 0;
function item(over: Partial<NewQueuedItem> = {}): NewQueuedItem {
  n += 1;
  return {
    clientId: `c-${n}`,
    userId: U,
    productionId: "p1",
    kind: "continuity",
    summary: `Scene ${n}`,
    queuedAt: new Date(0).toISOString(),
    payload: { notes: `n${n}` },
    photos: [],
    ...over,
  };
}

beforeEach(async () => {
  await closeOfflineDb();
  await new Promise<void>((resolve, reject) => {
    const r = indexedDB.deleteDatabase(OFFLINE_DB_NAME);
    r.onsuccess = () => resolve();
    r.onerror = () => reject(r.error);
  });
});
afterEach(async () => closeOfflineDb());

describe("queue", () => {
  it("keeps records in capture order and a second enqueue of the same client id adds nothing", async () => {
    const a = item();
    const b = item();
    await enqueue(a);
    await enqueue(b);
    await enqueue({ ...a, summary: "changed" });
    const list = await listQueue(U);
    expect(list.map((i) => i.clientId)).toEqual([a.clientId, b.clientId]);
    expect(list[0]!.summary).toBe(a.summary);
  });

  it("keeps photo bytes across a reopen of the database (a reload)", async () => {
    const bytes = new Uint8Array([0xff, 0xd8, 1, 2, 3]).buffer;
    await enqueue(item({ photos: [{ bytes, type: "image/jpeg", name: "front.jpg", view: "front", width: 10, height: 5 }] }));
    await closeOfflineDb();
    const [stored] = await listQueue(U);
    expect([...new Uint8Array(stored!.photos[0]!.bytes)]).toEqual([0xff, 0xd8, 1, 2, 3]);
  });

  it("lists only the account's own records; cancel removes one", async () => {
    const mine = item();
    await enqueue(mine);
    await enqueue(item({ userId: "user-b" }));
    expect((await listQueue(U)).length).toBe(1);
    expect(await removeQueued(mine.clientId)).toBe(true);
    expect(await removeQueued(mine.clientId)).toBe(false);
    expect(await listQueue(U)).toEqual([]);
    expect((await listQueue("user-b")).length).toBe(1);
  });
});

describe("sending", () => {
  it("sends oldest first and removes what the server stored", async () => {
    const seen: string[] = [];
    for (let i = 0; i < 3; i++) await enqueue(item());
    const transport: Transport = async (q) => {
      seen.push(q.clientId);
      return { id: q.clientId };
    };
    const r = await sendWaiting({ userId: U, transport });
    expect(r.sent.map((s) => s.clientId)).toEqual(seen);
    expect(seen).toEqual([...seen].sort((a, b) => Number(a.slice(2)) - Number(b.slice(2))));
    expect(await listQueue(U)).toEqual([]);
  });

  it("without a connection stops at the first record, counts the attempt and waits with backoff", async () => {
    const a = item();
    const b = item();
    await enqueue(a);
    await enqueue(b);
    let calls = 0;
    const down: Transport = async () => {
      calls += 1;
      throw new TypeError("Failed to fetch");
    };
    const r = await sendWaiting({ userId: U, transport: down, now: () => 1_000_000, random: () => 0 });
    expect(calls).toBe(1);
    // First failure: ceiling 2 s, equal jitter with random 0 → half of it.
    expect(r.nextAttemptAt).toBe(1_000_000 + RETRY_BASE_MS / 2);
    const [first, second] = await listQueue(U);
    expect(first).toMatchObject({ clientId: a.clientId, attempts: 1, state: "waiting" });
    expect(second).toMatchObject({ clientId: b.clientId, attempts: 0 });

    // Before the wait ends nothing is tried; after it (or forced) the queue drains in order.
    const up: Transport = async (q) => ({ id: q.clientId });
    const early = await sendWaiting({ userId: U, transport: up, now: () => 1_000_500 });
    expect(early.sent).toEqual([]);
    const late = await sendWaiting({ userId: U, transport: up, now: () => 1_001_000 });
    expect(late.sent.map((s) => s.clientId)).toEqual([a.clientId, b.clientId]);
  });

  it("holds a record the server refused, with its message, and sends the rest", async () => {
    const bad = item();
    const good = item();
    await enqueue(bad);
    await enqueue(good);
    const transport: Transport = async (q) => {
      if (q.clientId === bad.clientId) throw new ApiError(422, "validation", "Notes are too long.");
      return { id: q.clientId };
    };
    const r = await sendWaiting({ userId: U, transport });
    expect(r.held).toEqual([bad.clientId]);
    expect(r.sent.map((s) => s.clientId)).toEqual([good.clientId]);
    const [held] = await listQueue(U);
    expect(held).toMatchObject({ state: "held", lastError: "Notes are too long." });
    // A held record is not retried by itself; Try again puts it back in line.
    expect((await sendWaiting({ userId: U, transport })).sent).toEqual([]);
    await retryQueued(bad.clientId);
    expect((await listQueue(U))[0]!.state).toBe("waiting");
  });

  it("stops and asks for a sign-in when the session ended, keeping everything", async () => {
    await enqueue(item());
    await enqueue(item());
    const r = await sendWaiting({ userId: U, transport: async () => Promise.reject(new ApiError(401, "unauthenticated", "Sign in")) });
    expect(r.signInNeeded).toBe(true);
    expect((await listQueue(U)).length).toBe(2);
  });

  it("classifies failures: no answer or server fault retries, a refusal holds", () => {
    expect(classifyFailure(new TypeError("Failed to fetch"))).toBe("retry");
    expect(classifyFailure(new ApiError(0, "offline", "x"))).toBe("retry");
    expect(classifyFailure(new ApiError(503, "x", "x"))).toBe("retry");
    expect(classifyFailure(new ApiError(429, "x", "x"))).toBe("retry");
    expect(classifyFailure(new ApiError(404, "x", "x"))).toBe("held");
    expect(classifyFailure(new ApiError(401, "x", "x"))).toBe("signin");
  });
});

describe("backoff", () => {
  // Exponential backoff with equal jitter: wait = c/2 + U·c/2 with c = min(cap, base·2^(k−1))
  // (Brooker, "Exponential Backoff And Jitter", AWS Architecture Blog, 2015).
  it("doubles from the base up to the cap, half of it random", () => {
    expect(retryDelayMs(1, () => 0)).toBe(1_000);
    expect(retryDelayMs(1, () => 0.999999)).toBe(2_000);
    expect(retryDelayMs(3, () => 0)).toBe(4_000);
    expect(retryDelayMs(30, () => 0)).toBe(RETRY_CAP_MS / 2);
    expect(retryDelayMs(30, () => 0.999999)).toBe(RETRY_CAP_MS);
  });
});

describe("photo reduction", () => {
  it("scales the long edge to 2,400 px keeping the aspect ratio, never enlarging", () => {
    expect(fitLongEdge(4032, 3024)).toEqual({ width: 2400, height: 1800 });
    expect(fitLongEdge(3024, 4032)).toEqual({ width: 1800, height: 2400 });
    expect(fitLongEdge(1200, 800)).toEqual({ width: 1200, height: 800 });
  });
});

describe("signing out", () => {
  it("deletes the account's queue, packs and remembered sign-in, and nobody else's", async () => {
    const me = { id: U } as MeDto;
    await rememberAccount(me);
    await putPack(U, "p1", { savedAt: "2030-09-02T06:00:00Z" } as OfflinePackDto);
    await putPack("user-b", "p1", { savedAt: "2030-09-02T06:00:00Z" } as OfflinePackDto);
    await enqueue(item());
    await enqueue(item({ userId: "user-b" }));
    expect(await forgetAccount(U)).toBe(1);
    expect(await listQueue(U)).toEqual([]);
    expect(await getPack(U, "p1")).toBeUndefined();
    expect(await getPack("user-b", "p1")).toBeDefined();
    expect((await listQueue("user-b")).length).toBe(1);
  });
});
