import { describe, expect, it } from "vitest";
import { finishSnag } from "@shared/domain/snags/engine";
import { mergeSameCause } from "@shared/domain/snags/merge";
import type { Snag, SnagDraft } from "@shared/domain/snags/types";

const late = (ticketId: string, garmentId: string, severity: Snag["severity"] = "warning"): Snag =>
  finishSnag({
    key: `workroom_late:${ticketId}`,
    kind: "workroom_late",
    severity,
    title: `Alteration of ${garmentId} late by 2 working days`,
    explanation: `Ticket ${ticketId} is due Mon but the plan finishes it Wed.`,
    subject: { garmentId, shootDayIds: ["d2"] },
    evidence: { ticketId, dueDate: "2030-09-02", plannedFinish: "2030-09-04" },
  });
const away = (garmentId: string, status: "workroom" | "cleaning" = "workroom", neededOn = "2030-09-03"): Snag =>
  finishSnag({
    key: `availability:${garmentId}`,
    kind: "availability",
    severity: "blocking",
    title: `${garmentId} is in the workroom and needed today`,
    explanation: `${garmentId} has status “${status}” and is needed today, ${neededOn}.`,
    subject: { garmentId },
    evidence: { status, neededOn },
  } satisfies SnagDraft);
const other = finishSnag({
  key: "fit:g9:chest",
  kind: "fit",
  severity: "note",
  title: "t",
  explanation: "e",
  subject: { garmentId: "g9" },
  evidence: {},
});

describe("snags with one cause show as one", () => {
  it("a late alteration and 'in the workroom on the day' of the same garment become one card with both facts", () => {
    const out = mergeSameCause([other, away("g1"), late("t1", "g1")]);

    expect(out.map((s) => s.key)).toEqual(["workroom_late:t1", "fit:g9:chest"]);
    const m = out[0]!;
    expect(m.kind).toBe("workroom_late");
    expect(m.severity).toBe("blocking"); // the more severe of the two
    expect(m.facts!.map((f) => [f.kind, f.severity])).toEqual([
      ["workroom_late", "warning"],
      ["availability", "blocking"],
    ]);
    expect(m.explanation).toContain("the plan finishes it Wed");
    expect(m.explanation).toContain("needed today, 2030-09-03");
    expect(m.evidence.ticketId).toBe("t1");
  });

  it("the merged card's evidence hash changes when either fact's evidence changes (a dismissal lapses)", () => {
    const a = mergeSameCause([away("g1"), late("t1", "g1")])[0]!;
    const b = mergeSameCause([away("g1", "workroom", "2030-09-04"), late("t1", "g1")])[0]!;

    expect(a.evidenceHash).not.toBe(b.evidenceHash);
  });

  it("leaves other causes alone: cleaning is not the workroom, another garment is another garment", () => {
    const input = [away("g1", "cleaning"), late("t1", "g1"), away("g2"), late("t3", "g3")];

    const out = mergeSameCause(input);

    expect(out.map((s) => s.key).sort()).toEqual(["availability:g1", "availability:g2", "workroom_late:t1", "workroom_late:t3"]);
    expect(out.every((s) => !s.facts)).toBe(true);
  });

  it("with two late tickets on one garment, the fact joins the first by key only (no card says it twice)", () => {
    const out = mergeSameCause([late("t2", "g1"), away("g1"), late("t1", "g1")]);

    expect(out.map((s) => [s.key, Boolean(s.facts)])).toEqual([
      ["workroom_late:t1", true],
      ["workroom_late:t2", false],
    ]);
  });
});
