import { randomUUID } from "node:crypto";

import type { Logger } from "pino";

import type { Database } from "../db/client";
import { isDatabaseUnavailable } from "../lib/database-errors";
import type { Mailer } from "../lib/mailer";
import { claimNext, markForRetry, markInterrupted, markSent } from "./outbox.repository";

export interface OutboxWorkerOptions {
  db: Database;
  mailer: Mailer;
  logger: Logger;
  pollMs: number;
  retryMs: number;
  maxAttempts: number;
  leaseMs: number;
  /** The host part of Message-IDs. */
  messageIdDomain: string;
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;

/** Delay before attempt n+1: doubling from retryMs, capped at 30 minutes, with ±20% jitter. */
export function retryDelayMs(retryMs: number, attempts: number): number {
  const base = Math.min(retryMs * 2 ** Math.max(0, attempts - 1), 30 * 60 * 1000);
  return Math.round(base * (0.8 + Math.random() * 0.4));
}

export function createOutboxWorker(options: OutboxWorkerOptions) {
  const workerId = `worker-${randomUUID()}`;
  let running = false;
  let loop: Promise<void> | null = null;
  let wake: (() => void) | null = null;

  /** Sends every due e-mail once; returns how many were sent. */
  async function drain(): Promise<number> {
    await markInterrupted(options.db, options.leaseMs);
    let sent = 0;
    for (;;) {
      const mail = await claimNext(options.db, workerId);
      if (!mail) return sent;
      try {
        await options.mailer.send({
          // A stable Message-ID lets any receiver recognise the message as one event.
          messageId: `<${mail.id}@${options.messageIdDomain}>`,
          to: mail.recipient,
          subject: mail.subject,
          text: mail.textBody,
          html: mail.htmlBody,
        });
      } catch (error) {
        const message = error instanceof Error ? error.message : String(error);
        const retryAt =
          mail.attempts >= options.maxAttempts
            ? null
            : new Date(Date.now() + retryDelayMs(options.retryMs, mail.attempts));
        await markForRetry(options.db, mail.id, workerId, retryAt, message);
        options.logger.warn(
          { outboxId: mail.id, attempts: mail.attempts, error: message },
          "e-mail not sent; will retry",
        );
        // The server is likely down: stop this round and wait for the next one.
        return sent;
      }
      await markSent(options.db, mail.id, workerId);
      sent += 1;
    }
  }

  let databaseAway = false;

  async function run() {
    while (running) {
      try {
        await drain();
        if (databaseAway) options.logger.info("database is back; e-mail sending resumes");
        databaseAway = false;
      } catch (error) {
        // While PostgreSQL is away every round fails the same way: say so once, keep polling.
        if (!isDatabaseUnavailable(error)) {
          options.logger.error({ err: error }, "outbox round failed");
        } else if (!databaseAway) {
          databaseAway = true;
          options.logger.warn("database unreachable; e-mail waits in the outbox until it is back");
        }
      }
      if (!running) break;
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, options.pollMs);
        wake = () => {
          clearTimeout(timer);
          resolve();
        };
      });
      wake = null;
    }
  }

  return {
    workerId,
    drain,
    start() {
      if (running) return;
      running = true;
      loop = run();
    },
    /** Looks for due e-mail now rather than at the next poll. */
    nudge() {
      wake?.();
    },
    async stop() {
      running = false;
      wake?.();
      await loop;
      loop = null;
    },
  };
}
