import { pipeline } from "node:stream/promises";

import { imageParamsSchema, imageQuerySchema } from "@shared/schemas/floors";
import { siteParamsSchema } from "@shared/schemas/site";

import { notFound } from "../../lib/app-error";
import { storeImage } from "../../lib/images";
import { readUpload } from "../../middleware/upload";
import { findImageForServing } from "../../lib/images.repository";
import { atSite, defineRoute, siteThrough } from "../../lib/routes";
import { imageHiddenFrom } from "../audits/audits.service";

export const imageRoutes = [
  defineRoute({
    method: "post",
    path: "/sites/:siteId/images",
    summary: "Upload a photo for a site (JPEG, PNG or WebP; metadata removed)",
    access: atSite("upload:image:site"),
    params: siteParamsSchema,
    async handle({ req, res, deps, auth, params }) {
      const buffer = await readUpload(req, res, "photo");
      const image = await storeImage(deps, {
        siteId: params.siteId,
        uploadedBy: auth.user.id,
        buffer,
        field: "photo",
      });
      res.status(image.duplicate ? 200 : 201).json({ image });
    },
  }),
  defineRoute({
    method: "get",
    path: "/images/:imageId",
    summary: "An image's bytes, after checking the person may see its site",
    access: siteThrough(
      "imageId",
      async (db, imageId) => (await findImageForServing(db, imageId))?.siteId ?? null,
    )("read:site:site"),
    params: imageParamsSchema,
    query: imageQuerySchema,
    async handle({ res, deps, auth, params, query }) {
      const image = await findImageForServing(deps.db, params.imageId);
      // A photo of someone else's draft is as hidden as the draft.
      if (!image || (await imageHiddenFrom(deps.db, auth, { id: params.imageId, ...image })))
        throw notFound("That image");
      const stored = await deps.storage.get(
        query.variant === "thumb" ? image.thumbKey : image.displayKey,
      );
      res.set({
        "Content-Type": stored.contentType,
        // Private: the image is only for people who may see the site. Images never change in place.
        "Cache-Control": "private, max-age=86400, immutable",
        "X-Content-Type-Options": "nosniff",
      });
      if (stored.contentLength !== undefined)
        res.set("Content-Length", String(stored.contentLength));
      await pipeline(stored.body, res);
    },
  }),
];
