import { useEffect, useMemo, useRef, useState } from "react";
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import type { PlannedTicketDto, TicketStatus } from "@shared/schemas/workroom";
import { hazardousTaskKinds } from "@shared/schemas/workroom";
import { taskSummary } from "@shared/domain/workroom-snags";
import type { LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { Badge, EmptyState, ErrorAlert } from "@/components/ui/feedback";
import { controlClass } from "@/components/ui/field";
import { useSetTicketStatus, useUpdateTicket } from "../api/workroom";
import { TaskSafetyNotes } from "./safety";
import { OwnerPhotos } from "@/components/photos";
import { SortHeader } from "@/components/ui/table";
import { formatDate, formatHours } from "@shared/format";

const col = createColumnHelper<PlannedTicketDto>();
const NEXT: Partial<Record<TicketStatus, Array<{ to: TicketStatus; label: string }>>> = {
  waiting: [
    { to: "in_progress", label: "Start" },
    { to: "done", label: "Mark done" },
  ],
  in_progress: [{ to: "done", label: "Mark done" }],
  done: [
    { to: "checked", label: "Check" },
    { to: "in_progress", label: "Reopen" },
  ],
};

/** Open and done tickets with their plan: due date, who, planned finish, lateness; status moves and estimates inline. */
export function TicketsTable(props: {
  productionId: string;
  tickets: PlannedTicketDto[];
  units: LengthUnit;
  canUpdate: boolean;
  canEstimate: boolean;
  /** A ticket to open on (a snag's Fix link): its row is marked, scrolled into view and focused. */
  focusTicketId?: string | null;
}) {
  const focused = useRef<HTMLTableRowElement>(null);
  useEffect(() => {
    if (!props.focusTicketId || !focused.current) return;
    focused.current.scrollIntoView({ block: "center" });
    focused.current.focus();
  }, [props.focusTicketId, props.tickets.length]);
  const [sorting, setSorting] = useState<SortingState>([{ id: "dueDate", desc: false }]);
  const setStatus = useSetTicketStatus(props.productionId);
  const update = useUpdateTicket(props.productionId);
  const [safetyFor, setSafetyFor] = useState<string | null>(null);
  const [photosFor, setPhotosFor] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      col.accessor((t) => `${t.tagCode} ${t.garmentName}`, {
        id: "garment",
        header: "Garment",
        cell: (c) => (
          <span>
            <span className="font-semibold text-ink-900">{c.getValue()}</span>{" "}
            <button
              type="button"
              className="text-xs font-semibold text-ink underline"
              aria-expanded={photosFor === c.row.original.id}
              aria-label={`Before and after photos of ${c.row.original.tagCode}`}
              onClick={() => setPhotosFor(photosFor === c.row.original.id ? null : c.row.original.id)}
            >
              photos
            </button>
          </span>
        ),
      }),
      col.accessor((t) => taskSummary(t.tasks, props.units), {
        id: "tasks",
        header: "Tasks",
        cell: (c) => {
          const hazardous = c.row.original.tasks.some((k) => hazardousTaskKinds.includes(k.kind));
          return (
            <span>
              {c.getValue()}
              {hazardous && (
                <button
                  type="button"
                  className="ml-1 text-xs font-semibold text-[#8a5d17] underline"
                  onClick={() => setSafetyFor(safetyFor === c.row.original.id ? null : c.row.original.id)}
                >
                  safety
                </button>
              )}
            </span>
          );
        },
      }),
      col.accessor((t) => t.remainingHours ?? t.estimateHours, {
        id: "hours",
        header: "Hours",
        cell: (c) =>
          props.canEstimate && c.row.original.status !== "done" ? (
            <input
              aria-label={`Estimated hours for ${c.row.original.tagCode}`}
              className={`${controlClass} w-20 py-1`}
              defaultValue={c.row.original.estimateHours}
              inputMode="decimal"
              onBlur={(e) => {
                const v = Number(e.target.value.replace(",", "."));
                if (v > 0 && v !== c.row.original.estimateHours) update.mutate({ id: c.row.original.id, estimateHours: v });
              }}
            />
          ) : (
            formatHours(c.getValue())
          ),
      }),
      col.accessor((t) => t.plannedAssigneeName ?? t.assigneeName ?? "", {
        id: "who",
        header: "Who",
        cell: (c) => c.getValue() || <span className="text-slate">nobody has hours</span>,
      }),
      col.accessor((t) => t.neededOn ?? "", {
        id: "neededOn",
        header: "Needed",
        cell: (c) => <span className="whitespace-nowrap">{c.getValue() ? formatDate(c.getValue()) : "—"}</span>,
      }),
      col.accessor((t) => t.dueDate ?? "9999", {
        id: "dueDate",
        header: "Due",
        cell: (c) => <span className="whitespace-nowrap">{c.row.original.dueDate ? formatDate(c.row.original.dueDate) : "—"}</span>,
      }),
      col.accessor((t) => t.plannedFinish ?? "", {
        id: "finish",
        header: "Planned finish",
        cell: (c) => (
          <span className="whitespace-nowrap" data-planned-finish={c.row.original.plannedFinish ?? ""}>
            {c.row.original.planStatus === "done"
              ? "done"
              : c.row.original.plannedFinish
                ? formatDate(c.row.original.plannedFinish)
                : `${formatHours(c.row.original.unplannedHours)} do not fit`}
            {c.row.original.late && (
              <>
                {" "}
                <Badge tone="blocking">late{c.row.original.lateness ? ` ${c.row.original.lateness} d` : ""}</Badge>
              </>
            )}
          </span>
        ),
      }),
      col.accessor("status", {
        header: "Status",
        cell: (c) => (
          <div className="flex flex-wrap items-center gap-1">
            <Badge>{c.getValue().replace("_", " ")}</Badge>
            {props.canUpdate &&
              (NEXT[c.getValue()] ?? []).map((n) => (
                <Button
                  key={n.to}
                  size="sm"
                  variant={n.to === "in_progress" && c.getValue() === "done" ? "ghost" : "secondary"}
                  busy={setStatus.isPending && setStatus.variables?.id === c.row.original.id}
                  onClick={() => setStatus.mutate({ id: c.row.original.id, status: n.to })}
                >
                  {n.label}
                </Button>
              ))}
          </div>
        ),
      }),
    ],
    [props.units, props.canEstimate, props.canUpdate, setStatus, update, safetyFor, photosFor],
  );

  const table = useReactTable({
    data: props.tickets,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  if (props.tickets.length === 0) return <EmptyState title="No open alteration tickets">Raise one from a fitting.</EmptyState>;
  const safetyTicket = props.tickets.find((t) => t.id === safetyFor);
  const photosTicket = props.tickets.find((t) => t.id === photosFor);

  return (
    <div className="grid gap-2">
      {(setStatus.error || update.error) && <ErrorAlert error={setStatus.error ?? update.error} title="Ticket not changed" />}
      {safetyTicket && <TaskSafetyNotes kinds={safetyTicket.tasks.map((k) => k.kind)} />}
      {photosTicket && (
        <div className="rounded-md border border-chalk-200 bg-chalk p-3">
          <OwnerPhotos
            productionId={props.productionId}
            ownerType="alteration_ticket"
            ownerId={photosTicket.id}
            canEdit={props.canUpdate}
            title={`Before and after: ${photosTicket.tagCode} ${photosTicket.garmentName}`}
          />
        </div>
      )}
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm" aria-label="Alteration tickets">
          <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} className="px-2 py-2 font-semibold">
                    <SortHeader header={h} />
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                ref={row.original.id === props.focusTicketId ? focused : undefined}
                tabIndex={row.original.id === props.focusTicketId ? -1 : undefined}
                aria-current={row.original.id === props.focusTicketId ? "true" : undefined}
                aria-label={`Ticket ${row.original.tagCode}`}
                className={`border-b border-chalk-200 ${row.original.late ? "bg-madder-50/50" : ""} ${row.original.id === props.focusTicketId ? "outline-2 -outline-offset-2 outline-ink" : ""}`}
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-2 py-2 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
