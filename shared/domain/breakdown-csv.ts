// The breakdown CSV (our own layout): one row per scene; a scene shot on several days repeats on
// further rows that fill only `scene` and the shoot columns. Parsed with papaparse; every problem
// is reported with its line and column, so nothing is saved until the whole file is clean.
//
// An import merges into what is stored: a column the file does not have, or an empty cell, keeps
// the stored value; the token `(clear)` empties a field. `planBreakdownImport` works out, for the
// preview and the import alike, each row's old → new values and each shoot day's new order.
import Papa from "papaparse";
import { writeCsv } from "../csv.js";
import { compareSceneNumbers, formatEighths, parseEighths } from "./breakdown.js";
import type { ImportDayChange, ImportFieldChange, ImportRowChange, ImportRowError, IntExt } from "../schemas/breakdown.js";
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

/** The cell text that empties a field on import (any letter case). An empty cell keeps the stored value. */
export const CLEAR_TOKEN = "(clear)";

/** Accepted values per column, shown on the import screen and in the template. */
export const breakdownCsvFormats: Record<BreakdownCsvColumn, string> = {
  scene: "required; digits with an optional letter suffix: 42, 42A, 42AB",
  set: "set or location name, up to 200 characters",
  int_ext: "INT, EXT or INT/EXT (I/E also reads as INT/EXT)",
  time_of_day: "DAY, NIGHT, DAWN, DUSK, CONTINUOUS… up to 20 characters",
  story_day: "whole number 1–999",
  story_order: "whole number 0–1000000; empty keeps the scene's place (new scenes go last); cannot be cleared",
  pages: "page length in eighths: 3/8, 1, 1 3/8 (film)",
  running_minutes: "minutes 0–600, at most two decimals: 4 or 4.5 (stage)",
  synopsis: "free text, up to 5000 characters; quote it if it has commas",
  shoot_day: "shoot day number 1–10000; a scene on several days repeats on rows with only scene and the shoot columns",
  shoot_date: "YYYY-MM-DD; needed for a new shoot day, empty keeps a known day's date",
  shoot_position: `place in the day's order 1–500; empty keeps a scene's place or adds it last; ${CLEAR_TOKEN} takes the scene off that day`,
};

/** Scene fields a file can set; each maps to one CSV column. */
export type SceneFieldKey =
  "setName" | "intExt" | "timeOfDay" | "storyDay" | "storyOrder" | "lengthEighths" | "runningMinutes" | "synopsis";
const sceneFieldColumn: Record<SceneFieldKey, BreakdownCsvColumn> = {
  setName: "set",
  intExt: "int_ext",
  timeOfDay: "time_of_day",
  storyDay: "story_day",
  storyOrder: "story_order",
  lengthEighths: "pages",
  runningMinutes: "running_minutes",
  synopsis: "synopsis",
};
const sceneFieldKeys = Object.keys(sceneFieldColumn) as SceneFieldKey[];

/** A stored scene's fields (what an import merges into). */
export interface SceneValues {
  setName: string | null;
  intExt: IntExt | null;
  timeOfDay: string | null;
  storyDay: number | null;
  storyOrder: number;
  lengthEighths: number | null;
  runningMinutes: number | null;
  synopsis: string | null;
}

/**
 * A scene as read from the file. A field missing from `fields` keeps the stored value; `null`
 * clears it (the file said `(clear)`); anything else is the new value.
 */
export interface CsvScene {
  line: number;
  number: string;
  fields: { [K in SceneFieldKey]?: SceneValues[K] };
}

/** One row's place on a shoot day: a position, none (keep / add last), or taken off the day. */
export interface CsvDaySlot {
  number: string;
  position: number | null;
  remove: boolean;
  line: number;
}

/** A shoot day as read from the file; `date` is null when the file leaves it to the stored day. */
export interface CsvShootDay {
  dayNumber: number;
  date: string | null;
  line: number;
  scenes: CsvDaySlot[];
}

export interface ParsedBreakdownCsv {
  rows: number;
  scenes: CsvScene[];
  shootDays: CsvShootDay[];
  /** Each data row: its line and scene number (for the per-row preview). */
  lines: Array<{ line: number; number: string }>;
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

const isClear = (v: string) => v.toLowerCase() === CLEAR_TOKEN;

/**
 * Parses and checks a breakdown CSV. Every bad cell gives one error (line, column, message);
 * the caller saves nothing unless `errors` is empty. Lines starting with `#` are comments.
 */
export function parseBreakdownCsv(text: string): ParsedBreakdownCsv {
  const errors: ImportRowError[] = [];
  const source = text.replace(/^\uFEFF/, "");
  const parsed = Papa.parse<Record<string, string>>(source, {
    header: true,
    skipEmptyLines: "greedy",
    comments: "#",
    transformHeader: (h) => h.trim().toLowerCase().replace(/\s+/g, "_"),
  });
  const fields = parsed.meta.fields ?? [];
  if (!fields.includes("scene")) {
    errors.push({ line: 1, column: "scene", message: "the header row has no `scene` column" });
    return { rows: 0, scenes: [], shootDays: [], lines: [], errors };
  }
  // Comment lines before the header shift every line number by their count.
  const lead = source.split(/\r?\n/).findIndex((l) => l.trim() !== "" && !l.startsWith("#"));
  const headerLine = lead < 0 ? 1 : lead + 1;
  for (const f of fields) {
    if (!(breakdownCsvColumns as readonly string[]).includes(f))
      errors.push({ line: headerLine, column: f, message: `unknown column; expected ${breakdownCsvColumns.join(", ")}` });
  }
  for (const e of parsed.errors) {
    // papaparse counts data rows from 0; the header is the line before the first.
    errors.push({ line: (e.row ?? 0) + headerLine + 1, column: "_", message: e.message });
  }

  const scenes = new Map<string, CsvScene>();
  const days = new Map<number, CsvShootDay>();
  const dateToDay = new Map<string, number>();
  const lines: ParsedBreakdownCsv["lines"] = [];
  const data = parsed.data;

  data.forEach((raw, i) => {
    const line = i + headerLine + 1;
    const cell = (c: BreakdownCsvColumn) => (raw[c] ?? "").trim();
    const err = (column: string, message: string) => errors.push({ line, column, message });
    const number = cell("scene").toUpperCase();
    if (!number) return err("scene", "is required");
    if (isClear(number)) return err("scene", "cannot be cleared; every row names its scene");
    if (!SCENE_RE.test(number)) return err("scene", "must be digits with an optional letter suffix, like 42 or 42A");
    lines.push({ line, number });

    const hasSceneFields = sceneFieldKeys.some((k) => cell(sceneFieldColumn[k]) !== "");
    const existing = scenes.get(number);
    if (existing && hasSceneFields) {
      err("scene", `scene ${number} is already described on line ${existing.line}; repeat rows fill only scene and the shoot columns`);
    } else if (!existing) {
      const f: CsvScene["fields"] = {};
      // Each reader gets a non-empty, non-clear cell and returns the value or an error text.
      const read = <K extends SceneFieldKey>(key: K, parse: (v: string) => SceneValues[K] | { error: string }, clearable = true) => {
        const column = sceneFieldColumn[key];
        const v = cell(column);
        if (v === "") return;
        if (isClear(v)) {
          if (clearable) f[key] = null as SceneValues[K];
          else err(column, "cannot be cleared; leave the cell empty to keep the scene's place");
          return;
        }
        const r = parse(v);
        if (r !== null && typeof r === "object" && "error" in r) err(column, r.error);
        else f[key] = r as SceneValues[K];
      };
      const whole = (min: number, max: number) => (v: string) => {
        const r = intOrError(v, min, max);
        return typeof r === "string" ? { error: r } : r;
      };
      const text =
        (max: number, upper = false) =>
        (v: string) =>
          v.length > max ? { error: `is longer than ${max} characters` } : upper ? v.toUpperCase() : v;
      read("setName", text(200));
      read("intExt", (v) => {
        const raw = v.toUpperCase().replace(/\s+/g, "");
        const norm = raw === "I/E" ? "INT/EXT" : raw.replace(/\.$/, "");
        return norm === "INT" || norm === "EXT" || norm === "INT/EXT" ? norm : { error: "must be INT, EXT or INT/EXT" };
      });
      read("timeOfDay", text(20, true));
      read("storyDay", whole(1, 999));
      read("storyOrder", whole(0, 1_000_000), false);
      read("lengthEighths", (v) => parseEighths(v) ?? { error: "must be a page length in eighths, like 3/8, 1 or 1 3/8" });
      read("runningMinutes", (v) =>
        /^\d+(\.\d{1,2})?$/.test(v) && Number(v) <= 600 ? Number(v) : { error: "must be minutes between 0 and 600, at most two decimals" },
      );
      read("synopsis", text(5000));
      scenes.set(number, { line, number, fields: f });
    }

    const dayRaw = cell("shoot_day");
    const dateRaw = cell("shoot_date");
    const posRaw = cell("shoot_position");
    if (!dayRaw && !dateRaw && !posRaw) {
      if (existing) err("shoot_day", "a repeated scene row must name a shoot day");
      return;
    }
    if (!dayRaw) return err("shoot_day", "is required when shoot_date or shoot_position is given");
    if (isClear(dayRaw))
      return err("shoot_day", `cannot be cleared; to take a scene off a day, name the day and put ${CLEAR_TOKEN} in shoot_position`);
    const day = intOrError(dayRaw, 1, 10_000);
    if (typeof day === "string") return err("shoot_day", day);
    let position: number | null = null;
    const remove = isClear(posRaw);
    if (posRaw && !remove) {
      const p = intOrError(posRaw, 1, 500);
      if (typeof p === "string") return err("shoot_position", p);
      position = p;
    }
    if (dateRaw && isClear(dateRaw)) return err("shoot_date", "cannot be cleared; every shoot day has a date");
    if (dateRaw && !validDate(dateRaw)) return err("shoot_date", "must be a date as YYYY-MM-DD");
    const known = days.get(day);
    if (dateRaw) {
      const other = dateToDay.get(dateRaw);
      if (other !== undefined && other !== day) return err("shoot_date", `${dateRaw} is already shoot day ${other}`);
    }
    if (!known) {
      if (dateRaw) dateToDay.set(dateRaw, day);
      days.set(day, { dayNumber: day, date: dateRaw || null, line, scenes: [{ number, position, remove, line }] });
    } else {
      if (dateRaw && known.date && dateRaw !== known.date)
        return err("shoot_date", `shoot day ${day} is ${known.date} on line ${known.line}`);
      if (dateRaw && !known.date) {
        known.date = dateRaw;
        dateToDay.set(dateRaw, day);
      }
      if (known.scenes.some((s) => s.number === number)) return err("scene", `scene ${number} is already on shoot day ${day}`);
      known.scenes.push({ number, position, remove, line });
    }
  });

  const shootDays = [...days.values()].sort((a, b) => a.dayNumber - b.dayNumber);
  for (const d of shootDays) {
    const seen = new Map<number, number>();
    for (const s of d.scenes) {
      if (s.position === null) continue;
      const at = seen.get(s.position);
      if (at !== undefined)
        errors.push({
          line: s.line,
          column: "shoot_position",
          message: `position ${s.position} of shoot day ${d.dayNumber} is already used on line ${at}`,
        });
      else seen.set(s.position, s.line);
    }
  }
  errors.sort((a, b) => a.line - b.line);
  return { rows: data.length, scenes: [...scenes.values()], shootDays, lines, errors };
}

/**
 * A day's new scene order: the stored order, less the scenes the file takes off or places, plus
 * new scenes without a position at the end, then each placed scene inserted at its position
 * (lowest first). A scene named without a position keeps its place.
 */
export function mergeDayOrder(stored: readonly string[], slots: readonly CsvDaySlot[]): string[] {
  const removed = new Set(slots.filter((s) => s.remove).map((s) => s.number));
  const placed = slots.filter((s) => !s.remove && s.position !== null);
  const placedSet = new Set(placed.map((s) => s.number));
  const list = stored.filter((n) => !removed.has(n) && !placedSet.has(n));
  for (const s of slots) if (!s.remove && s.position === null && !list.includes(s.number)) list.push(s.number);
  const ordered = placed.map((s, i) => ({ ...s, i })).sort((a, b) => a.position! - b.position! || a.i - b.i);
  for (const s of ordered) list.splice(Math.min(s.position! - 1, list.length), 0, s.number);
  return list;
}

/** What is stored now, as far as an import needs to know. */
export interface StoredBreakdown {
  scenes: ReadonlyMap<string, SceneValues>;
  /** Shoot days by number: date and scene numbers in order. */
  days: ReadonlyMap<number, { date: string; sceneNumbers: readonly string[] }>;
  /** The story order a new scene without one gets first (then +1 each). */
  nextStoryOrder: number;
}

/** An import worked out against the stored breakdown: what to write and what the preview shows. */
export interface BreakdownImportPlan {
  /** Scenes to create or update, with merged values (unchanged scenes are left out). */
  sceneWrites: Array<{ number: string; isNew: boolean; values: SceneValues }>;
  /** Shoot days to create or update, with the merged date and full scene order. */
  dayWrites: Array<{ dayNumber: number; isNew: boolean; date: string; sceneNumbers: string[]; scenesChanged: boolean }>;
  changes: ImportRowChange[];
  days: ImportDayChange[];
  counts: {
    scenes: { created: number; updated: number; unchanged: number };
    shootDays: { created: number; updated: number; unchanged: number };
  };
  errors: ImportRowError[];
}

/** A field as the file writes it ("" for nothing). */
export function sceneFieldText(key: SceneFieldKey, v: SceneValues[SceneFieldKey] | undefined): string {
  if (v === null || v === undefined) return "";
  if (key === "lengthEighths") return formatEighths(v as number);
  return String(v);
}

const sameList = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);

/**
 * Merges a parsed file into the stored breakdown. Pure: the preview shows the result and the
 * import writes it, so both agree. Errors here need the stored data (a new day without a date).
 */
export function planBreakdownImport(parsed: ParsedBreakdownCsv, stored: StoredBreakdown): BreakdownImportPlan {
  const errors: ImportRowError[] = [];
  let nextOrder = stored.nextStoryOrder;
  const merged = new Map<string, SceneValues>();
  const sceneWrites: BreakdownImportPlan["sceneWrites"] = [];
  const fieldChanges = new Map<number, ImportFieldChange[]>();
  const rowStatus = new Map<number, ImportRowChange["status"]>();
  const counts = { scenes: { created: 0, updated: 0, unchanged: 0 }, shootDays: { created: 0, updated: 0, unchanged: 0 } };

  const blank: SceneValues = {
    setName: null,
    intExt: null,
    timeOfDay: null,
    storyDay: null,
    storyOrder: 0,
    lengthEighths: null,
    runningMinutes: null,
    synopsis: null,
  };
  for (const s of parsed.scenes) {
    const old = stored.scenes.get(s.number);
    const values: SceneValues = { ...(old ?? blank) };
    for (const k of sceneFieldKeys) if (k in s.fields) (values as unknown as Record<string, unknown>)[k] = s.fields[k];
    if (!old && !("storyOrder" in s.fields)) values.storyOrder = nextOrder++;
    const diffs: ImportFieldChange[] = [];
    for (const k of sceneFieldKeys) {
      const before = old ? sceneFieldText(k, old[k]) : "";
      const after = sceneFieldText(k, values[k]);
      if (before !== after) diffs.push({ column: sceneFieldColumn[k], old: before, new: after });
    }
    merged.set(s.number, values);
    fieldChanges.set(s.line, diffs);
    rowStatus.set(s.line, old ? (diffs.length ? "changed" : "unchanged") : "new");
    if (!old) counts.scenes.created++;
    else if (diffs.length) counts.scenes.updated++;
    else counts.scenes.unchanged++;
    if (!old || diffs.length) sceneWrites.push({ number: s.number, isNew: !old, values });
  }
  // A shoot row may name a scene the file does not describe and the database does not hold: it is
  // created empty, as a scene added from the schedule.
  for (const d of parsed.shootDays) {
    for (const slot of d.scenes) {
      if (slot.remove || merged.has(slot.number) || stored.scenes.has(slot.number)) continue;
      const values = { ...blank, storyOrder: nextOrder++ };
      merged.set(slot.number, values);
      sceneWrites.push({ number: slot.number, isNew: true, values });
      counts.scenes.created++;
      fieldChanges.set(slot.line, [{ column: "story_order", old: "", new: String(values.storyOrder) }]);
      rowStatus.set(slot.line, "new");
    }
  }

  const dayWrites: BreakdownImportPlan["dayWrites"] = [];
  const days: ImportDayChange[] = [];
  for (const d of parsed.shootDays) {
    const old = stored.days.get(d.dayNumber);
    const date = d.date ?? old?.date ?? null;
    if (!date) {
      errors.push({
        line: d.line,
        column: "shoot_date",
        message: `is required for a new shoot day (day ${d.dayNumber} does not exist yet)`,
      });
      continue;
    }
    const before = old ? [...old.sceneNumbers] : [];
    const after = mergeDayOrder(before, d.scenes);
    const scenesChanged = !sameList(before, after);
    const status: ImportDayChange["status"] = !old ? "new" : scenesChanged || date !== old.date ? "changed" : "unchanged";
    counts.shootDays[status === "new" ? "created" : status === "changed" ? "updated" : "unchanged"]++;
    days.push({ dayNumber: d.dayNumber, status, date: { old: old?.date ?? "", new: date }, scenes: { old: before, new: after } });
    if (status !== "unchanged") dayWrites.push({ dayNumber: d.dayNumber, isNew: !old, date, sceneNumbers: after, scenesChanged });
    for (const slot of d.scenes) {
      const was = before.indexOf(slot.number);
      const now = after.indexOf(slot.number);
      const o = was < 0 ? "" : `position ${was + 1}`;
      const n = now < 0 ? "" : `position ${now + 1}`;
      if (o === n) continue;
      fieldChanges.set(slot.line, [...(fieldChanges.get(slot.line) ?? []), { column: `shoot day ${d.dayNumber}`, old: o, new: n }]);
      if (rowStatus.get(slot.line) !== "new") rowStatus.set(slot.line, "changed");
    }
  }

  const changes: ImportRowChange[] = parsed.lines.map(({ line, number }) => ({
    line,
    scene: number,
    status: rowStatus.get(line) ?? "unchanged",
    fields: fieldChanges.get(line) ?? [],
  }));
  return { sceneWrites, dayWrites, changes, days, counts, errors };
}

/**
 * A template to fill in: comment lines (`#`) with each column's accepted values and the clear
 * token, the header, and one example row that imports as it is.
 */
export function breakdownTemplateCsv(kind: "film" | "series" | "stage"): string {
  const notes = [
    "# Seamscene breakdown import template. Lines starting with # are ignored.",
    `# An absent column or an empty cell keeps what is stored; ${CLEAR_TOKEN} in a cell empties that field.`,
    ...breakdownCsvColumns.map((c) => `# ${c}: ${breakdownCsvFormats[c]}`),
  ];
  const example =
    kind === "stage"
      ? [
          "1",
          "Orchard, moonlight",
          "EXT",
          "NIGHT",
          "1",
          "",
          "",
          "6.5",
          "Invented example: the sisters meet under the glass trees",
          "",
          "",
          "",
        ]
      : [
          "1",
          "Harbour wall",
          "EXT",
          "DAY",
          "1",
          "",
          "1 3/8",
          "",
          "Invented example: the boats come in, nets on the wall",
          "1",
          "2030-01-07",
          "1",
        ];
  return notes.join("\r\n") + "\r\n" + writeCsv(breakdownCsvColumns, [example]);
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

/** A shoot day for export: its date and scenes with positions. */
export interface ExportShootDay {
  dayNumber: number;
  date: string;
  scenes: ReadonlyArray<{ number: string; position: number }>;
}

/** Writes the breakdown CSV: scenes in story order, extra rows for a scene's further shoot days. */
export function breakdownToCsv(scenes: readonly ExportScene[], shootDays: readonly ExportShootDay[]): string {
  const slots = new Map<string, Array<{ dayNumber: number; date: string; position: number }>>();
  for (const d of shootDays)
    for (const s of d.scenes) {
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
    for (const more of list.slice(1))
      rows.push([s.number, "", "", "", "", "", "", "", "", String(more.dayNumber), more.date, String(more.position)]);
  }
  return writeCsv(breakdownCsvColumns, rows);
}
