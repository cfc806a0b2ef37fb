import type { Request, Response } from "express";
import multer from "multer";

import { maxUploadBytes } from "@shared/schemas/floors";

import { AppError } from "../lib/app-error";

// The HTTP side of an image upload: routers read the file here and hand its bytes to
// `storeImage` (server/lib/images.ts), which knows nothing of requests.

/** Reads one file from a multipart request into memory, within the size limit. */
export function readUpload(req: Request, res: Response, field: string): Promise<Buffer> {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxUploadBytes, files: 1, fields: 5, parts: 6 },
  }).single(field);
  return new Promise((resolve, reject) => {
    upload(req, res, (error: unknown) => {
      if (error instanceof multer.MulterError) {
        if (error.code === "LIMIT_FILE_SIZE") {
          const message = `The file is larger than ${maxUploadBytes / 1024 / 1024} MB.`;
          return reject(
            new AppError("payload_too_large", 413, message, { fields: { [field]: message } }),
          );
        }
        const message =
          error.code === "LIMIT_UNEXPECTED_FILE"
            ? `Send the file in the field "${field}".`
            : "The upload could not be read.";
        return reject(
          new AppError("bad_request", 400, message, {
            fields: { [error.field ?? field]: message },
          }),
        );
      }
      if (error)
        return reject(
          new AppError("bad_request", 400, "The upload could not be read.", {
            fields: { [field]: "The upload could not be read." },
          }),
        );
      if (!req.file) {
        return reject(
          new AppError("validation_failed", 400, `Attach an image in the field "${field}".`, {
            fields: { [field]: "Attach an image." },
          }),
        );
      }
      resolve(req.file.buffer);
    });
  });
}
