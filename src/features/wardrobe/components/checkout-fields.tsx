import type { CheckoutInput, CheckoutOptionsDto, GarmentCheckoutDto } from "@shared/schemas/garments";
import { scheduleLabels, type ScheduleKind } from "@shared/domain/schedule-labels";
import { formatDate } from "@shared/format";
import { InputField, SelectField } from "@/components/ui/field";
import { Badge } from "@/components/ui/feedback";

/** What the check-out fields hold while someone fills them in. */
export interface CheckoutDraft {
  /** "member:<userId>", "performer:<performerId>" or "" (nobody named). */
  to: string;
  shootDayId: string;
  sceneId: string;
  /** YYYY-MM-DD, or "" for the default (the day's date, else today). */
  dueBackOn: string;
}

export const emptyCheckout: CheckoutDraft = { to: "", shootDayId: "", sceneId: "", dueBackOn: "" };

/** The request part for a draft, or null when nobody is named (a plain move). */
export function checkoutFromDraft(d: CheckoutDraft): CheckoutInput | null {
  if (!d.to) return null;
  const [kind, id] = d.to.split(":") as ["member" | "performer", string];
  return {
    ...(kind === "member" ? { toUserId: id } : { toPerformerId: id }),
    shootDayId: d.shootDayId || null,
    sceneId: d.sceneId || null,
    dueBackOn: d.dueBackOn || null,
  };
}

interface CheckoutFieldsProps {
  options: CheckoutOptionsDto | undefined;
  kind: ScheduleKind;
  value: CheckoutDraft;
  onChange: (next: CheckoutDraft) => void;
  /** Server messages by field (`checkout.toUserId`, …). */
  errors?: Record<string, string>;
}

/** To whom (a member or a performer), for which shoot day / performance and scene, due back when. */
export function CheckoutFields({ options, kind, value, onChange, errors = {} }: CheckoutFieldsProps) {
  const words = scheduleLabels(kind);
  const set = (patch: Partial<CheckoutDraft>) => onChange({ ...value, ...patch });
  const day = options?.days.find((d) => d.id === value.shootDayId);
  const defaultDue = day?.date ?? options?.today ?? "";
  return (
    <fieldset className="grid gap-2 rounded-md border border-chalk-200 p-2">
      <legend className="px-1 text-sm font-semibold text-ink">Check out to</legend>
      <SelectField
        label="To whom"
        value={value.to}
        onChange={(e) => set({ to: e.target.value })}
        error={errors["checkout.toUserId"] ?? errors["checkout.toPerformerId"]}
        hint={value.to ? undefined : "Leave as is to move without naming anyone."}
      >
        <option value="">Nobody named</option>
        {options && options.members.length > 0 && (
          <optgroup label="Members">
            {options.members.map((m) => (
              <option key={m.userId} value={`member:${m.userId}`}>
                {m.name} ({m.role})
              </option>
            ))}
          </optgroup>
        )}
        {options && options.performers.length > 0 && (
          <optgroup label="Performers">
            {options.performers.map((p) => (
              <option key={p.id} value={`performer:${p.id}`}>
                {p.name}
                {p.characters.length ? ` (${p.characters.join(", ")})` : ""}
              </option>
            ))}
          </optgroup>
        )}
      </SelectField>
      {value.to && (
        <div className="grid gap-2 sm:grid-cols-2">
          <SelectField
            label={words.Day}
            value={value.shootDayId}
            onChange={(e) => set({ shootDayId: e.target.value, sceneId: "" })}
            error={errors["checkout.shootDayId"]}
          >
            <option value="">None</option>
            {options?.days.map((d) => (
              <option key={d.id} value={d.id}>
                {d.date === options.today ? "Today · " : ""}
                {words.numbered(d.dayNumber)} · {formatDate(d.date)}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Scene"
            value={value.sceneId}
            onChange={(e) => set({ sceneId: e.target.value })}
            error={errors["checkout.sceneId"]}
            disabled={!day}
          >
            <option value="">{day ? "Any / not one scene" : `Choose a ${words.day} first`}</option>
            {day?.scenes.map((s) => (
              <option key={s.id} value={s.id}>
                Scene {s.number}
              </option>
            ))}
          </SelectField>
          <InputField
            label="Due back"
            type="date"
            min={options?.today}
            value={value.dueBackOn || defaultDue}
            onChange={(e) => set({ dueBackOn: e.target.value })}
            error={errors["checkout.dueBackOn"]}
            className="sm:col-span-2"
            hint={value.dueBackOn ? undefined : day ? `The ${words.day}'s date unless you change it.` : "Today unless you change it."}
          />
        </div>
      )}
    </fieldset>
  );
}

/** "With Ada Pell · shoot day 2026-12-04, scene 42 · due back 2026-12-04" with a past-due badge. */
export function CheckoutSummary({ checkout: c, kind, compact }: { checkout: GarmentCheckoutDto; kind: ScheduleKind; compact?: boolean }) {
  const words = scheduleLabels(c.shootDay?.kind === "performance" ? "stage" : kind);
  const forWhat = [c.shootDay ? words.on(c.shootDay.date) : null, c.scene ? `scene ${c.scene.number}` : null].filter(Boolean).join(", ");
  return (
    <span className="inline-flex flex-wrap items-center gap-x-1.5 gap-y-0.5">
      <span>
        With <strong className="font-semibold">{c.to.name}</strong>
        {!compact && c.to.kind === "performer" && <span className="text-slate"> (performer)</span>}
      </span>
      {!compact && forWhat && <span className="text-slate">· {forWhat}</span>}
      <span className={c.pastDue ? "font-semibold text-madder" : "text-slate"}>· due back {formatDate(c.dueBackOn)}</span>
      {c.pastDue && <Badge tone="blocking">past due</Badge>}
    </span>
  );
}
