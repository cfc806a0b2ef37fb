import { mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";

import { chromium, type Browser, type BrowserContext } from "playwright-core";

import { demoPassword } from "../server/demo/people";
import { chromiumArgs, ensureChromium } from "./lib/chromium";
import { benchDatabase, runBenchAlone, startBenchServer } from "./lib/bench-standalone";
import { buildClient } from "./lib/client-build";
import type { Cluster } from "./lib/postgres";

/**
 * The phone figures: the built app in chromium at 390×844 on a slow phone with one bar of signal
 * (150 ms round trip, 1.6 Mbit/s down, 750 kbit/s up, CPU 4× slower), each page on a cold cache.
 * Largest contentful paint, bytes over the wire until the page is idle, layout shift; then what
 * the service worker fetches after that, on its own line.
 */
const profile = {
  latency: 150,
  downloadThroughput: 200_000,
  uploadThroughput: 93_750,
  cpuSlowdown: 4,
};
/** The page counts as idle once nothing has been on the wire for this long after `load`. */
const quietMs = 1500;

interface PhoneFigures {
  label: string;
  lcpMs: number;
  bytes: number;
  cls: number;
  requests: number;
  workerBytes: number;
  workerRequests: number;
}

/** Each page is opened this many times, each on a cold cache; the table shows the medians. */
const runsPerPage = Number(process.env.BENCH_PHONE_RUNS ?? 3);
/** `BENCH_PHONE_PAGES=audit,home`: only the pages whose label starts with one of these. */
const onlyPages = process.env.BENCH_PHONE_PAGES?.split(",").map((name) => name.trim());

function median(runs: PhoneFigures[]): PhoneFigures {
  const middle = <K extends keyof PhoneFigures>(key: K) =>
    runs.map((run) => run[key]).sort((a, b) => (a as number) - (b as number))[
      Math.floor(runs.length / 2)
    ]!;
  return {
    label: runs[0]!.label,
    lcpMs: middle("lcpMs") as number,
    bytes: middle("bytes") as number,
    cls: middle("cls") as number,
    requests: middle("requests") as number,
    workerBytes: middle("workerBytes") as number,
    workerRequests: middle("workerRequests") as number,
  };
}

const kb = (bytes: number) => `${(bytes / 1024).toFixed(0)} KB`;

/**
 * Opens `url` in a fresh context (cold cache) and reports its figures once it is idle, then waits
 * for the service worker to finish its own downloads and counts those apart.
 */
async function measurePage(
  browser: Browser,
  label: string,
  origin: string,
  url: string,
  ready: string,
  signIn: boolean,
): Promise<PhoneFigures> {
  const context: BrowserContext = await browser.newContext({
    viewport: { width: 390, height: 844 },
    deviceScaleFactor: 2,
    isMobile: true,
    hasTouch: true,
  });
  try {
    if (signIn) {
      // Shares the context's cookie jar, not its HTTP cache: the page's first visit stays cold.
      const response = await context.request.post(`${origin}/api/auth/sign-in`, {
        headers: { origin },
        data: { email: "auditor@example.org", password: demoPassword },
      });
      if (!response.ok()) throw new Error(`phone bench sign-in: HTTP ${response.status()}`);
    }
    let workerBytes = 0;
    let workerRequests = 0;
    context.on("requestfinished", (request) => {
      if (!request.serviceWorker()) return;
      void request
        .sizes()
        .then((sizes) => {
          workerBytes += sizes.responseBodySize + sizes.responseHeadersSize;
          workerRequests += 1;
        })
        .catch(() => undefined);
    });

    const page = await context.newPage();
    // With the timeline, the page's own console lines too (marks left while looking into a page).
    if (process.env.BENCH_PHONE_TIMELINE)
      page.on("console", (message) => console.log(`  console: ${message.text()}`));
    const cdp = await context.newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", {
      offline: false,
      latency: profile.latency,
      downloadThroughput: profile.downloadThroughput,
      uploadThroughput: profile.uploadThroughput,
    });
    await cdp.send("Emulation.setCPUThrottlingRate", { rate: profile.cpuSlowdown });

    let bytes = 0;
    let requests = 0;
    const inFlight = new Set<string>();
    let lastActivity = Date.now();
    const urls = new Map<string, string>();
    cdp.on("Network.requestWillBeSent", ({ requestId, request }) => {
      urls.set(requestId, request.url);
      inFlight.add(requestId);
      lastActivity = Date.now();
    });
    cdp.on("Network.loadingFinished", ({ requestId, encodedDataLength }) => {
      if (process.env.BENCH_PHONE_TIMELINE)
        console.log(`  ${urls.get(requestId)} ${encodedDataLength}`);
      if (inFlight.delete(requestId)) {
        bytes += encodedDataLength;
        requests += 1;
      }
      lastActivity = Date.now();
    });
    cdp.on("Network.loadingFailed", ({ requestId }) => {
      inFlight.delete(requestId);
      lastActivity = Date.now();
    });

    await page.goto(url, { waitUntil: "load", timeout: 120_000 });
    await page.getByText(ready).first().waitFor({ timeout: 120_000 });
    while (inFlight.size > 0 || Date.now() - lastActivity < quietMs)
      await new Promise((resolve) => setTimeout(resolve, 100));
    const pageBytes = bytes;
    const pageRequests = requests;

    const { lcpMs, cls } = await page.evaluate(
      () =>
        new Promise<{ lcpMs: number; cls: number }>((resolve) => {
          let lcpMs = 0;
          let cls = 0;
          new PerformanceObserver((list) => {
            for (const entry of list.getEntries()) {
              lcpMs = entry.startTime;
              const element = (entry as PerformanceEntry & { element?: Element }).element;
              if (element)
                (window as unknown as { lcpElements: string[] }).lcpElements = [
                  ...((window as unknown as { lcpElements?: string[] }).lcpElements ?? []),
                  `${entry.startTime.toFixed(0)} ${element.tagName} ${element.textContent?.slice(0, 40)}`,
                ];
            }
          }).observe({ type: "largest-contentful-paint", buffered: true });
          new PerformanceObserver((list) => {
            for (const entry of list.getEntries() as (PerformanceEntry & {
              value: number;
              hadRecentInput: boolean;
            })[])
              if (!entry.hadRecentInput) {
                cls += entry.value;
                const sources = (
                  entry as unknown as {
                    sources?: { node?: Node; previousRect: DOMRect; currentRect: DOMRect }[];
                  }
                ).sources;
                (window as unknown as { shifts?: string[] }).shifts = [
                  ...((window as unknown as { shifts?: string[] }).shifts ?? []),
                  `${entry.startTime.toFixed(0)} ${entry.value.toFixed(3)} ${(sources ?? [])
                    .map(
                      (source) =>
                        `${source.node?.nodeName ?? "?"}.${(source.node as Element | undefined)?.className ?? ""} ${source.previousRect.y}→${source.currentRect.y} h${source.previousRect.height}→${source.currentRect.height}`,
                    )
                    .join(" | ")}`,
                ];
              }
          }).observe({ type: "layout-shift", buffered: true });
          setTimeout(() => resolve({ lcpMs, cls }), 100);
        }),
    );

    if (process.env.BENCH_PHONE_TIMELINE)
      console.log(
        label,
        await page.evaluate(() =>
          [...performance.getEntriesByType("resource"), ...performance.getEntriesByType("paint")]
            .map((entry) => {
              const timing = entry as PerformanceResourceTiming;
              return `${entry.name.replace(location.origin, "")} ${entry.startTime.toFixed(0)}→${(timing.responseEnd ?? entry.startTime).toFixed(0)} ${timing.transferSize ?? ""}`;
            })
            .join("\n"),
        ),
        await page.evaluate(() => (window as unknown as { lcpElements?: string[] }).lcpElements),
        await page.evaluate(() => (window as unknown as { shifts?: string[] }).shifts),
      );

    // The service worker's own downloads come after the page is idle: wait until it is active
    // and its precache has gone quiet.
    await page
      .evaluate(
        () =>
          new Promise<void>((resolve) => {
            if (!("serviceWorker" in navigator)) return resolve();
            const timer = setTimeout(resolve, 60_000);
            void navigator.serviceWorker.ready.then(() => {
              clearTimeout(timer);
              resolve();
            });
          }),
      )
      .catch(() => undefined);
    let settled = workerRequests;
    for (let round = 0; round < 20; round += 1) {
      await new Promise((resolve) => setTimeout(resolve, 500));
      if (workerRequests === settled && round > 2) break;
      settled = workerRequests;
    }
    return {
      label,
      lcpMs,
      bytes: pageBytes,
      cls,
      requests: pageRequests,
      workerBytes,
      workerRequests,
    };
  } finally {
    await context.close();
  }
}

/**
 * The main chunk: the largest of the files the page loads before anything else (the entry and
 * what it imports, from the build's manifest), with the compressed copies written beside it.
 */
function mainChunkSizes(clientDir: string) {
  const manifest = JSON.parse(
    readFileSync(path.join(clientDir, ".vite", "manifest.json"), "utf8"),
  ) as Record<string, { file: string; imports?: string[] }>;
  const entry = manifest["index.html"];
  if (!entry) return null;
  const size = (file: string) =>
    statSync(path.join(clientDir, file), { throwIfNoEntry: false })?.size ?? 0;
  const main = [entry.file, ...(entry.imports ?? []).map((key) => manifest[key]?.file ?? "")]
    .filter((file) => file.endsWith(".js"))
    .sort((a, b) => size(b) - size(a))[0];
  if (!main) return null;
  return {
    file: path.basename(main),
    raw: size(main),
    gzip: size(`${main}.gz`),
    brotli: size(`${main}.br`),
  };
}

/**
 * A space the demo auditor may audit: the first isolation room on the first floor of their first
 * site.
 */
async function demoSpace(origin: string): Promise<string> {
  const signIn = await fetch(`${origin}/api/auth/sign-in`, {
    method: "POST",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ email: "auditor@example.org", password: demoPassword }),
  });
  const headers = { cookie: signIn.headers.getSetCookie()[0]!.split(";")[0]!, origin };
  const json = async <T>(route: string) =>
    (await (await fetch(`${origin}${route}`, { headers })).json()) as T;
  const { sites } = await json<{ sites: { id: string }[] }>("/api/sites");
  const { floors } = await json<{ floors: { id: string }[] }>(`/api/sites/${sites[0]!.id}/floors`);
  const floor = await json<{ spaces: { id: string; zoneType: string }[] }>(
    `/api/floors/${floors[0]!.id}`,
  );
  // An isolation room: its QR link goes straight to the audit (at a donning zone, doffing area or
  // anteroom it first asks whether to audit or to observe).
  return floor.spaces.find((space) => space.zoneType === "isolation_room")!.id;
}

/**
 * Builds the client, serves it with the demo network from a database of its own in `cluster`,
 * and prints the phone figures beside their targets.
 */
export async function benchPhone(cluster: Cluster, s3Endpoint: string): Promise<void> {
  const url = await benchDatabase(cluster, "lintel_bench_phone");
  const clientDir = mkdtempSync(path.join(os.tmpdir(), "lintel-bench-phone-"));
  await buildClient(clientDir);
  const server = await startBenchServer(url, s3Endpoint, {
    LINTEL_DEMO: "1",
    LINTEL_CLIENT_DIR: clientDir,
  });
  const browser = await chromium.launch({
    executablePath: await ensureChromium(),
    args: chromiumArgs,
  });
  try {
    const origin = server.url;
    const spaceId = await demoSpace(origin);
    const pages: PhoneFigures[] = [];
    for (const [label, route, ready, signedIn] of [
      ["sign-in page", "/sign-in", "Sign in", false],
      ["home page", "/", "My sites", true],
      ["audit screen", `/spaces/${spaceId}/audit`, "Item 1 of", true],
    ] as const) {
      if (onlyPages && !onlyPages.some((name) => label.startsWith(name))) continue;
      const runs: PhoneFigures[] = [];
      for (let run = 0; run < runsPerPage; run += 1)
        runs.push(await measurePage(browser, label, origin, `${origin}${route}`, ready, signedIn));
      pages.push(median(runs));
    }
    const targets: Record<string, { lcpMs?: number; bytes?: number }> = {
      "sign-in page": { lcpMs: 2000, bytes: 200 * 1024 },
      "audit screen": { lcpMs: 2500 },
    };
    const mark = (ok: boolean) => (ok ? "ok" : "MISSED");
    console.log(
      `\nPhone figures: chromium 390×844, ${profile.latency} ms latency, ${(profile.downloadThroughput * 8) / 1e6} Mbit/s down, ${(profile.uploadThroughput * 8) / 1e3} kbit/s up, CPU ${profile.cpuSlowdown}× slower, cold cache, median of ${runsPerPage} runs; load average ${os.loadavg()[0]!.toFixed(1)} on ${os.cpus().length} CPUs (CPU-bound steps stretch when it is high)`,
    );
    console.log(
      [
        "page".padEnd(14),
        "LCP".padStart(8),
        "target".padStart(16),
        "bytes".padStart(8),
        "target".padStart(16),
        "CLS".padStart(6),
        "target".padStart(14),
        "requests".padStart(9),
      ].join(" "),
    );
    for (const figures of pages) {
      const target = targets[figures.label] ?? {};
      console.log(
        [
          figures.label.padEnd(14),
          `${(figures.lcpMs / 1000).toFixed(2)} s`.padStart(8),
          (target.lcpMs
            ? `≤ ${(target.lcpMs / 1000).toFixed(1)} s ${mark(figures.lcpMs <= target.lcpMs)}`
            : ""
          ).padStart(16),
          kb(figures.bytes).padStart(8),
          (target.bytes
            ? `≤ ${kb(target.bytes)} ${mark(figures.bytes <= target.bytes)}`
            : ""
          ).padStart(16),
          figures.cls.toFixed(3).padStart(6),
          `≤ 0.1 ${mark(figures.cls <= 0.1)}`.padStart(14),
          String(figures.requests).padStart(9),
        ].join(" "),
      );
    }
    const first = pages[0]!;
    if (first.label === "sign-in page")
      console.log(
        `service worker, after the sign-in page is idle: ${kb(first.workerBytes)} in ${first.workerRequests} requests (not in the page's bytes)`,
      );
    const main = mainChunkSizes(clientDir);
    if (main)
      console.log(
        `main chunk ${main.file}: ${kb(main.raw)} raw · ${kb(main.gzip)} gzip · ${kb(main.brotli)} brotli`,
      );
  } finally {
    await browser.close();
    await server.close();
    rmSync(clientDir, { recursive: true, force: true });
  }
}

// `npx tsx scripts/bench-phone.ts`: the phone figures alone, on a throwaway cluster.
if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href)
  await runBenchAlone("phone", benchPhone);
