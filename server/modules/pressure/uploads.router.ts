import express, { type RequestHandler } from "express";

import { pressureUploadBodySchema } from "@shared/schemas/pressure-uploads";

import { defineRoute } from "../../lib/routes";
import { createOnStored } from "./ingest.hook";
import { requireUploadSite, storeUpload } from "./uploads.service";

export const pressureUploadPath = "/pressure/readings";

/** Up to 10,000 readings in one upload: larger than the API's usual JSON limit. */
const uploadLimit = "4mb";

/**
 * The upload's own body parsers, mounted before the API's general JSON parser: a larger limit,
 * and a CSV file (`text/csv`) handed on as `{ csv }` so one schema describes both forms.
 */
export function pressureUploadParsers(): express.Router {
  const router = express.Router();
  const csvAsBody: RequestHandler = (req, _res, next) => {
    if (typeof req.body === "string") req.body = { csv: req.body as string };
    next();
  };
  router.post(
    pressureUploadPath,
    express.json({ limit: uploadLimit }),
    express.text({ type: "text/csv", limit: uploadLimit }),
    csvAsBody,
  );
  return router;
}

export const uploadRoutes = [
  defineRoute({
    method: "post",
    path: pressureUploadPath,
    summary:
      "Upload room-pressure readings (JSON or CSV) with a site's upload token, for buildings without a broker",
    // No session: the site's upload token in the Authorization header says who sends.
    access: { kind: "public" },
    body: pressureUploadBodySchema,
    async handle({ req, res, deps, body }) {
      const upload = await requireUploadSite(deps.db, req.get("authorization"), req.ip ?? "");
      const onStored = createOnStored(deps);
      const result = await storeUpload(deps.db, upload, body, {
        now: new Date(),
        // The readings are stored either way: a failing alarm round must not turn this into a 500.
        onStored: (inserted, now) =>
          onStored(inserted, now).catch((err: unknown) =>
            deps.logger.error({ err }, "after a pressure upload, the alarm hook failed"),
          ),
      });
      res.json(result);
    },
  }),
];
