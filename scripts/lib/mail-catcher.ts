import { randomUUID } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import path from "node:path";

import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";

import type { MailboxMessage } from "../../shared/schemas/people";

export interface CaughtMail extends MailboxMessage {
  messageId: string | null;
}

export interface MailCatcher {
  readonly port: number;
  readonly messages: CaughtMail[];
  /** Stops listening (as if the SMTP server went down); `start` listens again on the same port. */
  stop: () => Promise<void>;
  start: () => Promise<void>;
  waitFor: (
    predicate: (messages: CaughtMail[]) => boolean,
    timeoutMs?: number,
  ) => Promise<CaughtMail[]>;
}

const addresses = (value: AddressObject | AddressObject[] | undefined): string[] =>
  (Array.isArray(value) ? value : value ? [value] : []).flatMap((group) =>
    group.value.map((entry) => entry.address ?? "").filter(Boolean),
  );

/**
 * A local SMTP server that accepts everything and keeps it: in memory, and as JSON files in `dir`
 * (the demo mailbox page reads those). Loopback only; nothing leaves the machine.
 */
export async function startMailCatcher(
  options: { port?: number; dir?: string } = {},
): Promise<MailCatcher> {
  const messages: CaughtMail[] = [];
  let port = options.port ?? 0;
  let server: SMTPServer | null = null;
  if (options.dir) mkdirSync(options.dir, { recursive: true });

  const listen = async () => {
    const smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      banner: "Lintel local mail catcher",
      onData(stream, _session, callback) {
        simpleParser(stream)
          .then((parsed) => {
            const mail: CaughtMail = {
              id: randomUUID(),
              messageId: parsed.messageId ?? null,
              to: addresses(parsed.to),
              from: addresses(parsed.from).join(", "),
              subject: parsed.subject ?? "",
              text: parsed.text ?? "",
              html: typeof parsed.html === "string" ? parsed.html : null,
              receivedAt: new Date().toISOString(),
            };
            messages.push(mail);
            if (options.dir) {
              const file = `${mail.receivedAt.replace(/[:.]/g, "-")}-${mail.id}.json`;
              writeFileSync(path.join(options.dir, file), JSON.stringify(mail, null, 2));
            }
            callback();
          })
          .catch((error: Error) => callback(error));
      },
    });
    smtp.on("error", () => undefined);
    await new Promise<void>((resolve, reject) => {
      smtp.server.once("error", reject);
      smtp.listen(port, "127.0.0.1", () => resolve());
    });
    port = (smtp.server.address() as AddressInfo).port;
    server = smtp;
  };

  await listen();

  return {
    get port() {
      return port;
    },
    messages,
    async stop() {
      const current = server;
      server = null;
      if (current) await new Promise<void>((resolve) => current.close(() => resolve()));
    },
    async start() {
      if (!server) await listen();
    },
    async waitFor(predicate, timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      while (!predicate(messages)) {
        if (Date.now() > deadline)
          throw new Error(
            `mail catcher: condition not met within ${timeoutMs} ms (${messages.length} received)`,
          );
        await new Promise((resolve) => setTimeout(resolve, 25));
      }
      return messages;
    },
  };
}
