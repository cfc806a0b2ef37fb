import type { ApiErrorCode } from "@shared/api-error";
import { apiErrorEnvelopeSchema } from "@shared/schemas/shell";
// The core's functions take the full and the small schemas alike, and weigh little in the shell.
import { safeParse, type $ZodType, type output } from "zod/v4/core";

/** Codes the client adds for failures that never reached the server or could not be read. */
export type ClientErrorCode = "network_unavailable" | "unexpected_response";

export interface ApiErrorInit {
  status: number;
  code: ApiErrorCode | ClientErrorCode | (string & {});
  message: string;
  fields?: Record<string, string>;
  /** From the Retry-After header: how long the server asks callers to wait (503, 429). */
  retryAfterSeconds?: number;
}

/** Every failed API call surfaces as this one type, parsed from the error envelope. */
export class ApiError extends Error {
  override readonly name = "ApiError";
  readonly status: number;
  readonly code: ApiErrorInit["code"];
  readonly fields: Readonly<Record<string, string>>;
  readonly retryAfterSeconds: number | null;

  constructor({ status, code, message, fields, retryAfterSeconds }: ApiErrorInit) {
    super(message);
    this.status = status;
    this.code = code;
    this.fields = fields ?? {};
    this.retryAfterSeconds = retryAfterSeconds ?? null;
  }

  /** The server's message for a body field; it may name the field plainly or as `body.<name>`. */
  fieldError(name: string): string | undefined {
    return this.fields[name] ?? this.fields[`body.${name}`];
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

export interface ApiRequestOptions<TSchema extends $ZodType | undefined> {
  method?: Method;
  /** Sent as JSON, or as multipart/form-data when it is a FormData (file uploads). */
  body?: unknown;
  /** Validates the reply against the shared contract; without it the reply is ignored. */
  schema?: TSchema;
  signal?: AbortSignal;
}

type Reply<TSchema> = TSchema extends $ZodType ? output<TSchema> : undefined;

const fallbackMessages: Record<number, string> = {
  401: "Please sign in to continue.",
  403: "You do not have access to this.",
  404: "We could not find that.",
  413: "The file is too large to upload.",
  415: "That kind of file cannot be uploaded.",
  429: "Too many attempts. Please wait a moment and try again.",
  502: "Lintel is not answering just now. Nothing you sent was lost; try again in a moment.",
  503: "Lintel is not answering just now. Nothing you sent was lost; try again in a moment.",
  504: "Lintel is not answering just now. Nothing you sent was lost; try again in a moment.",
};

/** Whether the failure is the server (or its database) being away for a while, not a refusal. */
export function isTemporarilyUnavailable(error: unknown): error is ApiError {
  return (
    isApiError(error) && (error.status === 502 || error.status === 503 || error.status === 504)
  );
}

function retryAfterOf(response: Response): number | undefined {
  const seconds = Number(response.headers.get("Retry-After"));
  return Number.isFinite(seconds) && seconds > 0 ? seconds : undefined;
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text();
  if (text.length === 0) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

function errorFromReply(response: Response, body: unknown): ApiError {
  const envelope = safeParse(apiErrorEnvelopeSchema, body);
  const retryAfterSeconds = retryAfterOf(response);
  if (envelope.success) {
    return new ApiError({ status: response.status, ...envelope.data.error, retryAfterSeconds });
  }
  return new ApiError({
    status: response.status,
    retryAfterSeconds,
    code: response.status >= 500 ? "internal" : "unexpected_response",
    message:
      fallbackMessages[response.status] ??
      "Lintel could not reach its server properly. Please try again.",
  });
}

/** The error a failed reply carries, for callers that read a reply's body themselves (downloads). */
export async function readApiError(response: Response): Promise<ApiError> {
  return errorFromReply(response, await readJson(response));
}

/**
 * `fetch` to the API with the session cookie; a request that never reached the server becomes
 * the same ApiError everywhere, and a cancelled one stays a cancellation.
 */
export async function fetchFromApi(path: string, init: RequestInit = {}): Promise<Response> {
  try {
    return await fetch(path, { ...init, credentials: "same-origin" });
  } catch (error) {
    if (init.signal?.aborted) throw error;
    throw new ApiError({
      status: 0,
      code: "network_unavailable",
      message: "No connection to Lintel. Check your network and try again.",
    });
  }
}

/** The one way the client talks to the API: same-origin, session cookie, envelope-aware. */
export async function apiRequest<TSchema extends $ZodType | undefined = undefined>(
  path: string,
  { method = "GET", body, schema, signal }: ApiRequestOptions<TSchema> = {},
): Promise<Reply<TSchema>> {
  const headers: Record<string, string> = { Accept: "application/json" };
  const isForm = body instanceof FormData;
  // The browser writes the multipart boundary into Content-Type itself.
  if (body !== undefined && !isForm) headers["Content-Type"] = "application/json";

  const response = await fetchFromApi(path, {
    method,
    headers,
    body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
    signal,
  });

  const payload = await readJson(response);
  if (!response.ok) throw errorFromReply(response, payload);
  if (schema === undefined) return undefined as Reply<TSchema>;

  const parsed = safeParse(schema, payload);
  if (!parsed.success) {
    throw new ApiError({
      status: response.status,
      code: "unexpected_response",
      message: "Lintel received a reply it could not read. Please reload the page.",
    });
  }
  return parsed.data as Reply<TSchema>;
}
