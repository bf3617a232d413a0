// Check-outs past due: a garment given to a member or performer that is not back by the date it
// was due. Judged against "today" as the server's clock gives it in the production's time zone.
import { calendarDaysBetween } from "../../calendar-days";
import { scheduleLabels } from "../schedule-labels";
import { formatDate } from "../../format";
import type { CheckoutRec, JsonValue, SnagDraft, SnapshotIndex } from "./types";

/** True when a check-out due back on `dueBackOn` is still out on `today` and should have come back. */
export function checkoutPastDue(dueBackOn: string, today: string): boolean {
  return dueBackOn < today;
}

/** Names the rule needs to explain one check-out. */
export interface CheckoutFacts {
  checkout: CheckoutRec;
  tagCode: string;
  garmentName: string;
  /** "shoot day 2026-12-04" or "performance 2026-12-04", when the check-out names a day. */
  dayText: string | null;
  sceneNumber: string | null;
  today: string;
}

/** The snag for one check-out past its due date, or null while it is not due yet. */
export function checkoutOverdueSnag(f: CheckoutFacts): SnagDraft | null {
  const c = f.checkout;
  if (!checkoutPastDue(c.dueBackOn, f.today)) return null;
  const late = calendarDaysBetween(c.dueBackOn, f.today);
  const forWhat = [f.dayText, f.sceneNumber ? `scene ${f.sceneNumber}` : null].filter(Boolean).join(", ");
  // Days late is in the explanation, not the evidence: the evidence (and so a dismissal) must not
  // change every morning while the facts stay the same.
  const evidence: { [k: string]: JsonValue } = {
    checkoutId: c.id,
    with: c.toName,
    checkedOutOn: c.checkedOutOn,
    dueBackOn: c.dueBackOn,
  };
  return {
    key: `checkout_overdue:${c.id}`,
    kind: "checkout_overdue",
    severity: "warning",
    title: `${f.tagCode} ${f.garmentName} is still with ${c.toName}, due back ${formatDate(c.dueBackOn)}`,
    explanation:
      `${f.tagCode} ${f.garmentName} went out to ${c.toName} on ${formatDate(c.checkedOutOn)}${forWhat ? ` for ${forWhat}` : ""} and was due back on ${formatDate(c.dueBackOn)}; ` +
      `on ${formatDate(f.today)} it is ${late} day${late === 1 ? "" : "s"} past due. Get it back and check it in, or check it out again with a new date.`,
    subject: { garmentId: c.garmentId, ...(c.sceneId ? { sceneIds: [c.sceneId] } : {}) },
    evidence,
  };
}

/** Snags for every open check-out past its due date. */
export function checkoutSnags(ix: SnapshotIndex, today: string): SnagDraft[] {
  const words = scheduleLabels(ix.snapshot.production.kind);
  const dates = new Map<string, string>();
  for (const d of ix.snapshot.shootDays) dates.set(d.id, d.date);
  for (const p of ix.snapshot.performances ?? []) dates.set(p.id, p.date);
  const out: SnagDraft[] = [];
  for (const c of ix.snapshot.checkouts ?? []) {
    const g = ix.garmentsById.get(c.garmentId);
    if (!g) continue;
    const date = c.shootDayId ? dates.get(c.shootDayId) : undefined;
    const s = checkoutOverdueSnag({
      checkout: c,
      tagCode: g.tagCode,
      garmentName: g.name,
      dayText: date ? words.on(date) : null,
      sceneNumber: c.sceneId ? (ix.scenesById.get(c.sceneId)?.number ?? null) : null,
      today,
    });
    if (s) out.push(s);
  }
  return out;
}
