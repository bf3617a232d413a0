/**
 * Breakdown demo data (Breakdown feature): cast, 60 scenes over 12 story days, 18 shoot days,
 * changes and appearances for "Saltmarsh Hollow", and the stage show "The Glass Orchard".
 * The planned conflicts of seeds/scenario.ts that live in the breakdown are built here.
 */
import type { Transaction } from "sequelize";
import { Appearance, Change, Character, CharacterDouble, Performer, Scene, ShootDay, ShootDayScene } from "../server/models/index.js";
import { demoId } from "./ids.js";
import { GLASS_ORCHARD_ID, SALTMARSH_ID } from "./accounts.js";
import { characters, FROCK_COAT_WORN_ON_SHOOT_DAY, performers } from "./scenario.js";
import { demoDaysFromToday, demoInstant, performanceDates, shootDayDates } from "./calendar.js";

type CharKey = keyof typeof characters;

const SETS: Array<{ name: string; intExt: "INT" | "EXT" }> = [
  { name: "Penhallow cottage kitchen", intExt: "INT" },
  { name: "Harbour wall", intExt: "EXT" },
  { name: "Lighthouse gallery", intExt: "EXT" },
  { name: "Chapel of St Keyne", intExt: "INT" },
  { name: "Net loft", intExt: "INT" },
  { name: "Cliff path", intExt: "EXT" },
  { name: "Rowe house parlour", intExt: "INT" },
  { name: "The Anchor, public bar", intExt: "INT" },
  { name: "Dr Fenn's surgery", intExt: "INT" },
  { name: "Lifeboat slip", intExt: "EXT" },
];
const TIMES = ["DAY", "DAY", "DUSK", "NIGHT", "DAWN"];

/** Story day of scene n (5 scenes per story day). */
export const storyDayOf = (n: number) => Math.ceil(n / 5);

/** Which characters play in scene n (an invented but fixed pattern, plus the planned scenes). */
export function castOf(n: number): CharKey[] {
  const out: CharKey[] = [];
  const add = (k: CharKey, cond: boolean) => cond && out.push(k);
  // Maud: even scenes and n % 5 === 3, plus 19 (the planned continuity break), never 20.
  add("maud", (n % 2 === 0 || n % 5 === 3 || n === 19) && n !== 20);
  add("elias", n % 3 === 0 || n % 7 === 1);
  add("jory", n % 4 === 1);
  add("ambrose", n % 6 === 2 || n === 45);
  add("hester", n % 5 === 4 && n !== 19);
  // Silas: the storm scenes 31, 33, 36, and every n % 8 === 5 outside story days 7–8.
  add("silas", [31, 33, 36].includes(n) || (n % 8 === 5 && (n < 30 || n > 40)));
  add("tamsin", n % 7 === 3);
  add("obadiah", n % 9 === 4);
  add("lowdy", n % 6 === 5 && n !== 35);
  add("pascoe", n % 10 === 7);
  if (!out.length) out.push("maud");
  return out;
}

/** Each character's changes: number, description, story-day span. */
export const demoChanges: Record<CharKey, Array<{ number: number; description: string; from: number; to: number }>> = {
  maud: [
    { number: 1, description: "Day dress, knitted shawl, apron", from: 1, to: 3 },
    { number: 2, description: "Day dress with oilcloth coat for the harbour", from: 4, to: 6 },
    { number: 3, description: "Sunday best: blue wool dress and hat", from: 4, to: 9 },
    { number: 4, description: "Mourning dress and veil", from: 10, to: 12 },
  ],
  elias: [
    { number: 1, description: "Keeper's jacket, flannel shirt, moleskin trousers, boots", from: 1, to: 4 },
    { number: 2, description: "Storm gear over keeper's shirt", from: 5, to: 8 },
    { number: 3, description: "Sunday suit, borrowed", from: 9, to: 12 },
  ],
  jory: [
    { number: 1, description: "Guernsey and canvas smock", from: 1, to: 6 },
    { number: 2, description: "Guernsey, torn and salt-stained", from: 7, to: 12 },
  ],
  ambrose: [{ number: 1, description: "Frock coat, clerical collar and bands", from: 1, to: 12 }],
  hester: [
    { number: 1, description: "Shop coat over print dress", from: 1, to: 6 },
    { number: 2, description: "Travelling coat and cloche", from: 7, to: 12 },
  ],
  silas: [
    { number: 1, description: "Captain's shore clothes: reefer jacket, peaked cap", from: 1, to: 6 },
    { number: 2, description: "Storm oilskin, sou'wester, sea boots", from: 7, to: 8 },
    { number: 3, description: "Reefer jacket with mourning band", from: 9, to: 12 },
  ],
  tamsin: [
    { number: 1, description: "School pinafore and boots", from: 1, to: 6 },
    { number: 2, description: "Borrowed coat, too large", from: 7, to: 12 },
  ],
  obadiah: [{ number: 1, description: "Three-piece tweed, Gladstone bag", from: 1, to: 12 }],
  lowdy: [
    { number: 1, description: "Barmaid's blouse and skirt", from: 1, to: 6 },
    { number: 2, description: "Best blouse and cardigan", from: 7, to: 12 },
  ],
  pascoe: [{ number: 1, description: "Constable's tunic and helmet", from: 1, to: 12 }],
};

/** The change a character wears on a story day (first change whose span covers it). */
export function changeFor(k: CharKey, n: number): number {
  if (k === "maud" && n === 19) return 3; // planned continuity break: 18 → 19 within story day 4, unmarked
  const day = storyDayOf(n);
  return (demoChanges[k].find((c) => day >= c.from && day <= c.to) ?? demoChanges[k][demoChanges[k].length - 1]!).number;
}

/** Required distress stage and flags of character k in scene n. */
export function stateFor(k: CharKey, n: number): { distressStage: number; wet: boolean; stunt: boolean; blood: boolean; vfxShot: boolean } {
  const s = { distressStage: 0, wet: false, stunt: false, blood: false, vfxShot: false };
  const day = storyDayOf(n);
  // Silas's oilskin: stages rise in story order (0, 1, 2) but are shot 36, 33, 31 → 3 copies needed.
  if (k === "silas" && n === 31) s.distressStage = 0;
  if (k === "silas" && n === 33) Object.assign(s, { distressStage: 1, wet: true });
  if (k === "silas" && n === 36) Object.assign(s, { distressStage: 2, wet: true, stunt: true });
  // Elias's keeper's jacket: lighthouse gallery shots with the digital double.
  if (k === "elias" && [3, 12, 15].includes(n)) s.vfxShot = true;
  if (k === "elias" && n === 15) s.stunt = true;
  if (k === "elias" && day >= 5 && day <= 8) Object.assign(s, { distressStage: day >= 7 ? 1 : 0, wet: n % 2 === 1 });
  // Jory's guernsey wears down through the second half of the story.
  if (k === "jory" && day >= 7) s.distressStage = Math.min(3, Math.floor((day - 7) / 2) + 1);
  if (k === "jory" && n === 41) s.blood = true;
  return s;
}

/** Scene numbers per shoot day (index 0 = shoot day 1): grouped by set, out of story order. */
export function demoSchedule(): number[][] {
  const special = [36, 33, 31]; // one day: the storm run, shot against story order
  const rest = Array.from({ length: 60 }, (_, i) => i + 1).filter((n) => !special.includes(n));
  rest.sort((a, b) => (a % SETS.length) - (b % SETS.length) || a - b);
  const sizes = [4, 3, 4, 3, 0, 4, 3, 4, 3, 3, 4, 3, 3, 4, 3, 3, 3, 3];
  const days: number[][] = [];
  let i = 0;
  for (const size of sizes) {
    days.push(size ? rest.slice(i, i + size) : [...special]);
    i += size;
  }
  // This shoot day must include a Reverend scene (planned rental conflict).
  const idx = FROCK_COAT_WORN_ON_SHOOT_DAY - 1;
  if (!days[idx]!.some((n) => castOf(n).includes("ambrose"))) {
    const from = days.findIndex((d, j) => j !== idx && j > 3 && days[j] !== days[4] && d.some((n) => castOf(n).includes("ambrose")));
    const pick = days[from]!.find((n) => castOf(n).includes("ambrose"))!;
    days[from] = days[from]!.map((n) => (n === pick ? days[idx]![0]! : n));
    days[idx] = [pick, ...days[idx]!.slice(1)];
  }
  return days;
}

const PERFORMER_NOTES: Partial<Record<keyof typeof performers, string>> = {
  eliasStunt: "Stunt double for Elias Marr (water and height work).",
  silasStunt: "Stunt double for Captain Silas Rowe (storm scenes).",
};

async function seedSaltmarsh(t: Transaction): Promise<void> {
  const pid = SALTMARSH_ID;
  for (const [key, p] of Object.entries(performers)) {
    await Performer.upsert(
      {
        id: p.id,
        productionId: pid,
        name: p.name,
        email: `${key.toLowerCase()}@performers.example.invalid`,
        phone: null,
        agentContact: "Invented agency, 020 7946 0000",
        notes: PERFORMER_NOTES[key as keyof typeof performers] ?? null,
      },
      { transaction: t },
    );
  }
  let order = 0;
  for (const [key, c] of Object.entries(characters) as Array<[CharKey, (typeof characters)[CharKey]]>) {
    order += 1;
    const notes = key === "elias" ? "Has a digital double: reference photos and the keeper's jacket go to the vfx team." : null;
    await Character.upsert(
      { id: c.id, productionId: pid, name: c.name, performerId: performers[c.performer].id, sortOrder: order, notes },
      { transaction: t },
    );
    if ("stuntDouble" in c) {
      await CharacterDouble.upsert(
        {
          id: demoId(`double:${key}:stunt`),
          productionId: pid,
          characterId: c.id,
          performerId: performers[c.stuntDouble].id,
          kind: "stunt",
        },
        { transaction: t },
      );
    }
    for (const ch of demoChanges[key]) {
      await Change.upsert(
        {
          id: demoId(`change:${key}:${ch.number}`),
          productionId: pid,
          characterId: c.id,
          number: ch.number,
          description: ch.description,
          storyDayFrom: ch.from,
          storyDayTo: ch.to,
          approval: ch.number === 1 ? "approved" : "proposed",
          approvedBy: null,
          approvedAt: ch.number === 1 ? demoInstant(demoDaysFromToday(-12), "10:00") : null,
        },
        { transaction: t },
      );
    }
  }
  for (let n = 1; n <= 60; n++) {
    const set = SETS[n % SETS.length]!;
    await Scene.upsert(
      {
        id: demoId(`scene:saltmarsh:${n}`),
        productionId: pid,
        number: String(n),
        setName: set.name,
        intExt: set.intExt,
        timeOfDay: TIMES[n % TIMES.length]!,
        storyDay: storyDayOf(n),
        storyOrder: n,
        lengthEighths: 3 + ((n * 5) % 14),
        runningMinutes: null,
        synopsis: synopsisFor(n),
      },
      { transaction: t },
    );
    for (const k of castOf(n)) {
      await Appearance.upsert(
        {
          id: demoId(`appearance:saltmarsh:${n}:${k}`),
          productionId: pid,
          sceneId: demoId(`scene:saltmarsh:${n}`),
          characterId: characters[k].id,
          changeId: demoId(`change:${k}:${changeFor(k, n)}`),
          ...stateFor(k, n),
          changeHere: false,
          notes: null,
        },
        { transaction: t },
      );
    }
  }
  const schedule = demoSchedule();
  for (const [i, date] of shootDayDates().entries()) {
    const dayId = demoId(`shootday:saltmarsh:${i + 1}`);
    await ShootDay.upsert(
      { id: dayId, productionId: pid, dayNumber: i + 1, date, kind: "shoot", startsAt: "07:00", notes: null },
      { transaction: t },
    );
    await ShootDayScene.destroy({ where: { shootDayId: dayId }, transaction: t });
    for (const [pos, n] of schedule[i]!.entries()) {
      await ShootDayScene.create(
        {
          id: demoId(`sds:saltmarsh:${i + 1}:${n}`),
          productionId: pid,
          shootDayId: dayId,
          sceneId: demoId(`scene:saltmarsh:${n}`),
          position: pos + 1,
        },
        { transaction: t },
      );
    }
  }
}

function synopsisFor(n: number): string {
  const lines = [
    "The boats come in late; the village waits on the harbour wall.",
    "Maud sets the table for one more than come home.",
    "Elias climbs to the lamp room and logs the weather.",
    "A stranger asks the Reverend about the wreck.",
    "Hester counts what the shop can still give on credit.",
    "Captain Rowe reads the glass and says nothing.",
  ];
  return `${lines[n % lines.length]} (Scene ${n}.)`;
}

/** The Glass Orchard: running order with minutes; Nell has a quick change under 2 minutes. */
export const glassOrchard = {
  scenes: [
    { n: "1", title: "Prologue: the orchard in frost", minutes: 4 },
    { n: "2", title: "The glasshouse at dawn", minutes: 7.5 },
    { n: "3", title: "Market day", minutes: 9 },
    { n: "4", title: "Nell's letter", minutes: 5 },
    { n: "5", title: "Interlude: the gardeners", minutes: 1.5 },
    { n: "6", title: "The ball at Ashcombe", minutes: 11 },
    { n: "7", title: "Storm over the orchard", minutes: 6 },
    { n: "8", title: "Morning after", minutes: 5.5 },
    { n: "9", title: "The sale", minutes: 8 },
    { n: "10", title: "Nell alone", minutes: 4.5 },
    { n: "11", title: "The last harvest", minutes: 10 },
    { n: "12", title: "Epilogue: glass and light", minutes: 3 },
  ],
  characters: [
    {
      key: "nell",
      name: "Nell Ashby",
      performer: "Saoirse Penrice",
      understudy: "Jenna Polglase",
      scenes: ["2", "4", "6", "8", "10", "12"],
      changes: { "2": 1, "4": 1, "6": 2, "8": 3, "10": 3, "12": 4 },
    },
    {
      key: "hal",
      name: "Hal Ashby",
      performer: "Tomas Keverne",
      scenes: ["1", "3", "6", "7", "9", "11"],
      changes: { "1": 1, "3": 1, "6": 2, "7": 2, "9": 3, "11": 3 },
    },
    {
      key: "agnes",
      name: "Aunt Agnes",
      performer: "Wenna Clemo",
      scenes: ["2", "3", "6", "9", "11"],
      changes: { "2": 1, "3": 1, "6": 2, "9": 1, "11": 1 },
    },
    {
      key: "gardener",
      name: "The Gardener",
      performer: "Petroc Angwin",
      scenes: ["1", "5", "7", "11", "12"],
      changes: { "1": 1, "5": 1, "7": 2, "11": 1, "12": 1 },
    },
    { key: "suitor", name: "Mr Ferris", performer: "Jory Tregenza", scenes: ["3", "6", "9"], changes: { "3": 1, "6": 2, "9": 1 } },
  ],
  changeNames: ["Work dress", "Ball gown", "Mourning", "Travelling clothes"],
} as const;

async function seedGlassOrchard(t: Transaction): Promise<void> {
  const pid = GLASS_ORCHARD_ID;
  for (const [i, s] of glassOrchard.scenes.entries()) {
    await Scene.upsert(
      {
        id: demoId(`scene:glass:${s.n}`),
        productionId: pid,
        number: s.n,
        setName: i < 6 ? "Act one: the orchard" : "Act two: the house",
        intExt: null,
        timeOfDay: null,
        storyDay: i < 6 ? 1 : 2,
        storyOrder: i + 1,
        lengthEighths: null,
        runningMinutes: s.minutes,
        synopsis: s.title,
      },
      { transaction: t },
    );
  }
  for (const [ci, c] of glassOrchard.characters.entries()) {
    const perfId = demoId(`performer:glass:${c.key}`);
    await Performer.upsert(
      { id: perfId, productionId: pid, name: c.performer, email: null, phone: null, agentContact: null, notes: null },
      { transaction: t },
    );
    const charId = demoId(`character:glass:${c.key}`);
    await Character.upsert(
      { id: charId, productionId: pid, name: c.name, performerId: perfId, sortOrder: ci + 1, notes: null },
      { transaction: t },
    );
    if ("understudy" in c) {
      const uId = demoId(`performer:glass:${c.key}:understudy`);
      await Performer.upsert(
        { id: uId, productionId: pid, name: c.understudy, email: null, phone: null, agentContact: null, notes: "Understudy" },
        { transaction: t },
      );
      await CharacterDouble.upsert(
        { id: demoId(`double:glass:${c.key}:understudy`), productionId: pid, characterId: charId, performerId: uId, kind: "understudy" },
        { transaction: t },
      );
    }
    const used = [...new Set(Object.values(c.changes) as number[])].sort();
    for (const num of used) {
      await Change.upsert(
        {
          id: demoId(`change:glass:${c.key}:${num}`),
          productionId: pid,
          characterId: charId,
          number: num,
          description: glassOrchard.changeNames[num - 1]!,
          storyDayFrom: null,
          storyDayTo: null,
          approval: "approved",
          approvedBy: null,
          approvedAt: demoInstant(demoDaysFromToday(-7), "10:00"),
        },
        { transaction: t },
      );
    }
    // On stage every costume change between entrances is planned: the breakdown marks it.
    let previous: number | null = null;
    for (const sn of [...c.scenes].sort((a, b) => Number(a) - Number(b))) {
      const num = (c.changes as Record<string, number>)[sn]!;
      const changeHere = previous !== null && previous !== num;
      previous = num;
      await Appearance.upsert(
        {
          id: demoId(`appearance:glass:${c.key}:${sn}`),
          productionId: pid,
          sceneId: demoId(`scene:glass:${sn}`),
          characterId: charId,
          changeId: demoId(`change:glass:${c.key}:${num}`),
          distressStage: 0,
          wet: false,
          stunt: false,
          blood: false,
          vfxShot: false,
          changeHere,
          notes: null,
        },
        { transaction: t },
      );
    }
  }
  // Performances: evenings at 19:30 and Saturday matinees at 14:30 (invented run).
  for (const [i, { date, time }] of performanceDates().entries()) {
    await ShootDay.upsert(
      {
        id: demoId(`performance:glass:${i + 1}`),
        productionId: pid,
        dayNumber: i + 1,
        date,
        kind: "performance",
        startsAt: time,
        notes: i === 0 ? "Opening night" : null,
      },
      { transaction: t },
    );
  }
}

/** Step "breakdown": cast, scenes, shoot days/performances, changes, appearances. */
export async function seedBreakdown(t: Transaction): Promise<void> {
  await seedSaltmarsh(t);
  await seedGlassOrchard(t);
}
