/**
 * Escapes a user's text for a LIKE / ILIKE pattern, so `%`, `_` and `\` match themselves (PostgreSQL's
 * default escape character is the backslash).
 */
export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}
