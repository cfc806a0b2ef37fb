import { existsSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { brotliCompressSync, gzipSync } from "node:zlib";

import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";

const shots = process.env.LINTEL_SHOTS_DIR;

/** Waits until a service worker controls the page and has finished installing. */
async function workerInCharge(page: Page) {
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, {
    timeout: 45_000,
    polling: 250,
  });
}

/** Every address kept in the page's Cache Storage, across all caches. */
async function cachedUrls(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    const urls: string[] = [];
    for (const name of await caches.keys()) {
      const cache = await caches.open(name);
      for (const request of await cache.keys()) urls.push(request.url);
    }
    return urls;
  });
}

/** The files the worker's precache list names, read from the served worker itself. */
function precacheList(workerSource: string): string[] {
  return [...workerSource.matchAll(/url["']?:\s*["']([^"']+)["']/g)].map((match) => match[1]!);
}

describe("the service worker on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when a phone has used Lintel once online, then the worker holds the whole built shell and no API reply, and the app opens again with no network", async () => {
    const { page, problems } = await phonePage(browser);
    const context = page.context();
    await signIn(page, "auditor@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    if (shots) await page.screenshot({ path: path.join(shots, "home.png") });
    await page
      .getByRole("list", { name: "Sites" })
      .getByRole("link", { name: /Wexley Rehabilitation Centre/ })
      .first()
      .click();
    await page.getByRole("heading", { level: 1, name: /Wexley Rehabilitation Centre/ }).waitFor();
    await workerInCharge(page);

    // The worker and its runtime are asked for again on every visit, never kept by the browser,
    // and travel compressed like the rest of the build.
    const compressed = { headers: { "accept-encoding": "br, gzip" } };
    const worker = await page.request.get(`${baseUrl()}/sw.js`, compressed);
    expect(worker.headers()["cache-control"]).toBe("no-cache");
    expect(worker.headers()["content-encoding"]).toBe("br");
    const workerSource = await worker.text();
    const runtime = /define\(\[["']\.\/(workbox-[\w-]+)["']\]/.exec(workerSource)?.[1];
    expect(runtime, workerSource.slice(0, 300)).toBeTruthy();
    const runtimeReply = await page.request.get(`${baseUrl()}/${runtime}.js`, compressed);
    expect(runtimeReply.status()).toBe(200);
    expect(runtimeReply.headers()["cache-control"]).toBe("no-cache");
    expect(runtimeReply.headers()["content-encoding"]).toBe("br");

    // Everything the build made for the browser is kept: every page's code, styles, fonts, icons.
    const listed = precacheList(workerSource);
    expect(listed).toEqual(expect.arrayContaining(["index.html", "manifest.webmanifest"]));
    expect(listed.some((url) => /^assets\/audit-[\w-]+\.js$/.test(url))).toBe(true);
    expect(
      listed.some((url) => /^assets\/noto-sans-latin-400-normal-[\w-]+\.woff2$/.test(url)),
    ).toBe(true);
    expect(listed.some((url) => /\.(map|br|gz)$/.test(url))).toBe(false);
    const kept = (await cachedUrls(page)).map((url) => new URL(url));
    const keptPaths = new Set(kept.map((url) => url.pathname.slice(1)));
    expect(listed.filter((url) => !keptPaths.has(url))).toEqual([]);
    // API replies stay out of the browser's caches: the phone's own store holds audit data.
    expect(kept.filter((url) => url.pathname.startsWith("/api/")).map(String)).toEqual([]);

    // No signal at all: the browser is offline and the API cannot be reached.
    await context.setOffline(true);
    await context.route("**/api/**", (route) => route.abort());
    const reopened = await page.goto(`${baseUrl()}/`);
    expect(reopened?.fromServiceWorker()).toBe(true);
    await page.getByRole("heading", { level: 1 }).first().waitFor();
    // A page never opened before still has its code on the phone.
    const actions = await page.goto(`${baseUrl()}/actions`);
    expect(actions?.fromServiceWorker()).toBe(true);
    await page.getByRole("heading", { level: 1 }).first().waitFor();
    expect(
      (await cachedUrls(page)).filter((url) => new URL(url).pathname.startsWith("/api/")),
    ).toEqual([]);
    expect(
      problems.filter(
        (problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED|status of 401/.test(problem),
      ),
    ).toEqual([]);
    await context.close();
  });

  it("when a new version is published while the app is open, then a banner offers to reload and Reload brings the new version in", async () => {
    const clientDir = process.env.LINTEL_E2E_CLIENT_DIR!;
    const workerFile = path.join(clientDir, "sw.js");
    const original = readFileSync(workerFile);
    const { page, problems } = await phonePage(browser);
    try {
      await page.goto(`${baseUrl()}/sign-in`);
      await page.getByRole("button", { name: "Continue" }).waitFor();
      await workerInCharge(page);
      const firstWorker = await page.evaluate(
        () => navigator.serviceWorker.controller?.scriptURL ?? null,
      );
      expect(firstWorker).toMatch(/\/sw\.js$/);
      if (shots) await page.screenshot({ path: path.join(shots, "sign-in.png") });
      expect(await page.getByText("A new version of Lintel is ready").count()).toBe(0);

      // A release: the server now sends a different worker.
      const released = Buffer.concat([original, Buffer.from(`\n// release ${Date.now()}\n`)]);
      writeFileSync(workerFile, released);
      for (const [suffix, compress] of [
        [".br", brotliCompressSync],
        [".gz", gzipSync],
      ] as const)
        if (existsSync(`${workerFile}${suffix}`))
          writeFileSync(`${workerFile}${suffix}`, compress(released));

      await page.reload();
      const banner = page
        .getByRole("status")
        .filter({ hasText: "A new version of Lintel is ready" });
      await banner.waitFor({ timeout: 45_000 });
      // It floats over the page, inside the phone's width.
      const box = (await banner.boundingBox())!;
      expect(box.x).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width).toBeLessThanOrEqual(390);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
        390,
      );
      if (shots) await page.screenshot({ path: path.join(shots, "update-banner.png") });

      const waitingBefore = await page.evaluate(
        async () => (await navigator.serviceWorker.getRegistration())?.waiting !== null,
      );
      expect(waitingBefore).toBe(true);
      await Promise.all([
        page.waitForEvent("load", { timeout: 30_000 }),
        banner.getByRole("button", { name: "Reload" }).click(),
      ]);
      await page.getByRole("button", { name: "Continue" }).waitFor();
      await expect
        .poll(
          () =>
            page.evaluate(async () => {
              const registration = await navigator.serviceWorker.getRegistration();
              return registration?.waiting === null && registration.active !== null;
            }),
          { timeout: 15_000 },
        )
        .toBe(true);
      expect(await page.getByText("A new version of Lintel is ready").count()).toBe(0);
      expect(problems.filter((problem) => !/status of 401/.test(problem))).toEqual([]);
    } finally {
      writeFileSync(workerFile, original);
      for (const [suffix, compress] of [
        [".br", brotliCompressSync],
        [".gz", gzipSync],
      ] as const)
        if (existsSync(`${workerFile}${suffix}`))
          writeFileSync(`${workerFile}${suffix}`, compress(original));
      await page.context().close();
    }
  });
});
