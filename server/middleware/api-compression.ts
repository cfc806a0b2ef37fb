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

/** Compresses API replies above the threshold, except those `mayCompress` keeps plain. */
export function compressApiReplies(): RequestHandler {
  return compression({ threshold: apiCompressionThreshold, filter: mayCompress });
}
