import { randomBytes } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { Writable } from "node:stream";

import { pino } from "pino";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { createApp } from "../../server/app";
import { connectDatabase, type DatabaseHandle } from "../../server/db/client";
import { buildDeps } from "../../server/deps";
import { storeImage } from "../../server/lib/images";
import { createStorage } from "../../server/lib/storage";
import { insertNetwork, insertSite } from "../factories/records";
import { signInAs } from "../helpers/auth";
import { testEnv, testOrigin } from "../helpers/test-env";

interface LogLine {
  level: number;
  msg: string;
}

// A phone that leaves a page while a photo is still arriving closes the connection mid-reply.
// That is the person moving on, not a fault of the server, and must not be logged as an error.
describe("a client that leaves before the reply ends", () => {
  const lines: LogLine[] = [];
  let database: DatabaseHandle;
  let server: http.Server;
  let imageId = "";
  let cookie = "";

  beforeAll(async () => {
    const env = testEnv();
    const sink = new Writable({
      write(chunk, _encoding, done) {
        for (const line of String(chunk).split("\n").filter(Boolean))
          lines.push(JSON.parse(line) as LogLine);
        done();
      },
    });
    const logger = pino({ level: "info" }, sink);
    database = connectDatabase(env.DATABASE_URL, { max: 2, logger });
    const deps = buildDeps(env, database, logger, createStorage(env));
    const networkId = (await insertNetwork(deps.db)).id;
    const siteId = (await insertSite(deps.db, networkId)).id;
    cookie = (await signInAs(networkId, [{ role: "auditor", siteId }])).cookie;
    // Noise compresses badly, so the photo is megabytes and cannot fit in the socket's buffers.
    const side = 2400;
    const noise = randomBytes(side * side * 3);
    const photo = await sharp(noise, { raw: { width: side, height: side, channels: 3 } })
      .png()
      .toBuffer();
    imageId = (await storeImage(deps, { siteId, uploadedBy: null, buffer: photo, field: "photo" }))
      .id;
    server = http.createServer(createApp(deps));
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  });

  afterAll(async () => {
    await new Promise((resolve) => server.close(resolve));
    await database.pool.end();
  });

  it("when the phone closes the connection while a photo streams, then nothing is logged as an error", async () => {
    const { port } = server.address() as AddressInfo;
    await new Promise<void>((resolve, reject) => {
      const request = http.get(
        {
          host: "127.0.0.1",
          port,
          path: `/api/images/${imageId}`,
          headers: { Cookie: cookie, Origin: testOrigin },
        },
        (response) => {
          expect(response.statusCode).toBe(200);
          expect(Number(response.headers["content-length"])).toBeGreaterThan(4_000_000);
          // The first bytes arrive, then the person taps away.
          response.once("data", () => {
            request.destroy();
            resolve();
          });
        },
      );
      request.on("error", (error) => {
        if (!request.destroyed) reject(error);
      });
    });
    // The server notices the closed connection and ends its reply, saying so in its log.
    await expect
      .poll(() => lines.some((line) => line.level >= 50 || /left before/.test(line.msg)), {
        timeout: 5000,
      })
      .toBe(true);
    expect(lines.filter((line) => line.level >= 50).map((line) => line.msg)).toEqual([]);
    expect(lines.some((line) => line.level === 30 && /left before/.test(line.msg))).toBe(true);
  });
});
