import { emailHtml } from "./layout.js";
import { formatNumber } from "@shared/format.js";
import type { OutgoingMail } from "../lib/mailer.js";

/** One person's evening reminder: tomorrow's fittings and the alterations due tomorrow. */
export function workroomReminderEmail(p: {
  to: string;
  name: string;
  productionTitle: string;
  dateLabel: string;
  /** The production's zone, named beside the fitting times. */
  timeZone: string;
  fittings: Array<{ time: string; performer: string; change: string | null; room: string | null }>;
  tickets: Array<{ tag: string; garment: string; tasks: string; remainingHours: number; late: boolean }>;
  url: string;
}): OutgoingMail {
  const subject = `Tomorrow in the workroom (${p.dateLabel}) — ${p.productionTitle}`;
  const lines = [`Hello ${p.name}, here is ${p.dateLabel} for "${p.productionTitle}".`];
  if (p.fittings.length) {
    lines.push(
      `Fittings (${p.timeZone} time): ${p.fittings.map((f) => `${f.time} ${f.performer}${f.change ? ` (${f.change})` : ""}${f.room ? `, ${f.room}` : ""}`).join("; ")}.`,
    );
  }
  if (p.tickets.length) {
    lines.push(
      `Alterations due: ${p.tickets.map((t) => `${t.tag} ${t.garment} — ${t.tasks}, ${formatNumber(t.remainingHours)} h left${t.late ? " (planned to finish late)" : ""}`).join("; ")}.`,
    );
  }
  return {
    to: p.to,
    subject,
    text: `${lines.join("\n\n")}\n\nOpen the workroom: ${p.url}\n`,
    html: emailHtml(lines, { label: "Open the workroom", url: p.url }),
  };
}
