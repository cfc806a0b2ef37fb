import { randomUUID } from "node:crypto";

import type { Role } from "@shared/roles";

import {
  startLocalIdentityProvider,
  type LocalIdentityProvider,
  type ProviderPerson,
} from "../../scripts/lib/identity-provider";
import { sealSecret } from "../../server/auth/secret-box";
import { identityProviderDomains, identityProviders } from "../../server/db/schema/index";
import { insertGrant, insertNetwork, insertUser } from "../factories/records";
import { api, testApp, type TestApp } from "./app";
import { testOrigin } from "./test-env";

/** A fresh domain no other test uses (a domain belongs to one network at most). */
export const uniqueDomain = () => `h-${randomUUID().slice(0, 8)}.example`;

export interface TestProvider extends LocalIdentityProvider {
  clientId: string;
  clientSecret: string;
}

/** A local provider whose one client is the test app (callback and sign-out under testOrigin). */
export async function startTestProvider(
  options: { people?: ProviderPerson[]; title?: string } = {},
): Promise<TestProvider> {
  const clientId = `lintel-${randomUUID().slice(0, 8)}`;
  const clientSecret = randomUUID();
  const provider = await startLocalIdentityProvider({
    title: options.title ?? "Test identity provider",
    people: options.people ?? [],
    clients: [
      {
        clientId,
        clientSecret,
        redirectUris: [`${testOrigin}/api/auth/provider/callback`],
        postLogoutRedirectUris: [`${testOrigin}/sign-in`],
      },
    ],
  });
  return Object.assign(provider, { clientId, clientSecret });
}

/** Stores a network's provider settings directly (the admin route has tests of its own). */
export async function configureProvider(
  networkId: string,
  provider: { issuer: string; clientId: string; clientSecret: string },
  options: {
    domains: string[];
    name?: string;
    passwordAllowed?: boolean;
    assumeVerifiedEmail?: boolean;
    app?: TestApp;
  },
): Promise<string> {
  const { deps } = options.app ?? testApp();
  const [row] = await deps.db
    .insert(identityProviders)
    .values({
      networkId,
      name: options.name ?? "Test Health",
      issuerUrl: provider.issuer,
      clientId: provider.clientId,
      clientSecretSealed: sealSecret(
        deps.env.secretKey,
        provider.clientSecret,
        `identity-provider:${networkId}`,
      ),
      passwordAllowed: options.passwordAllowed ?? true,
      assumeVerifiedEmail: options.assumeVerifiedEmail ?? false,
    })
    .returning({ id: identityProviders.id });
  await deps.db
    .insert(identityProviderDomains)
    .values(options.domains.map((domain) => ({ providerId: row!.id, domain })));
  return row!.id;
}

/** A network with a provider covering a fresh domain, and one person there known to both. */
export async function providerWorld(
  provider: TestProvider,
  options: { role?: Role; passwordAllowed?: boolean; assumeVerifiedEmail?: boolean } = {},
) {
  const { deps } = testApp();
  const network = await insertNetwork(deps.db);
  const domain = uniqueDomain();
  const providerId = await configureProvider(network.id, provider, {
    domains: [domain],
    passwordAllowed: options.passwordAllowed,
    assumeVerifiedEmail: options.assumeVerifiedEmail,
  });
  const email = `nurse.${randomUUID().slice(0, 6)}@${domain}`;
  const user = await insertUser(deps.db, network.id, { email, password: "a-long-test-password-1" });
  await insertGrant(deps.db, user.id, options.role ?? "committee_member", null);
  const sub = `sub-${randomUUID()}`;
  provider.addPerson({ sub, email, name: user.displayName, emailVerified: true });
  return { network, domain, providerId, user, email, sub };
}

/** Follows the provider's redirects with a cookie jar of its own, as a browser would. */
export class Browser {
  private readonly jar = new Map<string, string>();

  async fetch(url: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.jar.size > 0)
      headers.set("Cookie", [...this.jar].map(([name, value]) => `${name}=${value}`).join("; "));
    const res = await fetch(url, { ...init, headers, redirect: "manual" });
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const at = pair!.indexOf("=");
      const name = pair!.slice(0, at);
      const value = pair!.slice(at + 1);
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(line) || value === "") this.jar.delete(name);
      else this.jar.set(name, value);
    }
    return res;
  }
}

export interface ProviderRoundTrip {
  /** The callback path and query the provider sent the browser back to. */
  callback: string;
  /** The Cookie header value carrying the sign-in attempt's browser key. */
  attemptCookie: string;
  /** The browser's cookies at the provider (its session there). */
  browser: Browser;
}

/**
 * Begins a sign-in at Lintel for the address, picks `sub` on the provider's page (or cancels) and
 * returns where the provider sent the browser back, without calling Lintel's callback.
 */
export async function signInAtProvider(
  email: string,
  sub: string | "cancel",
  options: { next?: string; attemptCookie?: string; browser?: Browser; app?: TestApp } = {},
): Promise<ProviderRoundTrip> {
  const query = new URLSearchParams({ email, ...(options.next ? { next: options.next } : {}) });
  const start = await api(options.app?.app, { cookie: options.attemptCookie }).get(
    `/api/auth/provider/start?${query.toString()}`,
  );
  if (start.status !== 302) throw new Error(`start answered ${start.status}`);
  const location = start.headers.location as string;
  if (!location.startsWith("http://127.0.0.1:"))
    throw new Error(`start sent the browser to ${location}`);
  const setCookies = ([] as string[]).concat(start.headers["set-cookie"] ?? []);
  const attemptCookie =
    setCookies.map((line) => line.split(";")[0]!).find((c) => c.startsWith("lintel_sign_in=")) ??
    options.attemptCookie ??
    "";
  const browser = options.browser ?? new Browser();
  const back = await followProvider(location, sub, testOrigin, browser);
  return { callback: back.slice(testOrigin.length), attemptCookie, browser };
}

/**
 * Walks the browser through the provider from its authorization URL: picks the person whose
 * subject is `sub` on its page (or a person by e-mail, or cancels) and returns the first URL
 * under `lintelOrigin` it is sent back to.
 */
export async function followProvider(
  location: string,
  sub: string | "cancel" | { email: string },
  lintelOrigin: string,
  browser: Browser = new Browser(),
): Promise<string> {
  const origin = new URL(location).origin;
  let next = location;
  let posted = false;
  for (let hop = 0; hop < 12; hop += 1) {
    if (next.startsWith(lintelOrigin)) return next;
    const res = await browser.fetch(next);
    if (res.status >= 300 && res.status < 400) {
      next = new URL(res.headers.get("location")!, next).toString();
      continue;
    }
    const html = await res.text();
    const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
    if (res.status !== 200 || !action || posted)
      throw new Error(`the provider answered ${res.status} at ${next}`);
    posted = true;
    let body = "cancel=1";
    if (typeof sub === "object") {
      const found = new RegExp(`value="([^"]+)">[^<]*<span>${sub.email}</span>`).exec(html);
      if (!found) throw new Error(`${sub.email} is not on the provider's page`);
      body = `sub=${encodeURIComponent(found[1]!)}`;
    } else if (sub !== "cancel") body = `sub=${encodeURIComponent(sub)}`;
    const answer = await browser.fetch(new URL(action, origin).toString(), {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded" },
      body,
    });
    next = new URL(answer.headers.get("location")!, origin).toString();
  }
  throw new Error("the provider never sent the browser back");
}

/** Calls Lintel's callback as the browser would. */
export function finishAtLintel(trip: { callback: string; attemptCookie: string }, app?: TestApp) {
  return api(app?.app, { cookie: trip.attemptCookie }).get(trip.callback);
}

/** The session cookie from a successful callback (or null). */
export function sessionCookieOf(res: { headers: Record<string, unknown> }): string | null {
  const lines = ([] as string[]).concat((res.headers["set-cookie"] as string[] | undefined) ?? []);
  const line = lines.find(
    (l) => l.startsWith("lintel_session=") && !l.startsWith("lintel_session=;"),
  );
  return line ? line.split(";")[0]! : null;
}
