import { createCipheriv, createDecipheriv, randomBytes } from "node:crypto";

// Secrets Lintel must be able to read back (an identity provider's client secret) are stored
// sealed with AES-256-GCM under the key from LINTEL_SECRET_KEY. The context (what the secret
// belongs to) is bound as additional data, so a sealed value copied to another row does not open.

const version = "v1";

export function sealSecret(key: Buffer, plain: string, context: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", key, iv);
  cipher.setAAD(Buffer.from(context, "utf8"));
  const body = Buffer.concat([cipher.update(plain, "utf8"), cipher.final()]);
  const tag = cipher.getAuthTag();
  return [version, iv, tag, body]
    .map((part) => (typeof part === "string" ? part : part.toString("base64url")))
    .join(".");
}

/** Throws when the value was not sealed with this key and context, or was altered. */
export function openSecret(key: Buffer, sealed: string, context: string): string {
  const [tagVersion, iv, tag, body] = sealed.split(".");
  if (tagVersion !== version || iv === undefined || tag === undefined || body === undefined)
    throw new Error("The sealed secret is not in a form Lintel knows.");
  const decipher = createDecipheriv("aes-256-gcm", key, Buffer.from(iv, "base64url"));
  decipher.setAAD(Buffer.from(context, "utf8"));
  decipher.setAuthTag(Buffer.from(tag, "base64url"));
  return Buffer.concat([
    decipher.update(Buffer.from(body, "base64url")),
    decipher.final(),
  ]).toString("utf8");
}
