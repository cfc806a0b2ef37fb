import { lookup } from "node:dns/promises";

import ipaddr from "ipaddr.js";

/**
 * Where Lintel may send requests on an administrator's word (an identity provider's issuer):
 * public addresses only, so a setting can never make the server reach into the hospital's own
 * network or the machine itself. Loopback is allowed outside production, for the local provider
 * of the demo and the tests; plain http only there.
 */
export type AddressRefusal = "not_a_url" | "not_https" | "credentials" | "not_public" | "not_found";

export interface AddressPolicy {
  allowLoopback: boolean;
  /** Resolves a host name to every address it has (tests give their own). */
  resolve?: (host: string) => Promise<string[]>;
}

const resolveAll = async (host: string) =>
  (await lookup(host, { all: true, verbatim: true })).map((entry) => entry.address);

/** `unicast` is ipaddr.js's name for everything outside the special-purpose ranges. */
export function addressKind(address: string): "public" | "loopback" | "other" {
  if (!ipaddr.isValid(address)) return "other";
  const range = ipaddr.process(address).range();
  if (range === "unicast") return "public";
  if (range === "loopback") return "loopback";
  return "other";
}

/** Null when the URL may be used; otherwise why not. */
export async function refuseUnlessPublic(
  raw: string,
  policy: AddressPolicy,
): Promise<AddressRefusal | null> {
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    return "not_a_url";
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") return "not_https";
  if (url.username || url.password) return "credentials";
  const host = url.hostname.replace(/^\[(.*)\]$/, "$1");
  let addresses: string[];
  if (ipaddr.isValid(host)) addresses = [host];
  else {
    try {
      addresses = await (policy.resolve ?? resolveAll)(host);
    } catch {
      return "not_found";
    }
    if (addresses.length === 0) return "not_found";
  }
  const kinds = addresses.map(addressKind);
  const allLoopback = kinds.every((kind) => kind === "loopback");
  if (allLoopback && policy.allowLoopback) return null;
  if (!kinds.every((kind) => kind === "public")) return "not_public";
  if (url.protocol !== "https:") return "not_https";
  return null;
}

export const addressRefusalWords: Record<AddressRefusal, string> = {
  not_a_url: "Enter the issuer as a full address, such as https://login.example.org.",
  not_https: "The issuer must use https (plain http only for a provider on this machine).",
  credentials: "Leave user names and passwords out of the issuer address.",
  not_public:
    "The issuer's address is private, link-local or otherwise not public; Lintel only reaches providers on the public internet.",
  not_found: "Lintel could not find that host name.",
};
