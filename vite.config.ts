import { fileURLToPath } from "node:url";

import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vite";
import { compression } from "vite-plugin-compression2";
import { VitePWA } from "vite-plugin-pwa";

import { preloadFont } from "./scripts/lib/preload-font";

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The body text's weight; 600 and 700 follow when headings need them (all use font-display: swap).
    preloadFont(/noto-sans-latin-400-normal-[\w-]+\.woff2$/),
    // The service worker (sw.js, with Workbox's runtime beside it): keeps the built shell on the
    // phone so the app opens with no signal. The page registers it only once the first page is
    // idle (src/lib/service-worker.ts), and a new version waits until the person taps "Reload".
    // Nothing under /api/ is cached or answered by it: audit data lives in the page's own store.
    VitePWA({
      strategies: "generateSW",
      registerType: "prompt",
      injectRegister: false,
      // public/manifest.webmanifest stays the one manifest, linked from index.html.
      manifest: false,
      filename: "sw.js",
      workbox: {
        globPatterns: ["**/*.{html,js,css,woff2,svg,png,ico,webmanifest}"],
        globIgnores: ["**/*.map", ".vite/**"],
        navigateFallback: "/index.html",
        navigateFallbackDenylist: [/^\/api\//],
        runtimeCaching: [],
        cleanupOutdatedCaches: true,
        // The first worker takes the open page at once, so its later pages load offline too.
        clientsClaim: true,
        // Built files are named by content; Workbox need not add a revision to their addresses.
        dontCacheBustURLsMatching: /^assets\//,
      },
    }),
    // Brotli and gzip copies beside each built file; the server sends the best one the browser
    // accepts (server/middleware/client-files.ts). Source maps stay uncompressed: only tools read them.
    compression({
      algorithms: ["brotliCompress", "gzip"],
      include: /\.(html|css|js|mjs|json|svg|webmanifest|txt)$/,
      exclude: [/\.map$/, /(^|\/)\.vite\//],
      threshold: 512,
    }),
  ],
  resolve: {
    alias: {
      "@/": here("./src/"),
      "@shared/": here("./shared/"),
    },
  },
  build: {
    outDir: "dist/client",
    emptyOutDir: true,
    sourcemap: true,
    // Lets `npm run bench` weigh what each screen loads first.
    manifest: true,
  },
  server: {
    host: "127.0.0.1",
    proxy: { "/api": "http://127.0.0.1:3000" },
  },
});
