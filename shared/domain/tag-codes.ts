// Garment tag codes: short, unambiguous when read aloud or off a worn label, with a check character.
// Alphabet: digits 2–9 and A–Z without I, L and O (31 symbols), so 0/O and 1/I/L can never be confused.
// The check character is Σ (i+1)·v_i mod 31 over the body. 31 is prime and the weights 1..5 are distinct
// and non-zero mod 31, so every single-character substitution and every swap of two adjacent characters
// changes the check (the same argument as ISBN-10's mod-11 check).

/** The 31 symbols used in tag codes. */
export const TAG_ALPHABET = "23456789ABCDEFGHJKMNPQRSTUVWXYZ";
/** Random characters before the check character. */
export const TAG_BODY_LENGTH = 5;
const MOD = TAG_ALPHABET.length;

/** Check character for a tag body (body characters must be in TAG_ALPHABET). */
export function tagCheckChar(body: string): string {
  let sum = 0;
  for (let i = 0; i < body.length; i++) {
    const v = TAG_ALPHABET.indexOf(body[i]!);
    if (v < 0) throw new RangeError(`"${body[i]}" is not a tag character`);
    sum += (i + 1) * v;
  }
  return TAG_ALPHABET[sum % MOD]!;
}

/** Formats body + check as printed: "4K7-QMX" (groups of three read more easily). */
export function formatTagCode(compact: string): string {
  return `${compact.slice(0, 3)}-${compact.slice(3)}`;
}

/**
 * Makes a new tag code from a source of random integers.
 * @param randomInt returns an integer in [0, n) — crypto.randomInt on the server, a seeded generator in demo data
 */
export function generateTagCode(randomInt: (n: number) => number): string {
  let body = "";
  for (let i = 0; i < TAG_BODY_LENGTH; i++) body += TAG_ALPHABET[randomInt(MOD)];
  return formatTagCode(body + tagCheckChar(body));
}

/** Result of reading a typed or scanned tag code. */
export type ParseTagResult = { ok: true; code: string } | { ok: false; reason: string };

/**
 * Normalises a typed or scanned tag code ("4k7 qmx", "4K7-QMX") and verifies its check character.
 * @returns the code as stored ("4K7-QMX") or a plain reason
 */
export function parseTagCode(input: string): ParseTagResult {
  const s = input.toUpperCase().replace(/[\s\-_.]/g, "");
  if (s.length === 0) return { ok: false, reason: "enter a tag code" };
  if (s.length !== TAG_BODY_LENGTH + 1) return { ok: false, reason: `a tag code has ${TAG_BODY_LENGTH + 1} characters, e.g. 4K7-QMX` };
  for (const ch of s) {
    if (!TAG_ALPHABET.includes(ch)) {
      const hint = "0O1IL".includes(ch) ? " (tag codes never use 0, O, 1, I or L)" : "";
      return { ok: false, reason: `"${ch}" is not used in tag codes${hint}` };
    }
  }
  const body = s.slice(0, TAG_BODY_LENGTH);
  if (tagCheckChar(body) !== s[TAG_BODY_LENGTH])
    return { ok: false, reason: "the last character does not match; check the code for a typing slip" };
  return { ok: true, code: formatTagCode(s) };
}
