import { randomBytes, scrypt as scryptCb, timingSafeEqual, createHash } from "node:crypto";
import { availableParallelism } from "node:os";
import { promisify } from "node:util";
import pLimit from "p-limit";
import { config } from "../config.js";

/**
 * How many hashes run at once. scrypt runs on libuv's thread pool, which file reads (photo serving)
 * share; a flood of sign-ins would otherwise fill every thread and photos would queue behind the
 * hashes. Hashes wait in this queue instead, leaving threads (and a CPU core) free for everything else.
 */
export function hashConcurrency(
  c: Pick<typeof config, "HASH_CONCURRENCY" | "UV_THREADPOOL_SIZE"> = config,
  cores = availableParallelism(),
): number {
  if (c.HASH_CONCURRENCY) return c.HASH_CONCURRENCY;
  return Math.max(1, Math.min(cores - 1, Math.floor(c.UV_THREADPOOL_SIZE / 2)));
}

const hashSlots = pLimit(hashConcurrency());
const scryptAsync = promisify(scryptCb) as (pw: string, salt: Buffer, len: number, opts: object) => Promise<Buffer>;
const scrypt = (pw: string, salt: Buffer, len: number, opts: object) => hashSlots(() => scryptAsync(pw, salt, len, opts));

/** Hashes waiting for a slot and running now (for tests and the bench). */
export function hashQueue(): { active: number; pending: number } {
  return { active: hashSlots.activeCount, pending: hashSlots.pendingCount };
}
// scrypt is memory-hard; N=2^15, r=8 costs ~32 MiB and tens of milliseconds per check.
const PARAMS = { N: 1 << 15, r: 8, p: 1, maxmem: 64 * 1024 * 1024 };
const KEYLEN = 64;

/** Hashes a password as `scrypt$N$r$p$salt$hash` (base64). */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const hash = await scrypt(password.normalize("NFKC"), salt, KEYLEN, PARAMS);
  return ["scrypt", PARAMS.N, PARAMS.r, PARAMS.p, salt.toString("base64"), hash.toString("base64")].join("$");
}

/** Checks a password against a stored hash in constant time. */
export async function verifyPassword(password: string, stored: string | null): Promise<boolean> {
  if (!stored) return false;
  const [scheme, n, r, p, saltB64, hashB64] = stored.split("$");
  if (scheme !== "scrypt" || !saltB64 || !hashB64) return false;
  const expected = Buffer.from(hashB64, "base64");
  const actual = await scrypt(password.normalize("NFKC"), Buffer.from(saltB64, "base64"), expected.length, {
    N: Number(n),
    r: Number(r),
    p: Number(p),
    maxmem: 64 * 1024 * 1024,
  });
  return actual.length === expected.length && timingSafeEqual(actual, expected);
}

/** A random URL-safe token and its SHA-256 (only the hash is stored). */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}
