import type { Logger } from "pino";

import { dueSoonApplies, reminderNumber } from "@shared/calc/due";

import type { Database } from "../../db/client";
import type { Env } from "../../env";
import { isDatabaseUnavailable } from "../../lib/database-errors";
import { enqueueMail, type NewMail } from "../../outbox/outbox.repository";
import * as mails from "./actions.emails";
import * as repo from "./actions.repository";
import { mailFacts } from "./actions.service";

export interface ActionSchedulerOptions {
  db: Database;
  env: Env;
  logger: Logger;
  intervalMs: number;
  /** Called after notices were queued, so the e-mail worker looks at once. */
  notifyOutbox: () => void;
}

export type ActionScheduler = ReturnType<typeof createActionScheduler>;

type Candidate = Awaited<ReturnType<typeof repo.noticeCandidates>>[number];

/** Which time-based notice an action is owed now, if any. */
function noticeFor(candidate: Candidate, now: Date): { kind: string; weeks?: number } | null {
  if (now.getTime() > candidate.dueAt.getTime()) {
    if (!candidate.overdueNoticeAt) return { kind: "overdue" };
    const weeks = reminderNumber(candidate.overdueNoticeAt, now);
    return weeks >= 1 ? { kind: `reminder-${weeks}`, weeks } : null;
  }
  return dueSoonApplies(candidate.openedAt, candidate.dueAt, now) ? { kind: "due-soon" } : null;
}

/**
 * Due-soon, overdue and weekly notices from inside the server process. Each round looks at every
 * action as it stands (not at what changed since the last round), so a process that was down
 * catches up on its next round; each notice is recorded under a unique key in the transaction
 * that queues its e-mail, so two processes running rounds at once never send one twice.
 */
export function createActionScheduler(options: ActionSchedulerOptions) {
  let timer: NodeJS.Timeout | null = null;
  let round: Promise<number> | null = null;

  /** Queues every notice owed at `now`; returns how many e-mails were queued. */
  async function tick(now = new Date()): Promise<number> {
    const candidates = await repo.noticeCandidates(options.db, now);
    let queued = 0;
    for (const candidate of candidates) {
      const notice = noticeFor(candidate, now);
      if (!notice || !candidate.assigneeId) continue;
      const sent = await options.db.transaction(async (tx) => {
        const assignee = await repo.findPerson(tx, candidate.assigneeId!);
        if (!assignee) return false;
        if (!(await repo.claimNotice(tx, candidate.id, notice.kind, now))) return false;
        const facts = mailFacts(options.env, candidate, assignee);
        const mail: NewMail =
          notice.kind === "overdue"
            ? mails.overdueMail(facts)
            : notice.kind === "due-soon"
              ? mails.dueSoonMail(facts)
              : mails.reminderMail(facts, notice.weeks!);
        await enqueueMail(tx, mail, assignee);
        return true;
      });
      if (sent) queued += 1;
    }
    if (queued > 0) options.notifyOutbox();
    return queued;
  }

  let databaseAway = false;

  async function safeTick() {
    try {
      const queued = await tick();
      databaseAway = false;
      return queued;
    } catch (error) {
      // A round missed while PostgreSQL is away is caught up by the next one.
      if (!isDatabaseUnavailable(error)) {
        options.logger.error({ err: error }, "action notice round failed");
      } else if (!databaseAway) {
        databaseAway = true;
        options.logger.warn("database unreachable; action notices wait until it is back");
      }
      return 0;
    }
  }

  return {
    tick,
    start() {
      if (timer) return;
      round = safeTick();
      timer = setInterval(() => {
        // One round at a time in this process; the next waits for the one still running.
        round = (round ?? Promise.resolve(0)).then(safeTick);
      }, options.intervalMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await round;
      round = null;
    },
  };
}
