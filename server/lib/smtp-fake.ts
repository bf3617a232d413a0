import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import type { AddressInfo } from "node:net";
import { OutboxMessage } from "../models/index.js";
import { logger } from "./logger.js";

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
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const to = Array.isArray(parsed.to) ? parsed.to.map((a) => a.text).join(", ") : (parsed.to?.text ?? "");
          await OutboxMessage.create({
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
