import { useMemo, useRef, useState } from "react";
import { Link } from "react-router-dom";
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
  type VisibilityState,
} from "@tanstack/react-table";
import { useVirtualizer } from "@tanstack/react-virtual";
import type { SceneRowDto, ShootDayDto } from "@shared/schemas/breakdown";
import type { CharacterDto } from "@shared/schemas/cast";
import { compareSceneNumbers, formatEighths } from "@shared/domain/breakdown";
import { controlClass } from "@/components/ui/field";
import { cn } from "@/utils/cn";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { SortHeader } from "@/components/ui/table";
import { formatDate } from "@shared/format";

const col = createColumnHelper<SceneRowDto>();

const hasShootDay: FilterFn<SceneRowDto> = (row, _id, value: string) => row.original.shootDays.some((d) => d.id === value);
const hasCharacter: FilterFn<SceneRowDto> = (row, _id, value: string) => row.original.characters.some((c) => c.id === value);
const equalsValue: FilterFn<SceneRowDto> = (row, id, value: string) => String(row.getValue(id) ?? "") === value;

function buildColumns(stage: boolean, sceneHref: (id: string) => string) {
  return [
    col.accessor("storyOrder", { header: stage ? "Running order" : "Story order", size: 130 }),
    col.accessor("number", {
      header: "Scene",
      sortingFn: (a, b) => compareSceneNumbers(a.original.number, b.original.number),
      cell: (c) => (
        <Link className="font-semibold text-ink underline-offset-2 hover:underline" to={sceneHref(c.row.original.id)}>
          {c.getValue()}
        </Link>
      ),
      size: 80,
    }),
    col.accessor("setName", { header: "Set", filterFn: equalsValue, size: 200 }),
    col.accessor("intExt", { header: "I/E", size: 70 }),
    col.accessor("timeOfDay", { header: "Time", size: 80 }),
    col.accessor("storyDay", { header: "Story day", filterFn: equalsValue, size: 95 }),
    stage
      ? col.accessor("runningMinutes", { header: "Minutes", cell: (c) => c.getValue() ?? "", size: 85 })
      : col.accessor("lengthEighths", {
          header: "Pages",
          cell: (c) => (c.getValue() == null ? "" : formatEighths(c.getValue()!)),
          size: 85,
        }),
    col.accessor((r) => r.shootDays.map((d) => d.dayNumber).join(", "), {
      id: "shootDays",
      header: stage ? scheduleLabels("stage").Days : scheduleLabels("film").Day,
      filterFn: hasShootDay,
      sortingFn: (a, b) => (a.original.shootDays[0]?.dayNumber ?? 1e9) - (b.original.shootDays[0]?.dayNumber ?? 1e9),
      size: 105,
    }),
    col.accessor((r) => r.characters.map((c) => `${c.name}${c.changeNumber ? ` (${c.changeNumber})` : ""}`).join(", "), {
      id: "characters",
      header: "Characters (change)",
      filterFn: hasCharacter,
      enableSorting: false,
      size: 320,
    }),
    col.accessor("synopsis", { header: "Synopsis", enableSorting: false, size: 320 }),
  ];
}

const ROW_HEIGHT = 40;

/** The breakdown: sortable, filterable, column-hiding, virtualised so thousands of scenes stay smooth. */
export function BreakdownTable({
  scenes,
  shootDays,
  characters,
  stage,
  sceneHref,
}: {
  scenes: SceneRowDto[];
  shootDays: ShootDayDto[];
  characters: CharacterDto[];
  stage: boolean;
  sceneHref: (id: string) => string;
}) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "storyOrder", desc: false }]);
  const [filters, setFilters] = useState<ColumnFiltersState>([]);
  const [visibility, setVisibility] = useState<VisibilityState>({ synopsis: false, timeOfDay: !stage, intExt: !stage });
  const columns = useMemo(() => buildColumns(stage, sceneHref), [stage, sceneHref]);
  const table = useReactTable({
    data: scenes,
    columns,
    state: { sorting, columnFilters: filters, columnVisibility: visibility },
    onSortingChange: setSorting,
    onColumnFiltersChange: setFilters,
    onColumnVisibilityChange: setVisibility,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId: (r) => r.id,
  });
  const rows = table.getRowModel().rows;
  const scrollRef = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 12,
  });
  const items = virtualizer.getVirtualItems();
  const padTop = items[0]?.start ?? 0;
  const padBottom = virtualizer.getTotalSize() - (items[items.length - 1]?.end ?? 0);
  const storyDays = useMemo(
    () => [...new Set(scenes.map((s) => s.storyDay).filter((d): d is number => d != null))].sort((a, b) => a - b),
    [scenes],
  );
  const sets = useMemo(() => [...new Set(scenes.map((s) => s.setName).filter((d): d is string => Boolean(d)))].sort(), [scenes]);
  const filterValue = (id: string) => (filters.find((f) => f.id === id)?.value as string | undefined) ?? "";
  const setFilter = (id: string, value: string) =>
    setFilters((fs) => [...fs.filter((f) => f.id !== id), ...(value ? [{ id, value }] : [])]);

  return (
    <div className="grid gap-3">
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <label className="grid gap-1 text-sm font-semibold text-ink-900">
          Story day
          <select className={controlClass} value={filterValue("storyDay")} onChange={(e) => setFilter("storyDay", e.target.value)}>
            <option value="">All</option>
            {storyDays.map((d) => (
              <option key={d} value={String(d)}>
                Day {d}
              </option>
            ))}
          </select>
        </label>
        <label className="grid gap-1 text-sm font-semibold text-ink-900">
          {scheduleLabels(stage ? "stage" : "film").Day}
          <select
            className={controlClass}
            value={filterValue("shootDays")}
            onChange={(e) => setFilter("shootDays", e.target.value)}
            disabled={stage}
          >
            <option value="">All</option>
            {shootDays
              .filter((d) => d.kind === "shoot")
              .map((d) => (
                <option key={d.id} value={d.id}>
                  Day {d.dayNumber} · {formatDate(d.date)}
                </option>
              ))}
          </select>
        </label>
        <label className="grid gap-1 text-sm font-semibold text-ink-900">
          Character
          <select className={controlClass} value={filterValue("characters")} onChange={(e) => setFilter("characters", e.target.value)}>
            <option value="">All</option>
            {characters.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
        <label className="grid gap-1 text-sm font-semibold text-ink-900">
          Set
          <select className={controlClass} value={filterValue("setName")} onChange={(e) => setFilter("setName", e.target.value)}>
            <option value="">All</option>
            {sets.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </label>
      </div>
      <details className="text-sm">
        <summary className="cursor-pointer font-semibold text-ink">Columns</summary>
        <div className="mt-2 flex flex-wrap gap-3">
          {table.getAllLeafColumns().map((c) => (
            <label key={c.id} className="flex items-center gap-1">
              <input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} disabled={c.id === "number"} />
              {typeof c.columnDef.header === "string" ? c.columnDef.header : c.id}
            </label>
          ))}
        </div>
      </details>
      <p className="text-xs text-slate" aria-live="polite">
        {rows.length} of {scenes.length} scenes
      </p>
      <div ref={scrollRef} className="max-h-[70vh] overflow-auto rounded border border-chalk-200 bg-white">
        {/* Fixed layout: column widths come from the header, so scrolling new rows in never re-measures the table. */}
        <table className="w-full table-fixed border-collapse text-sm" aria-label="Breakdown">
          <thead className="sticky top-0 z-10 bg-ink-50">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th
                    key={h.id}
                    scope="col"
                    className="border-b border-chalk-200 px-2 py-2 text-left font-semibold whitespace-nowrap text-ink"
                    style={{ width: h.getSize() }}
                    aria-sort={h.column.getIsSorted() === "asc" ? "ascending" : h.column.getIsSorted() === "desc" ? "descending" : "none"}
                  >
                    <SortHeader header={h} />
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {padTop > 0 && (
              <tr aria-hidden>
                <td style={{ height: padTop }} colSpan={columns.length} />
              </tr>
            )}
            {items.map((vi) => {
              const row = rows[vi.index]!;
              return (
                <tr
                  key={row.id}
                  className={cn("border-b border-chalk-100", vi.index % 2 ? "bg-chalk/40" : "")}
                  style={{ height: ROW_HEIGHT }}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="max-w-80 truncate px-2 py-1 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {padBottom > 0 && (
              <tr aria-hidden>
                <td style={{ height: padBottom }} colSpan={columns.length} />
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
