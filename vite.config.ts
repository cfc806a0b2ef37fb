import { readFileSync } from "node:fs";
import { readdir, readFile, writeFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { brotliCompressSync, constants, gzipSync } from "node:zlib";

import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig, type Plugin } from "vite";
import { compression } from "vite-plugin-compression2";
import { VitePWA } from "vite-plugin-pwa";

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/**
 * Adds `<link rel="preload" as="font">` for each built font file matching one of `files`, so the
 * phone asks for the fonts with the page's first files instead of once the styles are applied.
 */
function preloadFonts(files: RegExp[]): Plugin {
  return {
    name: "lintel-preload-font",
    apply: "build",
    transformIndexHtml: {
      order: "post",
      handler(_html, context) {
        return files.map((file) => {
          const font = Object.values(context.bundle ?? {}).find(
            (output) => output.type === "asset" && file.test(output.fileName),
          );
          if (!font) throw new Error(`No built font file matches ${file}: nothing to preload.`);
          return {
            tag: "link",
            attrs: {
              rel: "preload",
              as: "font",
              type: "font/woff2",
              href: `/${font.fileName}`,
              crossorigin: "",
            },
            injectTo: "head" as const,
          };
        });
      },
    },
  };
}

/**
 * Whether a module of Lintel's own keeps something between calls: a variable, a map or set, a
 * React context, a listener. Such a module must exist once on the page, so it is never copied
 * into the screens that share it (see `experimentalInlineCommonChunks` below).
 */
function holdsState(id: string): boolean {
  if (id.includes("node_modules") || !/\.(ts|tsx)$/.test(id)) return id.includes("node_modules");
  const source = readFileSync(id, "utf8");
  return /^(export )?(let|var) |createContext\(|^(export )?const \w+[^=]*= new (Map|Set|WeakMap|BroadcastChannel|EventTarget)\b|^(window|document|self|globalThis)\.addEventListener/m.test(
    source,
  );
}

/**
 * The worker's files are written after the build's other files have had their brotli and gzip
 * copies made: this makes theirs, so a phone fetching the worker downloads it compressed too.
 */
function compressWorkerFiles(): Plugin {
  let outDir = "";
  return {
    name: "lintel-compress-worker-files",
    apply: "build",
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    closeBundle: {
      sequential: true,
      order: "post",
      async handler() {
        const names = (await readdir(outDir)).filter((name) =>
          /^(sw|workbox-[\w-]+)\.js$/.test(name),
        );
        for (const name of names) {
          const file = path.join(outDir, name);
          const bytes = await readFile(file);
          await writeFile(
            `${file}.br`,
            brotliCompressSync(bytes, {
              params: { [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY },
            }),
          );
          await writeFile(`${file}.gz`, gzipSync(bytes, { level: 9 }));
        }
      },
    },
  };
}

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The body text's weight; 600 and 700 follow when headings need them (all use font-display: swap).
    // Both weights: text drawn first in a fallback font and then in Noto Sans rewraps, and a
    // status line that went from two lines to one moved the audit screen below it.
    preloadFonts([
      /noto-sans-latin-400-normal-[\w-]+\.woff2$/,
      /noto-sans-latin-600-normal-[\w-]+\.woff2$/,
    ]),
    // The service worker (sw.js, with Workbox's runtime beside it): keeps the built shell on the
    // phone so the app opens with no signal. The page registers it only once the first page is
    // idle (src/lib/service-worker.ts), and a new version waits until the person taps "Reload".
    // Nothing under /api/ is cached or answered by it: audit data lives in the page's own store.
    VitePWA({
      strategies: "generateSW",
      // The same minified worker whatever NODE_ENV the build runs under (the tests build with "test").
      mode: "production",
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
    compressWorkerFiles(),
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
    // Fewer, larger screen files: on a phone each file costs a round trip, and a screen that
    // needed some forty files of under a kilobyte each waited on them six at a time. Everything
    // the first page needs stays in one file; the rest of the validation library and the form
    // libraries make one file each; and shared pieces under 12 KB are copied into the screens that
    // use them, except a piece that holds state: that must exist once. A QR link's audit screen
    // waited on 19 files after the first page's; now 8 (71 requests in all, now 59).
    rolldownOptions: {
      preserveEntrySignatures: false,
      output: {
        codeSplitting: {
          groups: [
            { name: "main", tags: ["$initial"], priority: 10 },
            // The rest of the validation library, which every screen's replies are read with.
            { name: "schemas", test: /node_modules[\\/]zod[\\/]/, priority: 6 },
            // The form and mutation pieces the editing screens share, as one file, not three.
            {
              name: "forms",
              test: /node_modules[\\/](react-hook-form|@hookform|@tanstack[\\/]query-core[\\/]build[\\/]modern[\\/]mutation|@tanstack[\\/]react-query[\\/]build[\\/]modern[\\/](useMutation|mutationOptions))/,
              priority: 5,
            },
          ],
          experimentalInlineCommonChunks: { maxSize: 12288, exclude: holdsState },
        },
      },
    },
  },
  server: {
    host: "127.0.0.1",
    proxy: { "/api": "http://127.0.0.1:3000" },
  },
});
