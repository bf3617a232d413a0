import { createEvent } from "ics";
import { emailHtml } from "./layout.js";
import { formatDateTimeWithZone } from "@shared/format.js";
import type { OutgoingMail } from "../lib/mailer.js";

export type FittingMailKind = "invite" | "update" | "cancel";

export interface FittingMailInput {
  kind: FittingMailKind;
  uid: string;
  /** RFC 5545 SEQUENCE: 0 when booked, +1 on every reschedule or cancellation. */
  sequence: number;
  productionTitle: string;
  performer: { name: string; email: string };
  changeLabel: string | null;
  startsAt: Date;
  durationMinutes: number;
  room: string | null;
  /** The member who booked the fitting: ORGANIZER of the invitation and Reply-To of the e-mail. */
  organizer: { name: string; email: string };
  timeZone: string;
}

/** The RFC 5545 VCALENDAR for a fitting (METHOD REQUEST, or CANCEL), generated with the `ics` package. */
export function fittingIcs(p: FittingMailInput): string {
  const { error, value } = createEvent({
    productId: "seamscene/workroom",
    method: p.kind === "cancel" ? "CANCEL" : "REQUEST",
    uid: p.uid,
    sequence: p.sequence,
    start: p.startsAt.getTime(),
    startInputType: "utc",
    startOutputType: "utc",
    duration: { minutes: p.durationMinutes },
    title: `Costume fitting — ${p.productionTitle}`,
    description: p.changeLabel ? `Fitting for ${p.changeLabel}.` : "Costume fitting.",
    location: p.room ?? undefined,
    status: p.kind === "cancel" ? "CANCELLED" : "CONFIRMED",
    busyStatus: "BUSY",
    organizer: { name: p.organizer.name, email: p.organizer.email },
    attendees: [{ name: p.performer.name, email: p.performer.email, rsvp: true, partstat: "NEEDS-ACTION", role: "REQ-PARTICIPANT" }],
  });
  if (error || !value) throw error ?? new Error("could not build the calendar invitation");
  return value;
}

/** The e-mail (with its text/calendar part) that books, moves or cancels a fitting. */
export function fittingEmail(p: FittingMailInput): OutgoingMail {
  // The performer may read this anywhere: the time carries its zone.
  const at = formatDateTimeWithZone(p.startsAt, p.timeZone);
  const when = `${at} (${p.durationMinutes} minutes)`;
  const where = p.room ? ` in ${p.room}` : "";
  const what = p.changeLabel ? ` for ${p.changeLabel}` : "";
  const subject =
    p.kind === "invite"
      ? `Costume fitting: ${at} — ${p.productionTitle}`
      : p.kind === "update"
        ? `Fitting moved: ${at} — ${p.productionTitle}`
        : `Fitting cancelled — ${p.productionTitle}`;
  const lines =
    p.kind === "cancel"
      ? [
          `Dear ${p.performer.name},`,
          `your costume fitting${what} on ${when} is cancelled. The costume department will be in touch about a new time.`,
        ]
      : [
          `Dear ${p.performer.name},`,
          p.kind === "invite"
            ? `the costume department of "${p.productionTitle}" has booked a fitting${what} on ${when}${where}.`
            : `your costume fitting${what} has moved to ${when}${where}.`,
          `The attached calendar invitation adds it to your calendar; please accept or decline it there. If the time does not work, reply to this e-mail: it reaches ${p.organizer.name}.`,
        ];
  return {
    to: p.performer.email,
    replyTo: { name: p.organizer.name, address: p.organizer.email },
    subject,
    text: lines.join("\n\n") + "\n",
    html: emailHtml(lines),
    icalEvent: { method: p.kind === "cancel" ? "CANCEL" : "REQUEST", content: fittingIcs(p), filename: "fitting.ics" },
  };
}
