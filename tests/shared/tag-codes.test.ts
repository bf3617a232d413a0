import { describe, expect, it } from "vitest";
import { TAG_ALPHABET, TAG_BODY_LENGTH, formatTagCode, generateTagCode, parseTagCode, tagCheckChar } from "@shared/domain/tag-codes";

// A small deterministic generator (mulberry32) so the checks below are repeatable.
function seeded(seed: number) {
  let a = seed >>> 0;
  return (n: number) => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return Math.floor((((t ^ (t >>> 14)) >>> 0) / 4294967296) * n);
  };
}

describe("tag code alphabet", () => {
  it("has 31 distinct symbols and none of 0, O, 1, I, L", () => {
    expect(new Set(TAG_ALPHABET).size).toBe(31);
    for (const ch of "0O1IL") expect(TAG_ALPHABET).not.toContain(ch);
  });
});

describe("check character (mod 31, weights 1..5)", () => {
  const bodies = Array.from({ length: 200 }, (_, i) =>
    generateTagCode(seeded(i + 1))
      .replace("-", "")
      .slice(0, TAG_BODY_LENGTH),
  );

  // Exhaustive over every position and every other symbol: a weighted sum modulo a prime with weights
  // non-zero mod 31 changes under any single substitution (same argument as the ISBN-10 check, mod 11).
  it("catches every single-character substitution (exhaustive over 200 bodies)", () => {
    for (const body of bodies) {
      const check = tagCheckChar(body);
      for (let i = 0; i < body.length; i++) {
        for (const ch of TAG_ALPHABET) {
          if (ch === body[i]) continue;
          const typo = body.slice(0, i) + ch + body.slice(i + 1);
          expect(parseTagCode(typo + check).ok).toBe(false);
        }
      }
    }
  });

  // Swapping positions i and i+1 changes the sum by (v_i − v_{i+1})·(w_{i+1} − w_i) = v_i − v_{i+1} ≠ 0 (mod 31).
  // The check itself acts as weight −1 (Σ i·v_i − c ≡ 0), so a swap with it changes the sum by 25·(v_5 − c) ≠ 0.
  it("catches every swap of two different adjacent characters (exhaustive over 200 bodies)", () => {
    for (const body of bodies) {
      const code = body + tagCheckChar(body);
      for (let i = 0; i < code.length - 1; i++) {
        if (code[i] === code[i + 1]) continue;
        const swapped = code.slice(0, i) + code[i + 1] + code[i] + code.slice(i + 2);
        expect(parseTagCode(swapped).ok, `${code} → ${swapped}`).toBe(false);
      }
    }
  });

  it("gives the hand-computed check for 22222 (all values 0 → sum 0 → '2') and 32222 (1·1 → '3')", () => {
    // TAG_ALPHABET[0] = "2", [1] = "3": worked by hand from the definition.
    expect(tagCheckChar("22222")).toBe("2");
    expect(tagCheckChar("32222")).toBe("3");
    // 23222: value 1 at weight 2 → 2 → "4".
    expect(tagCheckChar("23222")).toBe("4");
  });
});

describe("parseTagCode", () => {
  it("accepts lower case, spaces and missing hyphen, and returns the printed form", () => {
    const code = generateTagCode(seeded(7));
    const compact = code.replace("-", "");
    expect(parseTagCode(compact.toLowerCase())).toEqual({ ok: true, code });
    expect(parseTagCode(` ${compact.slice(0, 3)} ${compact.slice(3)} `)).toEqual({ ok: true, code });
    expect(formatTagCode(compact)).toBe(code);
  });

  it("explains look-alike characters", () => {
    const r = parseTagCode("0K7QMX");
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/never use 0, O, 1, I or L/);
  });

  it("refuses the wrong length", () => {
    expect(parseTagCode("4K7").ok).toBe(false);
  });
});
