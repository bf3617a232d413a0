import { useState, type FormEvent } from "react";
import type { CreateFabricInput, FabricDto } from "@shared/schemas/fabrics";
import { fibreContentSchema } from "@shared/schemas/fabrics";
import { gsmToOzPerSqYd, mmToUnit, parseLength, roundTo, type LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { InputField, SelectField, TextareaField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { fieldError, fieldErrorsOf } from "@/lib/form-errors";

interface Props {
  unit: LengthUnit;
  initial?: FabricDto;
  busy: boolean;
  error: unknown;
  submitLabel: string;
  onSubmit: (v: CreateFabricInput) => void;
}

const num = (v: FormDataEntryValue | null) => {
  const s = String(v ?? "")
    .trim()
    .replace(",", ".");
  return s === "" ? null : Number(s);
};

/** Fabric record: fibre content rows must add to 100 %, width in the production's unit, weight in g/m². */
export function FabricForm({ unit, initial, busy, error, submitLabel, onSubmit }: Props) {
  const [fibres, setFibres] = useState<Array<{ fibre: string; percent: string }>>(
    initial?.fibreContent.map((f) => ({ fibre: f.fibre, percent: String(f.percent) })) ?? [{ fibre: "", percent: "100" }],
  );
  const [gsm, setGsm] = useState(initial?.massPerAreaGsm != null ? String(initial.massPerAreaGsm) : "");
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const fields = { ...(error instanceof ApiError ? error.fields : {}), ...localErrors };
  const sum = fibres.reduce((s, f) => s + (Number(f.percent) || 0), 0);
  const gsmNum = Number(gsm);

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const fd = new FormData(e.currentTarget);
    const errs: Record<string, string> = {};
    const fibreContent = fibres
      .filter((f) => f.fibre.trim() || f.percent.trim())
      .map((f) => ({ fibre: f.fibre.trim(), percent: Number(f.percent) }));
    const fc = fibreContentSchema.safeParse(fibreContent);
    if (!fc.success) errs.fibreContent = Object.values(fieldErrorsOf(fc.error, "fibreContent"))[0] ?? "Check the fibres";
    let widthMm: number | null = null;
    const w = String(fd.get("width") ?? "").trim();
    if (w) {
      const r = parseLength(w, unit);
      if (!r.ok) errs.widthMm = fieldError("widthMm", r.reason);
      else widthMm = Math.round(r.mm);
    }
    setLocalErrors(errs);
    if (Object.keys(errs).length) return;
    onSubmit({
      name: String(fd.get("name") ?? ""),
      supplier: String(fd.get("supplier") ?? "") || null,
      fibreContent,
      construction: String(fd.get("construction")) as "woven" | "knit",
      widthMm,
      massPerAreaGsm: num(gsm),
      thicknessMm: num(fd.get("thicknessMm")),
      stretchWarpPct: num(fd.get("stretchWarpPct")),
      stretchWeftPct: num(fd.get("stretchWeftPct")),
      colour: String(fd.get("colour") ?? "") || null,
      careNotes: String(fd.get("careNotes") ?? "") || null,
    });
  };

  return (
    <form onSubmit={submit} noValidate className="grid gap-3" aria-label={submitLabel}>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <InputField label="Name" name="name" defaultValue={initial?.name} error={fields.name} />
        <InputField label="Supplier" name="supplier" defaultValue={initial?.supplier ?? ""} />
        <SelectField label="Construction" name="construction" defaultValue={initial?.construction ?? "woven"}>
          <option value="woven">woven</option>
          <option value="knit">knit</option>
        </SelectField>
        <InputField
          label={`Width (${unit})`}
          name="width"
          inputMode="decimal"
          defaultValue={initial?.widthMm != null ? String(roundTo(mmToUnit(initial.widthMm, unit), 1)) : ""}
          error={fields.widthMm}
        />
        <InputField
          label="Mass per area (g/m²)"
          name="gsm"
          inputMode="decimal"
          value={gsm}
          onChange={(e) => setGsm(e.target.value)}
          error={fields.massPerAreaGsm}
          hint={gsmNum > 0 ? `${roundTo(gsmToOzPerSqYd(gsmNum), 2)} oz/yd²` : "oz/yd² shown as you type"}
        />
        <InputField
          label="Thickness (mm)"
          name="thicknessMm"
          inputMode="decimal"
          defaultValue={initial?.thicknessMm ?? ""}
          error={fields.thicknessMm}
        />
        <InputField
          label="Stretch warp (%)"
          name="stretchWarpPct"
          inputMode="decimal"
          defaultValue={initial?.stretchWarpPct ?? ""}
          error={fields.stretchWarpPct}
        />
        <InputField
          label="Stretch weft (%)"
          name="stretchWeftPct"
          inputMode="decimal"
          defaultValue={initial?.stretchWeftPct ?? ""}
          error={fields.stretchWeftPct}
        />
        <InputField label="Colour" name="colour" defaultValue={initial?.colour ?? ""} />
      </div>
      <fieldset className="grid gap-2">
        <legend className="text-sm font-semibold text-ink">Fibre content — total {roundTo(sum, 2)} %</legend>
        {fibres.map((f, i) => (
          <div key={i} className="flex items-end gap-2">
            <InputField
              label={`Fibre ${i + 1}`}
              value={f.fibre}
              onChange={(e) => setFibres((xs) => xs.map((x, j) => (j === i ? { ...x, fibre: e.target.value } : x)))}
            />
            <InputField
              label="%"
              className="w-24"
              inputMode="decimal"
              value={f.percent}
              onChange={(e) => setFibres((xs) => xs.map((x, j) => (j === i ? { ...x, percent: e.target.value } : x)))}
            />
            {fibres.length > 1 && (
              <Button
                variant="ghost"
                size="sm"
                onClick={() => setFibres((xs) => xs.filter((_, j) => j !== i))}
                aria-label={`Remove fibre ${i + 1}`}
              >
                Remove
              </Button>
            )}
          </div>
        ))}
        <div>
          <Button variant="secondary" size="sm" onClick={() => setFibres((xs) => [...xs, { fibre: "", percent: "" }])}>
            Add a fibre
          </Button>
        </div>
        {fields.fibreContent && (
          <p role="alert" className="text-sm text-madder">
            {fields.fibreContent}
          </p>
        )}
      </fieldset>
      <TextareaField label="Care notes" name="careNotes" defaultValue={initial?.careNotes ?? ""} />
      {error != null && <ErrorAlert error={error} title="Not saved" />}
      <div>
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
