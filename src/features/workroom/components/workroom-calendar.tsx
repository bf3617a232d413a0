import { useMemo, useState } from "react";
import { Calendar, dateFnsLocalizer, type View } from "react-big-calendar";
import dndAddon, { type EventInteractionArgs } from "react-big-calendar/lib/addons/dragAndDrop";
import { format, getDay, parse, parseISO, startOfWeek } from "date-fns";
import { enGB } from "date-fns/locale";
import "react-big-calendar/lib/css/react-big-calendar.css";
import "react-big-calendar/lib/addons/dragAndDrop/styles.css";
import type { FittingDto, WorkroomPlanDto } from "@shared/schemas/workroom";
import { ErrorAlert } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { controlClass } from "@/components/ui/field";
import { useUpdateFitting } from "../api/workroom";

const localizer = dateFnsLocalizer({ format, parse, startOfWeek: (d: Date) => startOfWeek(d, { weekStartsOn: 1 }), getDay, locales: { "en-GB": enGB } });

interface CalEvent {
  id: string;
  title: string;
  start: Date;
  end: Date;
  allDay: boolean;
  kind: "shoot" | "fitting" | "work";
  late?: boolean;
  fitting?: FittingDto;
}

// The addon ships as CommonJS only; the bundler's interop may hand over module.exports instead of its default.
const withDragAndDrop = ((dndAddon as unknown as { default?: typeof dndAddon }).default ?? dndAddon) as typeof dndAddon;
const DnDCalendar = withDragAndDrop<CalEvent>(Calendar);
const day = (iso: string) => parseISO(iso);

/** Shoot days, fittings and planned work blocks in month, week and day views; drag a fitting to move it. */
export function WorkroomCalendar(props: {
  productionId: string;
  plan: WorkroomPlanDto;
  fittings: FittingDto[];
  canMoveFittings: boolean;
  date: Date;
  view: View;
  onNavigate: (d: Date, v: View) => void;
}) {
  const [person, setPerson] = useState("");
  const move = useUpdateFitting(props.productionId);
  // A drop only proposes the new time: the performer is e-mailed, so it is confirmed first.
  const [pending, setPending] = useState<{ fitting: FittingDto; startsAt: Date } | null>(null);

  const events = useMemo<CalEvent[]>(() => {
    const out: CalEvent[] = [];
    for (const s of props.plan.shootDays) {
      out.push({ id: `sd-${s.id}`, title: `${s.kind === "performance" ? "Performance" : "Shoot day"} ${s.dayNumber}`, start: day(s.date), end: day(s.date), allDay: true, kind: "shoot" });
    }
    for (const f of props.fittings) {
      if (f.status === "cancelled") continue;
      if (person && !f.attendeeIds.includes(person)) continue;
      out.push({ id: `f-${f.id}`, title: `Fitting: ${f.performerName}${f.room ? ` (${f.room})` : ""}`, start: new Date(f.startsAt), end: new Date(f.endsAt), allDay: false, kind: "fitting", fitting: f });
    }
    for (const t of props.plan.tickets) {
      for (const b of t.blocks) {
        if (person && b.personId !== person) continue;
        const who = props.plan.people.find((p) => p.id === b.personId)?.name ?? "";
        out.push({ id: `w-${t.id}-${b.date}-${b.personId}`, title: `${t.tagCode} ${t.garmentName} · ${b.hours} h · ${who}`, start: day(b.date), end: day(b.date), allDay: true, kind: "work", late: t.late });
      }
    }
    return out;
  }, [props.plan, props.fittings, person]);

  const onDrop = ({ event, start }: EventInteractionArgs<CalEvent>) => {
    if (event.kind !== "fitting" || !event.fitting) return;
    const startsAt = new Date(start);
    if (event.allDay || Number.isNaN(startsAt.getTime())) return;
    if (startsAt.getTime() === new Date(event.fitting.startsAt).getTime()) return;
    setPending({ fitting: event.fitting, startsAt });
  };
  const when = (d: Date) => d.toLocaleString(undefined, { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" });

  return (
    <div className="grid gap-2">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-900">
          Person
          <select className={`${controlClass} w-56`} value={person} onChange={(e) => setPerson(e.target.value)} aria-label="Show person">
            <option value="">Everyone</option>
            {props.plan.people.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <p className="text-xs text-slate">
          Dark: shoot days · ochre: fittings{props.canMoveFittings ? " (drag to move; the performer gets an update)" : ""} · grey: planned work · red: work that finishes late
        </p>
      </div>
      {move.error && <ErrorAlert error={move.error} title="Fitting not moved" />}
      <ConfirmDialog
        open={Boolean(pending)}
        title={pending ? `Move the fitting with ${pending.fitting.performerName}?` : ""}
        confirmLabel="Move and e-mail"
        busy={move.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() => pending && move.mutate({ id: pending.fitting.id, startsAt: pending.startsAt.toISOString() }, { onSettled: () => setPending(null) })}
      >
        {pending && `From ${when(new Date(pending.fitting.startsAt))} to ${when(pending.startsAt)}. `}
        {pending?.fitting.performerEmail ? `${pending.fitting.performerName} is e-mailed the new time at ${pending.fitting.performerEmail}.` : "The performer has no e-mail on file; tell them yourself."}
      </ConfirmDialog>
      <div className="h-[44rem] rounded-lg border border-chalk-200 bg-white p-2" aria-label="Workroom calendar" role="region">
        <DnDCalendar
          localizer={localizer}
          culture="en-GB"
          events={events}
          date={props.date}
          view={props.view}
          views={["month", "week", "day"]}
          onNavigate={(d) => props.onNavigate(d, props.view)}
          onView={(v) => props.onNavigate(props.date, v)}
          startAccessor="start"
          endAccessor="end"
          allDayAccessor="allDay"
          titleAccessor="title"
          popup
          scrollToTime={new Date(1970, 0, 1, 8)}
          draggableAccessor={(e) => props.canMoveFittings && e.kind === "fitting" && e.fitting?.status === "booked"}
          resizable={false}
          onEventDrop={onDrop}
          eventPropGetter={(e) => ({
            className: `workroom-${e.kind}`,
            style: {
              backgroundColor: e.kind === "shoot" ? "#2B3A67" : e.kind === "fitting" ? "#C98B2B" : e.late ? "#B5452E" : "#5B6770",
              borderColor: "transparent",
              fontSize: "0.75rem",
            },
          })}
        />
      </div>
    </div>
  );
}
