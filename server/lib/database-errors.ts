import { AppError } from "./app-error";

/**
 * The driver's error behind whatever wrapped it. Drizzle wraps pg's error in `DrizzleQueryError`
 * (and a transaction may wrap it again), so every caller that needs a SQLSTATE or a socket code
 * walks the `cause` chain through this one function.
 */
export function databaseCauseOf(err: unknown): { code?: string; message?: string } | null {
  let current: unknown = err;
  for (let depth = 0; depth < 8 && current && typeof current === "object"; depth += 1) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === "string") return current as { code: string; message?: string };
    current = (current as { cause?: unknown }).cause;
  }
  return null;
}

/** The SQLSTATE (or socket error code) behind an error, if there is one. */
export function databaseCodeOf(err: unknown): string | null {
  return databaseCauseOf(err)?.code ?? null;
}

const unavailableCodes = new Set([
  // Sockets: nothing listening, the server went away mid-query.
  "ECONNREFUSED",
  "ECONNRESET",
  "EPIPE",
  "ETIMEDOUT",
  "EHOSTUNREACH",
  "ENOTFOUND",
  // PostgreSQL: shutting down, starting up, connection lost or refused, too many connections.
  "57P01",
  "57P02",
  "57P03",
  "08000",
  "08001",
  "08003",
  "08004",
  "08006",
  "53300",
]);

// pg reports a dropped socket or a pool timeout with a plain Error and no code.
const unavailableMessages = [
  /connection terminated/i,
  /timeout exceeded when trying to connect/i,
  /not queryable/i,
  /connection (?:is )?closed/i,
  /Client was closed/i,
];

/** Whether an error means the database cannot be reached right now (rather than refusing a query). */
export function isDatabaseUnavailable(err: unknown): boolean {
  let current: unknown = err;
  for (let depth = 0; depth < 8 && current && typeof current === "object"; depth += 1) {
    const { code, message, errors } = current as {
      code?: unknown;
      message?: unknown;
      errors?: unknown;
    };
    if (typeof code === "string" && unavailableCodes.has(code)) return true;
    if (typeof message === "string" && unavailableMessages.some((re) => re.test(message)))
      return true;
    // Node reports a refused connection to every address of `localhost` as an AggregateError.
    if (Array.isArray(errors) && errors.some((inner) => isDatabaseUnavailable(inner))) return true;
    current = (current as { cause?: unknown }).cause;
  }
  return false;
}

/** Seconds a client should wait before trying again while the database is away. */
export const databaseRetryAfterSeconds = 5;

/**
 * The one mapping from database errors to answers, for every route: a race that slipped past a
 * service's own check is a 409, input the schema should have refused is a 400, a lost database is
 * a 503 with Retry-After. Anything else is not a database error we can explain (null).
 */
export function appErrorFromDatabase(err: unknown): AppError | null {
  if (isDatabaseUnavailable(err)) {
    return new AppError(
      "unavailable",
      503,
      "Lintel cannot reach its database just now. Nothing you sent was lost; try again in a moment.",
      { retryAfterSeconds: databaseRetryAfterSeconds },
    );
  }
  switch (databaseCodeOf(err)) {
    case "23505":
      return new AppError("conflict", 409, "That would duplicate an existing record.");
    case "23503":
      // Audits, findings and actions RESTRICT the delete of the place they describe.
      if (/^update or delete on table/i.test(databaseCauseOf(err)?.message ?? "")) {
        return new AppError(
          "conflict",
          409,
          "That still has history (audits, findings or corrective actions), so it cannot be deleted. Retire it instead.",
        );
      }
      return new AppError(
        "conflict",
        409,
        "That refers to a record that no longer exists, or is still in use.",
      );
    case "40001":
    case "40P01":
      return new AppError(
        "conflict",
        409,
        "Someone else changed this at the same moment. Reload and try again.",
      );
    case "22021":
    case "22P05":
      return new AppError(
        "bad_request",
        400,
        "The request holds a character that cannot be stored.",
      );
    case "22001":
      return new AppError("bad_request", 400, "A value in the request is too long.");
    case "22003":
      return new AppError("bad_request", 400, "A number in the request is out of range.");
    case "22P02":
    case "22007":
    case "22008":
      return new AppError(
        "bad_request",
        400,
        "A value in the request is not in the expected form.",
      );
    default:
      return null;
  }
}
