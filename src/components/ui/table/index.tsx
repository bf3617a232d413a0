import { flexRender, type Header } from "@tanstack/react-table";
import { cn } from "@/utils/cn";

/** A TanStack column header: a button that toggles sorting and shows the direction, or plain text. */
export function SortHeader<T>({ header, className }: { header: Header<T, unknown>; className?: string }) {
  const content = flexRender(header.column.columnDef.header, header.getContext());
  if (!header.column.getCanSort()) return <>{content}</>;
  const dir = header.column.getIsSorted();
  return (
    <button type="button" className={cn("inline-flex items-center gap-1", className)} onClick={header.column.getToggleSortingHandler()}>
      {content}
      <span aria-hidden>{dir === "asc" ? "▲" : dir === "desc" ? "▼" : ""}</span>
    </button>
  );
}
