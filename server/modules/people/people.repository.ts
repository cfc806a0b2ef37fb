import { and, asc, eq, inArray, isNull, ne, sql } from "drizzle-orm";

import type { Role } from "@shared/roles";
import type { Person } from "@shared/schemas/people";

import type { DbOrTx } from "../../db/client";
import {
  accountWithAddress,
  identityLinks,
  networks,
  roleGrants,
  sites,
  userTokens,
  users,
} from "../../db/schema/index";

interface PersonRow {
  id: string;
  email: string;
  name: string;
  hasPassword: boolean;
  deactivatedAt: Date | null;
  createdAt: Date;
}

const personColumns = {
  id: users.id,
  email: users.email,
  name: users.displayName,
  // Joined: a password set, or a first sign-in through the network's identity provider.
  // Qualified by hand: Drizzle leaves column names bare in a one-table select.
  hasPassword: sql<boolean>`("users"."password_hash" is not null or exists (select 1 from ${identityLinks} where "identity_links"."user_id" = "users"."id"))`,
  deactivatedAt: users.deactivatedAt,
  createdAt: users.createdAt,
};

/** People of the network; with `siteIds`, only those holding a role at one of those sites. */
export async function listPeople(
  db: DbOrTx,
  networkId: string,
  siteIds: string[] | null,
  userId?: string,
): Promise<Person[]> {
  if (siteIds !== null && siteIds.length === 0) return [];
  const inScope =
    siteIds === null
      ? undefined
      : inArray(
          users.id,
          db
            .select({ id: roleGrants.userId })
            .from(roleGrants)
            .where(inArray(roleGrants.siteId, siteIds)),
        );
  const rows: PersonRow[] = await db
    .select(personColumns)
    .from(users)
    .where(and(eq(users.networkId, networkId), inScope, userId ? eq(users.id, userId) : undefined))
    .orderBy(asc(users.displayName));
  return withGrantsAndInvitations(db, rows);
}

async function withGrantsAndInvitations(db: DbOrTx, rows: PersonRow[]): Promise<Person[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const grants = await db
    .select({
      id: roleGrants.id,
      userId: roleGrants.userId,
      role: roleGrants.role,
      siteId: roleGrants.siteId,
      siteName: sites.name,
    })
    .from(roleGrants)
    .leftJoin(sites, eq(sites.id, roleGrants.siteId))
    .where(inArray(roleGrants.userId, ids))
    .orderBy(asc(roleGrants.role), asc(sites.name));
  const invitations = await db
    .select({ userId: userTokens.userId, expiresAt: sql<Date>`max(${userTokens.expiresAt})` })
    .from(userTokens)
    .where(
      and(
        inArray(userTokens.userId, ids),
        eq(userTokens.purpose, "invitation"),
        isNull(userTokens.usedAt),
        isNull(userTokens.revokedAt),
      ),
    )
    .groupBy(userTokens.userId);
  const expiry = new Map(invitations.map((row) => [row.userId, new Date(row.expiresAt)]));

  return rows.map((row) => {
    const invitationExpiresAt = expiry.get(row.id);
    return {
      id: row.id,
      email: row.email,
      name: row.name,
      status: row.deactivatedAt ? "deactivated" : row.hasPassword ? "active" : "invited",
      grants: grants
        .filter((grant) => grant.userId === row.id)
        .map((grant) => ({
          id: grant.id,
          role: grant.role,
          siteId: grant.siteId,
          siteName: grant.siteName,
        })),
      createdAt: row.createdAt.toISOString(),
      deactivatedAt: row.deactivatedAt?.toISOString() ?? null,
      invitationExpiresAt:
        !row.hasPassword && invitationExpiresAt ? invitationExpiresAt.toISOString() : null,
    };
  });
}

/**
 * Who holds the address, as the inviting network may know it: its own row for the address (a
 * person or a placeholder, locked), and whether an account in another network holds it.
 */
export async function findAddress(
  db: DbOrTx,
  networkId: string,
  email: string,
): Promise<{ here: PersonRow | null; heldElsewhere: boolean }> {
  const address = eq(sql`lower(${users.email})`, email.toLowerCase());
  const [here] = await db
    .select(personColumns)
    .from(users)
    .where(and(eq(users.networkId, networkId), address))
    .limit(1)
    .for("update");
  if (here) return { here, heldElsewhere: false };
  const [elsewhere] = await db
    .select({ id: users.id })
    .from(users)
    .where(and(ne(users.networkId, networkId), accountWithAddress(email)))
    .limit(1);
  return { here: null, heldElsewhere: elsewhere !== undefined };
}

export async function isHeldElsewhere(db: DbOrTx, userId: string): Promise<boolean> {
  const [row] = await db
    .select({ heldElsewhere: users.heldElsewhere })
    .from(users)
    .where(eq(users.id, userId));
  return row?.heldElsewhere ?? false;
}

export async function insertUser(
  db: DbOrTx,
  values: { networkId: string; email: string; name: string; heldElsewhere: boolean },
): Promise<string> {
  const [row] = await db
    .insert(users)
    .values({
      networkId: values.networkId,
      email: values.email,
      displayName: values.name,
      heldElsewhere: values.heldElsewhere,
    })
    .returning({ id: users.id });
  return row!.id;
}

/** When the person's open invitation link was made, if they have one. */
export async function openInvitationIssuedAt(db: DbOrTx, userId: string): Promise<Date | null> {
  const [row] = await db
    .select({ createdAt: sql<Date>`max(${userTokens.createdAt})` })
    .from(userTokens)
    .where(
      and(
        eq(userTokens.userId, userId),
        eq(userTokens.purpose, "invitation"),
        isNull(userTokens.usedAt),
        isNull(userTokens.revokedAt),
      ),
    );
  return row?.createdAt ? new Date(row.createdAt) : null;
}

export async function renameUser(db: DbOrTx, userId: string, name: string): Promise<void> {
  await db
    .update(users)
    .set({ displayName: name, updatedAt: new Date() })
    .where(eq(users.id, userId));
}

/** Adds the grant unless the person already holds it; returns whether it was new. */
export async function addGrant(
  db: DbOrTx,
  values: { userId: string; role: Role; siteId: string | null; grantedBy: string },
): Promise<boolean> {
  const rows = await db
    .insert(roleGrants)
    .values(values)
    .onConflictDoNothing()
    .returning({ id: roleGrants.id });
  return rows.length > 0;
}

export async function findGrant(db: DbOrTx, userId: string, grantId: string) {
  const [row] = await db
    .select({ id: roleGrants.id, role: roleGrants.role, siteId: roleGrants.siteId })
    .from(roleGrants)
    .where(and(eq(roleGrants.id, grantId), eq(roleGrants.userId, userId)));
  return row ?? null;
}

export async function deleteGrant(db: DbOrTx, grantId: string): Promise<void> {
  await db.delete(roleGrants).where(eq(roleGrants.id, grantId));
}

export async function setDeactivated(db: DbOrTx, userId: string, at: Date | null): Promise<void> {
  await db
    .update(users)
    .set({ deactivatedAt: at, updatedAt: new Date() })
    .where(eq(users.id, userId));
}

export async function sitesOfNetwork(db: DbOrTx, networkId: string, onlyIds: string[] | null) {
  if (onlyIds !== null && onlyIds.length === 0) return [];
  return db
    .select({ id: sites.id, name: sites.name })
    .from(sites)
    .where(
      and(
        eq(sites.networkId, networkId),
        onlyIds === null ? undefined : inArray(sites.id, onlyIds),
      ),
    )
    .orderBy(asc(sites.name));
}

export async function lockUser(db: DbOrTx, userId: string): Promise<void> {
  await db.select({ id: users.id }).from(users).where(eq(users.id, userId)).for("update");
}

export async function networkName(db: DbOrTx, networkId: string): Promise<string> {
  const [row] = await db
    .select({ name: networks.name })
    .from(networks)
    .where(eq(networks.id, networkId));
  return row!.name;
}
