import type { ServerResponse } from "node:http";
import path from "node:path";

import type { Express, Request, Response, NextFunction } from "express";
import expressStaticGzip from "express-static-gzip";

/** Files the build names by their content: never change, so the browser keeps them a year. */
export const hashedFileCache = "public, max-age=31536000, immutable";
/** Everything else (the page, the service worker, the manifest, icons): asked again each time. */
export const unhashedFileCache = "no-cache";

// The build writes `assets/<name>-<hash>.<ext>` (and its source map); nothing else is hashed.
const hashedFile = /^assets\/[^/]+-[\w-]{8,}\.\w+(\.map)?$/;

/** Whether `relativePath` (inside the client folder, forward slashes) is named by its content. */
export function isHashedFile(relativePath: string): boolean {
  return hashedFile.test(relativePath.replace(/\.(br|gz)$/, ""));
}

/**
 * Serves the built client: each file as the brotli or gzip copy the build made beside it when the
 * browser accepts one (with `Vary: Accept-Encoding`), hashed files cached for good, the rest
 * revalidated; any other path gets the page, so the client's routes open directly.
 */
export function serveClientFiles(app: Express, clientDir: string): void {
  const root = path.resolve(clientDir);
  const files = expressStaticGzip(root, {
    enableBrotli: true,
    orderPreference: ["br", "gzip"],
    index: false,
    serveStatic: {
      index: false,
      cacheControl: false,
      setHeaders: (res: ServerResponse, filePath: string) => {
        const relative = path.relative(root, filePath).split(path.sep).join("/");
        res.setHeader(
          "Cache-Control",
          isHashedFile(relative) ? hashedFileCache : unhashedFileCache,
        );
      },
    },
  }) as (req: Request, res: Response, next: NextFunction) => void;

  app.use(files);
  app.get("/{*splat}", (req, res, next) => {
    req.url = "/index.html";
    files(req, res, next);
  });
}
