import { createApp } from "../../server/app.js";
import { Production } from "../../server/models/index.js";
import { buildAppearance, buildChange, buildCharacter, buildScene, buildShootDay } from "../factories.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";

// Validation runs after the permission check, so an empty body shows "allowed" as 400.
// vfx sees none of the breakdown; set costumers read it and log continuity but do not edit it.
const P = (c: { productionId: string }) => `/api/productions/${c.productionId}`;
const readers = ["supervisor", "designer", "set_costumer", "cutter"] as const;
const editors = ["supervisor", "designer"] as const;
const loggers = ["supervisor", "designer", "set_costumer"] as const;

const cases: MatrixCase[] = [
  { name: "list scenes", method: "get", path: (c) => `${P(c)}/scenes`, expect: only([...readers], 200) },
  { name: "scene page", method: "get", path: (c) => `${P(c)}/scenes/${c.extra.sceneId}`, expect: only([...readers], 200) },
  { name: "export CSV", method: "get", path: (c) => `${P(c)}/scenes/export`, expect: only([...readers], 200) },
  { name: "create scene", method: "post", path: (c) => `${P(c)}/scenes`, body: () => ({}), expect: only([...editors], 400) },
  {
    name: "edit scene",
    method: "patch",
    path: (c) => `${P(c)}/scenes/${c.extra.sceneId}`,
    body: () => ({ number: "??" }),
    expect: only([...editors], 400),
  },
  {
    name: "delete scene",
    method: "delete",
    path: (c) => `${P(c)}/scenes/00000000-0000-4000-8000-000000000000`,
    expect: only([...editors], 404),
  },
  { name: "list shoot days", method: "get", path: (c) => `${P(c)}/shoot-days`, expect: only([...readers], 200) },
  { name: "create shoot day", method: "post", path: (c) => `${P(c)}/shoot-days`, body: () => ({}), expect: only([...editors], 400) },
  {
    name: "edit shoot day",
    method: "patch",
    path: (c) => `${P(c)}/shoot-days/${c.extra.shootDayId}`,
    body: () => ({ date: "not a date" }),
    expect: only([...editors], 400),
  },
  {
    name: "move a scene to another day",
    method: "post",
    path: (c) => `${P(c)}/shoot-days/${c.extra.shootDayId}/move-scene`,
    body: () => ({}),
    expect: only([...editors], 400),
  },
  {
    name: "delete shoot day",
    method: "delete",
    path: (c) => `${P(c)}/shoot-days/00000000-0000-4000-8000-000000000000`,
    expect: only([...editors], 404),
  },
  { name: "import template", method: "get", path: (c) => `${P(c)}/imports/breakdown/template`, expect: only([...editors], 200) },
  {
    name: "import preview",
    method: "post",
    path: (c) => `${P(c)}/imports/breakdown/preview`,
    body: () => ({}),
    expect: only([...editors], 400),
  },
  { name: "import", method: "post", path: (c) => `${P(c)}/imports/breakdown`, body: () => ({}), expect: only([...editors], 400) },
  {
    name: "list appearances",
    method: "get",
    path: (c) => `${P(c)}/appearances?sceneId=${c.extra.sceneId}`,
    expect: only([...readers], 200),
  },
  { name: "create appearance", method: "post", path: (c) => `${P(c)}/appearances`, body: () => ({}), expect: only([...editors], 400) },
  {
    name: "edit appearance",
    method: "patch",
    path: (c) => `${P(c)}/appearances/${c.extra.appearanceId}`,
    body: () => ({ distressStage: -1 }),
    expect: only([...editors], 400),
  },
  { name: "list characters", method: "get", path: (c) => `${P(c)}/characters`, expect: only([...readers], 200) },
  {
    name: "character schedule",
    method: "get",
    path: (c) => `${P(c)}/characters/${c.extra.characterId}/schedule`,
    expect: only([...readers], 200),
  },
  { name: "create character", method: "post", path: (c) => `${P(c)}/characters`, body: () => ({}), expect: only([...editors], 400) },
  { name: "list performers", method: "get", path: (c) => `${P(c)}/performers`, expect: only([...readers], 200) },
  {
    name: "edit performer",
    method: "patch",
    path: (c) => `${P(c)}/performers/${c.extra.performerId}`,
    body: () => ({ name: "" }),
    expect: only([...editors], 400),
  },
  { name: "list changes", method: "get", path: (c) => `${P(c)}/changes`, expect: only([...readers], 200) },
  { name: "create change", method: "post", path: (c) => `${P(c)}/changes`, body: () => ({}), expect: only([...editors], 400) },
  {
    name: "approve change",
    method: "put",
    path: (c) => `${P(c)}/changes/${c.extra.changeId}/approval`,
    body: () => ({ approval: "maybe" }),
    expect: only([...editors], 400),
  },
  { name: "list continuity", method: "get", path: (c) => `${P(c)}/continuity`, expect: only([...readers], 200) },
  {
    name: "continuity timeline",
    method: "get",
    path: (c) => `${P(c)}/continuity/timeline/${c.extra.characterId}`,
    expect: only([...readers], 200),
  },
  { name: "log continuity", method: "post", path: (c) => `${P(c)}/continuity`, body: () => ({}), expect: only([...loggers], 400) },
  {
    name: "log continuity (valid)",
    method: "post",
    path: (c) => `${P(c)}/continuity`,
    body: (c) => ({ sceneId: c.extra.sceneId, characterId: c.extra.characterId, notes: "hat brim turned down" }),
    expect: only([...loggers], 201),
  },
  {
    name: "list scene photos",
    method: "get",
    path: (c) => `${P(c)}/photos?ownerType=scene&ownerId=${c.extra.sceneId}`,
    expect: only([...readers], 200),
  },
  {
    name: "list performer photos (personal data)",
    method: "get",
    path: (c) => `${P(c)}/photos?ownerType=performer&ownerId=${c.extra.performerId}`,
    expect: only(["supervisor", "designer", "cutter"], 200),
  },
  {
    name: "upload photo with no file",
    method: "post",
    path: (c) => `${P(c)}/photos`,
    body: (c) => ({ ownerType: "continuity_entry", ownerId: c.extra.sceneId }),
    expect: only([...loggers], 400),
  },
];

runRoleMatrix("breakdown", createApp(), cases, async (c) => {
  const production = c.production as Production;
  const character = await buildCharacter({ production });
  const change = await buildChange(character);
  const scene = await buildScene({ production, number: "7" });
  const day = await buildShootDay({ production, scenes: [scene] });
  const appearance = await buildAppearance(scene, character, change);
  return {
    shootDayId: day.id,
    sceneId: scene.id,
    characterId: character.id,
    changeId: change.id,
    appearanceId: appearance.id,
    performerId: character.performerId!,
  };
});
