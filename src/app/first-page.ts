import type { QueryClient } from "@tanstack/react-query";

import { paths } from "@/config/paths";

/**
 * Starts downloading the code of the page being opened while the app is still starting, rather
 * than once the router asks for it: on a slow phone that saves a round trip before the first
 * paint. The router's own `lazy` imports then find the same modules already on their way.
 */
const firstPages: [pattern: RegExp, load: () => Promise<unknown>][] = [
  [new RegExp(`^${paths.signIn.path}/?$`), () => import("./routes/sign-in")],
  // Where the server sends a provider sign-in that ended without a session.
  [new RegExp(`^${paths.signInProblem.path}/?$`), () => import("./routes/sign-in-problem")],
  [/^\/$/, () => import("./routes/home")],
  [
    // A QR code's link: it starts the audit and moves on to the audit screen at once.
    /^\/spaces\/[^/]+\/audit\/?$/,
    () =>
      Promise.all([
        import("./routes/audit-layout"),
        import("./routes/start-audit"),
        import("./routes/audit"),
      ]),
  ],
  [
    /^\/audits\/[^/]+\/?$/,
    () => Promise.all([import("./routes/audit-layout"), import("./routes/audit")]),
  ],
];

/** A QR code's link: `/spaces/<id>/audit`. */
const qrStart = /^\/spaces\/([^/]+)\/audit\/?$/;

export function preloadFirstPage(pathname: string, queryClient: QueryClient): void {
  // First the data a QR code's audit starts from: its questions go out as soon as their small
  // file is in, while the screens' code is still arriving.
  const spaceId = qrStart.exec(pathname)?.[1];
  if (spaceId)
    import("./qr-start-data")
      .then((module) => module.askForQrStartData(queryClient, decodeURIComponent(spaceId)))
      .catch(() => undefined);
  const match = firstPages.find(([pattern]) => pattern.test(pathname));
  // A failed download is retried, and reported, by the router when it needs the page.
  if (match) match[1]().catch(() => undefined);
}
