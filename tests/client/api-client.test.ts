import { meResponseSchema } from "@shared/schemas/auth";
import { afterEach, describe, expect, it, vi } from "vitest";

import { ApiError, apiRequest, isTemporarilyUnavailable } from "@/lib/api-client";

import { auditor, errorResponse, jsonResponse } from "./support/api-stub";

afterEach(() => {
  vi.unstubAllGlobals();
});

describe("apiRequest", () => {
  it("when the server answers with the error envelope, then it throws an ApiError carrying status, code, message and fields", async () => {
    vi.stubGlobal("fetch", () =>
      Promise.resolve(
        errorResponse(400, "validation_failed", "Check the highlighted fields.", {
          email: "Enter an e-mail address such as name@example.org.",
        }),
      ),
    );

    const failure = await apiRequest("/api/auth/sign-in", { method: "POST", body: {} }).catch(
      (error: unknown) => error,
    );

    expect(failure).toBeInstanceOf(ApiError);
    const error = failure as ApiError;
    expect(error.status).toBe(400);
    expect(error.code).toBe("validation_failed");
    expect(error.message).toBe("Check the highlighted fields.");
    expect(error.fields).toEqual({ email: "Enter an e-mail address such as name@example.org." });
    expect(error.fieldError("email")).toBe("Enter an e-mail address such as name@example.org.");
  });

  it("when a field is named with its body prefix, then fieldError still finds it", () => {
    const error = new ApiError({
      status: 400,
      code: "validation_failed",
      message: "Invalid.",
      fields: { "body.password": "Required." },
    });
    expect(error.fieldError("password")).toBe("Required.");
  });

  it("when the error reply is not the envelope, then it still throws an ApiError with a readable message", async () => {
    vi.stubGlobal("fetch", () =>
      Promise.resolve(new Response("<html>Bad gateway</html>", { status: 502 })),
    );

    await expect(apiRequest("/api/sites")).rejects.toMatchObject({
      name: "ApiError",
      status: 502,
      code: "internal",
    });
  });

  it("when the server's database is away (503 with Retry-After), then the ApiError carries its words and how long to wait", async () => {
    vi.stubGlobal("fetch", () => {
      const reply = errorResponse(
        503,
        "unavailable",
        "Lintel cannot reach its database just now. Nothing you sent was lost; try again in a moment.",
      );
      reply.headers.set("Retry-After", "5");
      return Promise.resolve(reply);
    });

    const failure = (await apiRequest("/api/sites").catch((error: unknown) => error)) as ApiError;

    expect(failure).toBeInstanceOf(ApiError);
    expect(failure).toMatchObject({ status: 503, code: "unavailable", retryAfterSeconds: 5 });
    expect(failure.message).toMatch(/^Lintel cannot reach its database just now\./);
    expect(isTemporarilyUnavailable(failure)).toBe(true);
  });

  it("when a 503 arrives without the envelope (from a proxy in front), then the message says Lintel is not answering and nothing was lost", async () => {
    vi.stubGlobal("fetch", () =>
      Promise.resolve(new Response("<html>Service Unavailable</html>", { status: 503 })),
    );

    const failure = (await apiRequest("/api/sites").catch((error: unknown) => error)) as ApiError;

    expect(failure.message).toBe(
      "Lintel is not answering just now. Nothing you sent was lost; try again in a moment.",
    );
    expect(failure.retryAfterSeconds).toBeNull();
    expect(isTemporarilyUnavailable(failure)).toBe(true);
  });

  it("when the network is down, then it throws an ApiError with status 0", async () => {
    vi.stubGlobal("fetch", () => Promise.reject(new TypeError("Failed to fetch")));

    await expect(apiRequest("/api/sites")).rejects.toMatchObject({
      status: 0,
      code: "network_unavailable",
    });
  });

  it("when a reply matches the contract, then it returns the parsed body and sends the session cookie", async () => {
    const fetchStub = vi.fn((_input: RequestInfo | URL, _init?: RequestInit) =>
      Promise.resolve(jsonResponse(auditor)),
    );
    vi.stubGlobal("fetch", fetchStub);

    const me = await apiRequest("/api/auth/me", { schema: meResponseSchema });

    expect(me).toEqual(auditor);
    expect(fetchStub.mock.calls[0]?.[1]).toMatchObject({ credentials: "same-origin" });
  });

  it("when a reply breaks the contract, then it throws an unexpected_response ApiError", async () => {
    vi.stubGlobal("fetch", () => Promise.resolve(jsonResponse({ user: { id: 7 } })));

    await expect(apiRequest("/api/auth/me", { schema: meResponseSchema })).rejects.toMatchObject({
      code: "unexpected_response",
    });
  });

  it("when the server answers 204, then it resolves without a body", async () => {
    vi.stubGlobal("fetch", () => Promise.resolve(new Response(null, { status: 204 })));

    await expect(apiRequest("/api/auth/sign-out", { method: "POST" })).resolves.toBeUndefined();
  });

  it("when the body is form data, then it is sent as is and the browser sets the multipart type", async () => {
    const fetchStub = vi.fn(() => Promise.resolve(jsonResponse({ ok: true })));
    vi.stubGlobal("fetch", fetchStub);
    const form = new FormData();
    form.append("plan", new File(["x"], "plan.png", { type: "image/png" }));

    await apiRequest("/api/floors/1/plan", { method: "PUT", body: form });

    const init = (fetchStub.mock.calls[0] as unknown as [string, RequestInit])[1];
    expect(init.body).toBe(form);
    expect(init.headers).not.toHaveProperty("Content-Type");
  });
});
