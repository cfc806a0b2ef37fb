import { and, asc, eq, inArray } from "drizzle-orm";

import type { Site } from "@shared/schemas/site";

import type { DbOrTx } from "../../db/client";
import { networks, sites } from "../../db/schema/index";

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
): Promise<Site[]> {
  if (onlyIds !== null && onlyIds.length === 0) return [];
  const scope = onlyIds === null ? undefined : inArray(sites.id, onlyIds);
  return db
    .select(siteColumns)
    .from(sites)
    .where(and(eq(sites.networkId, networkId), scope))
    .orderBy(asc(sites.name));
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
