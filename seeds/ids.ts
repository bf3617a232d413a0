import { createHash } from "node:crypto";

/** A fixed uuid for a demo record, derived from a readable name, so seeding is idempotent. */
export function demoId(name: string): string {
  const h = createHash("sha256").update(`seamscene-demo:${name}`).digest("hex");
  // Shape as a version-4-looking uuid (variant bits set) so uuid validators accept it.
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-${((parseInt(h[16]!, 16) & 0x3) | 0x8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}
