import { describe, expect, it } from "vitest";
import { scheduleLabels } from "@shared/domain/schedule-labels";

describe("schedule words", () => {
  it("a stage production says performance wherever a film says shoot day", () => {
    const film = scheduleLabels("film");
    const stage = scheduleLabels({ kind: "stage" });

    expect([film.Day, film.days, film.on("2030-09-02"), film.numbered(3), film.Next]).toEqual([
      "Shoot day",
      "shoot days",
      "shoot day Mon 2 Sep 2030",
      "Day 3",
      "Next shoot day",
    ]);
    expect([stage.Day, stage.days, stage.on("2030-09-02"), stage.numbered(3), stage.Next]).toEqual([
      "Performance",
      "performances",
      "performance Mon 2 Sep 2030",
      "Performance 3",
      "Next performance",
    ]);
    for (const v of Object.values(stage)) if (typeof v === "string") expect(v.toLowerCase()).not.toContain("shoot");
  });

  it("a series shoots like a film; an unknown or missing kind reads as film", () => {
    expect(scheduleLabels("series").day).toBe("shoot day");
    expect(scheduleLabels(undefined).day).toBe("shoot day");
    expect(scheduleLabels({ kind: null }).day).toBe("shoot day");
  });
});
