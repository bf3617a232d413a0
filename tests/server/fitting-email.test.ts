import { afterEach, beforeEach, describe, expect, it } from "vitest";
import ICAL from "ical.js";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import type { OutboxMessage } from "../../server/models/index.js";
import { fittingEmail } from "../../server/emails/fitting.email.js";
import { buildMember, buildProduction, buildUser } from "../factories.js";
import { buildPerformer } from "../factories.workroom.js";
import { resetDb, signedInAgent, waitForMail } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
  clock.set("2030-09-01", { frozen: true });
});
afterEach(() => clock.reset());

/** The calendar part of the newest message to `to` whose subject contains `subjectPart`, parsed with ical.js. */
async function invitationOf(to: string, subjectPart: string) {
  const msg = (await waitForMail((m) => m.recipients.includes(to) && m.subject.includes(subjectPart))) as OutboxMessage;
  const part = msg.attachments.find((a) => a.contentType.startsWith("text/calendar"));
  const cal = new ICAL.Component(ICAL.parse(part!.content!));
  return { msg, vevent: cal.getFirstSubcomponent("vevent")! };
}

describe("fitting invitation: a person organizes it, the performer is asked to reply", () => {
  it("names the booking member as ORGANIZER (not a no-reply address) and asks the performer to RSVP", async () => {
    const production = await buildProduction({ settings: { timeZone: "Europe/London" } });
    const booker = await buildUser({ name: "Rosa Cutter", email: "rosa@test.invalid" });
    await buildMember("cutter", { production, user: booker });
    const performerId = await buildPerformer(production.id, { name: "Ivy Example", email: "ivy@test.invalid" });
    const agent = await signedInAgent(app, booker.email);

    await agent
      .post(`/api/productions/${production.id}/fittings`, { performerId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 45 })
      .expect(201);
    const { msg, vevent } = await invitationOf("ivy@test.invalid", "Costume fitting");

    // RFC 5545 §3.8.4.3: ORGANIZER is a cal-address (mailto:) with an optional CN; read back with ical.js.
    const organizer = vevent.getFirstProperty("organizer")!;
    expect(String(organizer.getFirstValue()).toLowerCase()).toBe("mailto:rosa@test.invalid");
    expect(organizer.getParameter("cn")).toBe("Rosa Cutter");
    // RFC 5545 §3.2.17: RSVP=TRUE asks the attendee for a reply.
    const attendee = vevent.getFirstProperty("attendee")!;
    expect(String(attendee.getFirstValue()).toLowerCase()).toBe("mailto:ivy@test.invalid");
    expect(String(attendee.getParameter("rsvp")).toUpperCase()).toBe("TRUE");
    expect(String(attendee.getParameter("partstat")).toUpperCase()).toBe("NEEDS-ACTION");
    // The e-mail names the time zone: 09:30 UTC is 10:30 British Summer Time (UTC+1) on 3 Sep 2030.
    expect(msg.subject).toContain("Tue 3 Sep 2030, 10:30 GMT+1 (Europe/London)");
    expect(msg.textBody).toContain("Tue 3 Sep 2030, 10:30 GMT+1 (Europe/London) (45 minutes)");
    expect(msg.textBody).toContain("reaches Rosa Cutter");
  });

  it("keeps the booking member as organizer when someone else moves the fitting", async () => {
    const production = await buildProduction({ settings: { timeZone: "Europe/London" } });
    const booker = await buildUser({ name: "Rosa Cutter", email: "rosa@test.invalid" });
    await buildMember("cutter", { production, user: booker });
    const { user: supervisor } = await buildMember("supervisor", { production });
    const performerId = await buildPerformer(production.id, { name: "Ivy Example", email: "ivy@test.invalid" });
    const created = await (
      await signedInAgent(app, booker.email)
    ).post(`/api/productions/${production.id}/fittings`, { performerId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 45 });
    await invitationOf("ivy@test.invalid", "Costume fitting");

    await (
      await signedInAgent(app, supervisor.email)
    )
      .patch(`/api/productions/${production.id}/fittings/${created.body.data.id}`, { startsAt: "2030-09-04T13:00:00Z" })
      .expect(200);
    const { vevent } = await invitationOf("ivy@test.invalid", "Fitting moved");

    expect(String(vevent.getFirstPropertyValue("organizer")).toLowerCase()).toBe("mailto:rosa@test.invalid");
  });

  it("sets Reply-To to the organizer, so a reply to the e-mail reaches the same person", () => {
    const mail = fittingEmail({
      kind: "invite",
      uid: "u@seamscene",
      sequence: 0,
      productionTitle: "Test",
      performer: { name: "Ivy Example", email: "ivy@test.invalid" },
      changeLabel: null,
      startsAt: new Date("2030-12-03T09:30:00Z"),
      durationMinutes: 30,
      room: null,
      organizer: { name: "Rosa Cutter", email: "rosa@test.invalid" },
      timeZone: "America/New_York",
    });

    expect(mail.replyTo).toEqual({ name: "Rosa Cutter", address: "rosa@test.invalid" });
    // US Eastern Standard Time is UTC−5 in December.
    expect(mail.subject).toContain("Tue 3 Dec 2030, 04:30 EST (America/New_York)");
  });
});
