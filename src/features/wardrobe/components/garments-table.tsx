import { useEffect, useMemo, useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type RowSelectionState,
  type VisibilityState,
} from "@tanstack/react-table";
import { garmentStatuses, garmentStatusLabels, type GarmentDto, type GarmentStatus } from "@shared/schemas/garments";
import { formatLength, type LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { ErrorAlert, EmptyState, Spinner } from "@/components/ui/feedback";
import { controlClass, InputField, SelectField } from "@/components/ui/field";
import { cn } from "@/utils/cn";
import { garmentFileUrls, useGarmentFilterOptions, useGarments, useMoveGarments, type GarmentListParams } from "../api/garments";
import { StatusBadge } from "./status-badge";
import { CheckoutSummary } from "./checkout-fields";
import { formatDate } from "@shared/format";

const col = createColumnHelper<GarmentDto>();
const PAGE_SIZE = 50;

// Column definitions need the production's unit and the row link; built once per unit.
function buildColumns(unit: LengthUnit) {
  const len = (mm: number | undefined) => (mm === undefined ? "—" : formatLength(mm, unit));
  return [
    col.display({
      id: "select",
      header: ({ table }) => (
        <input
          type="checkbox"
          aria-label="Select all on this page"
          className="size-4"
          checked={table.getIsAllPageRowsSelected()}
          onChange={table.getToggleAllPageRowsSelectedHandler()}
        />
      ),
      cell: ({ row }) => (
        <input
          type="checkbox"
          aria-label={`Select ${row.original.tagCode}`}
          className="size-4"
          checked={row.getIsSelected()}
          onChange={row.getToggleSelectedHandler()}
        />
      ),
      enableHiding: false,
    }),
    col.accessor("tagCode", {
      header: "Tag",
      cell: (c) => (
        <Link to={`garments/${c.row.original.id}`} className="font-mono font-semibold text-ink underline-offset-2 hover:underline">
          {c.getValue()}
        </Link>
      ),
      enableHiding: false,
    }),
    col.accessor("name", {
      header: "Name",
      cell: (c) => (
        <span>
          {c.getValue()}
          {c.row.original.copyNumber !== null && <span className="ml-1 text-xs text-slate">#{c.row.original.copyNumber}</span>}
        </span>
      ),
    }),
    // Status and who has it come first: on a phone they are what a set costumer looks for.
    col.accessor("status", { header: "Status", cell: (c) => <StatusBadge status={c.getValue()} /> }),
    col.accessor("checkout", {
      header: "With",
      cell: (c) => {
        const v = c.getValue();
        return v ? <CheckoutSummary checkout={v} kind="film" compact /> : "—";
      },
      enableSorting: false,
    }),
    col.accessor("category", { header: "Category" }),
    col.accessor("sizeLabel", { header: "Size", cell: (c) => c.getValue() ?? "—" }),
    col.accessor("locationRack", {
      header: "Rack",
      cell: (c) => [c.getValue(), c.row.original.locationBin].filter(Boolean).join(" / ") || "—",
    }),
    col.accessor("source", { header: "Source" }),
    col.accessor("rentalDueOn", {
      header: "Rental due",
      cell: (c) => {
        const v = c.getValue();
        return v ? formatDate(v) : "—";
      },
    }),
    col.accessor("fabricName", { header: "Fabric", cell: (c) => c.getValue() ?? "—", enableSorting: false }),
    col.accessor("colour", { header: "Colour", cell: (c) => c.getValue() ?? "—", enableSorting: false }),
    col.accessor("multiplesGroupName", { header: "Multiples", cell: (c) => c.getValue() ?? "—", enableSorting: false }),
    col.accessor((g) => g.finishedMeasurements.chest ?? g.finishedMeasurements.bust, {
      id: "chest",
      header: "Chest / bust",
      cell: (c) => len(c.getValue()),
      enableSorting: false,
    }),
    col.accessor((g) => g.finishedMeasurements.waist, {
      id: "waist",
      header: "Waist",
      cell: (c) => len(c.getValue()),
      enableSorting: false,
    }),
    col.accessor("distressStage", { header: "Distress", enableSorting: false }),
    col.accessor("vendor", { header: "Vendor", cell: (c) => c.getValue() ?? "—", enableSorting: false }),
  ];
}

const SORTABLE = new Set(["tagCode", "name", "category", "status", "rentalDueOn", "locationRack"]);
const DEFAULT_HIDDEN: VisibilityState = { colour: false, vendor: false, distressStage: false, waist: false };
const VIS_KEY = "seamscene.wardrobe.columns";

/** The wardrobe: filters in the URL, server-side paging and sorting, bulk moves, column choice, CSV and labels. */
export function GarmentsTable({ productionId, unit, canMove }: { productionId: string; unit: LengthUnit; canMove: boolean }) {
  const [search, setSearch] = useSearchParams();
  const params: GarmentListParams = {
    page: Number(search.get("page") ?? 1) || 1,
    pageSize: PAGE_SIZE,
    q: search.get("q") ?? undefined,
    category: search.get("category") ?? undefined,
    status: search.get("status") ?? undefined,
    characterId: search.get("characterId") ?? undefined,
    rack: search.get("rack") ?? undefined,
    source: search.get("source") ?? undefined,
    dueWithinDays: search.get("dueWithinDays") ?? undefined,
    out: search.get("out") ?? undefined,
    sort: search.get("sort") ?? "tagCode",
    dir: (search.get("dir") as "asc" | "desc") ?? "asc",
  };
  const list = useGarments(productionId, params);
  const options = useGarmentFilterOptions(productionId);
  const move = useMoveGarments(productionId);
  const [rowSelection, setRowSelection] = useState<RowSelectionState>({});
  const [bulkStatus, setBulkStatus] = useState<GarmentStatus>("in_stock");
  const [visibility, setVisibility] = useState<VisibilityState>(() => {
    try {
      return { ...DEFAULT_HIDDEN, ...(JSON.parse(localStorage.getItem(VIS_KEY) ?? "{}") as VisibilityState) };
    } catch {
      return DEFAULT_HIDDEN;
    }
  });
  useEffect(() => localStorage.setItem(VIS_KEY, JSON.stringify(visibility)), [visibility]);

  const columns = useMemo(() => buildColumns(unit), [unit]);
  const rows = list.data?.data ?? [];
  const total = list.data?.pagination.total ?? 0;
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: (r) => r.id,
    state: { rowSelection, columnVisibility: visibility },
    onRowSelectionChange: setRowSelection,
    onColumnVisibilityChange: setVisibility,
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    rowCount: total,
  });

  const setParam = (key: string, value: string | undefined) => {
    const next = new URLSearchParams(search);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== "page") next.delete("page");
    setSearch(next, { replace: true });
  };
  const toggleSort = (id: string) => {
    const next = new URLSearchParams(search);
    const dir = params.sort === id && params.dir === "asc" ? "desc" : "asc";
    next.set("sort", id);
    next.set("dir", dir);
    setSearch(next, { replace: true });
  };

  const selectedIds = Object.keys(rowSelection).filter((k) => rowSelection[k]);
  const filterParams = { ...params, page: undefined, pageSize: undefined };
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));

  return (
    <div className="grid gap-3">
      <form
        className="grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-8"
        role="search"
        aria-label="Filter garments"
        onSubmit={(e) => e.preventDefault()}
      >
        <InputField
          label="Search"
          placeholder="name, tag, colour"
          defaultValue={params.q}
          onChange={(e) => setParam("q", e.target.value || undefined)}
        />
        <SelectField label="Category" value={params.category ?? ""} onChange={(e) => setParam("category", e.target.value || undefined)}>
          <option value="">All</option>
          {options.data?.categories.map((c) => (
            <option key={c}>{c}</option>
          ))}
        </SelectField>
        <SelectField label="Status" value={params.status ?? ""} onChange={(e) => setParam("status", e.target.value || undefined)}>
          <option value="">All</option>
          {garmentStatuses.map((s) => (
            <option key={s} value={s}>
              {garmentStatusLabels[s]}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Character"
          value={params.characterId ?? ""}
          onChange={(e) => setParam("characterId", e.target.value || undefined)}
        >
          <option value="">All</option>
          {options.data?.characters.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Rack" value={params.rack ?? ""} onChange={(e) => setParam("rack", e.target.value || undefined)}>
          <option value="">All</option>
          {options.data?.racks.map((r) => (
            <option key={r}>{r}</option>
          ))}
        </SelectField>
        <SelectField label="Source" value={params.source ?? ""} onChange={(e) => setParam("source", e.target.value || undefined)}>
          <option value="">All</option>
          <option value="built">Built</option>
          <option value="bought">Bought</option>
          <option value="rented">Rented</option>
        </SelectField>
        <SelectField label="Checked out" value={params.out ?? ""} onChange={(e) => setParam("out", e.target.value || undefined)}>
          <option value="">All</option>
          <option value="out">With someone</option>
          <option value="past_due">Past due back</option>
        </SelectField>
        <InputField
          label="Rented, due within (days)"
          type="number"
          min={0}
          inputMode="numeric"
          defaultValue={params.dueWithinDays}
          onChange={(e) => setParam("dueWithinDays", e.target.value || undefined)}
        />
      </form>

      <div className="flex flex-wrap items-center gap-2">
        {canMove && (
          <div className="flex flex-wrap items-center gap-2 rounded-md border border-chalk-200 bg-white px-2 py-1">
            <span className="text-sm text-slate">{selectedIds.length} selected →</span>
            <label className="sr-only" htmlFor="bulk-status">
              New status
            </label>
            <select
              id="bulk-status"
              className={cn(controlClass, "w-auto py-1")}
              value={bulkStatus}
              onChange={(e) => setBulkStatus(e.target.value as GarmentStatus)}
            >
              {garmentStatuses.map((s) => (
                <option key={s} value={s}>
                  {garmentStatusLabels[s]}
                </option>
              ))}
            </select>
            <Button
              size="sm"
              disabled={selectedIds.length === 0}
              busy={move.isPending}
              onClick={() => move.mutate({ garmentIds: selectedIds, status: bulkStatus }, { onSuccess: () => setRowSelection({}) })}
            >
              Change status
            </Button>
          </div>
        )}
        <details className="relative">
          <summary className="cursor-pointer rounded-md border border-ink-100 bg-white px-3 py-1.5 text-sm font-semibold text-ink">
            Columns
          </summary>
          <div className="absolute z-10 mt-1 grid w-56 gap-1 rounded-md border border-chalk-200 bg-white p-2 shadow-lg">
            {table
              .getAllLeafColumns()
              .filter((c) => c.getCanHide())
              .map((c) => (
                <label key={c.id} className="flex items-center gap-2 text-sm">
                  <input type="checkbox" className="size-4" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} />
                  {typeof c.columnDef.header === "string" ? c.columnDef.header : c.id}
                </label>
              ))}
          </div>
        </details>
        <a
          className="rounded-md border border-ink-100 bg-white px-3 py-1.5 text-sm font-semibold text-ink hover:bg-ink-50"
          href={garmentFileUrls.csv(productionId, filterParams)}
        >
          Export CSV
        </a>
        <a
          className="rounded-md border border-ink-100 bg-white px-3 py-1.5 text-sm font-semibold text-ink hover:bg-ink-50"
          target="_blank"
          rel="noreferrer"
          href={garmentFileUrls.labels(productionId, selectedIds.length ? { ids: selectedIds.join(",") } : filterParams)}
        >
          Tag labels (PDF{selectedIds.length ? `, ${selectedIds.length} selected` : ", all shown"})
        </a>
        <span className="ml-auto text-sm text-slate">{total} garments</span>
      </div>

      {move.error && <ErrorAlert error={move.error} title="Status not changed" />}
      {move.isSuccess && <p className="text-sm text-ink">Moved {move.data.filter((r) => r.event).length} garments.</p>}

      {list.isPending ? (
        <Spinner />
      ) : list.error ? (
        <ErrorAlert error={list.error} />
      ) : rows.length === 0 ? (
        <EmptyState title="No garments match">Clear a filter, or add a garment.</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-chalk-200 bg-white">
          <table className="w-full text-left text-sm" aria-label="Garments">
            <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => (
                    <th key={h.id} className="whitespace-nowrap px-2 py-2 font-semibold">
                      {SORTABLE.has(h.column.id) ? (
                        <button type="button" className="inline-flex items-center gap-1 uppercase" onClick={() => toggleSort(h.column.id)}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden>{params.sort === h.column.id ? (params.dir === "asc" ? "▲" : "▼") : ""}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.id} className={cn("border-b border-chalk-200 last:border-0", row.getIsSelected() && "bg-ink-50")}>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="whitespace-nowrap px-2 py-1.5 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <nav aria-label="Pages" className="flex items-center justify-end gap-2 text-sm">
        <Button size="sm" variant="secondary" disabled={params.page <= 1} onClick={() => setParam("page", String(params.page - 1))}>
          Previous
        </Button>
        <span>
          Page {params.page} of {pages}
        </span>
        <Button size="sm" variant="secondary" disabled={params.page >= pages} onClick={() => setParam("page", String(params.page + 1))}>
          Next
        </Button>
      </nav>
    </div>
  );
}
