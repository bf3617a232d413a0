import { useState } from "react";
import { Link } from "react-router-dom";
import {
  checkedOutStatuses,
  finishedPointLabels,
  garmentStatuses,
  garmentStatusLabels,
  type FinishedPoint,
  type GarmentDetailDto,
  type GarmentDto,
  type GarmentStatus,
} from "@shared/schemas/garments";
import { scheduleLabels, type ScheduleKind } from "@shared/domain/schedule-labels";
import { formatLength, type LengthUnit } from "@shared/domain/units";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { InputField, SelectField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { garmentFileUrls, useAddCopies, useCheckoutOptions, useFabricOptions, useMoveGarments, useUpdateGarment } from "../api/garments";
import { StatusBadge } from "./status-badge";
import { LabelPositionSelect } from "./label-position";
import { GarmentForm } from "./garment-form";
import { CheckoutFields, CheckoutSummary, checkoutFromDraft, emptyCheckout, type CheckoutDraft } from "./checkout-fields";
import { useProductionTime } from "@/hooks/use-production-time";
import { formatDate } from "@shared/format";

interface Props {
  productionId: string;
  garment: GarmentDetailDto;
  unit: LengthUnit;
  kind: ScheduleKind;
  canUpdate: boolean;
  canMove: boolean;
  canReadFabrics: boolean;
}

const outStatus = (s: GarmentStatus) => (checkedOutStatuses as readonly GarmentStatus[]).includes(s);

/** One click to this garment's tag label, on a chosen position of a partly used sheet. */
function TagLabelLink({ productionId, garmentId }: { productionId: string; garmentId: string }) {
  const [start, setStart] = useState(1);
  return (
    <div className="grid gap-1">
      <div className="flex flex-wrap items-end gap-2">
        <a
          className="inline-flex min-h-11 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50"
          target="_blank"
          rel="noreferrer"
          href={garmentFileUrls.labels(productionId, { ids: garmentId }, start)}
        >
          Print tag label (PDF)
        </a>
        <LabelPositionSelect value={start} onChange={setStart} />
      </div>
      <p className="text-xs text-slate">
        A4 sheet of 3 × 8 labels; on a partly used sheet, choose the first free one (1 is top left, counting along each row).
      </p>
    </div>
  );
}

/** "Make copies": makes N copies, says which it made (with links), clears its field. */
function MakeCopies({ productionId, garment: g }: { productionId: string; garment: GarmentDetailDto }) {
  const copies = useAddCopies(productionId, g.id);
  const [count, setCount] = useState("");
  const [made, setMade] = useState<{ copies: GarmentDto[]; becameFirst: boolean } | null>(null);
  const n = Number(count);
  const valid = Number.isInteger(n) && n >= 1 && n <= 20;
  return (
    <>
      <form
        className="mt-3 flex items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (!valid) return;
          // Whether this garment starts a new group is known before the page refetches it.
          const becameFirst = g.copyNumber === null;
          copies.mutate(
            { count: n },
            {
              onSuccess: (rows) => {
                setMade({ copies: rows.filter((r) => r.id !== g.id), becameFirst });
                setCount("");
              },
            },
          );
        }}
      >
        <InputField
          label="Make copies"
          type="number"
          min={1}
          max={20}
          inputMode="numeric"
          placeholder="1–20"
          value={count}
          onChange={(e) => {
            setCount(e.target.value);
            setMade(null);
          }}
          error={count !== "" && !valid ? "Enter a whole number from 1 to 20" : undefined}
          className="w-32"
        />
        <Button type="submit" size="md" variant="secondary" busy={copies.isPending} disabled={!valid}>
          {valid ? `Make ${n} ${n === 1 ? "copy" : "copies"}` : "Make copies"}
        </Button>
      </form>
      {made && made.copies.length > 0 && (
        <div role="status" className="mt-2 rounded-md border border-ink-100 bg-ink-50 px-3 py-2 text-sm text-ink">
          Made {made.copies.length} {made.copies.length === 1 ? "copy" : "copies"}
          {made.becameFirst ? ` (this garment is now #1 of “${made.copies[0]!.multiplesGroupName ?? g.name}”)` : ""}:{" "}
          {made.copies.map((c, i) => (
            <span key={c.id}>
              {i > 0 && ", "}
              <Link to={`../${c.id}`} relative="path" className="font-mono font-semibold underline">
                #{c.copyNumber} {c.tagCode}
              </Link>
            </span>
          ))}
          . Each has a history row; print their tag labels from the wardrobe table.
        </div>
      )}
      {copies.error && <ErrorAlert error={copies.error} title="No copies made" />}
    </>
  );
}

/** One garment: measurements, where it is and has been, which changes use it, its copies. */
export function GarmentDetail({ productionId, garment: g, unit, kind, canUpdate, canMove, canReadFabrics }: Props) {
  const [editing, setEditing] = useState(false);
  const { dateTime } = useProductionTime();
  const update = useUpdateGarment(productionId, g.id);
  const move = useMoveGarments(productionId);
  const fabrics = useFabricOptions(productionId, canReadFabrics && canUpdate);
  const checkoutOptions = useCheckoutOptions(productionId, canMove);
  const [status, setStatus] = useState<GarmentStatus>(g.status);
  const [checkout, setCheckout] = useState<CheckoutDraft>(emptyCheckout);
  const moveErrors = move.error instanceof ApiError ? move.error.fields : {};
  const words = scheduleLabels(kind);
  const other = unit === "cm" ? "in" : "cm";
  const points = Object.entries(g.finishedMeasurements) as [FinishedPoint, number][];

  return (
    // grid-cols-1 (minmax(0, 1fr)) keeps wide tables scrolling inside their cards on a phone.
    <div className="grid grid-cols-1 gap-4 lg:grid-cols-3">
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
        {g.checkout && (
          <p
            className={`mt-3 rounded-md border px-3 py-2 text-sm ${g.checkout.pastDue ? "border-madder/40 bg-madder-50" : "border-ink-100 bg-ink-50"}`}
            role="group"
            aria-label="Who has it"
          >
            <CheckoutSummary checkout={g.checkout} kind={kind} />
          </p>
        )}
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
            <div className="mt-3 flex flex-wrap items-end gap-3">
              {canUpdate && (
                <Button variant="secondary" onClick={() => setEditing(true)} className="min-h-11">
                  Edit
                </Button>
              )}
              <TagLabelLink productionId={productionId} garmentId={g.id} />
            </div>
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
                const form = e.currentTarget;
                const fd = new FormData(form);
                const to = outStatus(status) ? checkoutFromDraft(checkout) : null;
                move.mutate(
                  {
                    garmentIds: [g.id],
                    status,
                    locationRack: String(fd.get("rack") ?? ""),
                    locationBin: String(fd.get("bin") ?? ""),
                    note: String(fd.get("note") ?? "") || null,
                    checkout: to,
                  },
                  {
                    onSuccess: () => {
                      setCheckout(emptyCheckout);
                      form.reset();
                    },
                  },
                );
              }}
            >
              <SelectField
                label="Status"
                value={status}
                onChange={(e) => setStatus(e.target.value as GarmentStatus)}
                error={moveErrors.status}
              >
                {garmentStatuses.map((s) => (
                  <option key={s} value={s}>
                    {garmentStatusLabels[s]}
                  </option>
                ))}
              </SelectField>
              {outStatus(status) && (
                <CheckoutFields options={checkoutOptions.data} kind={kind} value={checkout} onChange={setCheckout} errors={moveErrors} />
              )}
              <div className="grid grid-cols-2 gap-2">
                <InputField label="Rack" name="rack" defaultValue={g.locationRack ?? ""} />
                <InputField label="Bin" name="bin" defaultValue={g.locationBin ?? ""} />
              </div>
              <InputField label="Note" name="note" />
              <Button type="submit" busy={move.isPending}>
                {outStatus(status) && checkout.to ? "Check out" : g.checkout && !outStatus(status) ? "Check in" : "Move"}
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
          {canUpdate && <MakeCopies productionId={productionId} garment={g} />}
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

      {g.checkouts.length > 0 && (
        <Card className="lg:col-span-3">
          <h3 className="mb-2 font-semibold text-ink">Check-outs</h3>
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" aria-label="Check-outs">
              <thead className="text-xs uppercase tracking-wide text-slate">
                <tr>
                  <th className="px-2 py-1">To</th>
                  <th className="px-2 py-1">For</th>
                  <th className="px-2 py-1">Out</th>
                  <th className="px-2 py-1">Due back</th>
                  <th className="px-2 py-1">Back</th>
                </tr>
              </thead>
              <tbody>
                {g.checkouts.map((c) => (
                  <tr key={c.id} className="border-t border-chalk-200">
                    <td className="px-2 py-1">
                      {c.to.name}
                      <span className="text-xs text-slate"> ({c.to.kind})</span>
                    </td>
                    <td className="px-2 py-1">
                      {[c.shootDay ? words.on(c.shootDay.date) : null, c.scene ? `scene ${c.scene.number}` : null]
                        .filter(Boolean)
                        .join(", ") || "—"}
                    </td>
                    <td className="px-2 py-1 whitespace-nowrap">
                      {dateTime(c.checkedOutAt)}
                      {c.checkedOutByName ? ` by ${c.checkedOutByName}` : ""}
                    </td>
                    <td className={c.pastDue ? "px-2 py-1 font-semibold text-madder" : "px-2 py-1"}>
                      {formatDate(c.dueBackOn)}
                      {c.pastDue ? " (past due)" : ""}
                    </td>
                    <td className="px-2 py-1 whitespace-nowrap">{c.returnedAt ? dateTime(c.returnedAt) : "still out"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Card>
      )}

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
                    <td className="px-2 py-1">
                      {e.fromStatus ? `${garmentStatusLabels[e.fromStatus]}${e.fromLocation ? ` · ${e.fromLocation}` : ""}` : "—"}
                    </td>
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
