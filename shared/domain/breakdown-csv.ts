// The breakdown CSV (our own layout): one row per scene; a scene shot on several days repeats on
// further rows that fill only `scene` and the shoot columns. Parsed with papaparse; every problem
// is reported with its line and column, so nothing is saved until the whole file is clean.
import Papa from "papaparse";
import { writeCsv } from "../csv.js";
import { compareSceneNumbers, formatEighths, parseEighths } from "./breakdown.js";
import type { ImportRowError, IntExt } from "../schemas/breakdown.js";

export const breakdownCsvColumns = [
  "scene",
  "set",
  "int_ext",
  "time_of_day",
  "story_day",
  "story_order",
  "pages",
  "running_minutes",
  "synopsis",
  "shoot_day",
  "shoot_date",
  "shoot_position",
] as const;
export type BreakdownCsvColumn = (typeof breakdownCsvColumns)[number];

/** A scene as read from the file. */
export interface CsvScene {
  line: number;
  number: string;
  setName: string | null;
  intExt: IntExt | null;
  timeOfDay: string | null;
  storyDay: number | null;
  storyOrder: number | null;
  lengthEighths: number | null;
  runningMinutes: number | null;
  synopsis: string | null;
}

/** A shoot day as read from the file, with its scenes in order. */
export interface CsvShootDay {
  dayNumber: number;
  date: string;
  scenes: Array<{ number: string; position: number }>;
}

export interface ParsedBreakdownCsv {
  rows: number;
  scenes: CsvScene[];
  shootDays: CsvShootDay[];
  errors: ImportRowError[];
}

const SCENE_RE = /^[0-9]{1,4}[A-Z]{0,3}$/;
const DATE_RE = /^\d{4}-\d{2}-\d{2}$/;

function validDate(s: string): boolean {
  if (!DATE_RE.test(s)) return false;
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

function intOrError(v: string, min: number, max: number): number | string {
  if (!/^-?\d+$/.test(v)) return "must be a whole number";
  const n = Number(v);
  if (n < min || n > max) return `must be between ${min} and ${max}`;
  return n;
}

/**
 * Parses and checks a breakdown CSV. Every bad cell gives one error (line, column, message);
 * the caller saves nothing unless `errors` is empty.
 */
export function parseBreakdownCsv(text: string): ParsedBreakdownCsv {
  const errors: ImportRowError[] = [];
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim().toLowerCase().replace(/\s+/g, "_"),
  });
  const fields = parsed.meta.fields ?? [];
  if (!fields.includes("scene")) {
    errors.push({ line: 1, column: "scene", message: "the header row has no `scene` column" });
    return { rows: 0, scenes: [], shootDays: [], errors };
  }
  for (const f of fields) {
    if (!(breakdownCsvColumns as readonly string[]).includes(f)) errors.push({ line: 1, column: f, message: `unknown column; expected ${breakdownCsvColumns.join(", ")}` });
  }
  for (const e of parsed.errors) {
    // papaparse counts data rows from 0; the header is line 1.
    if (e.code === "TooFewFields" || e.code === "TooManyFields") errors.push({ line: (e.row ?? 0) + 2, column: "_", message: e.message });
    else errors.push({ line: (e.row ?? 0) + 2, column: "_", message: e.message });
  }

  const scenes = new Map<string, CsvScene>();
  const days = new Map<number, { date: string; line: number; scenes: Array<{ number: string; position: number | null; line: number }> }>();
  const dateToDay = new Map<string, number>();
  const data = parsed.data;

  data.forEach((raw, i) => {
    const line = i + 2;
    const cell = (c: BreakdownCsvColumn) => (raw[c] ?? "").trim();
    const err = (column: string, message: string) => errors.push({ line, column, message });
    const number = cell("scene").toUpperCase();
    if (!number) return err("scene", "is required");
    if (!SCENE_RE.test(number)) return err("scene", "must be digits with an optional letter suffix, like 42 or 42A");

    const sceneCols = ["set", "int_ext", "time_of_day", "story_day", "story_order", "pages", "running_minutes", "synopsis"] as const;
    const hasSceneFields = sceneCols.some((c) => cell(c) !== "");
    const existing = scenes.get(number);
    if (existing && hasSceneFields) {
      err("scene", `scene ${number} is already described on line ${existing.line}; repeat rows fill only scene and the shoot columns`);
    } else if (!existing) {
      const intExtRaw = cell("int_ext").toUpperCase().replace(/\s+/g, "");
      let intExt: IntExt | null = null;
      if (intExtRaw) {
        const norm = intExtRaw === "I/E" ? "INT/EXT" : intExtRaw.replace(/\.$/, "");
        if (norm === "INT" || norm === "EXT" || norm === "INT/EXT") intExt = norm;
        else err("int_ext", "must be INT, EXT or INT/EXT");
      }
      const num = (c: BreakdownCsvColumn, min: number, max: number) => {
        const v = cell(c);
        if (!v) return null;
        const r = intOrError(v, min, max);
        if (typeof r === "string") {
          err(c, r);
          return null;
        }
        return r;
      };
      const storyDay = num("story_day", 1, 999);
      const storyOrder = num("story_order", 0, 1_000_000);
      let lengthEighths: number | null = null;
      if (cell("pages")) {
        lengthEighths = parseEighths(cell("pages"));
        if (lengthEighths === null) err("pages", "must be a page length in eighths, like 3/8, 1 or 1 3/8");
      }
      let runningMinutes: number | null = null;
      if (cell("running_minutes")) {
        const v = Number(cell("running_minutes"));
        if (!/^\d+(\.\d{1,2})?$/.test(cell("running_minutes")) || v > 600) err("running_minutes", "must be minutes between 0 and 600, at most two decimals");
        else runningMinutes = v;
      }
      const setName = cell("set");
      if (setName.length > 200) err("set", "is longer than 200 characters");
      const tod = cell("time_of_day").toUpperCase();
      if (tod.length > 20) err("time_of_day", "is longer than 20 characters");
      const synopsis = cell("synopsis");
      if (synopsis.length > 5000) err("synopsis", "is longer than 5000 characters");
      scenes.set(number, { line, number, setName: setName || null, intExt, timeOfDay: tod || null, storyDay, storyOrder, lengthEighths, runningMinutes, synopsis: synopsis || null });
    }

    const dayRaw = cell("shoot_day");
    const dateRaw = cell("shoot_date");
    const posRaw = cell("shoot_position");
    if (!dayRaw && !dateRaw && !posRaw) {
      if (existing) err("shoot_day", "a repeated scene row must name a shoot day");
      return;
    }
    if (!dayRaw) return err("shoot_day", "is required when shoot_date or shoot_position is given");
    const day = intOrError(dayRaw, 1, 10_000);
    if (typeof day === "string") return err("shoot_day", day);
    let position: number | null = null;
    if (posRaw) {
      const p = intOrError(posRaw, 1, 500);
      if (typeof p === "string") return err("shoot_position", p);
      position = p;
    }
    const known = days.get(day);
    if (dateRaw && !validDate(dateRaw)) return err("shoot_date", "must be a date as YYYY-MM-DD");
    if (!known) {
      if (!dateRaw) return err("shoot_date", `is required the first time shoot day ${day} appears`);
      const other = dateToDay.get(dateRaw);
      if (other !== undefined) return err("shoot_date", `${dateRaw} is already shoot day ${other}`);
      dateToDay.set(dateRaw, day);
      days.set(day, { date: dateRaw, line, scenes: [{ number, position, line }] });
    } else {
      if (dateRaw && dateRaw !== known.date) return err("shoot_date", `shoot day ${day} is ${known.date} on line ${known.line}`);
      if (known.scenes.some((s) => s.number === number)) return err("scene", `scene ${number} is already on shoot day ${day}`);
      known.scenes.push({ number, position, line });
    }
  });

  const shootDays: CsvShootDay[] = [];
  for (const [dayNumber, d] of [...days.entries()].sort((a, b) => a[0] - b[0])) {
    // Rows without a position keep file order after the positioned ones.
    const ordered = d.scenes.map((s, idx) => ({ ...s, idx })).sort((a, b) => (a.position ?? 1e9) - (b.position ?? 1e9) || a.idx - b.idx);
    const seen = new Map<number, number>();
    for (const s of d.scenes) {
      if (s.position === null) continue;
      const at = seen.get(s.position);
      if (at !== undefined) errors.push({ line: s.line, column: "shoot_position", message: `position ${s.position} of shoot day ${dayNumber} is already used on line ${at}` });
      else seen.set(s.position, s.line);
    }
    shootDays.push({ dayNumber, date: d.date, scenes: ordered.map((s, i) => ({ number: s.number, position: i + 1 })) });
  }
  errors.sort((a, b) => a.line - b.line);
  return { rows: data.length, scenes: [...scenes.values()], shootDays, errors };
}

/** Scene fields for export. */
export interface ExportScene {
  number: string;
  setName: string | null;
  intExt: string | null;
  timeOfDay: string | null;
  storyDay: number | null;
  storyOrder: number;
  lengthEighths: number | null;
  runningMinutes: number | null;
  synopsis: string | null;
}

/** Writes the breakdown CSV: scenes in story order, extra rows for a scene's further shoot days. */
export function breakdownToCsv(scenes: readonly ExportScene[], shootDays: readonly CsvShootDay[]): string {
  const slots = new Map<string, Array<{ dayNumber: number; date: string; position: number }>>();
  for (const d of shootDays) for (const s of d.scenes) {
    const list = slots.get(s.number) ?? [];
    list.push({ dayNumber: d.dayNumber, date: d.date, position: s.position });
    slots.set(s.number, list);
  }
  const ordered = [...scenes].sort((a, b) => a.storyOrder - b.storyOrder || compareSceneNumbers(a.number, b.number));
  const rows: string[][] = [];
  for (const s of ordered) {
    const list = (slots.get(s.number) ?? []).sort((a, b) => a.dayNumber - b.dayNumber);
    const first = list[0];
    rows.push([
      s.number,
      s.setName ?? "",
      s.intExt ?? "",
      s.timeOfDay ?? "",
      s.storyDay == null ? "" : String(s.storyDay),
      String(s.storyOrder),
      s.lengthEighths == null ? "" : formatEighths(s.lengthEighths),
      s.runningMinutes == null ? "" : String(s.runningMinutes),
      s.synopsis ?? "",
      first ? String(first.dayNumber) : "",
      first ? first.date : "",
      first ? String(first.position) : "",
    ]);
    for (const more of list.slice(1)) rows.push([s.number, "", "", "", "", "", "", "", "", String(more.dayNumber), more.date, String(more.position)]);
  }
  return writeCsv(breakdownCsvColumns, rows);
}
