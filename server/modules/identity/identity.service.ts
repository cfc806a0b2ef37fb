import { createHash, randomBytes } from "node:crypto";

import type {
  ConnectionTestResponse,
  IdentityProviderBody,
  IdentityProviderResponse,
  IdentityProviderSettings,
  ProviderProblemReason,
  SignInMethodResponse,
} from "@shared/schemas/identity-provider";

import { addressRefusalWords, refuseUnlessPublic } from "../../auth/public-address";
import { openSecret, sealSecret } from "../../auth/secret-box";
import { AppError } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { AppDeps, SignedIn } from "../../lib/context";
import { databaseCauseOf } from "../../lib/database-errors";
import {
  AddressRefused,
  client,
  isUnreachable,
  logCodeOf,
  reasonForExchangeError,
  type ProviderConnection,
} from "./identity.oidc";
import * as repo from "./identity.repository";

/** How long a sign-in begun at the provider may take before it has to start again. */
export const attemptMinutes = 10;
export const attemptCookieName = "lintel_sign_in";
export const callbackPath = "/api/auth/provider/callback";

const secretContext = (networkId: string) => `identity-provider:${networkId}`;
const hashKey = (key: string) => createHash("sha256").update(key).digest("hex");
const domainOf = (email: string) => email.slice(email.lastIndexOf("@") + 1).toLowerCase();

export function redirectUri(deps: Pick<AppDeps, "env">): string {
  return new URL(callbackPath, deps.env.publicUrl).toString();
}
export function postLogoutRedirectUri(deps: Pick<AppDeps, "env">): string {
  return new URL("/sign-in", deps.env.publicUrl).toString();
}

function connectionOf(deps: Pick<AppDeps, "env">, row: repo.ProviderRow): ProviderConnection {
  return {
    id: row.id,
    issuerUrl: row.issuerUrl,
    clientId: row.clientId,
    clientSecret: openSecret(
      deps.env.secretKey,
      row.clientSecretSealed,
      secretContext(row.networkId),
    ),
    updatedAt: row.updatedAt,
  };
}

// ---- Administration -----------------------------------------------------------------------------

function settingsOf(
  deps: Pick<AppDeps, "env">,
  row: repo.ProviderRow,
  domains: string[],
): IdentityProviderSettings {
  return {
    id: row.id,
    name: row.name,
    issuerUrl: row.issuerUrl,
    clientId: row.clientId,
    clientSecretStored: row.clientSecretSealed.length > 0,
    domains,
    passwordAllowed: row.passwordAllowed,
    assumeVerifiedEmail: row.assumeVerifiedEmail,
    redirectUri: redirectUri(deps),
    postLogoutRedirectUri: postLogoutRedirectUri(deps),
    updatedAt: row.updatedAt.toISOString(),
  };
}

export async function getSettings(
  deps: AppDeps,
  auth: SignedIn,
): Promise<IdentityProviderResponse> {
  const row = await repo.providerOfNetwork(deps.db, auth.user.networkId);
  return {
    provider: row ? settingsOf(deps, row, await repo.domainsOf(deps.db, row.id)) : null,
    redirectUri: redirectUri(deps),
    postLogoutRedirectUri: postLogoutRedirectUri(deps),
  };
}

const unprocessable = (field: string, message: string) =>
  new AppError("validation_failed", 422, message, { fields: { [field]: message } });

const domainTaken = (domain: string) =>
  unprocessable(
    "domains",
    `${domain} is already covered by another organisation's identity provider; a domain belongs to one network only.`,
  );

function verifiedWords(assumeVerifiedEmail: boolean): string {
  return assumeVerifiedEmail
    ? "The administrator declared that this provider only issues verified e-mail addresses, so Lintel does not ask it to say so."
    : "Lintel requires the provider to say each e-mail address is verified.";
}

/** Creates or replaces the network's provider settings, in one transaction with the change log. */
export async function saveSettings(
  deps: AppDeps,
  auth: SignedIn,
  body: IdentityProviderBody,
  actor: Actor,
): Promise<{ provider: IdentityProviderSettings }> {
  const networkId = auth.user.networkId;
  const issuerUrl = body.issuerUrl.trim();
  const refusal = await refuseUnlessPublic(issuerUrl, {
    allowLoopback: deps.env.NODE_ENV !== "production",
  });
  if (refusal) throw unprocessable("issuerUrl", addressRefusalWords[refusal]);
  const domains = [...new Set(body.domains)];
  const secret = body.clientSecret?.trim() ?? "";

  try {
    const saved = await deps.db.transaction(async (tx) => {
      const existing = await repo.providerOfNetwork(tx, networkId, { lock: true });
      if (!existing && secret === "")
        throw unprocessable("clientSecret", "Enter the client secret the provider gave you.");
      const taken = await repo.domainsCoveredElsewhere(tx, networkId, domains);
      if (taken.length > 0) throw domainTaken(taken[0]!);

      const values = {
        name: body.name,
        issuerUrl,
        clientId: body.clientId,
        clientSecretSealed:
          secret !== ""
            ? sealSecret(deps.env.secretKey, secret, secretContext(networkId))
            : existing!.clientSecretSealed,
        passwordAllowed: body.passwordAllowed,
        assumeVerifiedEmail: body.assumeVerifiedEmail,
      };
      const before = existing
        ? {
            name: existing.name,
            issuerUrl: existing.issuerUrl,
            clientId: existing.clientId,
            domains: await repo.domainsOf(tx, existing.id),
            passwordAllowed: existing.passwordAllowed,
            assumeVerifiedEmail: existing.assumeVerifiedEmail,
          }
        : null;
      let id: string;
      if (existing) {
        id = existing.id;
        await repo.updateProvider(tx, id, values);
      } else {
        id = await repo.insertProvider(tx, { networkId, ...values });
      }
      await repo.replaceDomains(tx, id, domains);
      const reasons: string[] = [];
      if ((before?.assumeVerifiedEmail ?? false) !== body.assumeVerifiedEmail || !before)
        reasons.push(verifiedWords(body.assumeVerifiedEmail));
      if (secret !== "") reasons.push("A new client secret was stored.");
      await recordChange(tx, actor, {
        action: existing ? "identity_provider.updated" : "identity_provider.created",
        entity: "identity_provider",
        entityId: id,
        siteId: null,
        before,
        after: {
          name: body.name,
          issuerUrl,
          clientId: body.clientId,
          domains,
          passwordAllowed: body.passwordAllowed,
          assumeVerifiedEmail: body.assumeVerifiedEmail,
          clientSecretChanged: secret !== "",
        },
        reason: reasons.join(" "),
      });
      return id;
    });
    deps.identityProviders.forget(saved);
    const row = (await repo.providerById(deps.db, saved))!;
    return { provider: settingsOf(deps, row, await repo.domainsOf(deps.db, row.id)) };
  } catch (err) {
    // Two networks claiming the same domain at the same moment: the unique index decides.
    const cause = databaseCauseOf(err) as { code?: string; constraint?: string } | null;
    if (cause?.code === "23505" && (cause.constraint ?? "").includes("domain")) {
      const mine = new Set(domains);
      const taken = await repo.domainsCoveredElsewhere(deps.db, networkId, [...mine]);
      throw domainTaken(taken[0] ?? domains[0]!);
    }
    throw err;
  }
}

export async function deleteSettings(deps: AppDeps, auth: SignedIn, actor: Actor): Promise<void> {
  const removed = await deps.db.transaction(async (tx) => {
    const existing = await repo.providerOfNetwork(tx, auth.user.networkId, { lock: true });
    if (!existing) return null;
    const domains = await repo.domainsOf(tx, existing.id);
    await repo.deleteProvider(tx, existing.id);
    await recordChange(tx, actor, {
      action: "identity_provider.removed",
      entity: "identity_provider",
      entityId: existing.id,
      siteId: null,
      before: { name: existing.name, issuerUrl: existing.issuerUrl, domains },
      reason: "Sign-in through the provider ended; password sign-in is allowed again.",
    });
    return existing.id;
  });
  if (removed) deps.identityProviders.forget(removed);
}

/** Tests the stored settings step by step; says what happened in Lintel's own words only. */
export async function testConnection(
  deps: AppDeps,
  auth: SignedIn,
): Promise<ConnectionTestResponse> {
  const row = await repo.providerOfNetwork(deps.db, auth.user.networkId);
  if (!row)
    throw new AppError("not_found", 404, "Save the provider's settings first, then test them.");
  const steps: ConnectionTestResponse["steps"] = [
    { step: "address", ok: null, words: "Not checked: an earlier step failed." },
    { step: "discovery", ok: null, words: "Not checked: an earlier step failed." },
    { step: "client", ok: null, words: "Not checked: an earlier step failed." },
  ];
  const done = () => ({ ok: steps.every((step) => step.ok === true), steps });

  const refusal = await refuseUnlessPublic(row.issuerUrl, {
    allowLoopback: deps.env.NODE_ENV !== "production",
  });
  if (refusal) {
    steps[0] = { step: "address", ok: false, words: addressRefusalWords[refusal] };
    return done();
  }
  steps[0] = { step: "address", ok: true, words: "The issuer's address is allowed." };

  let config: client.Configuration;
  try {
    config = await deps.identityProviders.discover(connectionOf(deps, row));
  } catch (err) {
    deps.logger.warn({ code: logCodeOf(err) }, "identity provider discovery failed");
    steps[1] = {
      step: "discovery",
      ok: false,
      words:
        err instanceof AddressRefused
          ? "The provider's description names an address Lintel may not reach."
          : isUnreachable(err)
            ? "Lintel could not reach the provider's description (/.well-known/openid-configuration), or it was not usable."
            : "The provider's description did not match the issuer address entered; check it letter for letter.",
    };
    return done();
  }
  steps[1] = { step: "discovery", ok: true, words: "Lintel read the provider's description." };

  // A made-up code: a provider that accepts the client refuses the code (invalid_grant); one that
  // does not know the client or its secret says so (invalid_client).
  try {
    await client.genericGrantRequest(config, "authorization_code", {
      code: randomBytes(16).toString("base64url"),
      redirect_uri: redirectUri(deps),
      code_verifier: client.randomPKCECodeVerifier(),
    });
    steps[2] = {
      step: "client",
      ok: true,
      words: "The provider accepted Lintel's client id and secret.",
    };
  } catch (err) {
    if (err instanceof client.ResponseBodyError && err.error === "invalid_grant") {
      steps[2] = {
        step: "client",
        ok: true,
        words: "The provider accepted Lintel's client id and secret.",
      };
    } else if (err instanceof client.ResponseBodyError && err.error === "invalid_client") {
      steps[2] = {
        step: "client",
        ok: false,
        words:
          "The provider refused the client id or secret. Check both against what it registered for Lintel.",
      };
    } else {
      deps.logger.warn({ code: logCodeOf(err) }, "identity provider client check failed");
      steps[2] = {
        step: "client",
        ok: false,
        words: "The provider's token endpoint could not be used to check the client.",
      };
    }
  }
  return done();
}

// ---- Sign-in ------------------------------------------------------------------------------------

/** How an address signs in, decided by its domain only (never whether the person exists). */
export async function signInMethod(deps: AppDeps, email: string): Promise<SignInMethodResponse> {
  const row = await repo.providerForDomain(deps.db, domainOf(email));
  if (!row) return { password: true, provider: null };
  return {
    password: row.passwordAllowed,
    provider: {
      name: row.name,
      startUrl: `/api/auth/provider/start?${new URLSearchParams({ email }).toString()}`,
    },
  };
}

/** Refuses a password for an address whose network signs in through its provider only. */
export async function assertPasswordAllowed(
  deps: Pick<AppDeps, "db">,
  email: string,
  field: string,
): Promise<void> {
  const row = await repo.providerForDomain(deps.db, domainOf(email));
  if (row && !row.passwordAllowed) {
    const message = `Addresses at ${domainOf(email)} sign in through ${row.name}, not with a password.`;
    throw new AppError("forbidden", 403, message, { fields: { [field]: message } });
  }
}

/** Only a path of this site: never another origin, whatever `next` says. */
export function safeNextPath(next: string | undefined): string {
  if (!next || next.length > 500) return "/";
  if (!/^\/(?![/\\])[^\s\\]*$/.test(next)) return "/";
  return next;
}

export class ProviderProblem extends Error {
  constructor(
    readonly reason: ProviderProblemReason,
    readonly detail: string,
  ) {
    super(`provider sign-in refused: ${reason}`);
    this.name = "ProviderProblem";
  }
}

/**
 * Begins a sign-in at the provider covering the address: an attempt row (state, nonce, PKCE
 * verifier) bound to this browser's key, and the provider's authorization URL to send it to.
 */
export async function startSignIn(
  deps: AppDeps,
  input: { email: string; next: string | undefined; browserKey: string | null },
): Promise<{ location: string; browserKey: string }> {
  const row = await repo.providerForDomain(deps.db, domainOf(input.email));
  if (!row) throw new ProviderProblem("unavailable", "no provider covers the domain");
  let config: client.Configuration;
  try {
    config = await deps.identityProviders.configuration(connectionOf(deps, row));
  } catch (err) {
    throw new ProviderProblem("unavailable", logCodeOf(err));
  }
  const browserKey = input.browserKey ?? randomBytes(32).toString("base64url");
  const state = client.randomState();
  const nonce = client.randomNonce();
  const codeVerifier = client.randomPKCECodeVerifier();
  await repo.purgeAttempts(deps.db, new Date(Date.now() - attemptMinutes * 60 * 1000));
  await repo.insertAttempt(deps.db, {
    browserKeyHash: hashKey(browserKey),
    state,
    nonce,
    codeVerifier,
    providerId: row.id,
    nextPath: safeNextPath(input.next),
  });
  const url = client.buildAuthorizationUrl(config, {
    redirect_uri: redirectUri(deps),
    response_type: "code",
    scope: "openid email profile",
    state,
    nonce,
    code_challenge: await client.calculatePKCECodeChallenge(codeVerifier),
    code_challenge_method: "S256",
    login_hint: input.email,
  });
  return { location: url.toString(), browserKey };
}

interface IdClaims {
  sub: string;
  email: string | null;
  emailVerified: boolean | null;
}

/**
 * Finishes a sign-in the provider sent back: the attempt is taken (once, this browser only), the
 * code exchanged and the ID token checked by openid-client, then the person is found — by the
 * linked subject first, else by an account or invitation of the provider's own network with that
 * address — and a session begun that lasts at most LINTEL_OIDC_SESSION_HOURS.
 */
export async function finishSignIn(
  deps: AppDeps,
  input: {
    query: Record<string, string>;
    browserKey: string | null;
    requestId: string;
  },
): Promise<{ setCookie: string; nextPath: string }> {
  const state = input.query.state;
  if (!state || !input.browserKey) throw new ProviderProblem("state", "no state or no browser key");
  const attempt = await repo.takeAttempt(
    deps.db,
    state,
    hashKey(input.browserKey),
    new Date(Date.now() - attemptMinutes * 60 * 1000),
  );
  if (!attempt) throw new ProviderProblem("state", "no such attempt for this browser");
  if (input.query.error) {
    throw new ProviderProblem(
      input.query.error === "access_denied" ? "cancelled" : "unavailable",
      `provider:${input.query.error.slice(0, 60)}`,
    );
  }
  const row = await repo.providerById(deps.db, attempt.providerId);
  if (!row) throw new ProviderProblem("unavailable", "provider removed");

  let claims: IdClaims;
  try {
    const config = await deps.identityProviders.configuration(connectionOf(deps, row));
    const currentUrl = new URL(redirectUri(deps));
    for (const [key, value] of Object.entries(input.query)) currentUrl.searchParams.set(key, value);
    const tokens = await client.authorizationCodeGrant(config, currentUrl, {
      pkceCodeVerifier: attempt.codeVerifier,
      expectedState: state,
      expectedNonce: attempt.nonce,
      idTokenExpected: true,
    });
    const idToken = tokens.claims();
    if (!idToken) throw new ProviderProblem("token", "no ID token");
    claims = {
      sub: idToken.sub,
      email: typeof idToken.email === "string" ? idToken.email.trim().toLowerCase() : null,
      emailVerified: typeof idToken.email_verified === "boolean" ? idToken.email_verified : null,
    };
  } catch (err) {
    if (err instanceof ProviderProblem) throw err;
    throw new ProviderProblem(reasonForExchangeError(err), logCodeOf(err));
  }

  const person = await deps.db.transaction(async (tx) => {
    const linked = await repo.linkedPerson(tx, row.id, claims.sub);
    if (linked) {
      // A link is only ever made to a person of the provider's own network.
      if (linked.networkId !== row.networkId)
        throw new ProviderProblem("unknown", "link across networks");
      if (linked.deactivatedAt)
        throw new ProviderProblem("deactivated", "linked person deactivated");
      await recordSignIn(tx, row, linked, input.requestId, false);
      return linked;
    }
    if (!claims.email) throw new ProviderProblem("unknown", "no e-mail in the ID token");
    if (claims.emailVerified !== true && !row.assumeVerifiedEmail)
      throw new ProviderProblem("unverified", "email_verified not true");
    const domains = await repo.domainsOf(tx, row.id);
    if (!domains.includes(domainOf(claims.email)))
      throw new ProviderProblem("unknown", "address outside the provider's domains");
    const candidate = await repo.personOfNetworkWithAddress(tx, row.networkId, claims.email);
    if (!candidate)
      throw new ProviderProblem("unknown", "no person of the network with the address");
    if (candidate.deactivatedAt) throw new ProviderProblem("deactivated", "person deactivated");
    // A person already linked to another subject: the address moved to someone else at the provider.
    if (await repo.hasLink(tx, row.id, candidate.id))
      throw new ProviderProblem("unknown", "person linked to another subject");
    let joined = false;
    if (!candidate.hasPassword) {
      const invitation = await repo.openInvitation(tx, candidate.id);
      if (!invitation) throw new ProviderProblem("unknown", "no usable invitation");
      await repo.useInvitation(tx, candidate.id, invitation);
      joined = true;
    }
    await repo.insertLink(tx, { providerId: row.id, subject: claims.sub, userId: candidate.id });
    await recordSignIn(tx, row, candidate, input.requestId, joined);
    return candidate;
  });

  const { setCookie } = await deps.sessions.create(person.id, { providerId: row.id });
  return { setCookie, nextPath: attempt.nextPath };
}

async function recordSignIn(
  tx: Parameters<typeof recordChange>[0],
  row: repo.ProviderRow,
  person: repo.Candidate,
  requestId: string,
  joined: boolean,
) {
  const actor = { userId: person.id, requestId };
  if (joined) {
    await recordChange(tx, actor, {
      action: "user.joined",
      entity: "user",
      entityId: person.id,
      siteId: null,
      reason: `Accepted the invitation by signing in through ${row.name}.`,
    });
  }
  await recordChange(tx, actor, {
    action: "user.signed_in_provider",
    entity: "user",
    entityId: person.id,
    siteId: null,
    after: { providerId: row.id },
    reason: `signed in through ${row.name}`,
  });
}

/**
 * Ends the session; for one begun through a provider that offers end-session, also the address
 * that ends the person's session there (RP-initiated logout).
 */
export async function signOut(
  deps: AppDeps,
  auth: SignedIn,
): Promise<{ setCookie: string; providerSignOutUrl: string | null; providerSession: boolean }> {
  const providerId = await repo.sessionProvider(deps.db, auth.sessionId);
  const setCookie = await deps.sessions.end(auth.sessionId);
  if (!providerId) return { setCookie, providerSignOutUrl: null, providerSession: false };
  const row = await repo.providerById(deps.db, providerId);
  if (!row) return { setCookie, providerSignOutUrl: null, providerSession: true };
  try {
    const config = await deps.identityProviders.configuration(connectionOf(deps, row));
    if (!config.serverMetadata().end_session_endpoint)
      return { setCookie, providerSignOutUrl: null, providerSession: true };
    const url = client.buildEndSessionUrl(config, {
      client_id: row.clientId,
      post_logout_redirect_uri: postLogoutRedirectUri(deps),
    });
    return { setCookie, providerSignOutUrl: url.toString(), providerSession: true };
  } catch (err) {
    deps.logger.warn({ code: logCodeOf(err) }, "identity provider end-session unavailable");
    return { setCookie, providerSignOutUrl: null, providerSession: true };
  }
}
