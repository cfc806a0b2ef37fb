import { fileURLToPath } from "node:url";

import react from "@vitejs/plugin-react";
import { VitePWA } from "vite-plugin-pwa";
import { defineConfig } from "vitest/config";

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));
const alias = {
  "@/": here("./src/"),
  "@shared/": here("./shared/"),
};

// One vitest run, four projects, one summary: pure computations, client components (jsdom),
// the API over HTTP against a throwaway PostgreSQL, and the built app in Debian's chromium.
export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: "unit",
          environment: "node",
          include: ["tests/shared/**/*.test.ts", "tests/tooling/**/*.test.ts"],
          setupFiles: ["tests/setup/fail-on-console-error.ts"],
        },
      },
      {
        // The PWA plugin provides `virtual:pwa-register`, which the app shell imports; the worker
        // itself is tested built, in the browser project.
        plugins: [react(), VitePWA({ injectRegister: false, manifest: false })],
        resolve: { alias },
        test: {
          name: "client",
          environment: "jsdom",
          include: ["tests/client/**/*.test.{ts,tsx}"],
          setupFiles: ["tests/setup/fail-on-console-error.ts", "tests/setup/client.ts"],
          // Screen tests render whole routes; on two busy cores a first render can pass 5 s.
          testTimeout: 15_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "api",
          environment: "node",
          include: ["tests/server/**/*.test.ts"],
          globalSetup: ["tests/setup/global-database.ts"],
          setupFiles: ["tests/setup/fail-on-console-error.ts", "tests/setup/server.ts"],
          testTimeout: 20_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "browser",
          environment: "node",
          include: ["tests/e2e/**/*.test.ts"],
          globalSetup: ["tests/setup/global-browser.ts"],
          setupFiles: ["tests/setup/fail-on-console-error.ts"],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
