import { useState } from "react";
import { Link } from "react-router-dom";
import type { FittingDetailDto, WorkroomOptionsDto } from "@shared/schemas/workroom";
import { taskKindLabels } from "@shared/schemas/workroom";
import { formatLength, type LengthUnit } from "@shared/domain/units";
import { isMeasurementKey, MEASUREMENT_LABELS } from "@shared/domain/plausibility";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Badge, ErrorAlert } from "@/components/ui/feedback";
import { TextareaField } from "@/components/ui/field";
import { useUpdateFitting } from "../api/workroom";
import { TicketForm } from "./ticket-form";
import { TaskSafetyNotes } from "./safety";
import { OwnerPhotos } from "@/components/photos";
import { useProductionTime } from "@/hooks/use-production-time";
import { formatDate, formatHours } from "@shared/format";
import { ConfirmDialog } from "@/components/ui/dialog";
import { LinkGarment } from "./link-garment";

/** During a fitting, on a tablet: the change's garments with their fit, measurements, fit snags, notes, one tap per garment to raise a ticket. */
export function FittingView(props: {
  productionId: string;
  fitting: FittingDetailDto;
  options: WorkroomOptionsDto;
  units: LengthUnit;
  canEdit: boolean;
  canLink: boolean;
}) {
  const { fitting: f, productionId } = props;
  const [raisingFor, setRaisingFor] = useState<string | null>(null);
  const [linking, setLinking] = useState<string | null>(null);
  const [confirmCancel, setConfirmCancel] = useState(false);
  const [outcome, setOutcome] = useState(f.outcome ?? "");
  const [notes, setNotes] = useState(f.notes ?? "");
  const update = useUpdateFitting(productionId);
  const { dateTime } = useProductionTime();

  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <Link to={`/p/${productionId}/workroom`} className="text-sm text-ink underline">
            ← Workroom
          </Link>
          <h1 className="text-2xl font-bold text-ink">Fitting: {f.performerName}</h1>
          <p className="text-slate">
            {f.changeLabel ?? "General fitting"} · {dateTime(f.startsAt)} · {f.durationMinutes} min
            {f.room ? ` · ${f.room}` : ""}
          </p>
          {f.attendeeNames.length > 0 && <p className="text-sm text-slate">With {f.attendeeNames.join(", ")}</p>}
        </div>
        <Badge tone={f.status === "cancelled" ? "blocking" : f.status === "done" ? "note" : "neutral"}>{f.status}</Badge>
      </div>

      <Card>
        <h2 className="mb-2 font-semibold text-ink">Garments</h2>
        {f.items.length === 0 && (
          <p className="text-sm text-slate">No change items to show{f.changeId ? " for this change yet" : " (general fitting)"}.</p>
        )}
        <ul className="grid gap-3">
          {f.items.map((item) => (
            <li key={`${item.changeItemId}-${item.garmentId}`} className="rounded-md border border-chalk-200 p-3">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <div>
                  <p className="font-semibold text-ink-900">
                    {item.tagCode ? `${item.tagCode} ` : ""}
                    {item.garmentName ?? item.label}
                  </p>
                  <p className="text-sm text-slate">
                    {item.label}
                    {!item.garmentId ? " · no garment linked yet" : ""}
                    {item.garmentStatus ? ` · ${item.garmentStatus.replace("_", " ")}` : ""}
                    {item.openTicketIds.length
                      ? ` · ${item.openTicketIds.length} open ticket${item.openTicketIds.length === 1 ? "" : "s"}`
                      : ""}
                  </p>
                </div>
                {props.canLink && !item.garmentId && linking !== item.changeItemId && f.status !== "cancelled" && (
                  <Button
                    size="lg"
                    variant="secondary"
                    onClick={() => setLinking(item.changeItemId)}
                    aria-label={`Link a garment to ${item.label}`}
                  >
                    Link a garment
                  </Button>
                )}
                {props.canEdit && item.garmentId && raisingFor !== item.garmentId && f.status !== "cancelled" && (
                  <Button
                    size="lg"
                    onClick={() => setRaisingFor(item.garmentId)}
                    aria-label={`Raise ticket for ${item.tagCode ?? ""} ${item.garmentName ?? item.label}`.trim()}
                  >
                    Raise ticket
                  </Button>
                )}
              </div>
              {item.fit.length > 0 && (
                <ul className="mt-2 flex flex-wrap gap-2">
                  {item.fit.map((p) => (
                    <li key={p.point} title={p.sentence}>
                      <Badge tone={p.status === "tight" ? "warning" : p.status === "loose" ? "note" : "neutral"}>
                        {p.point.replace("_", " ")}: {p.status === "fits" ? "fits" : `${p.status} by ${formatLength(p.by, props.units)}`}
                      </Badge>
                    </li>
                  ))}
                </ul>
              )}
              {linking === item.changeItemId && !item.garmentId && (
                <div className="mt-3">
                  <LinkGarment
                    productionId={productionId}
                    fittingId={f.id}
                    changeItemId={item.changeItemId}
                    itemLabel={item.label}
                    onCancel={() => setLinking(null)}
                    onLinked={(gid) => {
                      setLinking(null);
                      if (props.canEdit) setRaisingFor(gid);
                    }}
                  />
                </div>
              )}
              {raisingFor === item.garmentId && item.garmentId && (
                <div className="mt-3">
                  <TicketForm
                    productionId={productionId}
                    garment={{ id: item.garmentId, label: `${item.tagCode ?? ""} ${item.garmentName ?? item.label}`.trim() }}
                    fittingId={f.id}
                    units={props.units}
                    members={props.options.members}
                    onDone={() => setRaisingFor(null)}
                  />
                </div>
              )}
            </li>
          ))}
        </ul>
      </Card>

      {f.fitSnags.length > 0 && (
        <Card>
          <h2 className="mb-2 font-semibold text-ink">Fit snags</h2>
          <ul className="grid gap-2">
            {f.fitSnags.map((s) => (
              <li key={s.key} className="text-sm">
                <Badge tone={s.severity}>{s.severity}</Badge> <span className="font-semibold">{s.title}</span>
                <p className="text-slate">{s.explanation}</p>
              </li>
            ))}
          </ul>
        </Card>
      )}

      <Card>
        <h2 className="mb-2 font-semibold text-ink">Current measurements</h2>
        {f.measurements ? (
          <>
            <p className="mb-2 text-xs text-slate">
              Taken {formatDate(f.measurements.takenOn)}. Personal data: do not copy outside the department.
            </p>
            <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-3">
              {Object.entries(f.measurements.valuesMm).map(([k, v]) => (
                <div key={k} className="flex justify-between border-b border-chalk-200 py-1">
                  <dt className="text-slate">{isMeasurementKey(k) ? MEASUREMENT_LABELS[k] : k}</dt>
                  <dd className="font-semibold">{formatLength(v, props.units)}</dd>
                </div>
              ))}
            </dl>
          </>
        ) : (
          <p className="text-sm text-slate">No measurements on file, or your role does not see measurements.</p>
        )}
      </Card>

      <Card>
        <h2 className="mb-2 font-semibold text-ink">Tickets from this fitting</h2>
        {f.tickets.length === 0 ? (
          <p className="text-sm text-slate">None yet.</p>
        ) : (
          <ul className="grid gap-2" aria-label="Tickets from this fitting">
            {f.tickets.map((t) => (
              <li key={t.id} className="rounded border border-chalk-200 p-2 text-sm">
                <span className="font-semibold">
                  {t.tagCode} {t.garmentName}
                </span>{" "}
                ·{" "}
                {t.tasks
                  .map(
                    (k) =>
                      `${taskKindLabels[k.kind]}${k.amountMm ? ` ${formatLength(k.amountMm, props.units)}` : ""}${k.distressStage ? ` to stage ${k.distressStage}` : ""}`,
                  )
                  .join(", ")}{" "}
                · {formatHours(t.estimateHours)} · <Badge>{t.status.replace("_", " ")}</Badge>
                <div className="mt-1">
                  <TaskSafetyNotes kinds={t.tasks.map((k) => k.kind)} />
                </div>
              </li>
            ))}
          </ul>
        )}
      </Card>

      <Card>
        <h2 className="mb-2 font-semibold text-ink">Notes and outcome</h2>
        <div className="mb-3">
          <OwnerPhotos
            productionId={props.productionId}
            ownerType="fitting"
            ownerId={f.id}
            canEdit={props.canEdit}
            title="Fitting photos (turnarounds)"
          />
        </div>
        <div className="grid gap-3">
          <TextareaField label="Notes" value={notes} onChange={(e) => setNotes(e.target.value)} disabled={!props.canEdit} />
          <TextareaField label="Outcome" value={outcome} onChange={(e) => setOutcome(e.target.value)} disabled={!props.canEdit} />
          {update.error && <ErrorAlert error={update.error} title="Not saved" />}
          {props.canEdit && f.status !== "cancelled" && (
            <div className="flex flex-wrap gap-2">
              <Button
                size="lg"
                variant="secondary"
                busy={update.isPending}
                onClick={() => update.mutate({ id: f.id, notes: notes || null, outcome: outcome || null })}
              >
                Save notes
              </Button>
              {f.status === "booked" && (
                <Button
                  size="lg"
                  busy={update.isPending}
                  onClick={() => update.mutate({ id: f.id, notes: notes || null, outcome: outcome || null, status: "done" })}
                >
                  Fitting done
                </Button>
              )}
              {f.status === "booked" && (
                <Button
                  size="lg"
                  variant="ghost"
                  className="text-madder"
                  disabled={update.isPending}
                  onClick={() => setConfirmCancel(true)}
                >
                  Cancel fitting…
                </Button>
              )}
            </div>
          )}
          <ConfirmDialog
            open={confirmCancel}
            title={`Cancel the fitting with ${f.performerName}?`}
            confirmLabel="Cancel fitting and e-mail"
            danger
            busy={update.isPending}
            onCancel={() => setConfirmCancel(false)}
            onConfirm={() => update.mutate({ id: f.id, status: "cancelled" }, { onSettled: () => setConfirmCancel(false) })}
          >
            {f.performerEmail
              ? `${f.performerName} is e-mailed a cancellation at ${f.performerEmail} and the booking leaves their calendar. `
              : `${f.performerName} has no e-mail address on file, so nobody is told; let them know yourself. `}
            A cancelled fitting cannot be reopened; book a new one if needed.
          </ConfirmDialog>
        </div>
      </Card>
    </div>
  );
}
