import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldLabel, fieldSentence, issuesToFieldSentences, plainMessage } from "@shared/field-messages";
import { createFabricTestInputSchema } from "@shared/schemas/fabrics";
import { createProductionInputSchema } from "@shared/schemas/productions";

// Wording rules: common practice, no source (a field's own name, then what is wrong with it).
describe("fieldLabel", () => {
  it.each([
    ["name", "Name"],
    ["readings.overhangMm", "Overhang"],
    ["settings.reminderHour", "Reminder hour"],
    ["values.waist_girth", "Waist girth"],
    ["finishedMeasurements.chest", "Finished chest"],
    ["items.0.garmentId", "Item 1: garment"],
    ["tasks.2.amountMm", "Task 3: amount"],
    ["fibreContent.1.percent", "Fibre 2: per cent"],
    ["notches.0", "Notch 1"],
    ["storyDayTo", "To story day"],
    ["someNewFieldMm", "Some new field"],
    ["line 3, int_ext", "line 3, int_ext"],
  ])("%s → %s", (path, label) => {
    expect(fieldLabel(path)).toBe(label);
  });
});

describe("fieldSentence", () => {
  it("puts the field's name in front of a predicate", () => {
    expect(fieldSentence("name", "is required")).toBe("Name is required");
    expect(fieldSentence("readings.overhangMm", "must be greater than 0")).toBe("Overhang must be greater than 0");
  });

  it("uses a colon when the message does not read on from the name", () => {
    expect(fieldSentence("garmentId", "no such garment in this production")).toBe("Garment: no such garment in this production");
  });

  it("lets an instruction stand as its own sentence", () => {
    expect(fieldSentence("password", "choose a password")).toBe("Choose a password");
  });

  it("keeps a message that is already a sentence", () => {
    expect(fieldSentence("values.waist_girth", "Waist girth 5000 mm is above the plausible maximum of 1800 mm")).toBe(
      "Waist girth 5000 mm is above the plausible maximum of 1800 mm",
    );
  });
});

describe("plainMessage", () => {
  it("rewrites a service's 'path: predicate' message", () => {
    expect(plainMessage("name: is required")).toBe("Name is required");
    expect(plainMessage("readings.overhangMm: must be greater than 0")).toBe("Overhang must be greater than 0");
  });

  it("capitalises any other message and leaves it alone", () => {
    expect(plainMessage("A checked ticket is closed; raise a new one for more work.")).toBe(
      "A checked ticket is closed; raise a new one for more work.",
    );
  });
});

describe("zod issues in plain words", () => {
  it("words schema messages and zod's own defaults alike", () => {
    const r = createFabricTestInputSchema.safeParse({ testedOn: "2026-12-03", readings: { kind: "mass", massG: -1, lengthMm: 100 } });
    expect(r.success).toBe(false);
    const fields = issuesToFieldSentences(r.error!.issues);
    expect(fields["readings.massG"]).toBe("Specimen mass must be greater than 0");
    expect(fields["readings.widthMm"]).toBe("Width must be a number of millimetres");
  });

  it("says 'is required' for a missing value and names limits in words", () => {
    const r = createProductionInputSchema.safeParse({ title: "x".repeat(500), kind: "opera" });
    const fields = issuesToFieldSentences(r.error!.issues);
    expect(fields.title).toMatch(/^Title must be at most \d+ characters$/);
    expect(fields.kind).toBe("Kind must be one of: film, series, stage");

    const missing = issuesToFieldSentences(z.object({ storyDay: z.number().int().min(1) }).safeParse({}).error!.issues);
    expect(missing.storyDay).toBe("Story day is required");
    const small = issuesToFieldSentences(z.object({ storyDay: z.number().int().min(1) }).safeParse({ storyDay: 0 }).error!.issues);
    expect(small.storyDay).toBe("Story day must be at least 1");
  });
});
