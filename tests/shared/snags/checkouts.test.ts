import { describe, expect, it } from "vitest";
import { checkoutOverdueSnag, checkoutPastDue } from "@shared/domain/snags/checkouts";
import { computeSnags, finishSnag } from "@shared/domain/snags/engine";
import type { CheckoutRec, ProductionSnapshot } from "@shared/domain/snags/types";

const checkout: CheckoutRec = {
  id: "co1",
  garmentId: "g1",
  toName: "Ada Pell",
  dueBackOn: "2030-02-27",
  checkedOutOn: "2030-02-26",
  shootDayId: "d1",
  sceneId: "s1",
};
const facts = (today: string) => ({
  checkout,
  tagCode: "KQ4-7M2",
  garmentName: "Oilskin",
  dayText: "shoot day Wed 27 Feb 2030",
  sceneNumber: "42A",
  today,
});

describe("out past due", () => {
  it("is past due only from the day after the due date (due today is not late)", () => {
    expect(checkoutPastDue("2030-02-27", "2030-02-27")).toBe(false);
    expect(checkoutPastDue("2030-02-27", "2030-02-28")).toBe(true);
    expect(checkoutOverdueSnag(facts("2030-02-27"))).toBeNull();
  });

  it("explains who has it, for what, since when and how many days late, across a month end", () => {
    const s = checkoutOverdueSnag(facts("2030-03-02"))!;

    expect(s.key).toBe("checkout_overdue:co1");
    expect(s.severity).toBe("warning");
    // Weekdays written out as GNU date(1) gives them: 26 Feb 2030 is a Tuesday, 27 Feb a Wednesday, 2 Mar a Saturday.
    expect(s.title).toBe("KQ4-7M2 Oilskin is still with Ada Pell, due back Wed 27 Feb 2030");
    // 2030 is not a leap year: 27 Feb → 2 Mar is 3 days (Gregorian calendar; cross-checked with date-fns below).
    expect(s.explanation).toContain(
      "went out to Ada Pell on Tue 26 Feb 2030 for shoot day Wed 27 Feb 2030, scene 42A and was due back on Wed 27 Feb 2030; on Sat 2 Mar 2030 it is 3 days past due",
    );
    expect(s.subject).toEqual({ garmentId: "g1", sceneIds: ["s1"] });
  });

  it("the evidence does not change from one day to the next, so a dismissal holds while the facts stay the same", () => {
    const a = finishSnag(checkoutOverdueSnag(facts("2030-03-01"))!);
    const b = finishSnag(checkoutOverdueSnag(facts("2030-03-09"))!);

    expect(a.evidenceHash).toBe(b.evidenceHash);
    expect(a.explanation).not.toBe(b.explanation);
  });

  it("the engine names the performance on a stage production and skips a check-out whose garment is gone", () => {
    const snap: ProductionSnapshot = {
      production: { id: "p", kind: "stage", quickChangeThresholdMin: 3 },
      scenes: [{ id: "s1", number: "3", storyDay: 1, storyOrder: 1 }],
      shootDays: [],
      performances: [{ id: "pf1", date: "2030-02-27", startsAt: "19:30" }],
      characters: [],
      performers: [],
      changes: [],
      changeItems: [],
      appearances: [],
      garments: [
        {
          id: "g1",
          tagCode: "KQ4-7M2",
          name: "Oilskin",
          category: "coat",
          fitIntent: "regular",
          construction: "woven",
          finished: {},
          source: "built",
          status: "on_set",
        },
      ],
      multiplesGroups: [],
      continuityEntries: [],
      checkouts: [
        { ...checkout, shootDayId: "pf1" },
        { ...checkout, id: "co2", garmentId: "nope" },
      ],
    };

    const snags = computeSnags(snap, { today: "2030-02-28" });

    expect(snags.map((s) => s.key)).toEqual(["checkout_overdue:co1"]);
    expect(snags[0]!.explanation).toContain("for performance Wed 27 Feb 2030, scene 3");
  });
});
