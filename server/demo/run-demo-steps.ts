import { eq, sql } from "drizzle-orm";
import type { Logger } from "pino";

import type { Database, Tx } from "../db/client";
import type { Env } from "../env";
import type { Storage } from "../lib/storage";
import { demoSteps } from "../db/schema/index";

export interface DemoContext {
  storage: Storage;
  /** For the links in any notice a demo finding queues, as the app's own would carry. */
  env: Env;
  /** The local demo identity provider, when this process started one. */
  identityProvider?: DemoIdentityProvider | null;
}

export interface DemoIdentityProvider {
  issuer: string;
  clientId: string;
  clientSecret: string;
}

export interface DemoStep {
  /** Never renamed once released: the id is what marks the step as done in a database. */
  id: string;
  description: string;
  run: (tx: Tx, context: DemoContext) => Promise<void>;
}

/**
 * Runs each demo step that this database has not seen, in order, each in its own transaction with
 * its record, so a later release adds its demo data to an existing database exactly once.
 */
export async function runDemoSteps(
  db: Database,
  logger: Logger,
  steps: readonly DemoStep[],
  context: DemoContext,
): Promise<string[]> {
  const applied: string[] = [];
  for (const step of steps) {
    const ran = await db.transaction(async (tx) => {
      // Two processes starting at once must not both run a step.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext('lintel-demo-steps'))`);
      const [done] = await tx.select().from(demoSteps).where(eq(demoSteps.id, step.id));
      if (done) return false;
      await step.run(tx, context);
      await tx.insert(demoSteps).values({ id: step.id });
      return true;
    });
    if (ran) {
      applied.push(step.id);
      logger.info({ step: step.id }, `demo data: ${step.description}`);
    }
  }
  return applied;
}
