import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Link } from "react-router-dom";
import type { MultiplesPlanDto, MultiplesUseDto } from "@shared/schemas/snags";
import { scheduleLabels, type ScheduleKind } from "@shared/domain/schedule-labels";
import { Badge } from "@/components/ui/feedback";
import { SafetyNote } from "@/components/ui/feedback";
import { formatDate } from "@shared/format";

const col = createColumnHelper<MultiplesUseDto>();
const columnsFor = (kind: ScheduleKind) => [
  col.accessor((u) => u.date ?? "", {
    id: "date",
    header: scheduleLabels(kind).Day,
    cell: (c) => (c.getValue() ? formatDate(c.getValue()) : "—"),
  }),
  col.accessor("sceneNumber", { header: "Scene" }),
  col.accessor("characterName", { header: "Character" }),
  col.accessor("stage", {
    header: "Distress stage",
    cell: (c) => (
      <span>
        {c.getValue()}
        {c.row.original.inLongestFalling && (
          <span className="ml-1 text-xs text-madder" title="Part of the longest falling run">
            ▼
          </span>
        )}
      </span>
    ),
  }),
  col.accessor("copy", {
    header: "Copy",
    cell: (c) => (
      <span className="font-semibold">
        #{c.getValue()} {c.row.original.garment ? c.row.original.garment.tagCode : <Badge tone="blocking">not held</Badge>}
      </span>
    ),
  }),
  col.accessor("outForDay", { header: "Wet / stunt", cell: (c) => (c.getValue() ? "yes: out for the day" : "") }),
];

/** A group's copy plan: a summary per copy, then every use in shoot order (sortable). */
export function MultiplesPlan({
  productionId,
  plan,
  kind = "film",
}: {
  productionId: string;
  plan: MultiplesPlanDto;
  kind?: ScheduleKind;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo(() => columnsFor(kind), [kind]);
  const table = useReactTable({
    data: plan.uses,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const short = plan.copiesNeeded > plan.copiesHeld;
  return (
    <div className="grid gap-4">
      <p className="text-sm">
        <Badge tone={short ? "blocking" : "neutral"}>
          {plan.copiesHeld} held · {plan.copiesNeeded} needed
        </Badge>{" "}
        <span className="text-slate">
          Distress only goes up on one copy, so a copy follows rising stages in shoot order; ▼ marks the longest falling run, which sets the
          minimum.
        </span>
      </p>
      <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
        {plan.copies.map((c) => (
          <li key={c.copy} className="rounded-md border border-chalk-200 bg-white p-3">
            <p className="font-semibold text-ink">
              Copy #{c.copy}{" "}
              {c.garment ? (
                <Link className="underline-offset-2 hover:underline" to={`/p/${productionId}/wardrobe/garments/${c.garment.id}`}>
                  {c.garment.tagCode}
                </Link>
              ) : (
                <Badge tone="blocking">to make or buy</Badge>
              )}
            </p>
            <p className="text-sm text-slate">{c.uses ? `Scenes ${c.sceneNumbers.join(", ")}` : "Not used by the schedule"}</p>
          </li>
        ))}
      </ul>
      {plan.uses.some((u) => u.outForDay) && (
        <SafetyNote>Wet and stunt costumes: agree drying, padding and quick-release fastenings with the stunt coordinator.</SafetyNote>
      )}
      <div className="overflow-x-auto">
        <table aria-label="Copy plan" className="w-full text-left text-sm">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id} className="border-b border-chalk-200">
                {hg.headers.map((h) => (
                  <th key={h.id} className="px-2 py-2 font-semibold text-ink">
                    <button type="button" className="min-h-10 text-left" onClick={h.column.getToggleSortingHandler()}>
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      {{ asc: " ▲", desc: " ▼" }[h.column.getIsSorted() as string] ?? ""}
                    </button>
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-b border-chalk-200/60">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-2 py-2">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
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
