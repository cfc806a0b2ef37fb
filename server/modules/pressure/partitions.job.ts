import { sql } from "drizzle-orm";
import type { Logger } from "pino";

import type { Database } from "../../db/client";
import { ensureReadingPartitions } from "./readings.repository";

const partitionName = /^pressure_readings_(\d{4})_(\d{2})$/;
const dayMs = 24 * 60 * 60 * 1000;

export interface PartitionRound {
  /** The monthly partitions that exist ahead (this month and the next two). */
  ensured: string[];
  /** Monthly partitions dropped because their whole month is past the raw-reading limit. */
  dropped: string[];
}

/**
 * One round of the partition job: the partitions for this month and the next two are made ahead,
 * and a monthly partition is dropped once the whole of its month is older than `rawDays` — the
 * roll-ups keep its minutes and hours. The DEFAULT partition is never dropped.
 */
export async function runPartitionRound(
  db: Database,
  now: Date,
  rawDays: number,
): Promise<PartitionRound> {
  const ensured = await ensureReadingPartitions(db, now, 2);
  const limit = now.getTime() - rawDays * dayMs;
  const { rows } = await db.execute<{ name: string }>(sql`
    select child.relname as name
    from pg_inherits
    join pg_class parent on parent.oid = pg_inherits.inhparent
    join pg_class child on child.oid = pg_inherits.inhrelid
    where parent.relname = 'pressure_readings'
    order by child.relname`);
  const dropped: string[] = [];
  for (const { name } of rows) {
    const match = partitionName.exec(name);
    if (!match) continue;
    const monthEnd = Date.UTC(Number(match[1]), Number(match[2]), 1);
    if (monthEnd > limit) continue;
    await db.transaction(async (tx) => {
      await tx.execute(sql.raw(`alter table pressure_readings detach partition "${name}"`));
      await tx.execute(sql.raw(`drop table "${name}"`));
    });
    dropped.push(name);
  }
  return { ensured, dropped };
}

/** Runs a round at start and then daily; a failed round is logged and tried again next time. */
export function createPartitionJob(options: {
  db: Database;
  logger: Logger;
  rawDays: number;
  intervalMs?: number;
  now?: () => Date;
}) {
  const now = options.now ?? (() => new Date());
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<void> | null = null;
  const round = () => {
    running ??= runPartitionRound(options.db, now(), options.rawDays)
      .then(({ dropped }) => {
        if (dropped.length > 0)
          options.logger.info({ dropped }, "raw pressure readings past their keeping dropped");
      })
      .catch((err: unknown) =>
        options.logger.warn(
          { err: { message: (err as Error).message } },
          "pressure partition round failed",
        ),
      )
      .finally(() => {
        running = null;
      });
    return running;
  };
  return {
    async start() {
      await round();
      timer = setInterval(() => void round(), options.intervalMs ?? dayMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await running;
    },
  };
}
