import { useState, type FormEvent } from "react";
import { MEASUREMENT_KEYS, MEASUREMENT_LABELS, checkMeasurement, type MeasurementKey } from "@shared/domain/plausibility";
import { mmToUnit, parseLength, type LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { InputField, TextareaField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/utils/cn";
import { useCreateMeasurementSet } from "../api/measurements";

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Enter a dated set in cm or inches (fractions welcome); the server stores mm and refuses implausible values. */
export function MeasurementForm({
  productionId,
  performerId,
  defaultUnit,
  today,
}: {
  productionId: string;
  performerId: string;
  defaultUnit: LengthUnit;
  today: string;
}) {
  const create = useCreateMeasurementSet(productionId, performerId);
  const [unit, setUnit] = useState<LengthUnit>(defaultUnit);
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const serverFields = create.error instanceof ApiError ? create.error.fields : {};
  const err = (k: MeasurementKey) => localErrors[k] ?? serverFields[`values.${k}`];

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    const fd = new FormData(form);
    const values: Partial<Record<MeasurementKey, number>> = {};
    const errs: Record<string, string> = {};
    for (const k of MEASUREMENT_KEYS) {
      const raw = String(fd.get(k) ?? "").trim();
      if (!raw) continue;
      const r = parseLength(raw, unit);
      if (!r.ok) {
        errs[k] = r.reason;
        continue;
      }
      // Same plausibility rule as the server, so the message shows before the round trip.
      const c = checkMeasurement(k, r.mm);
      if (!c.ok) errs[k] = c.reason;
      values[k] = mmToUnit(r.mm, unit);
    }
    if (Object.keys(values).length === 0 && Object.keys(errs).length === 0) errs._ = "Enter at least one measurement.";
    setLocalErrors(errs);
    if (Object.keys(errs).length) return;
    create.mutate(
      { takenOn: String(fd.get("takenOn")), unit, values, notes: String(fd.get("notes") ?? "") || null },
      { onSuccess: () => form.reset() },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="grid gap-3" aria-label="New measurement set">
      <div className="flex flex-wrap items-end gap-3">
        <InputField label="Taken on" name="takenOn" type="date" defaultValue={today} error={serverFields.takenOn} />
        <div role="radiogroup" aria-label="Unit" className="flex overflow-hidden rounded-md border border-ink-100">
          {(["cm", "in"] as const).map((u) => (
            <button
              key={u}
              type="button"
              role="radio"
              aria-checked={unit === u}
              onClick={() => setUnit(u)}
              className={cn("min-h-10 px-4 text-sm font-semibold", unit === u ? "bg-ink text-chalk" : "bg-white text-ink")}
            >
              {u === "cm" ? "Centimetres" : "Inches"}
            </button>
          ))}
        </div>
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
        {MEASUREMENT_KEYS.map((k) => (
          <InputField
            key={k}
            label={`${cap(MEASUREMENT_LABELS[k])} (${unit})`}
            name={k}
            inputMode="decimal"
            autoComplete="off"
            error={err(k)}
          />
        ))}
      </div>
      <TextareaField label="Notes" name="notes" />
      {localErrors._ && (
        <p role="alert" className="text-sm text-madder">
          {localErrors._}
        </p>
      )}
      {create.error != null && <ErrorAlert error={create.error} title="Not saved" />}
      {create.isSuccess && <p className="text-sm text-ink">Saved.</p>}
      <div>
        <Button type="submit" size="lg" busy={create.isPending}>
          Save measurements
        </Button>
      </div>
    </form>
  );
}
