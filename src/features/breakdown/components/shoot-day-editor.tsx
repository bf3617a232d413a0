import { useMemo, useState, type FormEvent, type ReactNode } from "react";
import { Link } from "react-router-dom";
import {
  closestCenter,
  DndContext,
  KeyboardSensor,
  PointerSensor,
  useSensor,
  useSensors,
  type Announcements,
  type DragEndEvent,
} from "@dnd-kit/core";
import { arrayMove, SortableContext, sortableKeyboardCoordinates, useSortable, verticalListSortingStrategy } from "@dnd-kit/sortable";
import { CSS } from "@dnd-kit/utilities";
import type { SceneRowDto, ShootDayDto } from "@shared/schemas/breakdown";
import { formatEighths } from "@shared/domain/breakdown";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { formatClockTime, formatDate } from "@shared/format";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { InputField, TextareaField, controlClass } from "@/components/ui/field";
import { UndoBar } from "@/components/ui/undo";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/utils/cn";
import { useContinuityEntries, useCreateShootDay, useDeleteShootDay, useMoveScene, useUpdateShootDay } from "../api/breakdown";

interface EditorProps {
  productionId: string;
  days: ShootDayDto[];
  scenes: SceneRowDto[];
  /** A stage production plans performances (the whole show each time), not shoot days. */
  stage: boolean;
  canEdit: boolean;
  /** The production's today (from the server), to open on the next day. */
  today: string;
  sceneHref: (id: string) => string;
  /** The snags of one day, shown beside its scenes so a schedule change shows its effect. */
  daySnags?: (day: ShootDayDto) => ReactNode;
}

/** "Day 4" or "Performance 4": a stage production says performance. */
export const dayLabel = (d: Pick<ShootDayDto, "kind" | "dayNumber">) =>
  scheduleLabels(d.kind === "performance" ? "stage" : "film").numbered(d.dayNumber);

/** Shoot days (or performances): add, date, delete; a day's scenes put on, taken off, reordered (drag or keyboard), moved. */
export function ShootDayEditor({ productionId, days, scenes, stage, canEdit, today, sceneHref, daySnags }: EditorProps) {
  const kind = stage ? "performance" : "shoot";
  const sorted = useMemo(() => [...days].sort((a, b) => a.date.localeCompare(b.date) || a.dayNumber - b.dayNumber), [days]);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const selected = sorted.find((d) => d.id === selectedId) ?? sorted.find((d) => d.date >= today) ?? sorted.at(-1) ?? null;
  const words = scheduleLabels(stage ? "stage" : "film");
  const noun = words.day;

  return (
    <div className="grid gap-4 lg:grid-cols-[20rem_1fr]">
      <div className="grid content-start gap-3">
        {canEdit && <NewDayForm productionId={productionId} kind={kind} days={days} onCreated={setSelectedId} />}
        {sorted.length === 0 ? (
          <EmptyState title={words.none}>{canEdit ? `Add the first ${noun} above.` : "The supervisor or designer adds them."}</EmptyState>
        ) : (
          <nav aria-label={words.Days}>
            <ul className="grid max-h-[32rem] gap-1 overflow-y-auto">
              {sorted.map((d) => (
                <li key={d.id}>
                  <button
                    type="button"
                    aria-current={selected?.id === d.id ? "true" : undefined}
                    onClick={() => setSelectedId(d.id)}
                    className={cn(
                      "flex min-h-11 w-full items-center justify-between gap-2 rounded-md border px-3 py-2 text-left text-sm",
                      selected?.id === d.id ? "border-ink bg-ink text-chalk" : "border-chalk-200 bg-white text-ink-900 hover:bg-ink-50",
                    )}
                  >
                    <span className="font-semibold">
                      {dayLabel(d)} · {formatDate(d.date)}
                      {d.startsAt ? ` · ${formatClockTime(d.startsAt)}` : ""}
                    </span>
                    <span className="text-xs">
                      {d.kind === "shoot" ? `${d.scenes.length} scene${d.scenes.length === 1 ? "" : "s"}` : "full show"}
                    </span>
                  </button>
                </li>
              ))}
            </ul>
          </nav>
        )}
      </div>
      {selected && (
        <DayPanel
          key={selected.id}
          productionId={productionId}
          day={selected}
          days={sorted}
          scenes={scenes}
          canEdit={canEdit}
          sceneHref={sceneHref}
          onDeleted={() => setSelectedId(null)}
          snags={daySnags?.(selected)}
        />
      )}
    </div>
  );
}

function NewDayForm({
  productionId,
  kind,
  days,
  onCreated,
}: {
  productionId: string;
  kind: "shoot" | "performance";
  days: ShootDayDto[];
  onCreated: (id: string) => void;
}) {
  const create = useCreateShootDay(productionId);
  const next = days.reduce((m, d) => Math.max(m, d.dayNumber), 0) + 1;
  const [v, setV] = useState({ dayNumber: "", date: "", startsAt: "" });
  const fields = create.error instanceof ApiError ? create.error.fields : {};
  const [missing, setMissing] = useState(false);
  const label = scheduleLabels(kind === "performance" ? "stage" : "film").day;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!v.date) return setMissing(true);
    setMissing(false);
    create.mutate(
      { kind, dayNumber: v.dayNumber ? Number(v.dayNumber) : next, date: v.date, startsAt: v.startsAt || null },
      {
        onSuccess: (d) => {
          setV({ dayNumber: "", date: "", startsAt: "" });
          onCreated(d.id);
        },
      },
    );
  };
  return (
    <form
      onSubmit={submit}
      aria-label={`Add a ${label}`}
      className="grid grid-cols-2 gap-2 rounded-md border border-chalk-200 bg-white p-3"
    >
      <h2 className="col-span-2 text-sm font-semibold text-ink">Add a {label}</h2>
      <InputField
        label="Number"
        type="number"
        min={1}
        placeholder={String(next)}
        value={v.dayNumber}
        onChange={(e) => setV({ ...v, dayNumber: e.target.value })}
        error={fields.dayNumber}
      />
      <InputField
        label="Date"
        type="date"
        value={v.date}
        onChange={(e) => setV({ ...v, date: e.target.value })}
        error={missing ? "Choose the date." : fields.date}
      />
      <InputField
        label={kind === "performance" ? "Curtain" : "Call time"}
        type="time"
        value={v.startsAt}
        onChange={(e) => setV({ ...v, startsAt: e.target.value })}
        error={fields.startsAt}
      />
      <div className="flex items-end">
        <Button type="submit" busy={create.isPending} className="w-full">
          Add {label}
        </Button>
      </div>
      {create.error && !Object.keys(fields).length && <ErrorAlert error={create.error} title="Not added" />}
    </form>
  );
}

type Undo = { message: string; run: () => void };

function DayPanel(props: {
  productionId: string;
  day: ShootDayDto;
  days: ShootDayDto[];
  scenes: SceneRowDto[];
  canEdit: boolean;
  sceneHref: (id: string) => string;
  onDeleted: () => void;
  snags?: ReactNode;
}) {
  const { productionId, day, canEdit } = props;
  const update = useUpdateShootDay(productionId);
  const move = useMoveScene(productionId);
  const del = useDeleteShootDay(productionId);
  const [order, setOrder] = useState(() => day.scenes.map((s) => s.id));
  // The server's order replaces the local one whenever the day is fetched again (adjusted while rendering).
  const [orderOf, setOrderOf] = useState(day.scenes);
  if (orderOf !== day.scenes) {
    setOrderOf(day.scenes);
    setOrder(day.scenes.map((s) => s.id));
  }
  const [adding, setAdding] = useState("");
  const [undo, setUndo] = useState<Undo | null>(null);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const continuity = useContinuityEntries(productionId, { shootDayId: day.id }, confirmDelete);
  const sceneById = useMemo(() => new Map(props.scenes.map((s) => [s.id, s])), [props.scenes]);
  const otherDays = props.days.filter((d) => d.id !== day.id && d.kind === "shoot");
  const error = update.error ?? move.error ?? del.error;
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 4 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );
  const numberOf = (id: string | number) => sceneById.get(String(id))?.number ?? "";
  const announcements: Announcements = {
    onDragStart: ({ active }) =>
      `Picked up scene ${numberOf(active.id)}. Use the arrow keys to move it, space to drop it, escape to cancel.`,
    onDragOver: ({ active, over }) =>
      over ? `Scene ${numberOf(active.id)} is over place ${order.indexOf(String(over.id)) + 1} of ${order.length}.` : undefined,
    onDragEnd: ({ active, over }) =>
      over
        ? `Scene ${numberOf(active.id)} dropped at place ${order.indexOf(String(over.id)) + 1} of ${order.length}.`
        : `Scene ${numberOf(active.id)} dropped.`,
    onDragCancel: ({ active }) => `Moving scene ${numberOf(active.id)} was cancelled; it is back in its place.`,
  };

  const saveOrder = (ids: string[], undoMessage?: string) => {
    const before = order;
    setOrder(ids);
    update.mutate(
      { id: day.id, sceneIds: ids },
      {
        onSuccess: () =>
          setUndo(
            undoMessage
              ? { message: undoMessage, run: () => update.mutate({ id: day.id, sceneIds: before }, { onSuccess: () => setUndo(null) }) }
              : null,
          ),
        onError: () => setOrder(before),
      },
    );
  };
  const onDragEnd = ({ active, over }: DragEndEvent) => {
    if (!over || active.id === over.id) return;
    saveOrder(arrayMove(order, order.indexOf(String(active.id)), order.indexOf(String(over.id))));
  };
  const moveTo = (sceneId: string, toId: string) => {
    const to = props.days.find((d) => d.id === toId);
    const place = order.indexOf(sceneId) + 1;
    move.mutate(
      { fromId: day.id, sceneId, toShootDayId: toId },
      {
        onSuccess: () =>
          setUndo({
            message: `Scene ${numberOf(sceneId)} moved to ${to ? `${dayLabel(to)} (${formatDate(to.date)})` : "the other day"}.`,
            run: () => move.mutate({ fromId: toId, sceneId, toShootDayId: day.id, position: place }, { onSuccess: () => setUndo(null) }),
          }),
      },
    );
  };
  const notOnDay = props.scenes.filter((s) => !order.includes(s.id));

  return (
    <section aria-label={`${dayLabel(day)}, ${formatDate(day.date)}`} className="grid content-start gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-lg font-semibold text-ink">
          {dayLabel(day)} · {formatDate(day.date)}
        </h2>
        {canEdit && (
          <Button variant="ghost" size="sm" className="text-madder" onClick={() => setConfirmDelete(true)}>
            Delete {scheduleLabels(day.kind === "performance" ? "stage" : "film").day}
          </Button>
        )}
      </div>
      {canEdit && (
        <DayFields key={`${day.id}-${day.dayNumber}-${day.date}-${day.startsAt}-${day.notes}`} productionId={productionId} day={day} />
      )}
      {error && <ErrorAlert error={error} title="Not saved" />}
      {undo && (
        <UndoBar message={undo.message} busy={update.isPending || move.isPending} onUndo={undo.run} onDismiss={() => setUndo(null)} />
      )}

      {day.kind === "performance" ? (
        <p className="text-sm text-slate">
          A performance plays the whole show in running order ({day.scenes.length} scenes). Change the running order on the Running order
          tab.
        </p>
      ) : (
        <div className="grid gap-2">
          <h3 className="font-semibold text-ink">Scenes in shooting order</h3>
          {canEdit && order.length > 1 && (
            <p className="text-xs text-slate">
              Drag a scene by its handle, or focus the handle and press space, then the arrow keys, then space again.
            </p>
          )}
          {order.length === 0 ? (
            <p className="text-sm text-slate">No scenes on this day yet.</p>
          ) : (
            <DndContext
              sensors={sensors}
              collisionDetection={closestCenter}
              onDragEnd={onDragEnd}
              accessibility={{
                announcements,
                screenReaderInstructions: {
                  draggable:
                    "To move a scene, press space or enter, then the up and down arrow keys, then space or enter to drop it. Escape cancels.",
                },
              }}
            >
              <SortableContext items={order} strategy={verticalListSortingStrategy}>
                <ol className="grid gap-1.5" aria-label={`Scenes of ${dayLabel(day)}`}>
                  {order.map((id, i) => {
                    const s = sceneById.get(id);
                    return (
                      <SceneSlot
                        key={id}
                        id={id}
                        place={i + 1}
                        scene={s}
                        canEdit={canEdit}
                        href={props.sceneHref(id)}
                        otherDays={otherDays}
                        busy={update.isPending || move.isPending}
                        onMove={(toId) => moveTo(id, toId)}
                        onTakeOff={() =>
                          saveOrder(
                            order.filter((x) => x !== id),
                            `Scene ${s?.number ?? ""} taken off ${dayLabel(day)}.`,
                          )
                        }
                      />
                    );
                  })}
                </ol>
              </SortableContext>
            </DndContext>
          )}
          {canEdit && (
            <div className="flex flex-wrap items-end gap-2">
              <label className="grid grow gap-1 text-sm font-semibold text-ink-900">
                Put a scene on this day
                <select className={controlClass} value={adding} onChange={(e) => setAdding(e.target.value)}>
                  <option value="">Choose a scene…</option>
                  {notOnDay.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.number}
                      {s.setName ? ` · ${s.setName}` : ""}
                      {s.shootDays.length ? ` · on day ${s.shootDays.map((x) => x.dayNumber).join(", ")}` : " · not scheduled"}
                    </option>
                  ))}
                </select>
              </label>
              <Button
                disabled={!adding}
                busy={update.isPending}
                onClick={() => {
                  if (!adding) return;
                  saveOrder([...order, adding]);
                  setAdding("");
                }}
              >
                Add to day
              </Button>
            </div>
          )}
        </div>
      )}
      {props.snags}
      <ConfirmDialog
        open={confirmDelete}
        title={`Delete ${dayLabel(day)} (${formatDate(day.date)})?`}
        confirmLabel={`Delete ${dayLabel(day).toLowerCase()}`}
        danger
        busy={del.isPending}
        onCancel={() => setConfirmDelete(false)}
        onConfirm={() =>
          del.mutate(day.id, {
            onSuccess: () => {
              setConfirmDelete(false);
              props.onDeleted();
            },
            onError: () => setConfirmDelete(false),
          })
        }
      >
        {day.kind === "shoot"
          ? `Its ${order.length} scene${order.length === 1 ? "" : "s"} stay in the breakdown but lose this day and their order on it. `
          : ""}
        {continuity.data?.length
          ? `${continuity.data.length} continuity entr${continuity.data.length === 1 ? "y" : "ies"} logged on this day keep their scene and photos but no longer name the day. `
          : ""}
        This cannot be undone.
      </ConfirmDialog>
    </section>
  );
}

function DayFields({ productionId, day }: { productionId: string; day: ShootDayDto }) {
  const update = useUpdateShootDay(productionId);
  const [v, setV] = useState({
    dayNumber: String(day.dayNumber),
    date: day.date,
    startsAt: day.startsAt?.slice(0, 5) ?? "",
    notes: day.notes ?? "",
  });
  const fields = update.error instanceof ApiError ? update.error.fields : {};
  const dirty =
    v.dayNumber !== String(day.dayNumber) ||
    v.date !== day.date ||
    v.startsAt !== (day.startsAt?.slice(0, 5) ?? "") ||
    v.notes !== (day.notes ?? "");
  return (
    <form
      aria-label={`Details of ${dayLabel(day)}`}
      className="grid grid-cols-2 gap-2 sm:grid-cols-4"
      onSubmit={(e) => {
        e.preventDefault();
        update.mutate({ id: day.id, dayNumber: Number(v.dayNumber), date: v.date, startsAt: v.startsAt || null, notes: v.notes || null });
      }}
    >
      <InputField
        label="Number"
        type="number"
        min={1}
        required
        value={v.dayNumber}
        onChange={(e) => setV({ ...v, dayNumber: e.target.value })}
        error={fields.dayNumber}
      />
      <InputField
        label="Date"
        type="date"
        required
        value={v.date}
        onChange={(e) => setV({ ...v, date: e.target.value })}
        error={fields.date}
      />
      <InputField
        label={day.kind === "performance" ? "Curtain" : "Call time"}
        type="time"
        value={v.startsAt}
        onChange={(e) => setV({ ...v, startsAt: e.target.value })}
        error={fields.startsAt}
      />
      <div className="flex items-end">
        <Button type="submit" variant="secondary" disabled={!dirty} busy={update.isPending} className="w-full">
          Save day
        </Button>
      </div>
      <TextareaField
        className="col-span-2 sm:col-span-4"
        label="Notes"
        value={v.notes}
        onChange={(e) => setV({ ...v, notes: e.target.value })}
        error={fields.notes}
      />
    </form>
  );
}

function SceneSlot(props: {
  id: string;
  place: number;
  scene: SceneRowDto | undefined;
  canEdit: boolean;
  href: string;
  otherDays: ShootDayDto[];
  busy: boolean;
  onMove: (toId: string) => void;
  onTakeOff: () => void;
}) {
  const { attributes, listeners, setNodeRef, setActivatorNodeRef, transform, transition, isDragging } = useSortable({
    id: props.id,
    disabled: !props.canEdit,
  });
  const [to, setTo] = useState("");
  const s = props.scene;
  const number = s?.number ?? "?";
  return (
    <li
      ref={setNodeRef}
      style={{ transform: CSS.Transform.toString(transform), transition }}
      className={cn(
        "flex flex-wrap items-center gap-2 rounded-md border border-chalk-200 bg-white p-2 text-sm",
        isDragging && "relative z-10 shadow-lg",
      )}
    >
      {props.canEdit && (
        <button
          type="button"
          ref={setActivatorNodeRef}
          {...attributes}
          {...listeners}
          aria-label={`Reorder scene ${number} (place ${props.place})`}
          className="min-h-11 min-w-11 cursor-grab touch-none rounded-md border border-ink-100 text-lg text-slate hover:bg-ink-50"
        >
          ⠿
        </button>
      )}
      <span className="w-6 text-right text-xs text-slate" aria-hidden>
        {props.place}
      </span>
      <Link to={props.href} className="font-semibold text-ink underline-offset-2 hover:underline">
        Scene {number}
      </Link>
      <span className="grow text-slate">
        {s?.setName ?? "—"}
        {s?.intExt ? ` (${s.intExt})` : ""}
        {s?.storyDay != null ? ` · story day ${s.storyDay}` : ""}
        {s?.lengthEighths != null ? ` · ${formatEighths(s.lengthEighths)} pp` : ""}
      </span>
      {props.canEdit && (
        <span className="flex w-full flex-wrap items-center justify-end gap-1 sm:w-auto">
          {props.otherDays.length > 0 && (
            <>
              <span className="w-44">
                <select
                  className={cn(controlClass, "py-1")}
                  aria-label={`Move scene ${number} to`}
                  value={to}
                  onChange={(e) => setTo(e.target.value)}
                >
                  <option value="">Move to…</option>
                  {props.otherDays.map((d) => (
                    <option key={d.id} value={d.id}>
                      {dayLabel(d)} · {formatDate(d.date)}
                    </option>
                  ))}
                </select>
              </span>
              <Button size="sm" variant="secondary" disabled={!to || props.busy} onClick={() => to && props.onMove(to)}>
                Move
              </Button>
            </>
          )}
          <Button size="sm" variant="ghost" disabled={props.busy} onClick={props.onTakeOff} aria-label={`Take off scene ${number}`}>
            Take off
          </Button>
        </span>
      )}
    </li>
  );
}
