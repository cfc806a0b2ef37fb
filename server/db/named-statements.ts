import { createHash } from "node:crypto";

import type { SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";

import type { DbOrTx } from "./client";

const dialect = new PgDialect();

/**
 * Runs a statement as a named prepared statement: each pooled connection parses and analyses the
 * text once and then only binds and runs it, which matters for the committee's larger aggregates
 * that are asked for again and again. The name carries a hash of the text, so statements whose
 * text differs (an optional filter present or not) never share a name; the texts are few, because
 * values travel as parameters.
 */
export async function executeNamed<Row>(db: DbOrTx, label: string, query: SQL): Promise<Row[]> {
  const built = dialect.sqlToQuery(query);
  const name = `${label}_${createHash("sha256").update(built.sql).digest("hex").slice(0, 16)}`;
  const result = (await db._.session.prepareQuery(built, undefined, name, false).execute()) as {
    rows: Row[];
  };
  return result.rows;
}
