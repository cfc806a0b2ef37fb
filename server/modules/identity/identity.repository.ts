import { and, eq, gt, inArray, isNull, lt, ne, sql } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import {
  identityLinks,
  identityProviderDomains,
  identityProviders,
  sessions,
  signInAttempts,
  userTokens,
  users,
} from "../../db/schema/index";

export interface ProviderRow {
  id: string;
  networkId: string;
  name: string;
  issuerUrl: string;
  clientId: string;
  clientSecretSealed: string;
  passwordAllowed: boolean;
  assumeVerifiedEmail: boolean;
  updatedAt: Date;
}

const providerColumns = {
  id: identityProviders.id,
  networkId: identityProviders.networkId,
  name: identityProviders.name,
  issuerUrl: identityProviders.issuerUrl,
  clientId: identityProviders.clientId,
  clientSecretSealed: identityProviders.clientSecretSealed,
  passwordAllowed: identityProviders.passwordAllowed,
  assumeVerifiedEmail: identityProviders.assumeVerifiedEmail,
  updatedAt: identityProviders.updatedAt,
};

export async function providerOfNetwork(
  db: DbOrTx,
  networkId: string,
  options: { lock?: boolean } = {},
): Promise<ProviderRow | null> {
  const query = db
    .select(providerColumns)
    .from(identityProviders)
    .where(eq(identityProviders.networkId, networkId));
  const [row] = options.lock ? await query.for("update") : await query;
  return row ?? null;
}

export async function providerById(db: DbOrTx, id: string): Promise<ProviderRow | null> {
  const [row] = await db
    .select(providerColumns)
    .from(identityProviders)
    .where(eq(identityProviders.id, id));
  return row ?? null;
}

/** The provider covering an e-mail domain, if any. */
export async function providerForDomain(db: DbOrTx, domain: string): Promise<ProviderRow | null> {
  const [row] = await db
    .select(providerColumns)
    .from(identityProviderDomains)
    .innerJoin(identityProviders, eq(identityProviders.id, identityProviderDomains.providerId))
    .where(eq(sql`lower(${identityProviderDomains.domain})`, domain.toLowerCase()))
    .limit(1);
  return row ?? null;
}

export async function domainsOf(db: DbOrTx, providerId: string): Promise<string[]> {
  const rows = await db
    .select({ domain: identityProviderDomains.domain })
    .from(identityProviderDomains)
    .where(eq(identityProviderDomains.providerId, providerId))
    .orderBy(identityProviderDomains.domain);
  return rows.map((row) => row.domain);
}

/** Which of these domains another network's provider already covers. */
export async function domainsCoveredElsewhere(
  db: DbOrTx,
  networkId: string,
  domains: string[],
): Promise<string[]> {
  if (domains.length === 0) return [];
  const rows = await db
    .select({ domain: identityProviderDomains.domain })
    .from(identityProviderDomains)
    .innerJoin(identityProviders, eq(identityProviders.id, identityProviderDomains.providerId))
    .where(
      and(
        ne(identityProviders.networkId, networkId),
        inArray(sql`lower(${identityProviderDomains.domain})`, domains),
      ),
    );
  return rows.map((row) => row.domain);
}

export async function insertProvider(
  db: DbOrTx,
  values: Omit<ProviderRow, "id" | "updatedAt">,
): Promise<string> {
  const [row] = await db
    .insert(identityProviders)
    .values(values)
    .returning({ id: identityProviders.id });
  return row!.id;
}

export async function updateProvider(
  db: DbOrTx,
  id: string,
  values: Omit<ProviderRow, "id" | "networkId" | "updatedAt">,
): Promise<void> {
  await db
    .update(identityProviders)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(identityProviders.id, id));
}

export async function replaceDomains(db: DbOrTx, providerId: string, domains: string[]) {
  await db
    .delete(identityProviderDomains)
    .where(eq(identityProviderDomains.providerId, providerId));
  if (domains.length > 0)
    await db
      .insert(identityProviderDomains)
      .values(domains.map((domain) => ({ providerId, domain })));
}

export async function deleteProvider(db: DbOrTx, id: string): Promise<void> {
  await db.delete(identityProviders).where(eq(identityProviders.id, id));
}

// ---- Sign-in attempts ---------------------------------------------------------------------------

export async function insertAttempt(
  db: DbOrTx,
  values: {
    browserKeyHash: string;
    state: string;
    nonce: string;
    codeVerifier: string;
    providerId: string;
    nextPath: string;
  },
): Promise<void> {
  await db.insert(signInAttempts).values(values);
}

/** Takes the attempt (so it is usable once) when it belongs to this browser and is fresh enough. */
export async function takeAttempt(
  db: DbOrTx,
  state: string,
  browserKeyHash: string,
  notBefore: Date,
) {
  const [row] = await db
    .delete(signInAttempts)
    .where(
      and(
        eq(signInAttempts.state, state),
        eq(signInAttempts.browserKeyHash, browserKeyHash),
        gt(signInAttempts.createdAt, notBefore),
      ),
    )
    .returning({
      nonce: signInAttempts.nonce,
      codeVerifier: signInAttempts.codeVerifier,
      providerId: signInAttempts.providerId,
      nextPath: signInAttempts.nextPath,
    });
  return row ?? null;
}

export async function purgeAttempts(db: DbOrTx, olderThan: Date): Promise<void> {
  await db.delete(signInAttempts).where(lt(signInAttempts.createdAt, olderThan));
}

// ---- Who signs in -------------------------------------------------------------------------------

export interface Candidate {
  id: string;
  email: string;
  name: string;
  networkId: string;
  deactivatedAt: Date | null;
  hasPassword: boolean;
}

const candidateColumns = {
  id: users.id,
  email: users.email,
  name: users.displayName,
  networkId: users.networkId,
  deactivatedAt: users.deactivatedAt,
  hasPassword: sql<boolean>`${users.passwordHash} is not null`,
};

/** The person linked to the provider's subject (locked). */
export async function linkedPerson(
  db: DbOrTx,
  providerId: string,
  subject: string,
): Promise<Candidate | null> {
  const [row] = await db
    .select(candidateColumns)
    .from(identityLinks)
    .innerJoin(users, eq(users.id, identityLinks.userId))
    .where(and(eq(identityLinks.providerId, providerId), eq(identityLinks.subject, subject)))
    .limit(1)
    .for("update", { of: users });
  return row ?? null;
}

/** The network's own person with this address (never a placeholder for another network's). */
export async function personOfNetworkWithAddress(
  db: DbOrTx,
  networkId: string,
  email: string,
): Promise<Candidate | null> {
  const [row] = await db
    .select(candidateColumns)
    .from(users)
    .where(
      and(
        eq(users.networkId, networkId),
        eq(sql`lower(${users.email})`, email.toLowerCase()),
        eq(users.heldElsewhere, false),
      ),
    )
    .limit(1)
    .for("update");
  return row ?? null;
}

export async function hasLink(db: DbOrTx, providerId: string, userId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: identityLinks.id })
    .from(identityLinks)
    .where(and(eq(identityLinks.providerId, providerId), eq(identityLinks.userId, userId)))
    .limit(1);
  return row !== undefined;
}

export async function insertLink(
  db: DbOrTx,
  values: { providerId: string; subject: string; userId: string },
): Promise<void> {
  await db.insert(identityLinks).values(values);
}

/** The person's usable invitation (open and unexpired), if any. */
export async function openInvitation(db: DbOrTx, userId: string): Promise<string | null> {
  const [row] = await db
    .select({ id: userTokens.id })
    .from(userTokens)
    .where(
      and(
        eq(userTokens.userId, userId),
        eq(userTokens.purpose, "invitation"),
        isNull(userTokens.usedAt),
        isNull(userTokens.revokedAt),
        gt(userTokens.expiresAt, new Date()),
      ),
    )
    .limit(1)
    .for("update");
  return row?.id ?? null;
}

export async function useInvitation(db: DbOrTx, userId: string, tokenId: string): Promise<void> {
  const now = new Date();
  await db.update(userTokens).set({ usedAt: now }).where(eq(userTokens.id, tokenId));
  await db
    .update(userTokens)
    .set({ revokedAt: now })
    .where(
      and(
        eq(userTokens.userId, userId),
        eq(userTokens.purpose, "invitation"),
        isNull(userTokens.usedAt),
        isNull(userTokens.revokedAt),
      ),
    );
}

export async function sessionProvider(db: DbOrTx, sessionId: string): Promise<string | null> {
  const [row] = await db
    .select({ providerId: sessions.providerId })
    .from(sessions)
    .where(eq(sessions.id, sessionId));
  return row?.providerId ?? null;
}
