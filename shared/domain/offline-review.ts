// An entry captured without a signal can arrive hours later, after the office renumbered a scene,
// moved it to another day, gave the character another change or deleted a garment. The entry is
// always stored; these rules say what to flag for a person to look at. Pure: no I/O.
import type { CapturedAs, ReviewReason } from "../schemas/continuity.js";

/** The records as they are when the entry arrives (null: deleted, or never in this production). */
export interface ArrivalFacts {
  scene: { number: string } | null;
  /** Only asked when the entry names a shoot day. */
  shootDay: { dayNumber: number; kind: "shoot" | "performance"; sceneIds: string[] } | null;
  character: { name: string } | null;
  /** The character's appearance in the scene (null: not in the scene any more). */
  appearance: { changeId: string | null; changeNumber: number | null; distressStage: number } | null;
  /** Ids of the entry's garments that still exist in the production. */
  garmentIdsFound: string[];
}

/** The ids the entry names. */
export interface EntryRefs {
  sceneId: string;
  shootDayId: string | null;
  characterId: string;
  garmentIds: string[];
}

const sceneName = (n: string | null | undefined) => (n ? `Scene ${n}` : "The scene");
const dayName = (kind: "shoot" | "performance" | undefined, n: number | null | undefined) =>
  kind === "performance" ? "the performance" : n ? `day ${n}` : "the shoot day";

/**
 * Review reasons for an arriving entry: what was deleted, and where the records now differ from
 * what the phone showed. Comparisons are made only for what the phone sent in `captured`.
 * @returns an empty list when everything still matches
 */
export function reviewReasons(refs: EntryRefs, captured: CapturedAs | null | undefined, facts: ArrivalFacts): ReviewReason[] {
  const seen = captured ?? {};
  const out: ReviewReason[] = [];
  const scene = sceneName(facts.scene?.number ?? seen.sceneNumber);
  const who = facts.character?.name ?? seen.characterName ?? "The character";

  if (!facts.scene) {
    out.push({
      code: "scene_deleted",
      message: `${sceneName(seen.sceneNumber)} was deleted before this entry arrived; file it under the right scene.`,
    });
  } else if (seen.sceneNumber && seen.sceneNumber !== facts.scene.number) {
    out.push({ code: "scene_renumbered", message: `Scene ${seen.sceneNumber} is now scene ${facts.scene.number}.` });
  }

  if (refs.shootDayId) {
    if (!facts.shootDay) {
      out.push({
        code: "shoot_day_deleted",
        message: `${capitalise(dayName(undefined, seen.shootDayNumber))} was deleted before this entry arrived.`,
      });
    } else if (facts.scene && !facts.shootDay.sceneIds.includes(refs.sceneId)) {
      out.push({ code: "scene_left_day", message: `${scene} is no longer on ${dayName(facts.shootDay.kind, facts.shootDay.dayNumber)}.` });
    }
  }

  if (!facts.character) {
    out.push({
      code: "character_deleted",
      message: `${seen.characterName ?? "The character"} was deleted before this entry arrived; file it under the right character.`,
    });
  } else if (facts.scene) {
    if (!facts.appearance) {
      out.push({ code: "character_left_scene", message: `${who} is no longer in scene ${facts.scene.number}.` });
    } else {
      if (seen.changeId !== undefined && seen.changeId !== facts.appearance.changeId) {
        const was = seen.changeNumber != null ? `change ${seen.changeNumber}` : "no change";
        const now = facts.appearance.changeNumber != null ? `change ${facts.appearance.changeNumber}` : "no change";
        out.push({ code: "change_differs", message: `${scene} now has ${who} in ${now} (the phone showed ${was}).` });
      }
      if (seen.requiredDistress != null && seen.requiredDistress !== facts.appearance.distressStage) {
        out.push({
          code: "state_differs",
          message: `${scene} now asks for distress stage ${facts.appearance.distressStage} (the phone showed ${seen.requiredDistress}).`,
        });
      }
    }
  }

  const found = new Set(facts.garmentIdsFound);
  const tagOf = new Map((seen.garments ?? []).map((g) => [g.id, g.tagCode]));
  for (const id of new Set(refs.garmentIds)) {
    if (found.has(id)) continue;
    const tag = tagOf.get(id);
    out.push({
      code: "garment_deleted",
      message: `${tag ? `Garment ${tag}` : "A garment"} was deleted before this entry arrived; it is not linked.`,
    });
  }
  return out;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
