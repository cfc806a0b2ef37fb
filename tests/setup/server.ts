import pg from "pg";
import { afterAll } from "vitest";

import { testApp } from "../helpers/app";

afterAll(async () => {
  await testApp().database.close();
});

// A connection takes one statement at a time. A second sent before the first is answered (reads
// side by side inside a transaction) only warns in pg 8 and fails in pg 9; here it fails now, at
// the call, naming the statement, so the whole class is caught where it is written.
type Queued = { _queryQueue: unknown[]; _activeQuery: unknown; pipeline?: boolean };
const query = pg.Client.prototype.query;
pg.Client.prototype.query = function guardedQuery(this: pg.Client, ...args: unknown[]) {
  const self = this as unknown as Queued;
  if (!self.pipeline && (self._activeQuery || self._queryQueue.length > 0)) {
    const text = typeof args[0] === "string" ? args[0] : (args[0] as { text?: string })?.text;
    throw new Error(
      `A statement was sent on a connection still busy with another (use readTogether): ${String(text).slice(0, 120)}`,
    );
  }
  return (query as (...a: unknown[]) => unknown).apply(this, args);
} as typeof pg.Client.prototype.query;
