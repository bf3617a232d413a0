import { useCallback, useEffect, useMemo, useRef, useState, type RefObject } from "react";
import {
  Calendar,
  dateFnsLocalizer,
  type DateHeaderProps,
  type Formats,
  type HeaderProps,
  type ToolbarProps,
  type View,
} from "react-big-calendar";
import dndAddon, { type EventInteractionArgs } from "react-big-calendar/lib/addons/dragAndDrop";
import { endOfWeek, format, getDay, parse, parseISO, startOfMonth, startOfWeek } from "date-fns";
import { enGB } from "date-fns/locale";
import "react-big-calendar/lib/css/react-big-calendar.css";
import "react-big-calendar/lib/addons/dragAndDrop/styles.css";
import type { FittingDto, WorkroomPlanDto } from "@shared/schemas/workroom";
import {
  formatDate,
  formatDateRange,
  formatDateTime,
  formatHours,
  formatMonth,
  formatWallTime,
  formatWeekday,
  formatWeekdayDay,
  instantFromWallClock,
  wallClockOf,
} from "@shared/format";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { controlClass } from "@/components/ui/field";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { cn } from "@/utils/cn";
import { useUpdateFitting } from "../api/workroom";

const WEEK = { weekStartsOn: 1 } as const;
const localizer = dateFnsLocalizer({ format, parse, startOfWeek: (d: Date) => startOfWeek(d, WEEK), getDay, locales: { "en-GB": enGB } });

type EventKind = "shoot" | "fitting" | "work" | "late";

interface CalEvent {
  id: string;
  title: string;
  start: Date;
  end: Date;
  allDay: boolean;
  kind: EventKind;
  fitting?: FittingDto;
}

// The addon ships as CommonJS only; the bundler's interop may hand over module.exports instead of its default.
const withDragAndDrop = ((dndAddon as unknown as { default?: typeof dndAddon }).default ?? dndAddon) as typeof dndAddon;
const DnDCalendar = withDragAndDrop<CalEvent>(Calendar);
const day = (iso: string) => parseISO(iso);

/** Event colours: classes in src/index.css (`cal-event-*`), each text colour at least 4.5:1 on its fill. */
const LEGEND: Array<{ kind: EventKind; label: string }> = [
  { kind: "shoot", label: "Shoot day or performance" },
  { kind: "fitting", label: "Fitting" },
  { kind: "work", label: "Planned work" },
  { kind: "late", label: "Work that finishes late" },
];

const VIEWS: Array<{ view: View; label: string; here: string }> = [
  { view: "month", label: "Month", here: "This month" },
  { view: "week", label: "Week", here: "This week" },
  { view: "day", label: "One day", here: "Today" },
];

/** The range a view shows, in the app's one date format ("30 Nov – 6 Dec 2026", "December 2026", "Thu 3 Dec 2026"). */
export function calendarRangeLabel(date: Date, view: View): string {
  if (view === "month") return formatMonth(startOfMonth(date));
  if (view === "week") return formatDateRange(startOfWeek(date, WEEK), endOfWeek(date, WEEK));
  return formatDate(date);
}

// Every date and time the grid writes goes through the one formatter; times are wall-clock in the production's zone.
const formats: Formats = {
  dateFormat: (d: Date) => format(d, "d"),
  // "Mon 30": the range above the grid gives month and year, so the columns stay readable on a tablet.
  dayFormat: (d: Date) => formatWeekdayDay(d),
  weekdayFormat: (d: Date) => formatWeekday(d),
  timeGutterFormat: (d: Date) => formatWallTime(d),
  monthHeaderFormat: (d: Date) => formatMonth(d),
  dayHeaderFormat: (d: Date) => formatDate(d),
  dayRangeHeaderFormat: ({ start, end }: { start: Date; end: Date }) => formatDateRange(start, end),
  eventTimeRangeFormat: ({ start, end }: { start: Date; end: Date }) => `${formatWallTime(start)} – ${formatWallTime(end)}`,
  selectRangeFormat: ({ start, end }: { start: Date; end: Date }) => `${formatWallTime(start)} – ${formatWallTime(end)}`,
};

const messages = {
  allDay: "All day",
  previous: "Earlier",
  next: "Later",
  today: "Today",
  month: "Month",
  week: "Week",
  day: "One day",
  showMore: (n: number) => `${n} more`,
  noEventsInRange: "Nothing on these days.",
};

// The component marks parts of its grids as table, row and cell, but not in a shape a table can have (rows
// holding buttons, header cells outside rows), which screen readers and axe-core reject. Those roles are
// taken off as the component draws, so the calendar reads as the labelled region of buttons and text it is.
const GRID_ROLES = ["table", "rowgroup", "row", "cell", "gridcell", "columnheader", "rowheader"];
const GRID_SELECTOR = GRID_ROLES.map((r) => `[role="${r}"]`).join(",");

function useFlattenedGridRoles(ref: RefObject<HTMLElement | null>) {
  useEffect(() => {
    const root = ref.current;
    if (!root) return;
    const strip = () => {
      for (const el of root.querySelectorAll<HTMLElement>(GRID_SELECTOR)) {
        el.removeAttribute("role");
        el.removeAttribute("aria-sort");
        if (el.classList.contains("rbc-month-view")) el.removeAttribute("aria-label");
      }
      // The hours grid scrolls; a keyboard user must be able to reach it even on a week with no events.
      for (const el of root.querySelectorAll<HTMLElement>(".rbc-time-content:not([tabindex])")) {
        el.tabIndex = 0;
        el.setAttribute("aria-label", "Hours of the day");
      }
    };
    strip();
    const observer = new MutationObserver(strip);
    observer.observe(root, { subtree: true, childList: true, attributes: true, attributeFilter: ["role"] });
    return () => observer.disconnect();
  }, [ref]);
}

/** A column heading: the day's name as text (the component would mark it as a sortable column header). */
function ColumnHeading({ label }: HeaderProps) {
  return <span>{label}</span>;
}

/** The day number in a month cell: a button that opens that day, named with the full date. */
function MonthDayNumber({ label, date, drilldownView, onDrillDown }: DateHeaderProps) {
  if (!drilldownView) return <span>{label}</span>;
  return (
    <button type="button" className="rbc-button-link" aria-label={`${formatDate(date)}: open the day`} onClick={onDrillDown}>
      {label}
    </button>
  );
}

/** Our toolbar, in the component's toolbar slot: Earlier · This week · Later, the range, and the three views. */
function WorkroomToolbar({ date, view, onNavigate, onView }: ToolbarProps<CalEvent>) {
  const here = VIEWS.find((v) => v.view === view)?.here ?? "Today";
  return (
    <div role="toolbar" aria-label="Calendar" className="mb-2 flex flex-wrap items-center justify-between gap-2">
      <div className="flex flex-wrap gap-1" role="group" aria-label="Move through time">
        <Button variant="secondary" onClick={() => onNavigate("PREV")}>
          Earlier
        </Button>
        <Button variant="secondary" onClick={() => onNavigate("TODAY")}>
          {here}
        </Button>
        <Button variant="secondary" onClick={() => onNavigate("NEXT")}>
          Later
        </Button>
      </div>
      <h2 className="order-first w-full text-base font-semibold text-ink-900 md:order-none md:w-auto" aria-live="polite">
        {calendarRangeLabel(date, view)}
      </h2>
      <div className="flex flex-wrap gap-1" role="group" aria-label="View">
        {VIEWS.map((v) => (
          <Button
            key={v.view}
            variant={view === v.view ? "primary" : "secondary"}
            aria-pressed={view === v.view}
            onClick={() => onView(v.view)}
          >
            {v.label}
          </Button>
        ))}
      </div>
    </div>
  );
}

// One object for the component's slots, so a re-render never hands it new ones.
const components = { toolbar: WorkroomToolbar, header: ColumnHeading, month: { dateHeader: MonthDayNumber } };

/**
 * Shoot days, fittings and planned work blocks in month, week and day views; drag a fitting to move it.
 * Times are drawn in the production's time zone, and "today" is the production's, from the server.
 */
export function WorkroomCalendar(props: {
  productionId: string;
  plan: WorkroomPlanDto;
  fittings: FittingDto[];
  canMoveFittings: boolean;
  date: Date;
  view: View;
  /** The production's time zone (IANA). */
  timeZone: string;
  /** Today in that zone (YYYY-MM-DD), from the server's clock. */
  today: string;
  onNavigate: (d: Date, v: View) => void;
}) {
  const { timeZone, today } = props;
  const [person, setPerson] = useState("");
  const move = useUpdateFitting(props.productionId);
  const gridRef = useRef<HTMLDivElement>(null);
  useFlattenedGridRoles(gridRef);
  // A drop only proposes the new time: the performer is e-mailed, so it is confirmed first.
  const [pending, setPending] = useState<{ fitting: FittingDto; startsAt: Date } | null>(null);

  const events = useMemo<CalEvent[]>(() => {
    const out: CalEvent[] = [];
    for (const s of props.plan.shootDays) {
      out.push({
        id: `sd-${s.id}`,
        title: `${scheduleLabels(s.kind === "performance" ? "stage" : "film").Day} ${s.dayNumber}`,
        start: day(s.date),
        end: day(s.date),
        allDay: true,
        kind: "shoot",
      });
    }
    for (const f of props.fittings) {
      if (f.status === "cancelled") continue;
      if (person && !f.attendeeIds.includes(person)) continue;
      out.push({
        id: `f-${f.id}`,
        title: `Fitting: ${f.performerName}${f.room ? ` (${f.room})` : ""}`,
        start: wallClockOf(f.startsAt, timeZone),
        end: wallClockOf(f.endsAt, timeZone),
        allDay: false,
        kind: "fitting",
        fitting: f,
      });
    }
    for (const t of props.plan.tickets) {
      for (const b of t.blocks) {
        if (person && b.personId !== person) continue;
        const who = props.plan.people.find((p) => p.id === b.personId)?.name ?? "";
        out.push({
          id: `w-${t.id}-${b.date}-${b.personId}`,
          title: `${t.tagCode} ${t.garmentName} · ${formatHours(b.hours)} · ${who}`,
          start: day(b.date),
          end: day(b.date),
          allDay: true,
          kind: t.late ? "late" : "work",
        });
      }
    }
    return out;
  }, [props.plan, props.fittings, person, timeZone]);

  // "Now" for the time line and the today column: the production's today, at the wall-clock time in its zone.
  const getNow = useCallback(() => {
    const wall = wallClockOf(new Date(), timeZone);
    const d = parseISO(today);
    d.setHours(wall.getHours(), wall.getMinutes(), 0, 0);
    return d;
  }, [timeZone, today]);

  const onDrop = ({ event, start }: EventInteractionArgs<CalEvent>) => {
    if (event.kind !== "fitting" || !event.fitting) return;
    // The grid works in wall-clock time; the instant is that time in the production's zone.
    const wall = new Date(start);
    if (event.allDay || Number.isNaN(wall.getTime())) return;
    const startsAt = instantFromWallClock(wall, timeZone);
    if (startsAt.getTime() === new Date(event.fitting.startsAt).getTime()) return;
    setPending({ fitting: event.fitting, startsAt });
  };
  const when = (d: Date) => formatDateTime(d, timeZone);

  return (
    // min-w-0: the month grid's unbroken event titles must not widen the page.
    <div className="grid min-w-0 grid-cols-[minmax(0,1fr)] gap-2">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-900">
          Person
          <select className={`${controlClass} w-56`} value={person} onChange={(e) => setPerson(e.target.value)}>
            <option value="">Everyone</option>
            {props.plan.people.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </label>
        <ul className="flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-900" aria-label="Colours">
          {LEGEND.map((l) => (
            <li key={l.kind} className="flex items-center gap-1">
              <span aria-hidden className={cn("inline-block size-3 rounded-sm", `cal-event-${l.kind}`)} />
              {l.kind === "shoot"
                ? scheduleLabels(props.plan.shootDays.some((s) => s.kind === "performance") ? "stage" : "film").Day
                : l.label}
            </li>
          ))}
        </ul>
      </div>
      <p className="text-xs text-slate">
        Times in {timeZone}.{props.canMoveFittings ? " Drag a fitting to move it; the performer gets an update." : ""}
      </p>
      {move.error && <ErrorAlert error={move.error} title="Fitting not moved" />}
      <ConfirmDialog
        open={Boolean(pending)}
        title={pending ? `Move the fitting with ${pending.fitting.performerName}?` : ""}
        confirmLabel="Move and e-mail"
        busy={move.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() =>
          pending &&
          move.mutate({ id: pending.fitting.id, startsAt: pending.startsAt.toISOString() }, { onSettled: () => setPending(null) })
        }
      >
        {pending && `From ${when(new Date(pending.fitting.startsAt))} to ${when(pending.startsAt)}. `}
        {pending?.fitting.performerEmail
          ? `${pending.fitting.performerName} is e-mailed the new time at ${pending.fitting.performerEmail}.`
          : "The performer has no e-mail on file; tell them yourself."}
      </ConfirmDialog>
      <div
        ref={gridRef}
        className="workroom-calendar h-[36rem] rounded-lg border border-chalk-200 bg-white p-2 md:h-[44rem]"
        aria-label="Workroom calendar"
        role="region"
      >
        <DnDCalendar
          localizer={localizer}
          culture="en-GB"
          events={events}
          date={props.date}
          view={props.view}
          views={["month", "week", "day"]}
          getNow={getNow}
          formats={formats}
          messages={messages}
          components={components}
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
          eventPropGetter={(e) => ({ className: `cal-event-${e.kind}` })}
        />
      </div>
    </div>
  );
}
