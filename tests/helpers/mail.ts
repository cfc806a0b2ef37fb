import {
  startMailCatcher,
  type CaughtMail,
  type MailCatcher,
} from "../../scripts/lib/mail-catcher";
import { createMailer } from "../../server/lib/mailer";
import { createOutboxWorker, type OutboxWorker } from "../../server/outbox/outbox-worker";
import { createTestApp, type TestApp } from "./app";
import { createIsolatedDatabase } from "./isolated-database";

export interface MailTestApp extends TestApp {
  catcher: MailCatcher;
  worker: OutboxWorker;
  /** Makes another worker on the same outbox (for two-worker tests); stop it after. */
  extraWorker: () => OutboxWorker;
  close: () => Promise<void>;
}

/**
 * An app on a database of its own whose e-mail goes through a real outbox worker to a real local
 * SMTP server, so what the catcher receives is exactly what this app sent. With `mailCatcherDir`
 * the catcher also keeps files there and the app serves them as its demo mailbox.
 */
export async function createMailTestApp(
  overrides: Record<string, string> = {},
  options: { mailCatcherDir?: string } = {},
): Promise<MailTestApp> {
  const catcher = await startMailCatcher({ dir: options.mailCatcherDir });
  const databaseUrl = await createIsolatedDatabase();
  // The app is built before its worker; the nudge reaches the worker once it exists.
  const current: { worker?: OutboxWorker } = {};
  const app = createTestApp(
    {
      DATABASE_URL: databaseUrl,
      SMTP_PORT: String(catcher.port),
      LINTEL_OUTBOX_POLL_MS: "40",
      LINTEL_OUTBOX_RETRY_MS: "40",
      ...overrides,
    },
    () => current.worker?.nudge(),
    options,
  );
  const { env, db, logger } = app.deps;
  const mailer = createMailer(env);
  const makeWorker = () =>
    createOutboxWorker({
      db,
      mailer,
      logger,
      pollMs: env.LINTEL_OUTBOX_POLL_MS,
      retryMs: env.LINTEL_OUTBOX_RETRY_MS,
      maxAttempts: env.LINTEL_OUTBOX_MAX_ATTEMPTS,
      leaseMs: env.LINTEL_OUTBOX_LEASE_MS,
      messageIdDomain: "lintel.test",
    });
  const worker = makeWorker();
  current.worker = worker;
  worker.start();
  return {
    ...app,
    catcher,
    worker,
    extraWorker: makeWorker,
    async close() {
      await worker.stop();
      mailer.close();
      await catcher.stop();
      await app.database.close();
    },
  };
}

/** The first link into the app found in a received e-mail's text. */
export function linkIn(mail: CaughtMail): URL {
  const match = /https?:\/\/\S+/.exec(mail.text);
  if (!match) throw new Error(`no link in the e-mail "${mail.subject}"`);
  return new URL(match[0]);
}

export const mailTo = (catcher: MailCatcher, address: string) =>
  catcher.messages.filter((mail) => mail.to.includes(address));
