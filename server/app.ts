import { randomUUID } from "node:crypto";
import { existsSync } from "node:fs";
import path from "node:path";

import express from "express";
import helmet from "helmet";
import { pinoHttp } from "pino-http";

import { apiNotFound, errorHandler } from "./middleware/error-handler";
import { requireSameOrigin } from "./middleware/same-origin";
import { loadSession } from "./middleware/session";
import { compressApiReplies } from "./middleware/api-compression";
import { isHashedFile, serveClientFiles } from "./middleware/client-files";
import { mountRoutes, type AppDeps } from "./lib/routes";
import { apiRoutes } from "./routes";
import { pressureUploadParsers, pressureUploadPath } from "./modules/pressure/uploads.router";

const requestIdPattern = /^[A-Za-z0-9._-]{8,64}$/;

/** Builds the Express app: middleware, routes, error handler. Never listens (tests use it as is). */
export function createApp(deps: AppDeps): express.Express {
  const { env } = deps;
  const app = express();
  // No ETag on replies sent whole: every API reply is no-store, so a tag is never asked back, and
  // hashing a 50 KB reply costs each request. Built files keep theirs (set by the static server).
  app.set("etag", false);
  app.disable("x-powered-by");
  if (env.LINTEL_TRUST_PROXY) {
    const value = env.LINTEL_TRUST_PROXY;
    app.set("trust proxy", /^\d+$/.test(value) ? Number(value) : value === "true" ? true : value);
  }

  const https = env.publicUrl.protocol === "https:";
  const contentSecurityPolicy = {
    directives: {
      "img-src": ["'self'", "data:", "blob:"],
      // Over plain http (a phone on the local network) upgrading would break every asset.
      "upgrade-insecure-requests": https ? [] : null,
    },
  };
  const documentHeaders = helmet({ contentSecurityPolicy, strictTransportSecurity: https });
  // A policy binds only what a page or a worker runs; on the build's scripts, styles and fonts it
  // would be half a kilobyte of unread header on each of a first visit's files.
  const builtFileHeaders = helmet({
    contentSecurityPolicy: false,
    strictTransportSecurity: https,
  });
  app.use((req, res, next) =>
    (isHashedFile(req.path.slice(1)) ? builtFileHeaders : documentHeaders)(req, res, next),
  );

  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const incoming = req.headers["x-request-id"];
        const id =
          typeof incoming === "string" && requestIdPattern.test(incoming) ? incoming : randomUUID();
        res.setHeader("X-Request-Id", id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === "/api/health" },
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({
          id: req.id,
          method: req.method,
          url: req.url,
        }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );

  const api = express.Router();
  // First, so every API reply — refusals and parse errors included — stays out of the browser's
  // caches; the one route that may be cached (an image's bytes) sets its own header over this.
  api.use((_req, res, next) => {
    res.set("Cache-Control", "no-store");
    next();
  });
  api.use(compressApiReplies());
  api.use(pressureUploadParsers());
  api.use(express.json({ limit: "100kb" }));
  api.use(requireSameOrigin(env.publicUrl, [pressureUploadPath]));
  api.use(loadSession(deps));
  mountRoutes(api, apiRoutes, deps);
  api.use(apiNotFound);
  app.use("/api", api);

  const clientDir = env.LINTEL_CLIENT_DIR;
  if (clientDir && existsSync(path.join(clientDir, "index.html"))) {
    serveClientFiles(app, clientDir);
  }

  app.use(errorHandler);
  return app;
}
