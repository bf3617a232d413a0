import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app.js";
import { Production } from "../../server/models/index.js";
import { buildAppearance, buildChange, buildCharacter, buildScene, buildShootDay } from "../factories.js";
import { only, runRoleMatrix, type MatrixCase } from "../setup/role-matrix.js";

// The offline pack is for the roles that log continuity on set; the review of queued entries uses
// the continuity routes (read for readers, settle for loggers).
const P = (c: { productionId: string }) => `/api/productions/${c.productionId}`;
const readers = ["supervisor", "designer", "set_costumer", "cutter"] as const;
const loggers = ["supervisor", "designer", "set_costumer"] as const;

const cases: MatrixCase[] = [
  { name: "offline pack", method: "get", path: (c) => `${P(c)}/offline-pack`, expect: only([...loggers], 200) },
  { name: "entries open for review", method: "get", path: (c) => `${P(c)}/continuity?review=open`, expect: only([...readers], 200) },
  {
    name: "settle an entry's review (unknown entry)",
    method: "patch",
    path: (c) => `${P(c)}/continuity/00000000-0000-4000-8000-000000000000`,
    body: () => ({ reviewed: true }),
    expect: only([...loggers], 404),
  },
  {
    name: "log continuity with a client id",
    method: "post",
    path: (c) => `${P(c)}/continuity`,
    body: (c) => ({ clientId: randomUUID(), sceneId: c.extra.sceneId, characterId: c.extra.characterId, notes: "hat brim turned down" }),
    expect: only([...loggers], 201),
  },
];

runRoleMatrix("offline", createApp(), cases, async (c) => {
  const production = c.production as Production;
  const character = await buildCharacter({ production });
  const change = await buildChange(character);
  const scene = await buildScene({ production, number: "7" });
  await buildShootDay({ production, scenes: [scene] });
  await buildAppearance(scene, character, change);
  return { sceneId: scene.id, characterId: character.id };
});
