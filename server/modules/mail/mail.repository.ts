import { sql } from "drizzle-orm";

import type { UndeliveredMail } from "@shared/schemas/mail";

import type { DbOrTx } from "../../db/client";

type Row = {
  id: string;
  topic: string;
  recipient: string;
  recipient_name: string;
  subject: string;
  status: string;
  attempts: number;
  created_at: Date | string;
  claimed_at: Date | string | null;
  last_error: string | null;
};

const iso = (value: Date | string) => new Date(value).toISOString();

function toMail(row: Row): UndeliveredMail {
  return {
    id: row.id,
    topic: row.topic,
    recipient: row.recipient,
    recipientName: row.recipient_name,
    subject: row.subject,
    status: row.status === "failed" ? "failed" : "uncertain",
    attempts: row.attempts,
    queuedAt: iso(row.created_at),
    lastTriedAt: row.claimed_at === null ? null : iso(row.claimed_at),
    problem: row.last_error,
  };
}

/**
 * An e-mail belongs to the network of the person it was queued for. Rows queued before the
 * outbox named its person fall back to the account that holds the address (never another
 * network's pending invitation to the same address).
 */
const ofNetwork = (networkId: string) =>
  sql`join users u on u.network_id = ${networkId}
        and (u.id = o.recipient_id
             or (o.recipient_id is null and lower(u.email) = lower(o.recipient)
                 and not u.held_elsewhere))`;

/** E-mail of the network that may not have arrived, newest first. */
export async function listUndelivered(
  db: DbOrTx,
  networkId: string,
  limit = 200,
): Promise<UndeliveredMail[]> {
  const result = await db.execute<Row>(sql`
    select o.id, o.topic, o.recipient, u.display_name as recipient_name, o.subject, o.status,
           o.attempts, o.created_at, o.claimed_at, o.last_error
      from outbox o ${ofNetwork(networkId)}
     where o.status in ('uncertain', 'failed')
     order by o.created_at desc
     limit ${limit}`);
  return result.rows.map(toMail);
}

/** One e-mail of the network, locked until the transaction ends; null when not theirs. */
export async function lockMail(
  tx: DbOrTx,
  networkId: string,
  mailId: string,
): Promise<(UndeliveredMail & { rawStatus: string }) | null> {
  const result = await tx.execute<Row>(sql`
    select o.id, o.topic, o.recipient, u.display_name as recipient_name, o.subject, o.status,
           o.attempts, o.created_at, o.claimed_at, o.last_error
      from outbox o ${ofNetwork(networkId)}
     where o.id = ${mailId}
       for update of o`);
  const row = result.rows[0];
  return row ? { ...toMail(row), rawStatus: row.status } : null;
}

/** Back in the queue as if new: the worker sends it with a full set of attempts. */
export async function requeue(tx: DbOrTx, mailId: string): Promise<void> {
  await tx.execute(sql`
    update outbox
       set status = 'pending', attempts = 0, next_attempt_at = now(),
           claimed_at = null, claimed_by = null, last_error = null
     where id = ${mailId}`);
}
