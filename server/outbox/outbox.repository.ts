import { and, eq, lt, sql } from "drizzle-orm";

import type { Database, DbOrTx } from "../db/client";
import { outbox } from "../db/schema/index";

export interface NewMail {
  topic: string;
  to: string;
  subject: string;
  text: string;
  html: string | null;
}

/**
 * Call inside the transaction of the change that causes the e-mail, naming the person it is for
 * (their row decides which network's lists show it).
 */
export async function enqueueMail(
  tx: DbOrTx,
  mail: NewMail,
  recipient: { id: string } | null,
): Promise<string> {
  const [row] = await tx
    .insert(outbox)
    .values({
      topic: mail.topic,
      recipient: mail.to,
      recipientId: recipient?.id ?? null,
      subject: mail.subject,
      textBody: mail.text,
      htmlBody: mail.html,
    })
    .returning({ id: outbox.id });
  return row!.id;
}

export interface ClaimedMail {
  id: string;
  recipient: string;
  subject: string;
  textBody: string;
  htmlBody: string | null;
  attempts: number;
}

/** Takes the oldest due row for this worker; committed before sending, so no other worker can. */
export async function claimNext(db: Database, workerId: string): Promise<ClaimedMail | null> {
  const result = await db.execute<{
    id: string;
    recipient: string;
    subject: string;
    text_body: string;
    html_body: string | null;
    attempts: number;
  }>(sql`
    update outbox
       set status = 'sending', claimed_at = now(), claimed_by = ${workerId}, attempts = attempts + 1
     where id = (
       select id from outbox
        where status = 'pending' and next_attempt_at <= now()
        order by created_at
        limit 1
        for update skip locked
     )
    returning id, recipient, subject, text_body, html_body, attempts`);
  const row = result.rows[0];
  if (!row) return null;
  return {
    id: row.id,
    recipient: row.recipient,
    subject: row.subject,
    textBody: row.text_body,
    htmlBody: row.html_body,
    attempts: row.attempts,
  };
}

export async function markSent(db: Database, id: string, workerId: string): Promise<void> {
  await db
    .update(outbox)
    .set({ status: "sent", sentAt: new Date(), textBody: null, htmlBody: null, lastError: null })
    .where(and(eq(outbox.id, id), eq(outbox.claimedBy, workerId), eq(outbox.status, "sending")));
}

/** SMTP refused or was unreachable: nothing was delivered, so try again later (or give up). */
export async function markForRetry(
  db: Database,
  id: string,
  workerId: string,
  retryAt: Date | null,
  error: string,
): Promise<void> {
  await db
    .update(outbox)
    .set(
      retryAt
        ? { status: "pending", nextAttemptAt: retryAt, lastError: error }
        : { status: "failed", lastError: error },
    )
    .where(and(eq(outbox.id, id), eq(outbox.claimedBy, workerId), eq(outbox.status, "sending")));
}

/** Rows left in `sending` past the lease belonged to a process that stopped mid-send. */
export async function markInterrupted(db: Database, leaseMs: number): Promise<number> {
  const cutoff = new Date(Date.now() - leaseMs);
  const rows = await db
    .update(outbox)
    .set({
      status: "uncertain",
      lastError:
        "Sending was interrupted; it is not sent again automatically, to avoid a duplicate.",
    })
    .where(and(eq(outbox.status, "sending"), lt(outbox.claimedAt, cutoff)))
    .returning({ id: outbox.id });
  return rows.length;
}
