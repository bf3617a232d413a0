import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import type { AddressInfo } from "node:net";
import { OutboxMessage } from "../models/index.js";
import { logger } from "./logger.js";
import { OUTBOX_HEADERS } from "./mailer.js";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function header(value: unknown): string | null {
  return typeof value === "string" ? value.trim() : null;
}

/**
 * A local SMTP server on loopback for development and tests: the real protocol runs, nothing
 * leaves the machine, and every message lands in the outbox table shown on the Team screen.
 */
export async function startSmtpFake(options: { port: number; host?: string }): Promise<{ port: number; close: () => Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    size: 30 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(", ") : (parsed.to?.text ?? "");
          const productionId = header(parsed.headers.get(OUTBOX_HEADERS.production));
          await OutboxMessage.create({
            // What the outbox scopes by: the production the mail was sent for and who actually received it.
            productionId: productionId && UUID.test(productionId) ? productionId.toLowerCase() : null,
            mailKind: header(parsed.headers.get(OUTBOX_HEADERS.kind))?.slice(0, 40) ?? null,
            deliveredTo: session.envelope.rcptTo.map((r) => r.address.trim().toLowerCase()),
            recipients: to,
            sender: parsed.from?.text ?? null,
            subject: parsed.subject ?? "",
            textBody: parsed.text ?? null,
            htmlBody: typeof parsed.html === "string" ? parsed.html : null,
            attachments: parsed.attachments.map((a) => ({
              filename: a.filename ?? null,
              contentType: a.contentType,
              size: a.size,
              // Small text parts (calendar invitations) are kept so they can be shown and checked.
              content: a.contentType.startsWith("text/") && a.size < 64_000 ? a.content.toString("utf8") : undefined,
            })),
          });
          callback();
        })
        .catch((err: Error) => {
          logger.error({ err }, "SMTP fake could not store a message");
          callback(err);
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host ?? "127.0.0.1", () => resolve());
  });
  const port = (server.server.address() as AddressInfo).port;
  return { port, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
