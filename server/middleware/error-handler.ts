import type { ErrorRequestHandler, RequestHandler } from "express";

import type { ApiErrorEnvelope } from "@shared/api-error";

import { AppError } from "../lib/app-error";
import { appErrorFromDatabase } from "../lib/database-errors";

interface HttpLikeError {
  status?: number;
  statusCode?: number;
  type?: string;
}

/** Errors raised by body parsing arrive with a status and a type; give each a clear answer. */
function fromParserError(err: HttpLikeError): AppError | null {
  switch (err.type) {
    case "entity.parse.failed":
      return new AppError("bad_request", 400, "The request body is not valid JSON.", {
        fields: { body: "Not valid JSON." },
      });
    case "entity.too.large":
      return new AppError("payload_too_large", 413, "The request body is too large.");
    case "encoding.unsupported":
    case "charset.unsupported":
      return new AppError("unsupported_media_type", 415, "Send the body as UTF-8 JSON.");
    default: {
      const status = err.status ?? err.statusCode;
      if (status && status >= 400 && status < 500) {
        return new AppError("bad_request", status, "The request could not be read.");
      }
      return null;
    }
  }
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError("not_found", 404, `There is no API route ${req.method} ${req.originalUrl}.`));
};

/** The client closed the connection before the reply ended (a phone moving to another page). */
function clientLeft(err: unknown, res: { headersSent: boolean; destroyed: boolean }): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return res.destroyed && (code === "ERR_STREAM_PREMATURE_CLOSE" || res.headersSent);
}

/** The last middleware: every error leaves as the one envelope; no stack traces to clients. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  // Nobody is left to answer, and a person moving on is not a fault of the server.
  if (clientLeft(err, res)) {
    req.log.info("the client left before the reply ended");
    return;
  }
  const known =
    err instanceof AppError
      ? err
      : (fromParserError(err as HttpLikeError) ?? appErrorFromDatabase(err));
  const error =
    known ?? new AppError("internal", 500, "Something went wrong on our side. Try again.");
  if (!known) req.log.error({ err }, "unhandled error");
  // A lost database is logged once by the pool; each refused request is only a warning.
  else if (error.status === 503) req.log.warn({ code: error.code }, error.message);
  else if (error.status >= 500) req.log.error({ err }, error.message);

  if (error.retryAfterSeconds) res.set("Retry-After", String(error.retryAfterSeconds));
  const body: ApiErrorEnvelope = {
    error: {
      code: error.code,
      message: error.message,
      ...(error.fields ? { fields: error.fields } : {}),
    },
  };
  res.status(error.status).json(body);
};
