import { describe, expect, it } from "vitest";

import { api } from "../helpers/app";

describe("API platform", () => {
  it("when the database answers, then /api/health is 200 ok", async () => {
    const response = await api().get("/api/health");
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: "ok" });
  });

  it("when an /api route does not exist, then 404 in the error envelope", async () => {
    for (const [method, url] of [
      ["get", "/api/nothing-here"],
      ["post", "/api/sites/x/y/z"],
      ["delete", "/api/auth/me"],
    ] as const) {
      const response = await api().request(method, url);
      expect(response.status, `${method} ${url}`).toBe(404);
      expect(response.body).toEqual({ error: { code: "not_found", message: expect.any(String) } });
    }
  });

  it("when any request is answered, then it carries a request id and security headers", async () => {
    const response = await api().get("/api/health").set("X-Request-Id", "trace-abc-12345");
    expect(response.headers["x-request-id"]).toBe("trace-abc-12345");
    expect(response.headers["content-security-policy"]).toContain("default-src 'self'");
    expect(response.headers["x-content-type-options"]).toBe("nosniff");
    expect(response.headers["x-powered-by"]).toBeUndefined();
  });

  it("when a request id is unsafe, then the server makes its own", async () => {
    const response = await api().get("/api/health").set("X-Request-Id", "<script>");
    expect(response.headers["x-request-id"]).toMatch(/^[0-9a-f-]{36}$/);
  });
});
