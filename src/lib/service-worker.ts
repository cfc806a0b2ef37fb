import { announceUpdateWaiting } from "./app-updates";

/** The worker this app used before its service worker was generated: its cache is dropped. */
const retiredCaches = ["lintel-shell-v1"];
/** The first page counts as loaded once no file or reply has arrived for this long. */
const quietMs = 2000;

/**
 * Runs `work` once the page has loaded, nothing has arrived over the network for a while, and
 * the browser is idle: the worker's downloads then never compete with the first page's.
 */
export function afterFirstPageSettles(work: () => void): void {
  const whenIdle = () =>
    typeof window.requestIdleCallback === "function"
      ? window.requestIdleCallback(() => work(), { timeout: 5000 })
      : setTimeout(work, 0);
  const whenQuiet = () => {
    let timer = window.setTimeout(settled, quietMs);
    const observer = new PerformanceObserver(() => {
      window.clearTimeout(timer);
      timer = window.setTimeout(settled, quietMs);
    });
    observer.observe({ type: "resource" });
    function settled() {
      observer.disconnect();
      whenIdle();
    }
  };
  if (document.readyState === "complete") whenQuiet();
  else window.addEventListener("load", whenQuiet, { once: true });
}

/**
 * Registers the service worker that keeps the app's built files on the phone (production builds
 * only: in development it would serve stale modules), after the first page has settled. A newer
 * version found later waits until the person chooses to reload (see app-updates.ts).
 */
export function registerServiceWorker(): void {
  if (!("serviceWorker" in navigator)) return;
  afterFirstPageSettles(() => {
    void import("virtual:pwa-register")
      .then(({ registerSW }) => {
        const update = registerSW({
          immediate: true,
          onNeedRefresh: () => announceUpdateWaiting(() => update(true)),
          onRegisteredSW: () => {
            if ("caches" in window)
              for (const name of retiredCaches) void caches.delete(name).catch(() => undefined);
          },
          onRegisterError: () => {
            // Without the worker the app still runs; it only cannot reopen without a network.
          },
        });
      })
      .catch(() => undefined);
  });
}
