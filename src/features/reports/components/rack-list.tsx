import { Link } from "react-router-dom";
import type { RackGarmentDto, RackListDto } from "@shared/schemas/reports";
import { garmentStatusLabels } from "@shared/schemas/garments";
import { rackFlags } from "@shared/domain/reports/rack-list";
import { Badge, EmptyState, SafetyNote } from "@/components/ui/feedback";
import { Card } from "@/components/ui/card";
import { cn } from "@/utils/cn";
import { formatDay } from "../format";
import { QrCode } from "./qr-code";

/** "Shoot day 7 · Tue 8 Dec 2026 · 07:00" or "Performance · …". */
export function rackDayLabel(list: RackListDto): string {
  if (!list.day) return list.productionKind === "stage" ? "No performance after today" : "No shoot day after today";
  const d = list.day;
  return `${d.kind === "performance" ? "Performance" : `Shoot day ${d.dayNumber}`} · ${formatDay(d.date)}${d.startsAt ? ` · ${d.startsAt}` : ""}`;
}

function GarmentRow({ g }: { g: RackGarmentDto }) {
  const flags = rackFlags(g);
  // The QR holds the full address, so a second phone can scan it off this screen or the printed list.
  const href = g.checkOutPath ? new URL(g.checkOutPath, window.location.origin).toString() : null;
  return (
    <li className="flex gap-3 py-3" aria-label={`${g.tagCode ?? "No garment"} ${g.label}`}>
      {g.checkOutPath && href ? (
        <Link
          to={g.checkOutPath}
          className="rounded focus:outline-2 focus:outline-ink"
          aria-label={`Check out ${g.tagCode}`}
          data-qr-for={g.tagCode ?? ""}
        >
          <QrCode text={href} size={88} label={`QR code: check out ${g.tagCode}`} />
        </Link>
      ) : (
        <div className="grid size-[88px] shrink-0 place-items-center rounded border border-dashed border-madder/50 text-center text-xs text-madder">
          no garment
        </div>
      )}
      <div className="min-w-0 flex-1">
        <div className="flex flex-wrap items-baseline gap-x-2">
          <span className="font-mono text-lg font-bold text-ink-900">{g.tagCode ?? "—"}</span>
          {g.copyNumber !== null && (
            <span className="font-semibold text-ink">
              copy #{g.copyNumber}
              {g.copiesHeld !== null ? ` of ${g.copiesHeld}` : ""}
            </span>
          )}
        </div>
        <p className="text-sm text-ink-900">
          <span className="text-slate">{g.label}:</span> {g.name ?? (g.copyNumber !== null ? "this copy is not held" : "no garment linked")}
        </p>
        <p className="text-base font-semibold text-ink-900">
          Rack {g.rack ?? "–"} · bin {g.bin ?? "–"}
        </p>
        <div className="mt-1 flex flex-wrap gap-1">
          {g.status && <Badge tone={g.status === "in_stock" ? "neutral" : "blocking"}>{garmentStatusLabels[g.status]}</Badge>}
          <Badge>stage {g.distressStage}</Badge>
          {flags.map((f) => (
            <Badge key={f} tone="warning">
              {f}
            </Badge>
          ))}
          {g.bringSpare && (
            <Badge tone="warning">
              {g.spare
                ? `bring spare copy ${g.spare.tagCode}${g.spare.copyNumber ? ` (#${g.spare.copyNumber})` : ""}`
                : "bring spare copy: none held"}
            </Badge>
          )}
        </div>
        <p className="mt-1 text-xs text-slate">Scenes {g.sceneNumbers.join(", ")}</p>
        {g.warnings.length > 0 && (
          <ul className="mt-1 grid gap-0.5 text-sm" aria-label="Warnings">
            {g.warnings.map((w) => (
              <li key={w.message} className={cn(w.level === "blocking" ? "text-madder" : "text-[#8a5d17]", "font-semibold")}>
                {w.message}
              </li>
            ))}
          </ul>
        )}
        {g.checkOutPath && (
          <Link
            to={g.checkOutPath}
            className="mt-2 inline-flex min-h-11 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50"
          >
            Check out {g.tagCode}
          </Link>
        )}
      </div>
    </li>
  );
}

/** The rack list as the set reads it on a phone: characters in call order, big tag codes and locations. */
export function RackList({ list }: { list: RackListDto }) {
  if (!list.day) return <EmptyState title={rackDayLabel(list)}>Add shoot days or performances on the Breakdown screen.</EmptyState>;
  if (!list.characters.length)
    return <EmptyState title="Nobody is called on this day">The day has no scenes with characters in changes yet.</EmptyState>;
  const wetOrStunt = list.characters.some((c) => c.changes.some((ch) => ch.garments.some((g) => g.wet || g.stunt)));
  return (
    <div className="grid gap-3">
      {wetOrStunt && (
        <SafetyNote>
          Wet and stunt scenes: bring the spare copy; agree drying, padding and quick-release fastenings with the stunt coordinator.
        </SafetyNote>
      )}
      {list.characters.map((c) => (
        <Card key={c.characterId} className="p-3 sm:p-4">
          <h2 className="flex flex-wrap items-baseline justify-between gap-2 text-lg font-bold text-ink">
            <span>
              {c.callOrder}. {c.name}
            </span>
            <span className="text-sm font-normal text-slate">Scenes {c.sceneNumbers.join(", ")}</span>
          </h2>
          {c.changes.map((ch) => (
            <section key={ch.changeId ?? "none"} aria-label={`${c.name}, ${ch.number !== null ? `change ${ch.number}` : "no change"}`}>
              <h3 className="mt-2 text-sm font-semibold text-ink-900">
                {ch.number !== null ? `Change ${ch.number}` : "No change set"}
                {ch.description ? ` – ${ch.description}` : ""}{" "}
                <span className="font-normal text-slate">· scenes {ch.sceneNumbers.join(", ")}</span>
              </h3>
              <ul className="divide-y divide-chalk-200">
                {ch.garments.map((g, i) => (
                  <GarmentRow key={`${g.garmentId ?? g.label}-${i}`} g={g} />
                ))}
              </ul>
            </section>
          ))}
        </Card>
      ))}
    </div>
  );
}
