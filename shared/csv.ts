// The one CSV writer for every export (breakdown, garments, reports): RFC 4180 text with CRLF line
// ends, every line ended, and cells that a spreadsheet would run as a formula made inert.
import Papa from "papaparse";

/** A cell value; null and undefined write as empty. */
export type CsvCell = string | number | boolean | null | undefined;

// Cells starting with these are formulas in Excel, LibreOffice and Google Sheets (CSV injection; the
// OWASP "CSV Injection" page lists = + - @ tab and carriage return).
// Apostrophes already in front are counted too, so that escaping can always be undone exactly.
const FORMULA_START = /^'*[=+\-@\t\r]/;

/**
 * Makes a text cell inert in a spreadsheet: a leading apostrophe before a formula character.
 * Numbers are written as they are (a negative number is data, not a formula).
 */
export function escapeCsvFormula(cell: CsvCell): string {
  if (cell === null || cell === undefined) return "";
  if (typeof cell !== "string") return String(cell);
  return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

/** Reverses escapeCsvFormula when a file we wrote is read back (imports). */
export function unescapeCsvFormula(cell: string): string {
  return cell.startsWith("'") && FORMULA_START.test(cell.slice(1)) ? cell.slice(1) : cell;
}

/**
 * Writes a header and rows as CSV.
 * @param header column names, in order
 * @param rows one array per line, cells in header order
 */
export function writeCsv(header: readonly string[], rows: ReadonlyArray<ReadonlyArray<CsvCell>>): string {
  const data = rows.map((r) => r.map(escapeCsvFormula));
  const text = Papa.unparse({ fields: header.map(escapeCsvFormula), data }, { newline: "\r\n", quotes: false, escapeFormulae: false });
  return text.endsWith("\r\n") ? text : `${text}\r\n`;
}

/** Writes records as CSV, columns in the given order (missing keys write as empty). */
export function writeCsvRecords<K extends string>(columns: readonly K[], records: ReadonlyArray<Partial<Record<K, CsvCell>>>): string {
  return writeCsv(
    columns,
    records.map((r) => columns.map((c) => r[c])),
  );
}
