import { existsSync } from "node:fs";

import { aptInstall } from "./process";

export const chromiumPath = "/usr/bin/chromium";

/** Debian's chromium for the browser tests, installed when missing and allowed. */
export async function ensureChromium(): Promise<string> {
  if (!existsSync(chromiumPath))
    await aptInstall(["chromium"], "Chromium for the browser tests (Debian package chromium)");
  if (!existsSync(chromiumPath))
    throw new Error(`Chromium was installed but ${chromiumPath} is missing.`);
  return chromiumPath;
}

/** Flags that keep a headless chromium quiet on a machine without outside network. */
export const chromiumArgs = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-dev-shm-usage",
];
