import { useState, type FormEvent } from "react";
import {
  finishedPointLabels,
  finishedPoints,
  fitIntents,
  garmentCategories,
  garmentSources,
  wrapDispositions,
  type FinishedPoint,
  type GarmentDto,
} from "@shared/schemas/garments";
import { formatLength, mmToUnit, parseLength, roundTo, type LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { InputField, SelectField, TextareaField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";

/** What the form submits (the server schema parses it again). */
export type GarmentFormValues = Record<string, unknown>;

interface Props {
  unit: LengthUnit;
  fabrics: Array<{ id: string; name: string }>;
  initial?: GarmentDto;
  /** Show "copies" (creation only). */
  allowCopies?: boolean;
  busy: boolean;
  error: unknown;
  submitLabel: string;
  onSubmit: (values: GarmentFormValues) => void;
}

const MAIN_POINTS: FinishedPoint[] = [
  "chest",
  "bust",
  "waist",
  "hip",
  "back_length",
  "sleeve",
  "inside_leg",
  "neck",
  "shoulder",
  "head",
  "foot_length",
];

/** Create / edit a garment; lengths typed in the production's unit (fractions allowed in inches), sent in mm. */
export function GarmentForm({ unit, fabrics, initial, allowCopies, busy, error, submitLabel, onSubmit }: Props) {
  const [lengthErrors, setLengthErrors] = useState<Record<string, string>>({});
  const fields = error instanceof ApiError ? error.fields : {};
  const shownPoints = finishedPoints.filter((p) => MAIN_POINTS.includes(p) || initial?.finishedMeasurements[p] !== undefined);

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const fd = new FormData(e.currentTarget);
    const str = (k: string) => {
      const v = String(fd.get(k) ?? "").trim();
      return v === "" ? null : v;
    };
    const finished: Record<string, number> = {};
    const errs: Record<string, string> = {};
    for (const p of shownPoints) {
      const raw = str(`fm_${p}`);
      if (!raw) continue;
      const r = parseLength(raw, unit);
      if (!r.ok) errs[p] = r.reason;
      else finished[p] = roundTo(r.mm, 3);
    }
    setLengthErrors(errs);
    if (Object.keys(errs).length) return;
    const cost = str("cost");
    const weekly = str("rentalCostPerWeek");
    const values: GarmentFormValues = {
      name: str("name") ?? "",
      category: str("category") ?? "",
      sizeLabel: str("sizeLabel"),
      fitIntent: str("fitIntent"),
      source: str("source"),
      vendor: str("vendor"),
      costCents: cost === null ? null : Math.round(Number(cost) * 100),
      rentalDueOn: str("rentalDueOn"),
      rentalCostPerWeekCents: weekly === null ? null : Math.round(Number(weekly) * 100),
      wrapDisposition: str("wrapDisposition"),
      fabricId: str("fabricId"),
      colour: str("colour"),
      distressStage: Number(str("distressStage") ?? 0),
      notes: str("notes"),
      finishedMeasurements: finished,
    };
    if (!initial) {
      values.locationRack = str("locationRack");
      values.locationBin = str("locationBin");
      if (allowCopies) values.copies = Number(str("copies") ?? 1);
    }
    onSubmit(values);
  };

  const fm = (p: FinishedPoint) => {
    const mm = initial?.finishedMeasurements[p];
    return mm === undefined ? "" : String(roundTo(mmToUnit(mm, unit), unit === "cm" ? 1 : 3));
  };

  return (
    <form onSubmit={submit} noValidate className="grid gap-4" aria-label={submitLabel}>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <InputField label="Name" name="name" required defaultValue={initial?.name} error={fields.name} />
        <InputField label="Category" name="category" list="garment-categories" defaultValue={initial?.category} error={fields.category} />
        <datalist id="garment-categories">
          {garmentCategories.map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
        <InputField label="Size label" name="sizeLabel" defaultValue={initial?.sizeLabel ?? ""} error={fields.sizeLabel} />
        <SelectField label="Fit intent" name="fitIntent" defaultValue={initial?.fitIntent ?? "regular"}>
          {fitIntents.map((f) => (
            <option key={f}>{f}</option>
          ))}
        </SelectField>
        <SelectField label="Source" name="source" defaultValue={initial?.source ?? "built"} error={fields.source}>
          {garmentSources.map((s) => (
            <option key={s}>{s}</option>
          ))}
        </SelectField>
        <InputField label="Vendor / maker" name="vendor" defaultValue={initial?.vendor ?? ""} />
        <InputField
          label="Cost"
          name="cost"
          type="number"
          step="0.01"
          min={0}
          defaultValue={initial?.costCents != null ? (initial.costCents / 100).toFixed(2) : ""}
          error={fields.costCents}
          hint="Built: making cost; bought: price; rented: any flat hire fee"
        />
        <InputField
          label="Rental due back"
          name="rentalDueOn"
          type="date"
          defaultValue={initial?.rentalDueOn ?? ""}
          error={fields.rentalDueOn}
        />
        <InputField
          label="Hire rate per week"
          name="rentalCostPerWeek"
          type="number"
          step="0.01"
          min={0}
          defaultValue={initial?.rentalCostPerWeekCents != null ? (initial.rentalCostPerWeekCents / 100).toFixed(2) : ""}
          error={fields.rentalCostPerWeekCents}
          hint="Rented garments; the budget counts it for every week hired"
        />
        <SelectField
          label="At wrap"
          name="wrapDisposition"
          defaultValue={initial?.wrapDisposition ?? ""}
          error={fields.wrapDisposition}
          hint="Owned garments; rented ones go back"
        >
          <option value="">Not decided</option>
          {wrapDispositions.map((w) => (
            <option key={w} value={w}>
              {w === "keep" ? "Keep in stock" : "Sell"}
            </option>
          ))}
        </SelectField>
        <SelectField label="Fabric" name="fabricId" defaultValue={initial?.fabricId ?? ""} error={fields.fabricId}>
          <option value="">—</option>
          {fabrics.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name}
            </option>
          ))}
        </SelectField>
        <InputField label="Colour" name="colour" defaultValue={initial?.colour ?? ""} />
        <InputField
          label="Distress stage"
          name="distressStage"
          type="number"
          min={0}
          max={10}
          defaultValue={initial?.distressStage ?? 0}
          error={fields.distressStage}
        />
        {!initial && (
          <>
            <InputField label="Rack" name="locationRack" />
            <InputField label="Bin" name="locationBin" />
          </>
        )}
        {allowCopies && (
          <InputField
            label="Copies (multiples)"
            name="copies"
            type="number"
            min={1}
            max={20}
            defaultValue={1}
            hint="More than 1 makes a multiples group #1..#n"
            error={fields.copies}
          />
        )}
      </div>
      <fieldset className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <legend className="mb-1 text-sm font-semibold text-ink">
          Finished measurements ({unit === "cm" ? "cm" : "inches; 37 1/2 works"})
        </legend>
        {shownPoints.map((p) => (
          <InputField
            key={p}
            label={finishedPointLabels[p]}
            name={`fm_${p}`}
            inputMode="decimal"
            defaultValue={fm(p)}
            error={lengthErrors[p] ?? fields[`finishedMeasurements.${p}`]}
            hint={
              initial?.finishedMeasurements[p] !== undefined
                ? formatLength(initial.finishedMeasurements[p]!, unit === "cm" ? "in" : "cm")
                : undefined
            }
          />
        ))}
      </fieldset>
      <TextareaField label="Notes" name="notes" defaultValue={initial?.notes ?? ""} />
      {error != null && <ErrorAlert error={error} title="Not saved" />}
      <div>
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
