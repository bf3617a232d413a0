import type { AppearanceDto, SceneDto, ShootDayDto } from "@shared/schemas/breakdown.js";
import type { CharacterDto, PerformerDto } from "@shared/schemas/cast.js";
import type { ChangeDto } from "@shared/schemas/changes.js";
import type { Appearance, Change, Character, Performer, Scene, ShootDay } from "../models/index.js";

/** numeric columns arrive as strings from pg. */
export function num(v: string | number | null | undefined): number | null {
  return v == null ? null : Number(v);
}

/** A scene's own fields. */
export function presentScene(s: Scene): SceneDto {
  return {
    id: s.id,
    number: s.number,
    setName: s.setName,
    intExt: s.intExt,
    timeOfDay: s.timeOfDay,
    storyDay: s.storyDay,
    storyOrder: s.storyOrder,
    lengthEighths: s.lengthEighths,
    runningMinutes: num(s.runningMinutes),
    synopsis: s.synopsis,
  };
}

/** A shoot day with its scenes (already ordered by the service). */
export function presentShootDay(d: ShootDay, scenes: ShootDayDto["scenes"]): ShootDayDto {
  return {
    id: d.id,
    dayNumber: d.dayNumber,
    date: d.date,
    kind: d.kind,
    startsAt: d.startsAt ? d.startsAt.slice(0, 5) : null,
    notes: d.notes,
    scenes,
  };
}

/** An appearance's fields. */
export function presentAppearance(a: Appearance): AppearanceDto {
  return {
    id: a.id,
    sceneId: a.sceneId,
    characterId: a.characterId,
    changeId: a.changeId,
    distressStage: a.distressStage,
    wet: a.wet,
    stunt: a.stunt,
    blood: a.blood,
    vfxShot: a.vfxShot,
    changeHere: a.changeHere,
    notes: a.notes,
  };
}

/** A character with performer and doubles (loaded with include). */
export function presentCharacter(c: Character): CharacterDto {
  return {
    id: c.id,
    name: c.name,
    sortOrder: c.sortOrder,
    notes: c.notes,
    performer: c.performer ? { id: c.performer.id, name: c.performer.name } : null,
    doubles: (c.doubles ?? [])
      .map((d) => ({ id: d.id, kind: d.kind, performer: { id: d.performerId, name: d.performer?.name ?? "" } }))
      .sort((a, b) => a.kind.localeCompare(b.kind) || a.performer.name.localeCompare(b.performer.name)),
  };
}

/** A performer (name, contact, notes) with the characters they play or double. */
export function presentPerformer(p: Performer, roles: PerformerDto["roles"]): PerformerDto {
  return { id: p.id, name: p.name, email: p.email, phone: p.phone, agentContact: p.agentContact, notes: p.notes, roles };
}

/** A change with its items (sorted) and the scenes it is worn in. */
export function presentChange(c: Change, characterName: string, scenes: ChangeDto["scenes"]): ChangeDto {
  return {
    id: c.id,
    characterId: c.characterId,
    characterName,
    number: c.number,
    description: c.description,
    storyDayFrom: c.storyDayFrom,
    storyDayTo: c.storyDayTo,
    approval: c.approval,
    approvedAt: c.approvedAt ? c.approvedAt.toISOString() : null,
    items: (c.items ?? [])
      .slice()
      .sort((a, b) => a.sortOrder - b.sortOrder)
      .map((i) => ({ id: i.id, label: i.label, garmentId: i.garmentId, multiplesGroupId: i.multiplesGroupId, sortOrder: i.sortOrder })),
    scenes,
  };
}
