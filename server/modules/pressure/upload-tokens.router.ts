import {
  createUploadTokenBodySchema,
  uploadTokenItemParamsSchema,
  uploadTokenParamsSchema,
} from "@shared/schemas/pressure-uploads";

import { atSite, defineRoute } from "../../lib/routes";
import * as tokens from "./upload-tokens.service";

// A site's administrators keep its upload tokens (the same permission as the site's settings).
const siteAdmin = atSite("update:site:site");

export const uploadTokenRoutes = [
  defineRoute({
    method: "get",
    path: "/sites/:siteId/pressure-upload-tokens",
    summary: "The site's pressure upload tokens, in use and revoked (never the tokens themselves)",
    access: siteAdmin,
    params: uploadTokenParamsSchema,
    async handle({ res, deps, siteId }) {
      res.json({ tokens: await tokens.listUploadTokens(deps.db, siteId) });
    },
  }),
  defineRoute({
    method: "post",
    path: "/sites/:siteId/pressure-upload-tokens",
    summary: "Make a pressure upload token for the site; the token is shown this once",
    access: siteAdmin,
    params: uploadTokenParamsSchema,
    body: createUploadTokenBodySchema,
    async handle({ res, deps, siteId, body, actor }) {
      res.status(201).json(await tokens.createUploadToken(deps.db, siteId, body.name, actor));
    },
  }),
  defineRoute({
    method: "delete",
    path: "/sites/:siteId/pressure-upload-tokens/:tokenId",
    summary: "Revoke a pressure upload token: uploads with it are refused from now on",
    access: siteAdmin,
    params: uploadTokenItemParamsSchema,
    async handle({ res, deps, siteId, params, actor }) {
      res.json(await tokens.revokeUploadToken(deps.db, siteId, params.tokenId, actor));
    },
  }),
];
