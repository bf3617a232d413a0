import nodemailer from "nodemailer";
import type { Attachment } from "nodemailer/lib/mailer/index.js";
import { config } from "../config.js";
import { logger } from "./logger.js";

/** One SMTP transport. In development and tests it points at the local SMTP fake on loopback. */
const transport = nodemailer.createTransport({
  host: config.SMTP_HOST,
  port: config.SMTP_PORT,
  secure: config.SMTP_SECURE,
  auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASS } : undefined,
  // The local fake speaks plain SMTP; a real relay negotiates STARTTLS.
  ignoreTLS: config.NODE_ENV !== "production" && !config.SMTP_USER,
});

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html: string;
  attachments?: Attachment[];
  /** Where replies go when they should reach a person rather than the sending address. */
  replyTo?: { name: string; address: string };
  /** Extra alternatives, e.g. a text/calendar part for invitations. */
  icalEvent?: { method: string; content: string; filename?: string };
}

/** Sends one message. Returns false (and logs) on failure; callers decide whether to retry. */
export async function sendMail(mail: OutgoingMail): Promise<boolean> {
  try {
    await transport.sendMail({ from: config.MAIL_FROM, ...mail });
    return true;
  } catch (err) {
    logger.error({ err, to: mail.to, subject: mail.subject }, "e-mail send failed");
    return false;
  }
}

/** Sends and throws on failure (for job-queue workers that retry with backoff). */
export async function sendMailOrThrow(mail: OutgoingMail): Promise<void> {
  await transport.sendMail({ from: config.MAIL_FROM, ...mail });
}
