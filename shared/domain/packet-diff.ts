// What changed between two versions of a handoff packet: panels, fabrics, shots, photos and seams,
// each as added / removed / changed, with the fields that differ. Pure; runs on both sides.
import type { PacketContents } from "../schemas/packets";

/** One record that differs between versions. */
export interface DiffEntry {
  id: string;
  name: string;
  /** Fields whose values differ (only for "changed"). */
  fields?: string[];
}

/** Added, removed and changed records of one kind. */
export interface DiffGroup {
  added: DiffEntry[];
  removed: DiffEntry[];
  changed: DiffEntry[];
}

/** Differences between a version and the one before it. */
export interface PacketDiff {
  panels: DiffGroup;
  seams: DiffGroup;
  fabrics: DiffGroup;
  shots: DiffGroup;
  photos: DiffGroup;
  /** Whether the performer's measurements went in or out. */
  measurements: "unchanged" | "added" | "removed" | "changed";
  /** True when nothing differs at all. */
  empty: boolean;
}

// Stable JSON: object keys sorted, so field order never counts as a change.
function stable(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stable).join(",")}]`;
  if (v && typeof v === "object") {
    return `{${Object.keys(v as object)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stable((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v ?? null);
}

function diffBy<T>(
  before: readonly T[],
  after: readonly T[],
  key: (t: T) => string,
  name: (t: T) => string,
  fields: (keyof T)[],
): DiffGroup {
  const old = new Map(before.map((t) => [key(t), t]));
  const now = new Map(after.map((t) => [key(t), t]));
  const group: DiffGroup = { added: [], removed: [], changed: [] };
  for (const [k, t] of now) {
    const prev = old.get(k);
    if (!prev) {
      group.added.push({ id: k, name: name(t) });
      continue;
    }
    const changed = fields.filter((f) => stable(prev[f]) !== stable(t[f])).map(String);
    if (changed.length) group.changed.push({ id: k, name: name(t), fields: changed });
  }
  for (const [k, t] of old) if (!now.has(k)) group.removed.push({ id: k, name: name(t) });
  return group;
}

const groupEmpty = (g: DiffGroup) => g.added.length + g.removed.length + g.changed.length === 0;

/** Compares two packet versions' contents (previous → current). */
export function diffPacketContents(previous: PacketContents, current: PacketContents): PacketDiff {
  const panels = diffBy(
    previous.panels,
    current.panels,
    (p) => p.id,
    (p) => `${p.garmentName}: ${p.name}`,
    ["name", "outline", "grainline", "notches", "seamAllowanceMm", "cutCount", "mirrored", "grainMode", "fabricId"],
  );
  const seams = diffBy(
    previous.seams,
    current.seams,
    (s) => s.id,
    (s) => s.name,
    ["name", "a", "b", "eased", "toleranceMm", "lengthAMm", "lengthBMm"],
  );
  const fabrics = diffBy(
    previous.fabrics,
    current.fabrics,
    (f) => f.id,
    (f) => f.name,
    ["name", "construction", "widthMm", "simulation"],
  );
  const shots = diffBy(
    previous.shots,
    current.shots,
    (s) => s.appearanceId,
    (s) => `Scene ${s.sceneNumber}`,
    ["distressStage", "wet", "blood", "stunt", "notes", "photoFiles"],
  );
  const photos = diffBy(
    previous.photos,
    current.photos,
    (p) => p.id,
    (p) => p.caption || p.fileName,
    ["caption", "view", "contentHash"],
  );
  let measurements: PacketDiff["measurements"] = "unchanged";
  if (!previous.measurements && current.measurements) measurements = "added";
  else if (previous.measurements && !current.measurements) measurements = "removed";
  else if (stable(previous.measurements) !== stable(current.measurements)) measurements = "changed";
  const empty = [panels, seams, fabrics, shots, photos].every(groupEmpty) && measurements === "unchanged";
  return { panels, seams, fabrics, shots, photos, measurements, empty };
}
