import { useState, type FormEvent } from "react";
import { createFittingInputSchema, type WorkroomOptionsDto } from "@shared/schemas/workroom";
import { Button } from "@/components/ui/button";
import { InputField, SelectField, TextareaField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useCreateFitting } from "../api/workroom";
import { fieldErrorsOf } from "@/lib/form-errors";
import { useProductionTime } from "@/hooks/use-production-time";
import { instantFromZoned } from "@shared/format";

/** Book a fitting: performer, change, date and time (the production's time zone), length, room, who attends. */
export function FittingForm({ productionId, options, onDone }: { productionId: string; options: WorkroomOptionsDto; onDone: () => void }) {
  const create = useCreateFitting(productionId);
  const { timeZone } = useProductionTime();
  const [performerId, setPerformerId] = useState("");
  const [changeId, setChangeId] = useState("");
  const [date, setDate] = useState("");
  const [time, setTime] = useState("10:00");
  const [minutes, setMinutes] = useState("45");
  const [room, setRoom] = useState("");
  const [attendees, setAttendees] = useState<string[]>([]);
  const [notes, setNotes] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const performer = options.performers.find((p) => p.id === performerId);
  const changes = options.changes.filter((c) => !performerId || c.performerId === performerId);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    // The time typed is the department's local time, wherever this browser is.
    const when = date && time ? instantFromZoned(date, time, timeZone) : null;
    const input = {
      performerId,
      changeId: changeId || null,
      startsAt: when ? when.toISOString() : "",
      durationMinutes: Number(minutes),
      room: room.trim() || null,
      attendeeIds: attendees,
      notes: notes.trim() || null,
    };
    const parsed = createFittingInputSchema.safeParse(input);
    if (!parsed.success) {
      const errs = fieldErrorsOf(parsed.error);
      if (errs.startsAt) errs.date = "Choose a date and time";
      setErrors(errs);
      return;
    }
    setErrors({});
    create.mutate(parsed.data, { onSuccess: () => onDone(), onError: (err) => err instanceof ApiError && setErrors(err.fields) });
  };

  return (
    <form onSubmit={submit} className="grid gap-3" aria-label="Book a fitting">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Performer" value={performerId} onChange={(e) => setPerformerId(e.target.value)} error={errors.performerId}>
          <option value="">Choose…</option>
          {options.performers.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Change" value={changeId} onChange={(e) => setChangeId(e.target.value)} error={errors.changeId}>
          <option value="">General fitting</option>
          {changes.map((c) => (
            <option key={c.id} value={c.id}>
              {c.label}
            </option>
          ))}
        </SelectField>
        <InputField label="Date" type="date" value={date} onChange={(e) => setDate(e.target.value)} error={errors.date} />
        <InputField label="Time" type="time" value={time} onChange={(e) => setTime(e.target.value)} hint={`${timeZone} time`} />
        <InputField
          label="Length (minutes)"
          type="number"
          min={5}
          max={480}
          step={5}
          value={minutes}
          onChange={(e) => setMinutes(e.target.value)}
          error={errors.durationMinutes}
        />
        <InputField label="Room" value={room} onChange={(e) => setRoom(e.target.value)} error={errors.room} />
      </div>
      <fieldset>
        <legend className="text-sm font-semibold text-ink-900">Who attends</legend>
        <div className="mt-1 flex flex-wrap gap-3">
          {options.members.map((m) => (
            <label key={m.id} className="flex min-h-10 items-center gap-2 text-sm">
              <input
                type="checkbox"
                className="size-5"
                checked={attendees.includes(m.id)}
                onChange={(e) => setAttendees((a) => (e.target.checked ? [...a, m.id] : a.filter((x) => x !== m.id)))}
              />
              {m.name}
            </label>
          ))}
        </div>
        {errors.attendeeIds && <p className="text-sm text-madder">{errors.attendeeIds}</p>}
      </fieldset>
      <TextareaField label="Notes" value={notes} onChange={(e) => setNotes(e.target.value)} />
      {performer && (
        <p className="text-xs text-slate">
          {performer.email
            ? `The invitation (with a calendar file) goes to ${performer.email}.`
            : "This performer has no e-mail on file; the invitation goes to the address in their contact, if any."}
        </p>
      )}
      {create.error && <ErrorAlert error={create.error} title="Fitting not booked" />}
      <div className="flex gap-2">
        <Button type="submit" size="lg" busy={create.isPending}>
          Book fitting
        </Button>
        <Button variant="ghost" size="lg" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
