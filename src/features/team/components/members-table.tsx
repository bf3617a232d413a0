import { useState } from "react";
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import type { MemberDto } from "@shared/schemas/members";
import { roles, roleLabels, type Role } from "@shared/permissions";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { useRemoveMember, useUpdateMemberRole } from "../api/team";
import { controlClass } from "@/components/ui/field";
import { SortHeader } from "@/components/ui/table";
import { useProductionTime } from "@/hooks/use-production-time";

const col = createColumnHelper<MemberDto>();
/** Columns a phone leaves out: the e-mail moves under the name, the join date is for the desk. */
const PHONE_HIDDEN = new Set(["email", "joinedAt"]);
const cellClass = (id: string) => (PHONE_HIDDEN.has(id) ? "hidden sm:table-cell" : "");

/** Members with their roles; the supervisor changes a role inline or removes a member after confirming. */
export function MembersTable({
  productionId,
  members,
  currentUserId,
}: {
  productionId: string;
  members: MemberDto[];
  currentUserId: string;
}) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [removing, setRemoving] = useState<MemberDto | null>(null);
  const updateRole = useUpdateMemberRole(productionId);
  const remove = useRemoveMember(productionId);
  const { dateOf } = useProductionTime();

  const columns = [
    col.accessor("name", {
      header: "Name",
      cell: (c) => (
        <>
          <span className="font-semibold text-ink-900">{c.getValue()}</span>
          <span className="block text-xs break-all text-slate sm:hidden">{c.row.original.email}</span>
        </>
      ),
    }),
    col.accessor("email", { header: "E-mail", cell: (c) => <span className="break-all">{c.getValue()}</span> }),
    col.accessor("role", {
      header: "Role",
      cell: (c) => (
        <select
          aria-label={`Role of ${c.row.original.name}`}
          className={`${controlClass} max-w-56 min-w-32 py-1`}
          value={c.getValue()}
          disabled={updateRole.isPending}
          onChange={(e) => updateRole.mutate({ id: c.row.original.id, role: e.target.value as Role })}
        >
          {roles.map((r) => (
            <option key={r} value={r}>
              {roleLabels[r]}
            </option>
          ))}
        </select>
      ),
    }),
    col.accessor("joinedAt", { header: "Joined", cell: (c) => dateOf(c.getValue()) }),
    col.display({
      id: "actions",
      header: () => <span className="sr-only">Actions</span>,
      cell: (c) =>
        c.row.original.userId === currentUserId ? (
          <span className="text-xs text-slate">you</span>
        ) : (
          <Button size="sm" variant="ghost" onClick={() => setRemoving(c.row.original)}>
            Remove
          </Button>
        ),
    }),
  ];

  const table = useReactTable({
    data: members,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div>
      {updateRole.error && <ErrorAlert error={updateRole.error} title="Role not changed" />}
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm" aria-label="Members">
          <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => (
                  <th key={h.id} className={`px-2 py-2 font-semibold ${cellClass(h.column.id)}`}>
                    <SortHeader header={h} />
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-b border-chalk-200 last:border-0">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-2 py-2 align-middle ${cellClass(cell.column.id)}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ConfirmDialog
        open={Boolean(removing)}
        title={`Remove ${removing?.name ?? ""}?`}
        confirmLabel="Remove from production"
        danger
        busy={remove.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() => removing && remove.mutate(removing.id, { onSettled: () => setRemoving(null) })}
      >
        They lose access to this production at once. Their account and everything they recorded stay. You can invite them again.
      </ConfirmDialog>
      {remove.error && <ErrorAlert error={remove.error} title="Not removed" />}
    </div>
  );
}
