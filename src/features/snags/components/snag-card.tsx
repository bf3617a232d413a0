import { Link } from "react-router-dom";
import type { JsonValue } from "@shared/domain/snags/types";
import { snagKindLabels, type SnagDto } from "@shared/schemas/snags";
import { Badge } from "@/components/ui/feedback";
import { Button } from "@/components/ui/button";
import { cn } from "@/utils/cn";
import { useProductionTime } from "@/hooks/use-production-time";
import { formatDate } from "@shared/format";

const severityBorder = { blocking: "border-l-madder", warning: "border-l-ochre", note: "border-l-slate" } as const;

/** Evidence members that are ids or hashes say nothing to a reader. */
const hidden = (key: string) => /(^|[a-z])(id|ids|Id|Ids|hash)$/.test(key) || key === "copyId";
const isUuid = (v: unknown) => typeof v === "string" && /^[0-9a-f]{8}-[0-9a-f]{4}-/.test(v);
const words = (key: string) =>
  key
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/_/g, " ")
    .toLowerCase();

function show(v: JsonValue): string {
  if (v === null) return "—";
  if (Array.isArray(v))
    return v
      .filter((x) => !isUuid(x))
      .map(show)
      .join(", ");
  if (typeof v === "object") {
    return Object.entries(v)
      .filter(([k, x]) => !hidden(k) && !isUuid(x))
      .map(([k, x]) => `${words(k)} ${show(x)}`)
      .join(" · ");
  }
  return String(v);
}

/** The numbers behind a snag, as plain label/value rows (ids left out). */
export function EvidenceList({ evidence }: { evidence: SnagDto["evidence"] }) {
  const rows = Object.entries(evidence).filter(([k, v]) => !hidden(k) && !isUuid(v));
  if (!rows.length) return null;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-xs text-ink-900">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="font-semibold text-slate">{words(k)}</dt>
          <dd className="break-words">{show(v)}</dd>
        </div>
      ))}
    </dl>
  );
}

interface SnagCardProps {
  snag: SnagDto;
  canDismiss: boolean;
  onDismiss?: (snag: SnagDto) => void;
  onUndo?: (dismissalId: string) => void;
  undoBusy?: boolean;
  /** Compact: title, severity and the link only (for Today). */
  compact?: boolean;
}

/** One snag: severity, title, explanation with numbers, links to fix it, and dismiss / undo. */
export function SnagCard({ snag, canDismiss, onDismiss, onUndo, undoBusy, compact }: SnagCardProps) {
  const titleId = `snag-${snag.evidenceHash}-${snag.key.length}`;
  const { dateOf } = useProductionTime();
  return (
    <article
      aria-labelledby={titleId}
      className={cn(
        "rounded-md border border-chalk-200 border-l-4 bg-white p-3 shadow-sm",
        severityBorder[snag.severity],
        snag.dismissal && "opacity-70",
      )}
    >
      <div className="flex flex-wrap items-center gap-1.5">
        <Badge tone={snag.severity}>{snag.severity}</Badge>
        {(snag.facts?.map((f) => f.kind) ?? [snag.kind]).map((k) => (
          <Badge key={k}>{snagKindLabels[k]}</Badge>
        ))}
        {snag.shootDays.slice(0, 3).map((d) => (
          <span key={d.id} className="text-xs text-slate">
            {formatDate(d.date)}
          </span>
        ))}
        {snag.dismissal && <Badge tone="neutral">dismissed</Badge>}
      </div>
      <h3 id={titleId} className="mt-1 font-semibold text-ink-900">
        {snag.title}
      </h3>
      {!compact &&
        (snag.facts && snag.facts.length > 1 ? (
          // One cause, several facts: each as its own rule stated it.
          <ul className="mt-1 grid gap-1 text-sm text-ink-900" aria-label="What this concerns">
            {snag.facts.map((f) => (
              <li key={f.kind} className="flex gap-2">
                <span className="shrink-0">
                  <Badge>{snagKindLabels[f.kind]}</Badge>
                </span>
                <span>{f.explanation}</span>
              </li>
            ))}
          </ul>
        ) : (
          <p className="mt-1 text-sm text-ink-900">{snag.explanation}</p>
        ))}
      {!compact && (
        <details className="mt-2">
          <summary className="cursor-pointer text-xs font-semibold text-ink">The numbers</summary>
          <div className="mt-1">
            <EvidenceList evidence={snag.evidence} />
          </div>
        </details>
      )}
      {snag.lapsedDismissal && !snag.dismissal && (
        <p className="mt-2 text-xs text-slate">
          Dismissed earlier by {snag.lapsedDismissal.dismissedByName ?? "someone"} (“{snag.lapsedDismissal.reason}”); the numbers have
          changed since, so it shows again.
        </p>
      )}
      {snag.dismissal && (
        <p className="mt-2 text-xs text-slate">
          Dismissed by {snag.dismissal.dismissedByName ?? "someone"} on {dateOf(snag.dismissal.dismissedAt)}: “{snag.dismissal.reason}”
        </p>
      )}
      <div className="mt-2 flex flex-wrap items-center gap-x-3 gap-y-1">
        {(compact ? snag.links.slice(0, 1) : snag.links).map((l, i) => (
          <Link
            key={`${l.href}-${i}`}
            to={l.href}
            className={cn("text-sm underline-offset-2 hover:underline", i === 0 ? "font-semibold text-ink" : "text-slate")}
          >
            {i === 0 ? `Fix: ${l.label}` : l.label}
          </Link>
        ))}
        {!compact && canDismiss && !snag.dismissal && onDismiss && (
          <Button size="sm" variant="ghost" className="ml-auto" onClick={() => onDismiss(snag)}>
            Dismiss…
          </Button>
        )}
        {!compact && canDismiss && snag.dismissal && onUndo && (
          <Button size="sm" variant="ghost" className="ml-auto" busy={undoBusy} onClick={() => onUndo(snag.dismissal!.id)}>
            Undo dismissal
          </Button>
        )}
      </div>
    </article>
  );
}
