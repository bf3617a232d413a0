import { emailHtml } from "./layout.js";

/** The e-mail with a single-use link to choose a new password. */
export function passwordResetEmail(p: { name: string; url: string; minutes: number }) {
  const lines = [
    `Hello ${p.name},`,
    `Someone asked to reset the password of your Seamscene account. If that was you, choose a new password with the link below. It works once and expires in ${p.minutes} minutes.`,
    "If you did not ask, ignore this message; your password stays as it is.",
  ];
  return {
    subject: "Reset your Seamscene password",
    text: `${lines.join("\n\n")}\n\n${p.url}\n`,
    html: emailHtml(lines, { label: "Choose a new password", url: p.url }),
  };
}
