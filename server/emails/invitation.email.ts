import { roleLabels, type Role } from "@shared/permissions.js";
import { emailHtml } from "./layout.js";

/** The e-mail that invites someone into a production. */
export function invitationEmail(p: { productionTitle: string; role: Role; inviterName: string; url: string; days: number }) {
  const subject = `You are invited to ${p.productionTitle} on Seamscene`;
  const lines = [
    `${p.inviterName} invited you to join the costume department of "${p.productionTitle}" as ${roleLabels[p.role]}.`,
    `The link works once and expires in ${p.days} days.`,
  ];
  return {
    subject,
    text: `${lines.join("\n\n")}\n\nAccept: ${p.url}\n`,
    html: emailHtml(lines, { label: "Accept the invitation", url: p.url }),
  };
}
