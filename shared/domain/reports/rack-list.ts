// Tomorrow's rack list: for one shoot day (or performance), each character in the order they are
// first needed, the change(s) they wear, and every garment to pull from the rack — with the copy of a
// multiples group that the copy plan gives those scenes, its status now, and what to watch for.
import { buildIndex } from "../snags/engine.js";
import { planMultiples, type GroupPlan } from "../snags/multiples.js";
import type { GarmentRec, ProductionSnapshot, SnapshotIndex } from "../snags/types.js";
import type { RackChangeDto, RackCharacterDto, RackGarmentDto, RackWarningDto } from "../../schemas/reports.js";
import { garmentStatusLabels, type GarmentStatus } from "../../schemas/garments.js";

/** What the rack list reads besides the snag engine's snapshot. */
export interface RackListInput {
  snapshot: ProductionSnapshot;
  /** The shoot day or performance the list is for. */
  day: { id: string; date: string; kind: "shoot" | "performance" };
  /** Rack and bin of each garment (the snapshot does not carry them). */
  locations: Map<string, { rack: string | null; bin: string | null }>;
  /** Change descriptions (the snapshot carries numbers only). */
  changeDescriptions: Map<string, string | null>;
  /** Change item labels and their order within the change. */
  items: Map<string, { label: string; sortOrder: number }>;
  /** Character sort order (ties in call order). */
  characterSort: Map<string, number>;
  /** Client path that opens check-out for a garment. */
  checkOutPath: (g: GarmentRec) => string;
}

/** Statuses a garment can be pulled from the rack in without a second look. */
const READY: ReadonlySet<GarmentStatus> = new Set(["in_stock"]);

/** Warnings for one garment on the day (anything not in stock, hires due back before the day). */
export function garmentWarnings(g: GarmentRec, date: string): RackWarningDto[] {
  const out: RackWarningDto[] = [];
  if (!READY.has(g.status)) {
    const blocking = g.status === "lost" || g.status === "returned";
    out.push({ level: blocking ? "blocking" : "warning", message: `Not in stock: ${garmentStatusLabels[g.status].toLowerCase()}` });
  }
  if (g.source === "rented" && g.rentalDueDate && g.rentalDueDate < date && g.status !== "returned") {
    out.push({ level: "warning", message: `Hire due back ${g.rentalDueDate}, before this day` });
  }
  return out;
}

/** The scenes of the day in order: a shoot day's own list, or the whole running order for a performance. */
function dayScenes(ix: SnapshotIndex, dayId: string): { runId: string; sceneIds: string[] } | null {
  if (ix.isStage) {
    const run = ix.runs[0];
    return run ? { runId: run.id, sceneIds: run.sceneIds } : null;
  }
  const run = ix.runs.find((r) => r.id === dayId);
  return run ? { runId: run.id, sceneIds: run.sceneIds } : null;
}

/** (appearance, change item) → 0-based copy index, for the day's run, from every group's copy plan. */
function copiesForRun(plans: GroupPlan[], runId: string): Map<string, { plan: GroupPlan; copy: number }> {
  const out = new Map<string, { plan: GroupPlan; copy: number }>();
  for (const plan of plans) {
    plan.demands.forEach((d, i) => {
      if (d.runId === runId) out.set(`${d.appearanceId}|${d.itemId}`, { plan, copy: plan.copyOf[i]! });
    });
  }
  return out;
}

interface GarmentAcc {
  dto: RackGarmentDto;
  order: number;
  /** The multiples group the garment is a copy of (spares come from it). */
  groupId: string | null;
}

function changeNumber(ix: SnapshotIndex, changeId: string): number | null {
  const n = Number(ix.changesById.get(changeId)?.number);
  return Number.isFinite(n) ? n : null;
}

/** Builds the rack list for one day. Characters come in call order: first scene of the day they appear in. */
export function buildRackList(input: RackListInput): RackCharacterDto[] {
  const ix = buildIndex(input.snapshot);
  const run = dayScenes(ix, input.day.id);
  if (!run) return [];
  const plans = planMultiples(ix);
  const copyOf = copiesForRun(plans, run.runId);

  // Character → change → garment key → accumulated line.
  const chars = new Map<
    string,
    { first: number; scenes: string[]; changes: Map<string, { changeId: string; scenes: string[]; garments: Map<string, GarmentAcc> }> }
  >();
  run.sceneIds.forEach((sceneId, pos) => {
    const sceneNumber = ix.scenesById.get(sceneId)?.number ?? "?";
    for (const app of ix.appearancesByScene.get(sceneId) ?? []) {
      const c =
        chars.get(app.characterId) ?? chars.set(app.characterId, { first: pos, scenes: [], changes: new Map() }).get(app.characterId)!;
      if (!c.scenes.includes(sceneNumber)) c.scenes.push(sceneNumber);
      const ch =
        c.changes.get(app.changeId) ??
        c.changes.set(app.changeId, { changeId: app.changeId, scenes: [], garments: new Map() }).get(app.changeId)!;
      if (!ch.scenes.includes(sceneNumber)) ch.scenes.push(sceneNumber);
      for (const item of ix.itemsByChange.get(app.changeId) ?? []) {
        const info = input.items.get(item.id);
        let garment: GarmentRec | undefined;
        let copyNumber: number | null = null;
        let copiesHeld: number | null = null;
        let groupName: string | null = null;
        let missingCopy: number | null = null;
        let groupId: string | null = null;
        if (item.garmentId) {
          garment = ix.garmentsById.get(item.garmentId);
          if (garment?.multiplesGroupId) {
            groupId = garment.multiplesGroupId;
            copiesHeld = ix.groupCopies.get(groupId)?.length ?? null;
            copyNumber = garment.copyNumber ?? null;
            groupName = ix.groupsById.get(groupId)?.name ?? null;
          }
        } else if (item.multiplesGroupId) {
          groupId = item.multiplesGroupId;
          groupName = ix.groupsById.get(groupId)?.name ?? null;
          const copies = ix.groupCopies.get(groupId) ?? [];
          copiesHeld = copies.length;
          const planned = copyOf.get(`${app.id}|${item.id}`);
          const idx = planned?.copy ?? 0;
          const gid = copies[idx];
          garment = gid ? ix.garmentsById.get(gid) : undefined;
          copyNumber = garment?.copyNumber ?? idx + 1;
          if (!gid) missingCopy = idx + 1;
        }
        const key = garment ? `g:${garment.id}` : missingCopy ? `m:${groupId}:${missingCopy}` : `i:${item.id}`;
        let acc = ch.garments.get(key);
        if (!acc) {
          const loc = garment ? input.locations.get(garment.id) : undefined;
          acc = {
            order: info?.sortOrder ?? 0,
            groupId: garment ? groupId : null,
            dto: {
              label: info?.label ?? garment?.category ?? "item",
              garmentId: garment?.id ?? null,
              tagCode: garment?.tagCode ?? null,
              name: garment?.name ?? null,
              category: garment?.category ?? null,
              rack: loc?.rack ?? null,
              bin: loc?.bin ?? null,
              copyNumber,
              copiesHeld,
              multiplesGroupName: groupName,
              status: garment?.status ?? null,
              sceneNumbers: [],
              distressStage: 0,
              wet: false,
              stunt: false,
              blood: false,
              vfxShot: false,
              bringSpare: false,
              spare: null,
              warnings: garment ? garmentWarnings(garment, input.day.date) : [],
              checkOutPath: garment ? input.checkOutPath(garment) : null,
            },
          };
          if (!garment && missingCopy)
            acc.dto.warnings.push({
              level: "blocking",
              message: `Copy #${missingCopy} of \u201c${groupName ?? "the group"}\u201d does not exist: the group holds ${copiesHeld ?? 0}`,
            });
          else if (!garment) acc.dto.warnings.push({ level: "blocking", message: "No garment is linked to this item of the change" });
          ch.garments.set(key, acc);
        }
        const d = acc.dto;
        if (!d.sceneNumbers.includes(sceneNumber)) d.sceneNumbers.push(sceneNumber);
        d.distressStage = Math.max(d.distressStage, app.distressStage);
        d.wet ||= app.wet;
        d.stunt ||= app.stunt;
        d.blood ||= app.blood;
        d.vfxShot ||= app.vfxShot;
      }
    }
  });

  // Wet and stunt: bring a spare copy (the lowest-numbered copy of the group in stock and not already
  // on this list).
  const onList = new Set<string>();
  for (const c of chars.values())
    for (const ch of c.changes.values()) for (const a of ch.garments.values()) if (a.dto.garmentId) onList.add(a.dto.garmentId);
  for (const c of chars.values()) {
    for (const ch of c.changes.values()) {
      for (const a of ch.garments.values()) {
        const d = a.dto;
        const groupId = a.groupId;
        if (!(d.wet || d.stunt) || !d.garmentId) continue;
        d.bringSpare = true;
        const spareId = groupId
          ? (ix.groupCopies.get(groupId) ?? []).find((id) => !onList.has(id) && ix.garmentsById.get(id)?.status === "in_stock")
          : undefined;
        const spare = spareId ? ix.garmentsById.get(spareId) : undefined;
        if (spare) {
          d.spare = { tagCode: spare.tagCode, copyNumber: spare.copyNumber ?? null };
          onList.add(spare.id);
        } else if (groupId) {
          // A single garment has no spare to bring; a group that has run out of copies is worth a warning.
          d.warnings.push({ level: "warning", message: "Wet or stunt scene: no spare copy of the group in stock" });
        }
      }
    }
  }

  const out: RackCharacterDto[] = [...chars.entries()]
    .sort(
      ([a, ca], [b, cb]) =>
        ca.first - cb.first ||
        (input.characterSort.get(a) ?? 0) - (input.characterSort.get(b) ?? 0) ||
        (ix.charactersById.get(a)?.name ?? "").localeCompare(ix.charactersById.get(b)?.name ?? ""),
    )
    .map(([characterId, c], i) => ({
      characterId,
      name: ix.charactersById.get(characterId)?.name ?? "?",
      callOrder: i + 1,
      sceneNumbers: c.scenes,
      changes: [...c.changes.values()].map((ch): RackChangeDto => ({
        changeId: ch.changeId,
        number: changeNumber(ix, ch.changeId),
        description: input.changeDescriptions.get(ch.changeId) ?? null,
        sceneNumbers: ch.scenes,
        garments: [...ch.garments.values()]
          .sort(
            (a, b) =>
              a.order - b.order ||
              (a.dto.copyNumber ?? 0) - (b.dto.copyNumber ?? 0) ||
              (a.dto.tagCode ?? "").localeCompare(b.dto.tagCode ?? ""),
          )
          .map((a) => a.dto),
      })),
    }));
  return out;
}

/** Counts for the heading: characters, garment lines, warnings and blocking ones. */
export function rackListCounts(characters: RackCharacterDto[]): {
  characters: number;
  garments: number;
  warnings: number;
  blocking: number;
} {
  let garments = 0;
  let warnings = 0;
  let blocking = 0;
  for (const c of characters)
    for (const ch of c.changes)
      for (const g of ch.garments) {
        garments++;
        warnings += g.warnings.length;
        blocking += g.warnings.filter((w) => w.level === "blocking").length;
      }
  return { characters: characters.length, garments, warnings, blocking };
}

/** Flags of a garment line as short words for print ("wet · stunt"). */
export function rackFlags(g: Pick<RackGarmentDto, "wet" | "stunt" | "blood" | "vfxShot">): string[] {
  return [g.wet && "wet", g.stunt && "stunt", g.blood && "blood", g.vfxShot && "effects shot"].filter((x): x is string => Boolean(x));
}
