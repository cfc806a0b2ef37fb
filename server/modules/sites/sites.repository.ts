import { and, asc, desc, eq, inArray, isNotNull, isNull } from "drizzle-orm";

import type { Site } from "@shared/schemas/site";

import type { DbOrTx } from "../../db/client";
import { networks, sites, users } from "../../db/schema/index";

const siteColumns = {
  id: sites.id,
  name: sites.name,
  address: sites.address,
  timeZone: sites.timeZone,
  latitude: sites.latitude,
  longitude: sites.longitude,
};

export async function listSites(
  db: DbOrTx,
  networkId: string,
  onlyIds: string[] | null,
  options: { includeRetired?: boolean } = {},
): Promise<Site[]> {
  if (onlyIds !== null && onlyIds.length === 0) return [];
  const scope = onlyIds === null ? undefined : inArray(sites.id, onlyIds);
  return db
    .select(siteColumns)
    .from(sites)
    .where(
      and(
        eq(sites.networkId, networkId),
        scope,
        options.includeRetired ? undefined : isNull(sites.retiredAt),
      ),
    )
    .orderBy(asc(sites.name));
}

/** The site with its retirement, locked for retiring or restoring it. */
export async function lockSiteRetirement(db: DbOrTx, siteId: string, networkId?: string) {
  const [row] = await db
    .select({
      id: sites.id,
      name: sites.name,
      retiredAt: sites.retiredAt,
      retirementId: sites.retirementId,
    })
    .from(sites)
    .where(and(eq(sites.id, siteId), networkId ? eq(sites.networkId, networkId) : undefined))
    .for("update");
  return row ?? null;
}

export async function setSiteRetirement(
  db: DbOrTx,
  siteId: string,
  retirement: { id: string; at: Date; by: string | null } | null,
) {
  await db
    .update(sites)
    .set({
      retiredAt: retirement?.at ?? null,
      retiredBy: retirement?.by ?? null,
      retirementId: retirement?.id ?? null,
      updatedAt: new Date(),
    })
    .where(eq(sites.id, siteId));
}

export async function listRetiredSites(db: DbOrTx, networkId: string) {
  return db
    .select({
      id: sites.id,
      name: sites.name,
      retiredAt: sites.retiredAt,
      retiredByName: users.displayName,
    })
    .from(sites)
    .leftJoin(users, eq(users.id, sites.retiredBy))
    .where(and(eq(sites.networkId, networkId), isNotNull(sites.retiredAt)))
    .orderBy(desc(sites.retiredAt), asc(sites.name));
}

export async function findSite(
  db: DbOrTx,
  networkId: string,
  siteId: string,
  options: { forUpdate?: boolean } = {},
): Promise<Site | null> {
  const query = db
    .select(siteColumns)
    .from(sites)
    .where(and(eq(sites.id, siteId), eq(sites.networkId, networkId)))
    .limit(1);
  const [row] = options.forUpdate ? await query.for("update") : await query;
  return row ?? null;
}

export async function findSiteByName(
  db: DbOrTx,
  networkId: string,
  name: string,
): Promise<{ id: string } | null> {
  const [row] = await db
    .select({ id: sites.id })
    .from(sites)
    .where(and(eq(sites.networkId, networkId), eq(sites.name, name)))
    .limit(1);
  return row ?? null;
}

export async function insertSite(
  db: DbOrTx,
  networkId: string,
  values: Omit<Site, "id">,
): Promise<Site> {
  const [row] = await db
    .insert(sites)
    .values({ networkId, ...values })
    .returning(siteColumns);
  return row!;
}

export async function updateSite(
  db: DbOrTx,
  siteId: string,
  values: Partial<Omit<Site, "id">>,
): Promise<Site> {
  const [row] = await db
    .update(sites)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(sites.id, siteId))
    .returning(siteColumns);
  return row!;
}

export async function findNetworkName(db: DbOrTx, networkId: string): Promise<string | null> {
  const [row] = await db
    .select({ name: networks.name })
    .from(networks)
    .where(eq(networks.id, networkId));
  return row?.name ?? null;
}
