/**
 * The demo is anchored to the day it is seeded: on any date the shoot is under way and every planned
 * conflict of seeds/scenario.ts appears, with fittings, tickets and rentals at the same distances from
 * today. Checked on dates chosen to break date arithmetic: a Monday, a Sunday, 29 February of a leap
 * year, and the days the UK clocks change (Europe/London: last Sunday of March and of October).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { addDays, differenceInCalendarDays, getISODay, parseISO } from "date-fns";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { zonedParts } from "../../server/lib/zoned-time.js";
import { Fitting, Garment, ShootDay } from "../../server/models/index.js";
import { seedDemo } from "../../seeds/index.js";
import { DEMO_PASSWORD, GLASS_ORCHARD_ID, SALTMARSH_ID } from "../../seeds/accounts.js";
import { DEMO_TIME_ZONE } from "../../seeds/calendar.js";
import { FROCK_COAT_DUE_SHOOT_DAY, FROCK_COAT_WORN_ON_SHOOT_DAY, keyGarments } from "../../seeds/scenario.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { SnagListDto } from "../../shared/schemas/snags.js";

const app = createApp();

beforeAll(async () => {
  await resetDb();
});
afterAll(() => {
  clock.reset();
});

/** Working days strictly between two dates (Mon–Fri), counted from a to b. */
function workingDaysFrom(a: string, b: string): number {
  let n = 0;
  for (let d = parseISO(a); d < parseISO(b); d = addDays(d, 1)) if (getISODay(addDays(d, 1)) <= 5) n++;
  return n;
}

const anchors = [
  ["2026-12-02", "a Wednesday (the scenario as written)"],
  ["2026-11-30", "a Monday"],
  ["2026-12-06", "a Sunday"],
  ["2028-02-29", "29 February of a leap year"],
  ["2028-03-26", "a Sunday in a leap year when the clocks go forward"],
  ["2027-10-31", "the Sunday the clocks go back"],
] as const;

describe.each(anchors)("demo seeded on %s (%s)", (today) => {
  let supervisor: TestAgent;
  let snags: SnagListDto;

  beforeAll(async () => {
    // Seeded at 09:00 local time on the anchor day; the server's clock reads the same day.
    clock.set(`${today}T09:00:00Z`, { frozen: true });
    await seedDemo({ today });
    supervisor = await signedInAgent(app, "supervisor@seamscene.test", DEMO_PASSWORD);
    snags = (await supervisor.get(`/api/productions/${SALTMARSH_ID}/snags`).expect(200)).body.data;
  }, 120_000);

  it("judges snags on the anchor day and has the shoot under way: two days done, shoot day 3 next", async () => {
    const days = await ShootDay.findAll({ where: { productionId: SALTMARSH_ID }, order: [["dayNumber", "ASC"]] });

    expect(snags.today).toBe(today);
    expect(days).toHaveLength(18);
    expect(days.filter((d) => d.date < today)).toHaveLength(2);
    expect(snags.nextShootDay?.date).toBe(days[2]!.date);
    // Shoot days are working days: none on a Saturday or Sunday.
    expect(days.every((d) => getISODay(parseISO(d.date)) <= 5)).toBe(true);
    // Shoot day 3 is today, or the next working day when today is a weekend day.
    expect(differenceInCalendarDays(parseISO(days[2]!.date), parseISO(today))).toBeLessThanOrEqual(getISODay(parseISO(today)) >= 6 ? 2 : 0);
  });

  it("shows every planned conflict of the scenario", () => {
    const titles = snags.snags.map((s) => `${s.kind}: ${s.title}`);

    expect(titles).toContainEqual(expect.stringMatching(/^fit: .*Keeper's jacket on Corwen Blakely: tight at chest/));
    expect(titles).toContainEqual(expect.stringMatching(/^continuity: .*Maud Penhallow: change 2 → 3 within story day 4/));
    expect(titles).toContainEqual(expect.stringMatching(/^multiples: .*storm oilskin.*2 copies, 3 needed/));
    expect(snags.snags.some((s) => s.kind === "rental" && s.title.includes("Frock coat"))).toBe(true);
    // The keeper's jacket: 10 h of work left, due before tomorrow's shoot day, is late.
    expect(snags.snags.some((s) => s.kind === "workroom_late" && /keeper's jacket/i.test(s.title))).toBe(true);
  });

  it("dates the frock coat's return on shoot day 10 while it is worn on shoot day 14", async () => {
    const coat = await Garment.findByPk(keyGarments.ambroseFrockCoat);
    const days = await ShootDay.findAll({ where: { productionId: SALTMARSH_ID }, order: [["dayNumber", "ASC"]] });

    expect(coat!.rentalDueOn).toBe(days[FROCK_COAT_DUE_SHOOT_DAY - 1]!.date);
    expect(days[FROCK_COAT_WORN_ON_SHOOT_DAY - 1]!.date > coat!.rentalDueOn!).toBe(true);
  });

  it("keeps fittings at the same working-day distances from today, at the same local times", async () => {
    const fittings = await Fitting.findAll({ where: { productionId: SALTMARSH_ID }, order: [["startsAt", "ASC"]] });
    const local = fittings.map((f) => zonedParts(f.startsAt, DEMO_TIME_ZONE));

    // Two fittings on each of the two working days before today are done; the rest are booked from today on.
    expect(fittings.filter((f) => f.status === "done")).toHaveLength(4);
    expect(local.every((p) => p.date >= today || workingDaysFrom(p.date, today) <= 2)).toBe(true);
    expect(local.map((p) => `${String(p.hour).padStart(2, "0")}:${String(p.minute).padStart(2, "0")}`)).toEqual([
      "10:00",
      "14:00",
      "11:00",
      "15:30",
      "10:00",
      "09:30",
      "11:00",
      "10:00",
      "14:00",
    ]);
  });

  it("the stage show's quick change is flagged and its first night is within the last week", async () => {
    const glass = (await supervisor.get(`/api/productions/${GLASS_ORCHARD_ID}/snags`).expect(200)).body.data as SnagListDto;
    const shows = await ShootDay.findAll({ where: { productionId: GLASS_ORCHARD_ID }, order: [["dayNumber", "ASC"]] });

    expect(glass.snags.map((s) => s.kind)).toEqual(["quick_change"]);
    expect(differenceInCalendarDays(parseISO(today), parseISO(shows[0]!.date))).toBeGreaterThanOrEqual(0);
    expect(differenceInCalendarDays(parseISO(today), parseISO(shows[0]!.date))).toBeLessThanOrEqual(6);
    expect(glass.nextShootDay).not.toBeNull();
  });
});
