import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// WCAG 2.1, definitions of "relative luminance" and "contrast ratio" (sRGB, (L1 + 0.05) / (L2 + 0.05)).
function luminance(hex: string): number {
  const [r, g, b] = [0, 2, 4]
    .map((i) => parseInt(hex.slice(1 + i, 3 + i), 16) / 255)
    .map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

const css = readFileSync(path.resolve("src/index.css"), "utf8");
const tokens = Object.fromEntries([...css.matchAll(/--color-([\w-]+):\s*(#[0-9a-fA-F]{6})/g)].map((m) => [m[1]!, m[2]!]));
const colour = (v: string) => (v.startsWith("#") ? v : tokens[/var\(--color-([\w-]+)\)/.exec(v)![1]!]!);

/** Fill and text colour of each calendar event kind, read from the stylesheet the app ships. */
function eventColours(kind: string): { fill: string; text: string } {
  const rule = new RegExp(`^\\.cal-event-${kind}\\s*\\{([^}]*)\\}`, "m").exec(css);
  expect(rule, `.cal-event-${kind} in src/index.css`).not.toBeNull();
  const fill = /background-color:\s*([^;]+);/.exec(rule![1]!)![1]!.trim();
  const text = /(?:^|;)\s*color:\s*([^;]+);/.exec(rule![1]!)![1]!.trim();
  return { fill: colour(fill), text: colour(text) };
}

describe("calendar event colours", () => {
  it("computes contrast as WCAG 2.1 defines it", () => {
    // WCAG 2.1 Understanding SC 1.4.3: ratios run from 1:1 to 21:1 (black on white).
    expect(contrast("#000000", "#FFFFFF")).toBeCloseTo(21, 10);
    expect(contrast("#777777", "#777777")).toBeCloseTo(1, 10);
  });

  it.each(["shoot", "fitting", "work", "late"])("%s: text at least 4.5:1 on its fill (WCAG 2.1 SC 1.4.3)", (kind) => {
    const { fill, text } = eventColours(kind);

    expect(contrast(fill, text)).toBeGreaterThanOrEqual(4.5);
  });

  it("fittings keep the ochre fill and the calendar's rules use the same colours as the legend", () => {
    expect(eventColours("fitting").fill.toLowerCase()).toBe(tokens.ochre!.toLowerCase());
    for (const kind of ["shoot", "fitting", "work", "late"]) {
      const scoped = new RegExp(`\\.workroom-calendar \\.rbc-event\\.cal-event-${kind}\\s*\\{([^}]*)\\}`).exec(css);
      const { fill, text } = eventColours(kind);
      expect(colour(/background-color:\s*([^;]+);/.exec(scoped![1]!)![1]!.trim())).toBe(fill);
      expect(colour(/(?:^|;)\s*color:\s*([^;]+);/.exec(scoped![1]!)![1]!.trim())).toBe(text);
    }
  });
});
