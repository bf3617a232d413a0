import { useState } from "react";
import { WEEKDAYS, type Weekday } from "@shared/domain/workroom";
import { upsertCapacityInputSchema, type CapacityDto } from "@shared/schemas/workroom";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { InputField, controlClass } from "@/components/ui/field";
import { useUpdateWorkroomSettings, useUpsertCapacity } from "../api/workroom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { fieldErrorsOf } from "@/lib/form-errors";

const DAY_LABEL: Record<Weekday, string> = { mon: "Mon", tue: "Tue", wed: "Wed", thu: "Thu", fri: "Fri", sat: "Sat", sun: "Sun" };

function PersonRow({ productionId, person, canEdit }: { productionId: string; person: CapacityDto; canEdit: boolean }) {
  const save = useUpsertCapacity(productionId);
  const [hours, setHours] = useState<Record<Weekday, string>>(
    () => Object.fromEntries(WEEKDAYS.map((d) => [d, String(person.hoursPerWeekday[d])])) as Record<Weekday, string>,
  );
  const [daysOff, setDaysOff] = useState(person.daysOff.join(", "));
  const [error, setError] = useState<string | null>(null);
  const submit = () => {
    const input = {
      hoursPerWeekday: Object.fromEntries(WEEKDAYS.map((d) => [d, Number(hours[d].replace(",", ".") || 0)])),
      daysOff: daysOff.split(/[\s,;]+/).filter(Boolean),
    };
    const parsed = upsertCapacityInputSchema.safeParse(input);
    if (!parsed.success) return setError(Object.values(fieldErrorsOf(parsed.error)).join("; "));
    setError(null);
    save.mutate({ userId: person.userId, ...parsed.data });
  };
  return (
    <tr className="border-b border-chalk-200" aria-label={`Hours of ${person.name}`}>
      <td className="px-2 py-2 font-semibold text-ink-900">
        {person.name}
        <span className="block text-xs font-normal text-slate">{person.role}</span>
      </td>
      {WEEKDAYS.map((d) => (
        <td key={d} className="px-1 py-2">
          <input
            aria-label={`${person.name} ${DAY_LABEL[d]} hours`}
            className={`${controlClass} w-16 px-2 py-1`}
            inputMode="decimal"
            value={hours[d]}
            disabled={!canEdit}
            onChange={(e) => setHours((h) => ({ ...h, [d]: e.target.value }))}
          />
        </td>
      ))}
      <td className="px-1 py-2">
        <input
          aria-label={`${person.name} days off`}
          className={`${controlClass} min-w-48 py-1`}
          placeholder="2026-12-11, …"
          value={daysOff}
          disabled={!canEdit}
          onChange={(e) => setDaysOff(e.target.value)}
        />
        {error && <p className="text-xs text-madder">{error}</p>}
        {save.error && <ErrorAlert error={save.error} title="Not saved" />}
      </td>
      <td className="px-1 py-2">
        {canEdit && (
          <Button size="sm" busy={save.isPending} onClick={submit}>
            Save
          </Button>
        )}
      </td>
    </tr>
  );
}

/** Each workroom member's hours per weekday and days off, plus the production's buffer and reminder hour. */
export function CapacityEditor(props: {
  productionId: string;
  people: CapacityDto[];
  settings: { bufferWorkingDays: number; reminderHour: number };
  canEdit: boolean;
}) {
  const words = scheduleLabels(useCurrentProduction().production);
  const saveSettings = useUpdateWorkroomSettings(props.productionId);
  const [buffer, setBuffer] = useState(String(props.settings.bufferWorkingDays));
  const [hour, setHour] = useState(String(props.settings.reminderHour));
  return (
    <div className="grid gap-4">
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm" aria-label="Workroom hours">
          <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
            <tr>
              <th className="px-2 py-2">Person</th>
              {WEEKDAYS.map((d) => (
                <th key={d} className="px-1 py-2">
                  {DAY_LABEL[d]}
                </th>
              ))}
              <th className="px-1 py-2">Days off</th>
              <th className="px-1 py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {props.people.map((p) => (
              <PersonRow key={p.userId} productionId={props.productionId} person={p} canEdit={props.canEdit} />
            ))}
          </tbody>
        </table>
      </div>
      <div className="grid max-w-xl gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
        <InputField
          label={`Buffer before a ${words.day} (working days)`}
          type="number"
          min={0}
          max={10}
          value={buffer}
          disabled={!props.canEdit}
          onChange={(e) => setBuffer(e.target.value)}
          hint="Time for pressing and rack prep."
        />
        <InputField
          label="Evening reminders at (hour)"
          type="number"
          min={0}
          max={23}
          value={hour}
          disabled={!props.canEdit}
          onChange={(e) => setHour(e.target.value)}
        />
        {props.canEdit && (
          <Button
            busy={saveSettings.isPending}
            onClick={() => saveSettings.mutate({ bufferWorkingDays: Number(buffer), reminderHour: Number(hour) })}
          >
            Save
          </Button>
        )}
      </div>
      {saveSettings.error && <ErrorAlert error={saveSettings.error} title="Settings not saved" />}
    </div>
  );
}
