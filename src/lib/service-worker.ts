/**
 * Registers the service worker that keeps the app shell on the phone (production builds only:
 * in development it would serve stale modules). Files the page loaded before the worker took
 * control are listed to it, so they are on the phone too.
 */
export function registerServiceWorker(): void {
  if (!("serviceWorker" in navigator)) return;

  const listLoadedFiles = (worker: ServiceWorker | null | undefined) => {
    const urls = performance
      .getEntriesByType("resource")
      .map((entry) => entry.name)
      .filter((name) => {
        const url = new URL(name, window.location.origin);
        return url.origin === window.location.origin && url.pathname.startsWith("/assets/");
      });
    worker?.postMessage({ type: "keep-files", urls });
  };

  const register = () => {
    navigator.serviceWorker
      .register("/sw.js", { scope: "/" })
      .then(() => navigator.serviceWorker.ready)
      .then((registration) => {
        listLoadedFiles(registration.active);
        navigator.serviceWorker.addEventListener("controllerchange", () =>
          listLoadedFiles(navigator.serviceWorker.controller),
        );
      })
      .catch(() => {
        // Without the worker the app still runs; it only cannot reopen without a network.
      });
  };

  if (document.readyState === "complete") register();
  else window.addEventListener("load", register, { once: true });
}
