import { mkdirSync, mkdtempSync, rmSync, statSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { brotliCompressSync, gzipSync } from "node:zlib";

import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { apiCompressionThreshold } from "../../server/middleware/api-compression";
import { insertGrant, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api, createTestApp, testApp, type TestApp } from "../helpers/app";
import { sessionCookieFor } from "../helpers/auth";

const hashedScript = "assets/index-Bq3xK9_a.js";
const longCache = "public, max-age=31536000, immutable";
const workboxRuntime = "workbox-d8ed3718.js";

/** A built client as the build leaves it: each text file with its brotli and gzip copies. */
function writeClient(dir: string) {
  const write = (name: string, body: string | Buffer, compressed = true) => {
    mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    writeFileSync(path.join(dir, name), body);
    if (!compressed) return;
    writeFileSync(path.join(dir, `${name}.br`), brotliCompressSync(body));
    writeFileSync(path.join(dir, `${name}.gz`), gzipSync(body));
  };
  const script = Array.from(
    { length: 400 },
    (_, i) => `export const zone${i} = "anteroom ${i}";`,
  ).join("\n");
  write(
    "index.html",
    `<!doctype html><html><head><title>Lintel</title></head><body>${"<!-- shell -->".repeat(80)}<script type="module" src="/${hashedScript}"></script></body></html>`,
  );
  write(hashedScript, script);
  write(`${hashedScript}.map`, JSON.stringify({ version: 3, mappings: "" }), false);
  write("sw.js", `self.addEventListener("fetch", () => {});\n${"// keeps the shell\n".repeat(60)}`);
  // Workbox's runtime, which the generated worker loads beside itself (named by content, but
  // outside assets/: read again with the worker).
  write(workboxRuntime, `define(["exports"], function (e) {});\n${"// precache\n".repeat(60)}`);
  write("manifest.webmanifest", JSON.stringify({ name: "Lintel", start_url: "/" }), false);
  write(
    "icons/lintel-192.png",
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    false,
  );
}

describe("serving the built client", () => {
  let clientDir = "";
  let served: TestApp;
  const size = (name: string) => String(statSync(path.join(clientDir, name)).size);

  beforeAll(() => {
    clientDir = mkdtempSync(path.join(os.tmpdir(), "lintel-served-client-"));
    writeClient(clientDir);
    served = createTestApp({ LINTEL_CLIENT_DIR: clientDir });
  });
  afterAll(async () => {
    await served.database.close();
    rmSync(clientDir, { recursive: true, force: true });
  });

  it("when the browser accepts brotli, then a hashed file goes out as its brotli copy, kept for a year", async () => {
    const response = await api(served.app)
      .get(`/${hashedScript}`)
      .set("Accept-Encoding", "gzip, deflate, br");
    expect(response.status).toBe(200);
    expect(response.headers["content-encoding"]).toBe("br");
    expect(response.headers["content-length"]).toBe(size(`${hashedScript}.br`));
    expect(response.headers["content-type"]).toMatch(/^text\/javascript; charset=utf-8$/i);
    expect(response.headers["vary"]).toMatch(/Accept-Encoding/i);
    expect(response.headers["cache-control"]).toBe(longCache);
  });

  it("when a built file is sent, then it carries no content security policy, while the page and the worker keep theirs", async () => {
    const file = await api(served.app)
      .get(`/${hashedScript}`)
      .set("Accept-Encoding", "gzip, deflate, br");
    expect(file.status).toBe(200);
    expect(file.headers["content-security-policy"]).toBeUndefined();
    // What still matters on a script stays.
    expect(file.headers["x-content-type-options"]).toBe("nosniff");
    expect(file.headers["cross-origin-resource-policy"]).toBe("same-origin");
    for (const documentPath of ["/", "/sites/anywhere", "/sw.js"]) {
      const response = await api(served.app).get(documentPath);
      expect(response.status, documentPath).toBe(200);
      expect(response.headers["content-security-policy"], documentPath).toContain(
        "default-src 'self'",
      );
    }
  });

  it("when the browser accepts gzip but not brotli, then the gzip copy goes out", async () => {
    const response = await api(served.app).get(`/${hashedScript}`).set("Accept-Encoding", "gzip");
    expect(response.status).toBe(200);
    expect(response.headers["content-encoding"]).toBe("gzip");
    expect(response.headers["content-length"]).toBe(size(`${hashedScript}.gz`));
    expect(response.headers["content-type"]).toMatch(/^text\/javascript; charset=utf-8$/i);
    expect(response.headers["vary"]).toMatch(/Accept-Encoding/i);
    expect(response.headers["cache-control"]).toBe(longCache);
  });

  it("when the browser accepts neither, then the file goes out as built", async () => {
    const response = await api(served.app)
      .get(`/${hashedScript}`)
      .set("Accept-Encoding", "identity");
    expect(response.status).toBe(200);
    expect(response.headers["content-encoding"]).toBeUndefined();
    expect(response.headers["content-length"]).toBe(size(hashedScript));
    expect(response.headers["vary"]).toMatch(/Accept-Encoding/i);
    expect(response.headers["cache-control"]).toBe(longCache);
    expect(response.text).toContain('export const zone399 = "anteroom 399";');
  });

  it("when a hashed file's source map is asked for, then it is kept for a year too", async () => {
    const response = await api(served.app).get(`/${hashedScript}.map`);
    expect(response.status).toBe(200);
    expect(response.headers["cache-control"]).toBe(longCache);
  });

  it("when the page, the service worker, its runtime, the manifest or an icon is asked for, then the browser must check it each time", async () => {
    for (const url of [
      "/",
      "/index.html",
      "/audits/due",
      "/sw.js",
      `/${workboxRuntime}`,
      "/manifest.webmanifest",
      "/icons/lintel-192.png",
    ]) {
      const response = await api(served.app).get(url).set("Accept-Encoding", "br, gzip");
      expect(response.status, url).toBe(200);
      expect(response.headers["cache-control"], url).toBe("no-cache");
    }
  });

  it("when the page is opened at a client route, then it goes out compressed as HTML", async () => {
    const response = await api(served.app).get("/audits/due").set("Accept-Encoding", "br, gzip");
    expect(response.headers["content-encoding"]).toBe("br");
    expect(response.headers["content-length"]).toBe(size("index.html.br"));
    expect(response.headers["content-type"]).toMatch(/^text\/html; charset=utf-8$/i);
    expect(response.headers["vary"]).toMatch(/Accept-Encoding/i);
  });

  it("when the service worker is asked for, then it goes out compressed as JavaScript", async () => {
    const response = await api(served.app).get("/sw.js").set("Accept-Encoding", "gzip");
    expect(response.headers["content-encoding"]).toBe("gzip");
    expect(response.headers["content-type"]).toMatch(/^text\/javascript; charset=utf-8$/i);
  });
});

describe("compressing API replies", () => {
  const password = "the passphrase for the plant room";
  let networkId = "";
  let email = "";
  let cookie = "";

  // Enough sites, each granted, that both the site list and the sign-in reply pass the threshold.
  beforeAll(async () => {
    const { deps } = testApp();
    networkId = (await insertNetwork(deps.db)).id;
    const user = await insertUser(deps.db, networkId, { password });
    email = user.email;
    for (let i = 0; i < 14; i += 1) {
      const site = await insertSite(deps.db, networkId);
      await insertGrant(deps.db, user.id, "auditor", site.id);
    }
    cookie = await sessionCookieFor(user.id);
  });

  it("when a reply is above the threshold, then it goes out compressed", async () => {
    const response = await api(undefined, { cookie })
      .get("/api/sites")
      .set("Accept-Encoding", "gzip");
    expect(response.status).toBe(200);
    expect(JSON.stringify(response.body).length).toBeGreaterThan(apiCompressionThreshold);
    expect(response.headers["content-encoding"]).toBe("gzip");
    expect(response.headers["vary"]).toMatch(/Accept-Encoding/i);
  });

  it("when a phone's browser accepts brotli among others, then a whole reply goes out as brotli that reads back as the same answer, with no tag to hash", async () => {
    const raw = (request: ReturnType<ReturnType<typeof api>["get"]>) =>
      request.buffer(true).parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on("data", (chunk: Buffer) => chunks.push(chunk));
        response.on("end", () => done(null, Buffer.concat(chunks)));
      });
    const compressed = await raw(
      api(undefined, { cookie })
        .get("/api/sites")
        .set("Accept-Encoding", "gzip, deflate, br, zstd"),
    );
    expect(compressed.status).toBe(200);
    expect(compressed.headers["content-encoding"]).toBe("br");
    expect(compressed.headers["vary"]).toMatch(/Accept-Encoding/i);
    expect(compressed.headers["etag"]).toBeUndefined();
    const plain = await raw(
      api(undefined, { cookie }).get("/api/sites").set("Accept-Encoding", "identity"),
    );
    expect(plain.headers["content-encoding"]).toBeUndefined();
    // The test client decodes brotli itself; what crossed the wire is the length sent.
    expect((compressed.body as Buffer).toString()).toBe((plain.body as Buffer).toString());
    expect(Number(compressed.headers["content-length"])).toBeLessThan(
      (plain.body as Buffer).length / 2,
    );
  });

  it("when a reply is below the threshold, then it goes out as it is", async () => {
    const response = await api().get("/api/health").set("Accept-Encoding", "gzip");
    expect(response.status).toBe(200);
    expect(response.headers["content-encoding"]).toBeUndefined();
  });

  it("when someone signs in, then the reply carrying the session is never compressed", async () => {
    const response = await api()
      .post("/api/auth/sign-in")
      .set("Accept-Encoding", "br, gzip")
      .send({ email, password });
    expect(response.status).toBe(200);
    expect(response.headers["set-cookie"]).toBeDefined();
    expect(JSON.stringify(response.body).length).toBeGreaterThan(apiCompressionThreshold);
    expect(response.headers["content-encoding"]).toBeUndefined();
  });

  it("when the session's own person is read, then the reply is never compressed", async () => {
    const response = await api(undefined, { cookie })
      .get("/api/auth/me")
      .set("Accept-Encoding", "br, gzip");
    expect(response.status).toBe(200);
    expect(JSON.stringify(response.body).length).toBeGreaterThan(apiCompressionThreshold);
    expect(response.headers["content-encoding"]).toBeUndefined();
  });
});
