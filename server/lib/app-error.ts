import type { ApiErrorCode } from "@shared/api-error";

interface AppErrorDetails {
  /** Field name → message, shown beside the field. */
  fields?: Record<string, string>;
  /** Sent as Retry-After. */
  retryAfterSeconds?: number;
}

/** The one error type. Thrown anywhere; the error middleware turns it into the envelope. */
export class AppError extends Error {
  readonly fields?: Record<string, string>;
  readonly retryAfterSeconds?: number;

  constructor(
    readonly code: ApiErrorCode,
    readonly status: number,
    message: string,
    details: AppErrorDetails = {},
  ) {
    super(message);
    this.name = "AppError";
    this.fields = details.fields;
    this.retryAfterSeconds = details.retryAfterSeconds;
  }
}

export const notFound = (what = "That") => new AppError("not_found", 404, `${what} was not found.`);
export const forbidden = () =>
  new AppError(
    "forbidden",
    403,
    "Your role does not allow this. Ask an administrator if you need it.",
  );
export const unauthenticated = () => new AppError("unauthenticated", 401, "Sign in to continue.");
