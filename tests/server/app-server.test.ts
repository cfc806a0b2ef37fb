import { IncomingMessage, ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";

import { describe, expect, it } from "vitest";

import { createAppServer } from "../../server/lib/app-server";
import { testApp } from "../helpers/app";

/**
 * The server hands Express requests and responses already built on the app's prototypes, so
 * Express never has to change an object's prototype mid-life (which kept every finished request
 * alive through the next young-generation collections).
 */
describe("the app's HTTP server", () => {
  it("when a request arrives, then it and its response already have the app's prototypes, and the app answers as before", async () => {
    const { app } = testApp();
    const server = createAppServer(app);
    const seen: boolean[] = [];
    server.prependListener("request", (req: IncomingMessage, res: ServerResponse) => {
      seen.push(
        Object.getPrototypeOf(req) === app.request,
        Object.getPrototypeOf(res) === app.response,
        req instanceof IncomingMessage,
        res instanceof ServerResponse,
      );
    });
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
    try {
      const { port } = server.address() as AddressInfo;
      const health = await fetch(`http://127.0.0.1:${port}/api/health`);
      expect(health.status).toBe(200);
      expect(await health.json()).toEqual({ status: "ok" });
      // Express's own request and response methods work on them.
      const missing = await fetch(`http://127.0.0.1:${port}/api/no-such-route`);
      expect(missing.status).toBe(404);
      expect(missing.headers.get("cache-control")).toBe("no-store");
      expect(seen).toEqual([true, true, true, true, true, true, true, true]);
    } finally {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
      });
    }
  });
});
