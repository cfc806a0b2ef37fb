import { randomUUID } from "node:crypto";

import pg from "pg";

import { templateDatabase } from "../setup/test-cluster";

/**
 * A fresh, migrated database of its own on the test cluster, for tests that must see every row
 * of a table (the e-mail outbox), where other test files' rows would get in the way.
 */
export async function createIsolatedDatabase(): Promise<string> {
  const shared = new URL(process.env.DATABASE_URL!);
  const name = `lintel_iso_${randomUUID().replace(/-/g, "").slice(0, 16)}`;
  const admin = new pg.Client({ connectionString: new URL("/postgres", shared).toString() });
  await admin.connect();
  try {
    await admin.query(`create database ${name} template ${templateDatabase}`);
  } finally {
    await admin.end();
  }
  return new URL(`/${name}`, shared).toString();
}
