import { brotliCompressSync, constants, gzipSync } from "node:zlib";

import compression from "compression";
import type { Request, RequestHandler, Response } from "express";

/** Replies smaller than this go as they are: compressing them saves nothing worth the work. */
export const apiCompressionThreshold = 1024;

// Replies that carry a session, a password-reset or invitation token, or mail holding one. A
// compressed reply that mixes a secret with text the caller chose lets the caller guess the
// secret from the reply's length, so these are always sent uncompressed.
const secretBearingPaths = [
  /^\/api\/auth(\/|$)/,
  /^\/api\/invitations(\/|$)/,
  /^\/api\/people\/invitations\/?$/,
  /^\/api\/people\/[^/]+\/invitation\/?$/,
  /^\/api\/dev\/mailbox\/?$/,
];

/** Whether a reply may be compressed: never one that sets a cookie or answers a secret route. */
export function mayCompress(req: Request, res: Response): boolean {
  if (res.getHeader("Set-Cookie") !== undefined) return false;
  const pathname = new URL(req.originalUrl, "http://lintel.invalid").pathname;
  if (secretBearingPaths.some((pattern) => pattern.test(pathname))) return false;
  return compression.filter(req, res);
}

/** The encoding to send a whole reply in, of those the caller accepts; null to send it plain. */
function chosenEncoding(req: Request): "br" | "gzip" | null {
  const accepted = req.acceptsEncodings() as string[];
  if (accepted.includes("br")) return "br";
  if (accepted.includes("gzip")) return "gzip";
  return null;
}

/**
 * Brotli's quality for whole replies. On the committee's 52 KB comparison (40 sites), quality 1
 * made 11.3 KB in 0.11 ms (p95 0.21 ms) where quality 4 made 11.2 KB in 0.43 ms (p95 1.3 ms): JSON
 * this repetitive gains next to nothing from the slower levels, and every reply pays for them.
 */
export const apiBrotliQuality = 1;

/**
 * A reply handed over whole (every JSON answer) is compressed here in one step. The `compression`
 * package compresses through a stream set up for each reply, which cost the committee's 50 KB
 * comparison about a millisecond more at the median and two more at the 95th percentile
 * (`npm run bench`). Replies written piece by piece, such as the CSV exports, still go through it.
 */
function compressWholeReplies(): RequestHandler {
  return (req, res, next) => {
    const send = res.send.bind(res);
    res.send = (body?: unknown) => {
      if (
        (typeof body === "string" || Buffer.isBuffer(body)) &&
        req.method !== "HEAD" &&
        res.statusCode !== 204 &&
        res.statusCode !== 304 &&
        res.getHeader("Content-Encoding") === undefined
      ) {
        const raw = typeof body === "string" ? Buffer.from(body) : body;
        if (raw.length >= apiCompressionThreshold && mayCompress(req, res)) {
          res.vary("Accept-Encoding");
          const encoding = chosenEncoding(req);
          if (encoding) {
            res.setHeader("Content-Encoding", encoding);
            return send(
              encoding === "br"
                ? brotliCompressSync(raw, {
                    params: {
                      [constants.BROTLI_PARAM_QUALITY]: apiBrotliQuality,
                      [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
                      [constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
                    },
                  })
                : gzipSync(raw),
            );
          }
        }
      }
      return send(body);
    };
    next();
  };
}

/** Compresses API replies above the threshold, except those `mayCompress` keeps plain. */
export function compressApiReplies(): RequestHandler[] {
  return [
    compressWholeReplies(),
    compression({ threshold: apiCompressionThreshold, filter: mayCompress }),
  ];
}
