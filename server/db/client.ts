import { fileURLToPath } from "node:url";

import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { PgTransaction } from "drizzle-orm/pg-core";
import pg from "pg";

import * as schema from "./schema/index";

export type Database = NodePgDatabase<typeof schema>;
/** A transaction handle; repositories accept either so services can compose them in one transaction. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type DbOrTx = Database | Tx;

/**
 * Runs independent reads: side by side on the pool, one after another inside a transaction. A
 * transaction is one connection, which takes one statement at a time; sending the next before
 * the last is answered is what pg deprecates (and the api tests refuse). Use this, never
 * `Promise.all`, for reads that may be given a transaction.
 */
export async function readTogether<const T extends readonly unknown[]>(
  db: DbOrTx,
  reads: { [K in keyof T]: () => Promise<T[K]> },
): Promise<T> {
  const list = reads as readonly (() => Promise<unknown>)[];
  if (!(db instanceof PgTransaction))
    return (await Promise.all(list.map((read) => read()))) as unknown as T;
  const results: unknown[] = [];
  for (const read of list) results.push(await read());
  return results as unknown as T;
}

export interface DatabaseHandle {
  db: Database;
  pool: pg.Pool;
  close: () => Promise<void>;
}

/** What the pool reports about the connection to PostgreSQL (a pino logger fits). */
export interface DatabaseLog {
  warn: (details: object, message: string) => void;
  info: (details: object, message: string) => void;
}

const consoleLog: DatabaseLog = {
  warn: (details, message) => console.warn(message, details),
  info: () => undefined,
};

export interface ConnectOptions {
  max?: number;
  logger?: DatabaseLog;
  /** How long a request waits for a connection before it is answered 503. */
  connectionTimeoutMs?: number;
}

/**
 * The pool every part of the server shares (routes, sessions, sign-in counters, the e-mail
 * worker, the notice scheduler). A connection that PostgreSQL drops — restart, crash, network —
 * is logged once and discarded; the pool opens new ones when asked, so the process outlives the
 * database and carries on by itself when it returns. Meanwhile queries fail at once (connection
 * refused) or after `connectionTimeoutMs`, and the error handler answers 503.
 */
export function connectDatabase(url: string, options: ConnectOptions = {}): DatabaseHandle {
  const log = options.logger ?? consoleLog;
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    connectionTimeoutMillis: options.connectionTimeoutMs ?? 5_000,
    // Notices a peer that vanished without closing (a host or network gone), not only a closed socket.
    keepAlive: true,
    keepAliveInitialDelayMillis: 10_000,
  });

  let lost = false;
  const connectionLost = (err: Error) => {
    if (lost) return;
    lost = true;
    log.warn(
      { err: { message: err.message, code: (err as { code?: string }).code } },
      "PostgreSQL connection lost; requests answer 503 until it is back",
    );
  };
  // An idle client's error reaches the pool; without a listener Node would end the process.
  pool.on("error", connectionLost);
  pool.on("connect", (client) => {
    // A client in use (inside a transaction, between two queries) emits its error itself: its
    // query fails with the error, and this listener keeps the event from ending the process.
    client.on("error", connectionLost);
    if (lost) {
      lost = false;
      log.info({}, "PostgreSQL is reachable again");
    }
  });

  const db = drizzle(pool, { schema });
  return { db, pool, close: () => pool.end() };
}

export const migrationsFolder = fileURLToPath(new URL("../../drizzle", import.meta.url));

/** Applies every pending drizzle migration; safe to run again. */
export async function migrateDatabase(url: string): Promise<void> {
  const handle = connectDatabase(url, { max: 1 });
  try {
    await migrate(handle.db, { migrationsFolder });
  } finally {
    await handle.close();
  }
}
