import { describe, expect, it } from "vitest";
import { hasVisibleCharacter, nameFromFile, nameSchema, optionalNameSchema } from "@shared/schemas/common";
import { fittingNewGarmentSchema } from "@shared/schemas/workroom";
import { performerInputSchema, characterInputSchema } from "@shared/schemas/cast";
import { createGarmentInputSchema } from "@shared/schemas/garments";
import { createFabricInputSchema } from "@shared/schemas/fabrics";
import { createProductionInputSchema } from "@shared/schemas/productions";

const name = nameSchema(120);

describe("nameSchema", () => {
  it.each([
    ["a plain name", "Ivy Example", "Ivy Example"],
    ["surrounding spaces trimmed", "  Ivy  ", "Ivy"],
    ["accents and other scripts", "Zoë Ó Briain · 山田", "Zoë Ó Briain · 山田"],
    // A joiner inside a name is kept (Unicode: ZWJ builds emoji sequences and some scripts' ligatures).
    ["a joiner inside", "क्‍ष", "क्‍ष"],
    ["an emoji sequence", "👩‍🔧 cutter", "👩‍🔧 cutter"],
  ])("accepts %s", (_label, input, expected) => {
    expect(name.parse(input)).toBe(expected);
  });

  it.each([
    ["empty", "", "is required"],
    ["only spaces", "   ", "is required"],
    ["a NUL", "Ivy\u0000Example", "must not contain control characters"],
    ["a line break", "Ivy\nExample", "must not contain control characters"],
    ["only zero-width spaces", "\u200B\u200B", "must contain a visible character"],
    ["only bidi marks and a word joiner", "\u200E\u200F\u2060", "must contain a visible character"],
    ["only a Hangul filler", "\u3164", "must contain a visible character"],
    ["only a Braille blank", "\u2800\u2800", "must contain a visible character"],
    ["only combining marks", "\u0301\u0308", "must contain a visible character"],
    ["only a soft hyphen", "\u00AD", "must contain a visible character"],
    ["too long", "x".repeat(121), "must be at most 120 characters"],
  ])("refuses %s with a message", (_label, input, message) => {
    const res = name.safeParse(input);

    expect(res.success).toBe(false);
    expect(res.error?.issues[0]?.message).toContain(message);
  });

  it("treats an empty optional name as none", () => {
    expect(optionalNameSchema(50).parse("")).toBeNull();
    expect(optionalNameSchema(50).parse(undefined)).toBeNull();
    expect(optionalNameSchema(50).safeParse("\u200B").success).toBe(false);
  });

  it("hasVisibleCharacter", () => {
    expect(hasVisibleCharacter("a")).toBe(true);
    expect(hasVisibleCharacter("\uFEFF\u200D")).toBe(false);
  });
});

describe("every name field uses it", () => {
  const invisible = "\u200B\u2060";
  it.each([
    ["performer", () => performerInputSchema.safeParse({ name: invisible }), "name"],
    ["character", () => characterInputSchema.safeParse({ name: "A\u0000B" }), "name"],
    [
      "garment",
      () => createGarmentInputSchema.safeParse({ name: invisible, category: "jacket", source: "built", fitIntent: "fitted" }),
      "name",
    ],
    [
      "fabric",
      () => createFabricInputSchema.safeParse({ name: invisible, fibreContent: [{ fibre: "wool", percent: 100 }], construction: "woven" }),
      "name",
    ],
    ["production", () => createProductionInputSchema.safeParse({ title: invisible, kind: "film" }), "title"],
  ])("%s", (_label, parse, field) => {
    const res = parse();

    expect(res.success).toBe(false);
    expect(res.error?.issues.map((i) => i.path.join("."))).toContain(field);
  });
});

describe("names from elsewhere", () => {
  it("a garment added at a fitting refuses NUL and invisible-only names like every other name", () => {
    const garment = (name: string) => fittingNewGarmentSchema.safeParse({ name, category: "coat" });

    expect(garment("Frock coat").success).toBe(true);
    expect(garment("Frock\u0000coat").success).toBe(false);
    expect(garment("\u200B\u3164").success).toBe(false);
  });

  it("a piece name read from a DXF file loses control characters and falls back when nothing visible is left", () => {
    expect(nameFromFile("FRONT\u0000BODICE\r\n", 120, "Piece")).toBe("FRONT BODICE");
    expect(nameFromFile("\u200B\u2060", 120, "Piece")).toBe("Piece");
    expect(nameFromFile("", 120, "Piece")).toBe("Piece");
    expect(nameFromFile("Sleeve", 3, "Piece")).toBe("Sle");
  });
});
