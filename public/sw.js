/* global caches, clients, self */
/**
 * Lintel's service worker: keeps the app shell (index.html and the built files it loads) on the
 * phone, so an audit opens in a basement with no signal. It never answers or stores anything
 * under /api/: audit data lives in the page's own store and goes through its sync queue.
 */

const shellCache = "lintel-shell-v1";
const shellUrl = "/index.html";
// Built files are named by content, so an old one is never wrong, only unused.
const keepAtMost = 300;
const navigationTimeoutMs = 4000;

function isShellFile(pathname) {
  return (
    pathname.startsWith("/assets/") ||
    pathname.startsWith("/icons/") ||
    pathname === "/manifest.webmanifest" ||
    pathname === "/lintel.svg"
  );
}

function filesIn(html) {
  return [...html.matchAll(/(?:src|href)="(\/[^"]+)"/g)]
    .map((match) => match[1])
    .filter((path) => isShellFile(new URL(path, self.location.origin).pathname));
}

async function keep(cache, urls) {
  await Promise.all(
    urls
      .map(async (url) => {
        if (await cache.match(url)) return;
        const response = await fetch(url, { credentials: "same-origin" });
        if (response.status === 200) await cache.put(url, response);
      })
      .map((work) => work.catch(() => undefined)),
  );
}

/** Drops the oldest files beyond the limit, never one the stored shell still loads. */
async function prune(cache) {
  const requests = await cache.keys();
  if (requests.length <= keepAtMost) return;
  const shell = await cache.match(shellUrl);
  const inUse = new Set(shell ? filesIn(await shell.text()) : []);
  let excess = requests.length - keepAtMost;
  for (const request of requests) {
    if (excess <= 0) break;
    const { pathname } = new URL(request.url);
    if (pathname === shellUrl || inUse.has(pathname)) continue;
    await cache.delete(request);
    excess -= 1;
  }
}

async function storeShell() {
  const cache = await caches.open(shellCache);
  const response = await fetch(shellUrl, { cache: "no-cache", credentials: "same-origin" });
  if (!response.ok) return;
  await cache.put(shellUrl, response.clone());
  await keep(cache, [...filesIn(await response.text()), "/manifest.webmanifest", "/lintel.svg"]);
}

self.addEventListener("install", (event) => {
  // A file that fails to download must not stop the worker from installing.
  event.waitUntil(storeShell().catch(() => undefined));
  self.skipWaiting();
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    (async () => {
      const names = await caches.keys();
      await Promise.all(
        names
          .filter((name) => name.startsWith("lintel-") && name !== shellCache)
          .map((name) => caches.delete(name)),
      );
      await clients.claim();
    })(),
  );
});

// The page lists the built files it loaded before this worker took control.
self.addEventListener("message", (event) => {
  const data = event.data;
  if (!data || data.type !== "keep-files" || !Array.isArray(data.urls)) return;
  const urls = data.urls.filter((url) => {
    try {
      const parsed = new URL(url, self.location.origin);
      return parsed.origin === self.location.origin && isShellFile(parsed.pathname);
    } catch {
      return false;
    }
  });
  event.waitUntil(caches.open(shellCache).then((cache) => keep(cache, urls)));
});

function withTimeout(promise, ms) {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error("slow network")), ms);
    promise.then(
      (value) => {
        clearTimeout(timer);
        resolve(value);
      },
      (error) => {
        clearTimeout(timer);
        reject(error);
      },
    );
  });
}

/** Network first, so a new release arrives at once; the stored shell when there is no network. */
async function navigate(request) {
  const cache = await caches.open(shellCache);
  try {
    const response = await withTimeout(fetch(request), navigationTimeoutMs);
    const isPage = (response.headers.get("content-type") || "").includes("text/html");
    if (response.ok && isPage) {
      await cache.put(shellUrl, response.clone());
      return response;
    }
    if (response.status >= 500) return (await cache.match(shellUrl)) || response;
    return response;
  } catch {
    return (await cache.match(shellUrl)) || Response.error();
  }
}

/** Built files never change under the same name: the stored copy is always right. */
async function shellFile(request) {
  const cache = await caches.open(shellCache);
  const stored = await cache.match(request);
  if (stored) return stored;
  const response = await fetch(request);
  if (response.status === 200 && response.type === "basic") {
    await cache.put(request, response.clone());
    await prune(cache);
  }
  return response;
}

self.addEventListener("fetch", (event) => {
  const { request } = event;
  if (request.method !== "GET") return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  // Left entirely to the network: never cached, never answered from here.
  if (url.pathname.startsWith("/api/")) return;
  if (request.mode === "navigate") {
    event.respondWith(navigate(request));
    return;
  }
  if (isShellFile(url.pathname)) event.respondWith(shellFile(request));
});
