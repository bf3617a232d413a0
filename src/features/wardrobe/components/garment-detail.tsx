import { useState } from "react";
import { Link } from "react-router";
import { finishedPointLabels, garmentStatuses, garmentStatusLabels, type FinishedPoint, type GarmentDetailDto, type GarmentStatus } from "@shared/schemas/garments";
import { formatLength, type LengthUnit } from "@shared/domain/units";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { InputField, SelectField } from "@/components/ui/field";
import { useAddCopies, useFabricOptions, useMoveGarments, useUpdateGarment } from "../api/garments";
import { StatusBadge } from "./status-badge";
import { GarmentForm } from "./garment-form";
import { useProductionTime } from "@/hooks/use-production-time";
import { formatDate } from "@shared/format";

interface Props {
  productionId: string;
  garment: GarmentDetailDto;
  unit: LengthUnit;
  canUpdate: boolean;
  canMove: boolean;
  canReadFabrics: boolean;
}

/** One garment: measurements, where it is and has been, which changes use it, its copies. */
export function GarmentDetail({ productionId, garment: g, unit, canUpdate, canMove, canReadFabrics }: Props) {
  const [editing, setEditing] = useState(false);
  const { dateTime } = useProductionTime();
  const update = useUpdateGarment(productionId, g.id);
  const copies = useAddCopies(productionId, g.id);
  const move = useMoveGarments(productionId);
  const fabrics = useFabricOptions(productionId, canReadFabrics && canUpdate);
  const [status, setStatus] = useState<GarmentStatus>(g.status);
  const [copyCount, setCopyCount] = useState(1);
  const other = unit === "cm" ? "in" : "cm";
  const points = Object.entries(g.finishedMeasurements) as [FinishedPoint, number][];

  return (
    <div className="grid gap-4 lg:grid-cols-3">
      <Card className="lg:col-span-2">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div>
            <p className="font-mono text-lg font-bold text-ink">{g.tagCode}</p>
            <h2 className="text-xl font-bold text-ink-900">
              {g.name}
              {g.copyNumber !== null && <span className="ml-2 text-base text-slate">copy #{g.copyNumber}</span>}
            </h2>
            <p className="text-sm text-slate">
              {g.category} · size {g.sizeLabel ?? "—"} · {g.fitIntent} fit · {g.source}
              {g.vendor && ` (${g.vendor})`}
              {g.fabricName && ` · ${g.fabricName}`}
              {g.colour && ` · ${g.colour}`}
            </p>
          </div>
          <div className="text-right">
            <StatusBadge status={g.status} />
            <p className="mt-1 text-sm text-slate">{[g.locationRack, g.locationBin].filter(Boolean).join(" / ") || "no location"}</p>
            {g.rentalDueOn && <p className="text-sm font-semibold text-ochre">Rental due back {formatDate(g.rentalDueOn)}</p>}
            <p className="text-sm text-slate">Distress stage {g.distressStage}</p>
          </div>
        </div>
        {editing ? (
          <div className="mt-4">
            <GarmentForm
              unit={unit}
              fabrics={fabrics.data ?? (g.fabricId ? [{ id: g.fabricId, name: g.fabricName ?? "current fabric" }] : [])}
              initial={g}
              busy={update.isPending}
              error={update.error}
              submitLabel="Save garment"
              onSubmit={(v) => update.mutate(v, { onSuccess: () => setEditing(false) })}
            />
          </div>
        ) : (
          <>
            <h3 className="mt-4 mb-1 font-semibold text-ink">Finished measurements</h3>
            {points.length === 0 ? (
              <p className="text-sm text-slate">None recorded.</p>
            ) : (
              <table className="text-sm" aria-label="Finished measurements">
                <tbody>
                  {points.map(([p, mm]) => (
                    <tr key={p}>
                      <th className="pr-4 text-left font-normal text-slate">{finishedPointLabels[p] ?? p}</th>
                      <td className="pr-4 font-semibold">{formatLength(mm, unit)}</td>
                      <td className="text-slate">{formatLength(mm, other)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
            {g.notes && <p className="mt-3 text-sm whitespace-pre-line">{g.notes}</p>}
            {canUpdate && (
              <Button className="mt-3" variant="secondary" size="sm" onClick={() => setEditing(true)}>
                Edit
              </Button>
            )}
          </>
        )}
      </Card>

      <div className="grid content-start gap-4">
        {canMove && (
          <Card>
            <h3 className="mb-2 font-semibold text-ink">Move</h3>
            <form
              className="grid gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                const fd = new FormData(e.currentTarget);
                move.mutate({ garmentIds: [g.id], status, locationRack: String(fd.get("rack") ?? ""), locationBin: String(fd.get("bin") ?? ""), note: String(fd.get("note") ?? "") || null });
              }}
            >
              <SelectField label="Status" value={status} onChange={(e) => setStatus(e.target.value as GarmentStatus)}>
                {garmentStatuses.map((s) => (
                  <option key={s} value={s}>
                    {garmentStatusLabels[s]}
                  </option>
                ))}
              </SelectField>
              <div className="grid grid-cols-2 gap-2">
                <InputField label="Rack" name="rack" defaultValue={g.locationRack ?? ""} />
                <InputField label="Bin" name="bin" defaultValue={g.locationBin ?? ""} />
              </div>
              <InputField label="Note" name="note" />
              <Button type="submit" busy={move.isPending}>
                Move
              </Button>
              {move.error && <ErrorAlert error={move.error} title="Not moved" />}
            </form>
          </Card>
        )}
        <Card>
          <h3 className="mb-2 font-semibold text-ink">Multiples</h3>
          {g.groupCopies.length > 0 ? (
            <ul className="grid gap-1 text-sm">
              {g.groupCopies.map((c) => (
                <li key={c.id} className="flex items-center justify-between gap-2">
                  <Link to={`../${c.id}`} relative="path" className="font-mono text-ink underline-offset-2 hover:underline">
                    #{c.copyNumber} {c.tagCode}
                  </Link>
                  <span className="flex items-center gap-2">
                    <span className="text-xs text-slate">distress {c.distressStage}</span>
                    <StatusBadge status={c.status} />
                  </span>
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-slate">A single garment, not in a multiples group.</p>
          )}
          {canUpdate && (
            <form
              className="mt-3 flex items-end gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                copies.mutate({ count: copyCount });
              }}
            >
              <InputField label="Make copies" type="number" min={1} max={20} value={copyCount} onChange={(e) => setCopyCount(Number(e.target.value))} className="w-28" />
              <Button type="submit" size="md" variant="secondary" busy={copies.isPending}>
                Make {copyCount}
              </Button>
            </form>
          )}
          {copies.error && <ErrorAlert error={copies.error} title="No copies made" />}
        </Card>
        <Card>
          <h3 className="mb-2 font-semibold text-ink">Changes using it</h3>
          {g.changes.length === 0 ? (
            <p className="text-sm text-slate">Not in any change yet.</p>
          ) : (
            <ul className="grid gap-1 text-sm">
              {g.changes.map((c) => (
                <li key={`${c.changeId}-${c.label}`}>
                  {c.characterName}, change {c.changeNumber}: {c.label}
                  {c.viaGroup && <span className="text-xs text-slate"> (any copy)</span>}
                </li>
              ))}
            </ul>
          )}
        </Card>
      </div>

      <Card className="lg:col-span-3">
        <h3 className="mb-2 font-semibold text-ink">History</h3>
        {g.history.length === 0 ? (
          <EmptyState title="No moves recorded" />
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" aria-label="Status history">
              <thead className="text-xs uppercase tracking-wide text-slate">
                <tr>
                  <th className="px-2 py-1">When</th>
                  <th className="px-2 py-1">Who</th>
                  <th className="px-2 py-1">From</th>
                  <th className="px-2 py-1">To</th>
                  <th className="px-2 py-1">Note</th>
                </tr>
              </thead>
              <tbody>
                {g.history.map((e) => (
                  <tr key={e.id} className="border-t border-chalk-200">
                    <td className="px-2 py-1 whitespace-nowrap">{dateTime(e.at)}</td>
                    <td className="px-2 py-1">{e.actorName ?? "—"}</td>
                    <td className="px-2 py-1">{e.fromStatus ? `${garmentStatusLabels[e.fromStatus]}${e.fromLocation ? ` · ${e.fromLocation}` : ""}` : "—"}</td>
                    <td className="px-2 py-1">
                      {garmentStatusLabels[e.toStatus]}
                      {e.toLocation ? ` · ${e.toLocation}` : ""}
                    </td>
                    <td className="px-2 py-1">{e.note ?? ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
    </div>
  );
}
