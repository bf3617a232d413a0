import nodemailer, { type Transporter } from "nodemailer";
import type { Attachment } from "nodemailer/lib/mailer/index.js";
import { config, outboxEnabled } from "../config.js";
import { logger } from "./logger.js";

let transport: Transporter | undefined;

/**
 * One SMTP transport, built at the first send (the SMTP fake of development and tests picks its port
 * after this module loads). In development and tests it points at the fake on loopback.
 */
function smtp(): Transporter {
  transport ??= nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: config.SMTP_SECURE,
    auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASS } : undefined,
    // The local fake speaks plain SMTP; a real relay negotiates STARTTLS.
    ignoreTLS: config.NODE_ENV !== "production" && !config.SMTP_USER,
  });
  return transport;
}

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

/** Why a message is sent. Account mail (password reset) belongs to no production. */
export type MailKind =
  "password_reset" | "invitation" | "packet_published" | "fitting_invite" | "fitting_update" | "fitting_cancel" | "evening_reminder";

/** What a message is about: its kind and the production it was sent for (null for account mail). */
export interface MailAbout {
  kind: MailKind;
  productionId: string | null;
}

/** Headers the development outbox reads to scope messages; names shared with server/lib/smtp-fake.ts. */
export const OUTBOX_HEADERS = { production: "x-seamscene-production", kind: "x-seamscene-mail" } as const;

function message(mail: OutgoingMail, about: MailAbout) {
  // Only the local outbox needs to know the production; real recipients' mail carries no extra headers.
  const headers = outboxEnabled()
    ? { [OUTBOX_HEADERS.kind]: about.kind, ...(about.productionId ? { [OUTBOX_HEADERS.production]: about.productionId } : {}) }
    : undefined;
  return { from: config.MAIL_FROM, ...mail, headers };
}

/** Sends one message. Returns false (and logs) on failure; callers decide whether to retry. */
export async function sendMail(mail: OutgoingMail, about: MailAbout): Promise<boolean> {
  try {
    await smtp().sendMail(message(mail, about));
    return true;
  } catch (err) {
    // The subject and kind say what failed; addresses are personal data and stay out of the log.
    logger.error({ err, kind: about.kind, subject: mail.subject }, "e-mail send failed");
    return false;
  }
}

/** Sends and throws on failure (for job-queue workers that retry with backoff). */
export async function sendMailOrThrow(mail: OutgoingMail, about: MailAbout): Promise<void> {
  await smtp().sendMail(message(mail, about));
}
