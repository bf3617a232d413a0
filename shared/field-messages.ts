// Validation messages in the person's language: one mapping from field paths ("readings.overhangMm",
// "items.0.garmentId") to the names people see on the forms, and one function that turns a path and a
// predicate ("must be greater than 0") into a sentence ("Overhang must be greater than 0"). The server's
// error responses and the client's own checks both go through here.
import "./schemas/error-map.js";
import { MEASUREMENT_LABELS, type MeasurementKey } from "./domain/plausibility.js";
import { finishedPointLabels, type FinishedPoint } from "./schemas/garments.js";

/** Field name → label, as the forms show it. Keys are the last segment of a path. */
export const FIELD_LABELS: Record<string, string> = {
  name: "Name",
  title: "Title",
  email: "E-mail",
  password: "Password",
  confirm: "Password again",
  phone: "Phone",
  agentContact: "Agent / contact",
  role: "Role",
  kind: "Kind",
  units: "Units",
  startsOn: "Start date",
  endsOn: "End date",
  timeZone: "Time zone",
  quickChangeThresholdMin: "Quick-change threshold",
  bufferWorkingDays: "Buffer",
  reminderHour: "Reminder hour",
  seamToleranceMm: "Seam tolerance",
  easeOverrides: "Ease ranges",
  number: "Scene",
  setName: "Set",
  intExt: "Interior / exterior",
  timeOfDay: "Time of day",
  storyDay: "Story day",
  storyDayFrom: "From story day",
  storyDayTo: "To story day",
  lengthEighths: "Length in eighths",
  runningMinutes: "Running minutes",
  synopsis: "Synopsis",
  date: "Date",
  dayNumber: "Day number",
  sceneId: "Scene",
  sceneIds: "Scenes",
  shootDayId: "Shoot day",
  characterId: "Character",
  performerId: "Performer",
  changeId: "Change",
  garmentId: "Garment",
  garmentIds: "Garments",
  fabricId: "Fabric",
  fittingId: "Fitting",
  panelId: "Panel",
  panelIds: "Panels",
  photoIds: "Reference photos",
  appearanceIds: "Effects shots",
  recipientUserIds: "Recipients",
  attendeeIds: "Attendees",
  assigneeId: "Assigned to",
  userId: "Member",
  multiplesGroupId: "Multiples group",
  description: "Description",
  distressStage: "Distress stage",
  tagCode: "Tag code",
  category: "Category",
  sizeLabel: "Size",
  colour: "Colour",
  source: "Source",
  vendor: "Vendor",
  costCents: "Cost",
  rentalDueOn: "Rental due",
  locationRack: "Rack",
  locationBin: "Bin",
  status: "Status",
  copies: "Copies",
  supplier: "Supplier",
  fibreContent: "Fibre content",
  fibre: "Fibre",
  percent: "Per cent",
  construction: "Construction",
  widthMm: "Width",
  massPerAreaGsm: "Mass per area",
  thicknessMm: "Thickness",
  stretchWarpPct: "Stretch (warp)",
  stretchWeftPct: "Stretch (weft)",
  careNotes: "Care notes",
  testedOn: "Tested on",
  massG: "Specimen mass",
  lengthMm: "Length",
  overhangMm: "Overhang",
  angleDeg: "Angle",
  direction: "Direction",
  loadN: "Load",
  stripWidthMm: "Strip width",
  gaugeLengthMm: "Gauge length",
  extensionMm: "Extension",
  notes: "Notes",
  note: "Note",
  reason: "Reason",
  startsAt: "Start",
  durationMinutes: "Duration",
  room: "Room",
  outcome: "Outcome",
  estimateHours: "Estimated hours",
  remainingHours: "Hours left",
  amountMm: "Amount",
  tasks: "Tasks",
  hoursPerWeekday: "Hours per weekday",
  daysOff: "Days off",
  from: "From",
  to: "To",
  takenOn: "Measured on",
  values: "Measurements",
  finishedMeasurements: "Finished measurements",
  outline: "Outline",
  notches: "Notches",
  grainline: "Grainline",
  seamAllowanceMm: "Seam allowance",
  cutCount: "Cut count",
  mirrored: "Mirrored",
  eased: "Ease",
  maxMm: "Ease to",
  minMm: "Ease from",
  toleranceMm: "Tolerance",
  file: "File",
  ownerType: "Photo owner",
  ownerId: "Photo owner",
  view: "View",
  views: "Views",
  caption: "Caption",
  csv: "CSV file",
  token: "Link",
  q: "Search",
  page: "Page",
  pageSize: "Page size",
  sortOrder: "Order",
  items: "Items",
  edge: "Edge",
  point: "Point",
  a: "First edge",
  b: "Second edge",
  // Check-out to a person, tag labels, copies.
  dueBackOn: "Due back",
  start: "First free label",
  // Fabric care tests (the form's names).
  beforeMm: "before",
  afterMm: "after",
  cycles: "Washes or cleans",
  changeGrade: "Grade for change in colour",
  stainingGrade: "Grade for staining",
  agent: "Test",
  adjacent: "Adjacent fabric",
  treatedOn: "Treated on",
  renewBy: "Renew by",
  certificateRef: "Certificate number",
};

/** Singular names for list fields, used as "Task 2: amount". */
const ITEM_NAMES: Record<string, string> = {
  items: "Item",
  tasks: "Task",
  notches: "Notch",
  fibreContent: "Fibre",
  outline: "Point",
  views: "View",
  daysOff: "Day off",
  sceneIds: "Scene",
  length: "Length pair",
  width: "Width pair",
};

/** "storyDayTo" → "Story day to", "neck_girth" → "Neck girth": the fallback for a name not in the table. */
function humanize(key: string): string {
  const words = key
    .replace(/_/g, " ")
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .toLowerCase()
    .replace(/\b(mm|pct|gsm|cents|id|ids)\b/g, "")
    .replace(/\s+/g, " ")
    .trim();
  return words ? words[0]!.toUpperCase() + words.slice(1) : key;
}

function leafLabel(parent: string | undefined, key: string): string {
  if (parent === "values" && key in MEASUREMENT_LABELS) {
    const l = MEASUREMENT_LABELS[key as MeasurementKey];
    return l[0]!.toUpperCase() + l.slice(1);
  }
  if (parent === "checkout" && key === "to") return "Checked out to";
  if (parent === "finishedMeasurements" && key in finishedPointLabels)
    return `Finished ${finishedPointLabels[key as FinishedPoint].toLowerCase()}`;
  return FIELD_LABELS[key] ?? humanize(key);
}

/**
 * The label people see for a field path: "name" → "Name", "readings.overhangMm" → "Overhang",
 * "values.waist_girth" → "Waist girth", "items.0.garmentId" → "Item 1: garment". A key that is not a
 * path (it has spaces, like "line 3, int_ext") is returned as it is.
 */
export function fieldLabel(path: string | readonly (string | number)[]): string {
  const parts = (typeof path === "string" ? (path === "" ? [] : path.split(".")) : path.map(String)).filter((p) => p !== "");
  if (parts.length === 0) return "";
  if (parts.some((p) => /\s/.test(p))) return parts.join(".");
  // The last list index decides the "Task 2" prefix; containers such as readings or settings add nothing.
  let idx = -1;
  for (let i = parts.length - 1; i >= 0; i--)
    if (/^\d+$/.test(parts[i]!)) {
      idx = i;
      break;
    }
  const leafIdx = parts.length - 1;
  if (idx === leafIdx) {
    const list = parts[idx - 1];
    const item = list ? (ITEM_NAMES[list] ?? leafLabel(parts[idx - 2], list)) : "Entry";
    return `${item} ${Number(parts[idx]) + 1}`;
  }
  const leaf = leafLabel(parts[leafIdx - 1], parts[leafIdx]!);
  if (idx >= 1) {
    const list = parts[idx - 1]!;
    const item = ITEM_NAMES[list] ?? leafLabel(parts[idx - 2], list);
    return `${item} ${Number(parts[idx]) + 1}: ${leaf.toLowerCase()}`;
  }
  return leaf;
}

// Predicates that read on from a field's name ("Name is required"); an instruction ("choose a password") stands
// as its own sentence; anything else follows a colon.
const INSTRUCTS = /^(choose|give|enter|record|add|use|pick|select|write|type|remove|describe)\b/;
const CONTINUES =
  /^(is|are|must|cannot|can|can't|has|have|needs|need|should|was|were|does|do|did|names|lists|contains|belongs|uses|will|may|already|only|doesn't|isn't)\b/;

/**
 * One sentence for one field: "Name is required", "Overhang must be greater than 0",
 * "Garment: no such garment in this production". A message that already reads as a sentence
 * (starts with a capital) is kept as it is.
 */
export function fieldSentence(path: string | readonly (string | number)[], predicate: string): string {
  const p = predicate.trim();
  const label = fieldLabel(path);
  if (!label || /^[A-Z]/.test(p)) return p ? p[0]!.toUpperCase() + p.slice(1) : label;
  if (INSTRUCTS.test(p)) return sentenceCase(p);
  return CONTINUES.test(p) ? `${label} ${p}` : `${label}: ${p}`;
}

/** Field messages keyed by path, each rewritten as a sentence (the keys stay as they are, for the forms). */
export function fieldSentences(fields: Record<string, string>): Record<string, string> {
  const out: Record<string, string> = {};
  // "_" (the whole input) and keys that are not paths ("line 3, int_ext" from an import) keep their text.
  for (const [k, v] of Object.entries(fields)) out[k] = k === "_" || /\s/.test(k) ? v : fieldSentence(k, v);
  return out;
}

/** Zod issues (or anything with a path and a message) → one sentence per field path, the first issue winning. */
export function issuesToFieldSentences(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.length ? issue.path.map(String).join(".") : "_";
    if (!out[key]) out[key] = key === "_" ? sentenceCase(issue.message) : fieldSentence(key, issue.message);
  }
  return out;
}

function sentenceCase(s: string): string {
  return s ? s[0]!.toUpperCase() + s.slice(1) : s;
}

/**
 * A whole error message in plain words. A message written as "path: predicate" (how services name the
 * field at fault) becomes that field's sentence; any other message is only capitalised.
 */
export function plainMessage(message: string): string {
  const m = /^([A-Za-z_][\w]*(?:\.[\w]+)*): (.+)$/s.exec(message);
  return m ? fieldSentence(m[1]!, m[2]!) : sentenceCase(message);
}
