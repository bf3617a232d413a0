// Pure helpers for the breakdown: scene numbers, page eighths, stage running-time gaps.

/** Splits a scene number like "42AB" into its numeric part and letter suffix. */
export function splitSceneNumber(n: string): { num: number; suffix: string } {
  const m = /^([0-9]+)([A-Za-z]*)$/.exec(n.trim());
  if (!m) return { num: Number.POSITIVE_INFINITY, suffix: n };
  return { num: Number(m[1]), suffix: m[2]!.toUpperCase() };
}

/**
 * Orders scene numbers as scripts do: 41 < 42 < 42A < 42AA < 42B < 43 (numeric part, then the
 * suffix letter by letter, so a scene inserted between 42A and 42B reads 42AA).
 */
export function compareSceneNumbers(a: string, b: string): number {
  const x = splitSceneNumber(a);
  const y = splitSceneNumber(b);
  if (x.num !== y.num) return x.num < y.num ? -1 : 1;
  return x.suffix < y.suffix ? -1 : x.suffix > y.suffix ? 1 : 0;
}

/**
 * Parses a page length written in eighths: "3/8", "1", "1 3/8", "2 4/8" → eighths (11 for 1 3/8).
 * Returns null for anything else (including fractions not in eighths).
 */
export function parseEighths(text: string): number | null {
  const t = text.trim();
  const m = /^(?:(\d{1,3})(?:\s+(\d)\/8)?|(\d)\/8)$/.exec(t);
  if (!m) return null;
  if (m[3] !== undefined) {
    const e = Number(m[3]);
    return e >= 1 && e <= 7 ? e : null;
  }
  const whole = Number(m[1]);
  const frac = m[2] === undefined ? 0 : Number(m[2]);
  if (m[2] !== undefined && (frac < 1 || frac > 7)) return null;
  return whole * 8 + frac;
}

/** Writes eighths as a script page length: 11 → "1 3/8", 3 → "3/8", 16 → "2". */
export function formatEighths(eighths: number): string {
  const whole = Math.floor(eighths / 8);
  const frac = eighths % 8;
  if (!frac) return String(whole);
  return whole ? `${whole} ${frac}/8` : `${frac}/8`;
}

/** A scene in running order with its running minutes (null when unknown). */
export interface RunningScene {
  id: string;
  runningMinutes: number | null;
}

/** A character's presence in a scene. */
export interface RunningAppearance {
  id: string;
  sceneId: string;
  characterId: string;
}

/**
 * For each appearance, the running time since the same character's previous exit: the minutes of
 * the scenes played strictly between the character's previous scene and this one (unknown running
 * times count as 0, as the quick-change check does). null for a character's first entrance.
 * @param scenes scenes in running order
 */
export function minutesSincePreviousExit(
  scenes: readonly RunningScene[],
  appearances: readonly RunningAppearance[],
): Map<string, number | null> {
  const pos = new Map<string, number>();
  const prefix: number[] = [0];
  scenes.forEach((s, i) => {
    pos.set(s.id, i);
    prefix.push(prefix[i]! + (s.runningMinutes ?? 0));
  });
  const byChar = new Map<string, Array<{ id: string; p: number }>>();
  for (const a of appearances) {
    const p = pos.get(a.sceneId);
    if (p === undefined) continue;
    const list = byChar.get(a.characterId) ?? [];
    list.push({ id: a.id, p });
    byChar.set(a.characterId, list);
  }
  const out = new Map<string, number | null>();
  for (const list of byChar.values()) {
    list.sort((a, b) => a.p - b.p);
    list.forEach((a, i) => {
      if (i === 0) return out.set(a.id, null);
      const prev = list[i - 1]!;
      // Round to hundredths: running minutes are stored as numeric(6,2).
      out.set(a.id, Math.round((prefix[a.p]! - prefix[prev.p + 1]!) * 100) / 100);
    });
  }
  return out;
}
