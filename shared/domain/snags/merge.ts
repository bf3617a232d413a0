// Snags with one cause show as one. A garment whose alteration runs late is, for the same reason,
// still in the workroom on the day it is needed: two rules see one problem. The late-alteration
// snag keeps its key (so its link opens the ticket) and carries both facts.
import { finishSnag, sortSnags } from "./engine";
import type { JsonValue, Snag, SnagFact, SnagSeverity } from "./types";

const RANK: Record<SnagSeverity, number> = { blocking: 0, warning: 1, note: 2 };

const factOf = (s: Snag): SnagFact => ({ kind: s.kind, severity: s.severity, title: s.title, explanation: s.explanation });

/** Whether an availability snag says the garment is in the workroom (not cleaning, lost or returned). */
function isWorkroomAvailability(s: Snag): boolean {
  return s.kind === "availability" && s.evidence.status === "workroom" && Boolean(s.subject.garmentId);
}

/**
 * Folds each "in the workroom on the day it is needed" snag into the late-alteration snag of the same
 * garment (the first by key when several tickets are late). The merged snag keeps the late snag's key,
 * takes the more severe severity, states both facts, and hashes both evidences, so a dismissal lapses
 * when either changes. Snags without a partner pass through unchanged.
 * @returns the snags, sorted like the engine's
 */
export function mergeSameCause(snags: readonly Snag[]): Snag[] {
  const lateByGarment = new Map<string, Snag>();
  for (const s of snags) {
    if (s.kind !== "workroom_late" || !s.subject.garmentId) continue;
    const cur = lateByGarment.get(s.subject.garmentId);
    if (!cur || s.key < cur.key) lateByGarment.set(s.subject.garmentId, s);
  }
  const partnerOf = new Map<string, Snag>(); // late snag key → its availability snag
  const folded = new Set<string>();
  for (const s of snags) {
    if (!isWorkroomAvailability(s)) continue;
    const late = lateByGarment.get(s.subject.garmentId!);
    if (!late) continue;
    partnerOf.set(late.key, s);
    folded.add(s.key);
  }
  if (folded.size === 0) return sortSnags([...snags]);
  const out: Snag[] = [];
  for (const s of snags) {
    if (folded.has(s.key)) continue;
    const other = partnerOf.get(s.key);
    if (!other) {
      out.push(s);
      continue;
    }
    const severity = RANK[other.severity] < RANK[s.severity] ? other.severity : s.severity;
    const evidence: { [k: string]: JsonValue } = {
      ...s.evidence,
      garmentStatus: other.evidence.status ?? "workroom",
      neededOn: other.evidence.neededOn ?? null,
    };
    const shootDayIds = Array.from(new Set([...(s.subject.shootDayIds ?? []), ...(other.subject.shootDayIds ?? [])])).sort();
    out.push(
      finishSnag({
        key: s.key,
        kind: s.kind,
        severity,
        title: `${s.title}; in the workroom on the day it is needed`,
        explanation: `${s.explanation} ${other.explanation}`,
        subject: { ...s.subject, shootDayIds },
        evidence,
        facts: [factOf(s), factOf(other)],
      }),
    );
  }
  return sortSnags(out);
}
