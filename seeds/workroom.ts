/**
 * Workroom demo data for "Saltmarsh Hollow": two more workroom members, everyone's hours, fittings
 * (two working days done, the rest to come) and alteration tickets — one visibly late. Dates are working
 * days from the day the demo is seeded (seeds/calendar.ts).
 * Records of other features (garments, changes) are found by their fixed ids or natural keys, so this
 * step works on top of the breakdown and wardrobe steps.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../server/db.js";
import { AlterationTicket, Fitting, Membership, User, WorkroomCapacity } from "../server/models/index.js";
import { hashPassword } from "../server/auth/passwords.js";
import type { AlterationTask, TicketStatus } from "../shared/schemas/workroom.js";
import { demoId } from "./ids.js";
import { DEMO_PASSWORD, SALTMARSH_ID, userId } from "./accounts.js";
import { characters, keyGarments, performers } from "./scenario.js";
import { demoInstant, demoWorkday } from "./calendar.js";

const P = SALTMARSH_ID;

/** Invented workroom members (cutter role) besides the demo cutter. */
export const workroomMembers = [
  { key: "stitcher-merryn", name: "Merryn Coad", email: "merryn.coad@seamscene.test" },
  { key: "stitcher-jago", name: "Jago Trethewey", email: "jago.trethewey@seamscene.test" },
] as const;

async function exec(sql: string, replacements: Record<string, unknown>, transaction: Transaction): Promise<void> {
  await sequelize.query(sql, { replacements, transaction });
}

async function one<T>(sql: string, replacements: Record<string, unknown>, transaction: Transaction): Promise<T | undefined> {
  const rows = await sequelize.query<T & object>(sql, { replacements, transaction, type: QueryTypes.SELECT });
  return rows[0];
}

/** The demo change of a character by number (whoever created it). */
async function changeId(characterKey: keyof typeof characters, number: number, t: Transaction): Promise<string | null> {
  const row = await one<{ id: string }>(
    `SELECT id FROM changes WHERE character_id = :c AND number = :n`,
    { c: characters[characterKey].id, n: number },
    t,
  );
  return row?.id ?? null;
}

/** A local time on the n-th working day from today (see seeds/calendar.ts). */
const at = (workday: number, time: string) => demoInstant(demoWorkday(workday), time);

/** The workroom step: members, hours, fittings and tickets (idempotent upserts with fixed ids). */
export async function seedWorkroom(t: Transaction): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  for (const m of workroomMembers) {
    await User.upsert(
      { id: userId(m.key), email: m.email, name: m.name, passwordHash: hash, isActive: true, lastProductionId: P },
      { transaction: t },
    );
    await Membership.upsert(
      { id: demoId(`membership:saltmarsh:${m.key}`), productionId: P, userId: userId(m.key), role: "cutter" },
      { transaction: t },
    );
  }
  const cutter = userId("cutter");
  const merryn = userId("stitcher-merryn");
  const jago = userId("stitcher-jago");
  const designer = userId("designer");
  const capacity = [
    { user: cutter, hours: { mon: 8, tue: 8, wed: 8, thu: 8, fri: 6, sat: 0, sun: 0 }, off: [demoWorkday(7)] },
    { user: merryn, hours: { mon: 7.5, tue: 7.5, wed: 7.5, thu: 7.5, fri: 7.5, sat: 0, sun: 0 }, off: [demoWorkday(2)] },
    { user: jago, hours: { mon: 4, tue: 0, wed: 4, thu: 0, fri: 4, sat: 0, sun: 0 }, off: [] },
  ];
  for (const c of capacity) {
    await WorkroomCapacity.upsert(
      { id: demoId(`capacity:saltmarsh:${c.user}`), productionId: P, userId: c.user, hoursPerWeekday: c.hours, daysOff: c.off },
      { transaction: t },
    );
  }

  const eliasChange = await changeId("elias", 1, t);
  const maudDay = await changeId("maud", 1, t);
  const maudMourning = await changeId("maud", 2, t);
  const silasStorm = await changeId("silas", 1, t);
  const ambroseSunday = await changeId("ambrose", 1, t);
  const tamsinHarbour = await changeId("tamsin", 1, t);
  const fittings: Array<{
    key: string;
    performer: string;
    change: string | null;
    at: [workday: number, time: string];
    minutes: number;
    room: string;
    attendees: string[];
    status: "booked" | "done";
    notes?: string;
    outcome?: string;
  }> = [
    {
      key: "elias-1",
      performer: performers.elias.id,
      change: eliasChange,
      at: [-2, "10:00"],
      minutes: 60,
      room: "Fitting room 1",
      attendees: [cutter, designer],
      status: "done",
      outcome: "Jacket tight across the chest; let out 2.5 cm at the side seams and take the sleeves up 1.5 cm. Shirt sleeves 2 cm long.",
    },
    {
      key: "maud-1",
      performer: performers.maud.id,
      change: maudDay,
      at: [-2, "14:00"],
      minutes: 45,
      room: "Fitting room 1",
      attendees: [cutter, merryn],
      status: "done",
      outcome: "Day dress hem 2 cm too long for the boots; shawl has a dropped stitch at the fringe.",
    },
    {
      key: "silas-1",
      performer: performers.silas.id,
      change: silasStorm,
      at: [-1, "11:00"],
      minutes: 45,
      room: "Workroom bay",
      attendees: [cutter, jago],
      status: "done",
      outcome: "Copy #2 to be distressed to stage 1 for the harbour scenes.",
    },
    {
      key: "ambrose-1",
      performer: performers.ambrose.id,
      change: ambroseSunday,
      at: [-1, "15:30"],
      minutes: 30,
      room: "Fitting room 2",
      attendees: [merryn],
      status: "done",
      outcome: "Rented frock coat needs 3 cm let out at the waist (rental house approved).",
    },
    {
      key: "maud-2",
      performer: performers.maud.id,
      change: maudMourning,
      at: [0, "10:00"],
      minutes: 60,
      room: "Fitting room 1",
      attendees: [cutter, designer],
      status: "booked",
      notes: "Bring the overdyed sample.",
    },
    {
      key: "tamsin-1",
      performer: performers.tamsin.id,
      change: tamsinHarbour,
      at: [1, "09:30"],
      minutes: 45,
      room: "Fitting room 2",
      attendees: [merryn],
      status: "booked",
    },
    {
      key: "elias-2",
      performer: performers.elias.id,
      change: eliasChange,
      at: [2, "11:00"],
      minutes: 30,
      room: "Fitting room 1",
      attendees: [cutter],
      status: "booked",
      notes: "Check the let-out jacket before shoot day 9.",
    },
    {
      key: "hester-1",
      performer: performers.hester.id,
      change: null,
      at: [3, "10:00"],
      minutes: 60,
      room: "Fitting room 1",
      attendees: [cutter, designer],
      status: "booked",
      notes: "First fitting: toiles for the chapel scenes.",
    },
    {
      key: "ambrose-2",
      performer: performers.ambrose.id,
      change: ambroseSunday,
      at: [4, "14:00"],
      minutes: 30,
      room: "Fitting room 2",
      attendees: [merryn],
      status: "booked",
    },
  ];
  for (const f of fittings) {
    const id = demoId(`fitting:${f.key}`);
    await Fitting.upsert(
      {
        id,
        productionId: P,
        performerId: f.performer,
        changeId: f.change,
        startsAt: at(...f.at),
        durationMinutes: f.minutes,
        room: f.room,
        attendeeIds: f.attendees,
        notes: f.notes ?? null,
        outcome: f.outcome ?? null,
        status: f.status,
        icsUid: `fitting-${id}@seamscene`,
        icsSequence: 0,
        createdBy: userId("supervisor"),
      },
      { transaction: t },
    );
  }

  const oilskin2 = await one<{ id: string }>(
    `SELECT id FROM garments WHERE multiples_group_id = :g ORDER BY copy_number OFFSET 1 LIMIT 1`,
    { g: keyGarments.silasOilskinGroup },
    t,
  );
  const tickets: Array<{
    key: string;
    garment: string | undefined;
    fitting: string | null;
    tasks: AlterationTask[];
    estimate: number;
    remaining?: number;
    assignee: string | null;
    status: TicketStatus;
    raisedOn: number;
    notes?: string;
  }> = [
    // The late one: 10 h still to do on the jacket, pinned to the cutter, needed on shoot day 4 (tomorrow).
    {
      key: "elias-jacket",
      garment: keyGarments.eliasJacket,
      fitting: "elias-1",
      tasks: [
        { kind: "let_out", amountMm: 25, note: "chest, both side seams" },
        { kind: "shorten", amountMm: 15, note: "sleeves, from the cuff" },
      ],
      estimate: 12,
      remaining: 10,
      assignee: cutter,
      status: "in_progress",
      raisedOn: -2,
      notes: "Only Agnes knows this canvas; keep it with her.",
    },
    {
      key: "elias-shirt",
      garment: keyGarments.eliasShirt,
      fitting: "elias-1",
      tasks: [{ kind: "shorten", amountMm: 20, note: "sleeves" }],
      estimate: 1.5,
      assignee: merryn,
      status: "done",
      raisedOn: -2,
    },
    {
      key: "maud-dress",
      garment: keyGarments.maudDressDay,
      fitting: "maud-1",
      tasks: [{ kind: "shorten", amountMm: 20 }, { kind: "re_hem" }],
      estimate: 3,
      assignee: null,
      status: "waiting",
      raisedOn: -2,
    },
    {
      key: "maud-shawl",
      garment: keyGarments.maudShawl,
      fitting: "maud-1",
      tasks: [{ kind: "repair", note: "dropped stitch at the fringe" }],
      estimate: 1.5,
      assignee: null,
      status: "waiting",
      raisedOn: -2,
    },
    {
      key: "silas-oilskin-2",
      garment: oilskin2?.id,
      fitting: "silas-1",
      tasks: [{ kind: "distress", distressStage: 1, note: "salt bloom and scuffing; abrade, then sponge a fuller's earth wash" }],
      estimate: 4,
      assignee: null,
      status: "waiting",
      raisedOn: -1,
    },
    {
      key: "ambrose-coat",
      garment: keyGarments.ambroseFrockCoat,
      fitting: "ambrose-1",
      tasks: [{ kind: "let_out", amountMm: 30, note: "waist, centre back seam" }, { kind: "press" }],
      estimate: 5,
      assignee: null,
      status: "waiting",
      raisedOn: -1,
    },
    {
      key: "maud-mourning",
      garment: keyGarments.maudMourning,
      fitting: null,
      tasks: [
        { kind: "dye", note: "overdye to a deeper black" },
        { kind: "take_in", amountMm: 10, note: "waist" },
      ],
      estimate: 6,
      assignee: merryn,
      status: "waiting",
      raisedOn: -1,
    },
    {
      key: "elias-trousers",
      garment: keyGarments.eliasTrousers,
      fitting: "elias-1",
      tasks: [{ kind: "re_hem", amountMm: 0 }],
      estimate: 2,
      assignee: merryn,
      status: "checked",
      raisedOn: -2,
    },
  ];
  for (const k of tickets) {
    if (!k.garment) continue;
    const raisedOn = demoWorkday(k.raisedOn);
    const id = demoId(`ticket:${k.key}`);
    const isNew = !(await AlterationTicket.findByPk(id, { transaction: t }));
    await AlterationTicket.upsert(
      {
        id,
        productionId: P,
        garmentId: k.garment,
        fittingId: k.fitting ? demoId(`fitting:${k.fitting}`) : null,
        tasks: k.tasks,
        estimateHours: k.estimate,
        remainingHours: k.status === "done" || k.status === "checked" ? 0 : (k.remaining ?? null),
        assigneeId: k.assignee,
        status: k.status,
        raisedOn,
        raisedBy: cutter,
        garmentStatusBefore: "in_stock",
        doneAt: k.status === "done" || k.status === "checked" ? demoInstant(raisedOn, "16:00") : null,
        checkedAt: k.status === "checked" ? demoInstant(raisedOn, "17:00") : null,
        checkedBy: k.status === "checked" ? userId("supervisor") : null,
        notes: k.notes ?? null,
      },
      { transaction: t },
    );
    // Garments with open tickets are in the workroom, with the move in their history (first load only).
    if (isNew && k.status !== "checked") {
      await exec(
        `UPDATE garments SET status = 'workroom' WHERE id = :g AND production_id = :P AND status <> 'workroom'`,
        { g: k.garment, P },
        t,
      );
      await exec(
        `INSERT INTO garment_status_events (id, production_id, garment_id, from_status, to_status, note, actor_id, created_at) VALUES (:id, :P, :g, 'in_stock', 'workroom', 'alteration ticket raised', :a, :at) ON CONFLICT DO NOTHING`,
        { id: demoId(`garment-event:ticket:${k.key}`), P, g: k.garment, a: cutter, at: demoInstant(raisedOn, "12:00") },
        t,
      );
    }
  }
}
