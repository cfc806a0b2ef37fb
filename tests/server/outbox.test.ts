import { eq, inArray } from "drizzle-orm";
import { afterEach, beforeEach, describe, expect, it } from "vitest";

import { outbox } from "../../server/db/schema/index";
import { claimNext, enqueueMail } from "../../server/outbox/outbox.repository";
import { retryDelayMs } from "../../server/outbox/outbox-worker";
import { createMailTestApp, type MailTestApp } from "../helpers/mail";

const event = (n: number, tag: string) => ({
  topic: "test",
  to: `outbox-${tag}-${n}@example.org`,
  subject: `Event ${n}`,
  text: `Body of event ${n}: https://lintel.test/secret-link-${n}`,
  html: `<p>Body of event ${n}</p>`,
});

const byMessageId = (ids: string[]) => ids.map((id) => `<${id}@lintel.test>`);

describe("e-mail outbox", () => {
  let mail: MailTestApp;
  beforeEach(async () => {
    mail = await createMailTestApp();
  });
  afterEach(async () => {
    await mail.close();
  });

  it("when the SMTP server is down during ten events and comes back, then each is delivered exactly once", async () => {
    const { db } = mail.deps;
    await mail.catcher.stop();
    const ids: string[] = [];
    for (let n = 0; n < 10; n += 1) {
      ids.push(await db.transaction((tx) => enqueueMail(tx, event(n, "down"), null)));
      mail.deps.notifyOutbox();
    }
    // The worker has tried and failed at least once while the server was down.
    await expect
      .poll(async () =>
        (await db.select().from(outbox).where(inArray(outbox.id, ids))).some(
          (row) => row.attempts > 0,
        ),
      )
      .toBe(true);
    expect(mail.catcher.messages).toHaveLength(0);

    await mail.catcher.start();
    await mail.catcher.waitFor((messages) => messages.length >= 10);
    await new Promise((resolve) => setTimeout(resolve, 300)); // room for a duplicate to show up

    const received = mail.catcher.messages.map((message) => message.messageId).sort();
    expect(received).toEqual(byMessageId(ids).sort());
    const rows = await db.select().from(outbox).where(inArray(outbox.id, ids));
    expect(rows.every((row) => row.status === "sent" && row.sentAt !== null)).toBe(true);
    // Bodies carried one-time links: gone once delivered.
    expect(rows.every((row) => row.textBody === null && row.htmlBody === null)).toBe(true);
    expect(mail.catcher.messages[0]!.text).toContain("Body of event");
  });

  it("when two workers drain the same outbox at once, then every e-mail is sent exactly once", async () => {
    const { db } = mail.deps;
    await mail.worker.stop();
    const ids = await db.transaction(async (tx) => {
      const made: string[] = [];
      for (let n = 0; n < 20; n += 1) made.push(await enqueueMail(tx, event(n, "two"), null));
      return made;
    });
    const [first, second] = [mail.extraWorker(), mail.extraWorker()];
    const [sentByFirst, sentBySecond] = await Promise.all([first.drain(), second.drain()]);

    expect(sentByFirst + sentBySecond).toBe(20);
    await mail.catcher.waitFor((messages) => messages.length >= 20);
    expect(mail.catcher.messages.map((m) => m.messageId).sort()).toEqual(byMessageId(ids).sort());
  });

  it("when the change that causes an e-mail is rolled back, then no e-mail is queued or sent", async () => {
    const { db } = mail.deps;
    await expect(
      db.transaction(async (tx) => {
        await enqueueMail(tx, event(1, "rollback"), null);
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await db.select().from(outbox)).toHaveLength(0);
  });

  it("when a process died while sending, then the e-mail is marked uncertain and never sent again", async () => {
    const { db } = mail.deps;
    await mail.worker.stop();
    const id = await db.transaction((tx) => enqueueMail(tx, event(1, "died"), null));
    // A worker claims the row and its process stops before the send finishes.
    expect((await claimNext(db, "worker-that-died"))?.id).toBe(id);
    await db
      .update(outbox)
      .set({ claimedAt: new Date(Date.now() - 10 * 60 * 1000) })
      .where(eq(outbox.id, id));

    const survivor = mail.extraWorker();
    expect(await survivor.drain()).toBe(0);

    const [row] = await db.select().from(outbox).where(eq(outbox.id, id));
    expect(row!.status).toBe("uncertain");
    expect(mail.catcher.messages).toHaveLength(0);
  });

  it("when SMTP keeps failing past the attempt limit, then the e-mail is marked failed, not retried forever", async () => {
    await mail.close();
    mail = await createMailTestApp({
      LINTEL_OUTBOX_MAX_ATTEMPTS: "2",
      LINTEL_OUTBOX_RETRY_MS: "1",
    });
    const { db } = mail.deps;
    await mail.catcher.stop();
    const id = await db.transaction((tx) => enqueueMail(tx, event(1, "fail"), null));
    mail.deps.notifyOutbox();
    await expect
      .poll(async () => (await db.select().from(outbox).where(eq(outbox.id, id)))[0]!.status, {
        timeout: 5000,
      })
      .toBe("failed");
    const [row] = await db.select().from(outbox).where(eq(outbox.id, id));
    expect(row!.attempts).toBe(2);
    expect(row!.lastError).toBeTruthy();
  });
});

describe("retry delay", () => {
  it("when attempts grow, then the delay doubles within ±20% and stops at 30 minutes", () => {
    for (let attempt = 1; attempt <= 5; attempt += 1) {
      const delay = retryDelayMs(1000, attempt);
      const base = 1000 * 2 ** (attempt - 1);
      expect(delay).toBeGreaterThanOrEqual(base * 0.8);
      expect(delay).toBeLessThanOrEqual(base * 1.2);
    }
    expect(retryDelayMs(1000, 40)).toBeLessThanOrEqual(30 * 60 * 1000 * 1.2);
  });
});
