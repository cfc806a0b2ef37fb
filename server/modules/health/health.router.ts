import { sql } from "drizzle-orm";

import { AppError } from "../../lib/app-error";
import { appErrorFromDatabase, databaseRetryAfterSeconds } from "../../lib/database-errors";
import { defineRoute } from "../../lib/routes";

export const healthRoutes = [
  defineRoute({
    method: "get",
    path: "/health",
    summary: "Liveness: 200 once the database answers",
    access: { kind: "public" },
    async handle({ res, deps }) {
      try {
        await deps.db.execute(sql`select 1`);
      } catch (error) {
        throw (
          appErrorFromDatabase(error) ??
          new AppError("unavailable", 503, "The database is not answering.", {
            retryAfterSeconds: databaseRetryAfterSeconds,
          })
        );
      }
      res.json({ status: "ok" });
    },
  }),
];
