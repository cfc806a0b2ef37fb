import * as client from "openid-client";

import type { ProviderProblemReason } from "@shared/schemas/identity-provider";

import { refuseUnlessPublic, type AddressRefusal } from "../../auth/public-address";

/**
 * Everything Lintel says to an identity provider goes through here: each request's address is
 * checked first (the issuer and every endpoint its discovery names), so no setting and no answer
 * can point the server at a private address.
 */

export interface ProviderConnection {
  id: string;
  issuerUrl: string;
  clientId: string;
  clientSecret: string;
  /** Part of the cache key: a changed setting is discovered again. */
  updatedAt: Date;
}

export class AddressRefused extends Error {
  constructor(readonly refusal: AddressRefusal) {
    super(`The provider's address was refused (${refusal}).`);
    this.name = "AddressRefused";
  }
}

const requestTimeoutSeconds = 10;
const cacheMs = 5 * 60 * 1000;

export function createProviderClient(options: { allowLoopback: boolean }) {
  const policy = { allowLoopback: options.allowLoopback };
  const guardedFetch: client.CustomFetch = async (url, init) => {
    const refusal = await refuseUnlessPublic(url, policy);
    if (refusal) throw new AddressRefused(refusal);
    return fetch(url, { ...init, redirect: "manual" } as RequestInit);
  };
  const cache = new Map<string, { config: client.Configuration; at: number }>();

  async function discover(connection: ProviderConnection): Promise<client.Configuration> {
    const refusal = await refuseUnlessPublic(connection.issuerUrl, policy);
    if (refusal) throw new AddressRefused(refusal);
    const issuer = new URL(connection.issuerUrl);
    const config = await client.discovery(
      issuer,
      connection.clientId,
      undefined,
      client.ClientSecretPost(connection.clientSecret),
      {
        [client.customFetch]: guardedFetch,
        timeout: requestTimeoutSeconds,
        // Plain http passes the address check only for loopback (the local provider).
        execute: issuer.protocol === "http:" ? [client.allowInsecureRequests] : [],
      },
    );
    // The ID token's signature is checked against the provider's published keys, always.
    client.enableNonRepudiationChecks(config);
    return config;
  }

  return {
    discover,

    /** Discovery, kept for a few minutes per provider and settings version. */
    async configuration(connection: ProviderConnection): Promise<client.Configuration> {
      const key = `${connection.id}:${connection.updatedAt.getTime()}`;
      const hit = cache.get(key);
      if (hit && Date.now() - hit.at < cacheMs) return hit.config;
      const config = await discover(connection);
      for (const old of cache.keys()) if (old.startsWith(`${connection.id}:`)) cache.delete(old);
      cache.set(key, { config, at: Date.now() });
      return config;
    },

    forget(providerId: string) {
      for (const old of cache.keys()) if (old.startsWith(`${providerId}:`)) cache.delete(old);
    },
  };
}

export type ProviderClient = ReturnType<typeof createProviderClient>;

const networkCodes = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EHOSTUNREACH",
  "ENOTFOUND",
  "EAI_AGAIN",
  "UND_ERR_CONNECT_TIMEOUT",
  "UND_ERR_SOCKET",
]);

/** Whether the error means the provider could not be reached or answered with something unusable. */
export function isUnreachable(err: unknown): boolean {
  let current: unknown = err;
  for (let depth = 0; depth < 8 && current && typeof current === "object"; depth += 1) {
    const { name, code, message } = current as {
      name?: unknown;
      code?: unknown;
      message?: unknown;
    };
    if (current instanceof AddressRefused) return true;
    if (name === "AbortError" || name === "TimeoutError") return true;
    if (typeof code === "string" && networkCodes.has(code)) return true;
    if (name === "TypeError" && message === "fetch failed") return true;
    if (
      code === "OAUTH_RESPONSE_IS_NOT_CONFORM" ||
      code === "OAUTH_RESPONSE_IS_NOT_JSON" ||
      code === "OAUTH_INVALID_RESPONSE_STATUS"
    )
      return true;
    current = (current as { cause?: unknown }).cause;
  }
  return false;
}

/** Why an exchange of the code failed, in the contract's reasons. */
export function reasonForExchangeError(err: unknown): ProviderProblemReason {
  if (err instanceof client.ResponseBodyError) {
    return err.error === "invalid_grant" ? "code" : "unavailable";
  }
  if (isUnreachable(err)) return "unavailable";
  // Every other failure is a check of the ID token: issuer, audience, expiry, signature, nonce.
  return "token";
}

/** A short code for the log (never the provider's own text). */
export function logCodeOf(err: unknown): string {
  if (err instanceof client.ResponseBodyError) return `provider:${err.error}`.slice(0, 80);
  const code = (err as { code?: unknown } | null)?.code;
  if (typeof code === "string") return code;
  return err instanceof Error ? err.name : "unknown";
}

export { client };
