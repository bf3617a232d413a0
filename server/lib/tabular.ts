// Report tables as CSV and XLSX. Numbers stay numbers (a sum in a spreadsheet just works); text that a
// spreadsheet would run as a formula is escaped in CSV. XLSX is streamed row by row with ExcelJS.
import type { Writable } from "node:stream";
import ExcelJS from "exceljs";
import { writeCsv } from "@shared/csv.js";

export type CellValue = string | number | null;

/** One column of a report table. */
export interface Column<T> {
  header: string;
  value: (row: T) => CellValue;
  /** Excel number format for numeric cells ("#,##0.00", "0"). */
  numFmt?: string;
  /** Add this column to the sheet's total row. */
  sum?: boolean;
}

/** One table: a CSV file, or a sheet of a workbook. */
export interface Sheet {
  name: string;
  columns: Column<unknown>[];
  rows: unknown[];
  /** Append a "Total" row summing the columns marked `sum` (with a SUM formula in XLSX). */
  totals?: boolean;
}

/** The sheet as CSV text through the app's one CSV writer (formula-looking text made inert; numbers stay numbers). */
export function toCsv(sheet: Sheet): string {
  const data = sheet.rows.map((r) => sheet.columns.map((c) => c.value(r)));
  if (sheet.totals && sheet.columns.some((c) => c.sum)) data.push(totalRow(sheet));
  return writeCsv(
    sheet.columns.map((c) => c.header),
    data,
  );
}

function totalRow(sheet: Sheet): CellValue[] {
  return sheet.columns.map((c, i) => {
    if (i === 0) return "Total";
    if (!c.sum) return null;
    // Sum in cents to avoid binary-fraction drift, then back to units.
    const cents = sheet.rows.reduce<number>((s, r) => s + Math.round(Number(c.value(r) ?? 0) * 100), 0);
    return cents / 100;
  });
}

/** Writes sheets as an XLSX workbook to `out`, row by row. */
export async function writeXlsx(sheets: Sheet[], out: Writable, meta: { title: string; creator?: string }): Promise<void> {
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: out, useStyles: true, useSharedStrings: false });
  wb.creator = meta.creator ?? "Seamscene";
  wb.title = meta.title;
  for (const sheet of sheets) {
    const ws = wb.addWorksheet(sheet.name.slice(0, 31), { views: [{ state: "frozen", ySplit: 1 }] });
    ws.columns = sheet.columns.map((c) => ({
      header: c.header,
      key: c.header,
      width: Math.min(48, Math.max(10, c.header.length + 2)),
      style: c.numFmt ? { numFmt: c.numFmt } : {},
    }));
    ws.getRow(1).font = { bold: true };
    ws.getRow(1).commit();
    for (const r of sheet.rows) ws.addRow(sheet.columns.map((c) => c.value(r))).commit();
    if (sheet.totals && sheet.columns.some((c) => c.sum)) {
      const last = sheet.rows.length + 1;
      const totals = totalRow(sheet);
      const row = ws.addRow(
        sheet.columns.map((c, i) => {
          if (i === 0) return "Total";
          if (!c.sum) return null;
          const col = ws.getColumn(i + 1).letter;
          return { formula: `SUM(${col}2:${col}${last})`, result: totals[i] as number };
        }),
      );
      row.font = { bold: true };
      row.commit();
    }
    ws.commit();
  }
  await wb.commit();
}
