import type { RoleGrant } from "@shared/roles";
import type { RetiredSite } from "@shared/schemas/retirement";
import type { CreateSiteBody, Site, UpdateSiteBody } from "@shared/schemas/site";

import type { Database } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import * as repo from "./sites.repository";

const nameTaken = () =>
  new AppError("conflict", 409, "Another site already has that name.", {
    fields: { name: "Another site already has that name." },
  });

/** The sites where the person holds any role; a network-wide grant covers them all. */
export function listSitesFor(
  db: Database,
  networkId: string,
  grants: readonly RoleGrant[],
  options: { includeRetired?: boolean } = {},
): Promise<Site[]> {
  const networkWide = grants.some((grant) => grant.siteId === null);
  const ids = [...new Set(grants.flatMap((grant) => (grant.siteId ? [grant.siteId] : [])))];
  return repo.listSites(db, networkId, networkWide ? null : ids, options);
}

/** Retired sites of the network, most recently retired first. */
export async function listRetiredSites(db: Database, networkId: string): Promise<RetiredSite[]> {
  const rows = await repo.listRetiredSites(db, networkId);
  return rows.map((row) => ({ ...row, retiredAt: row.retiredAt!.toISOString() }));
}

// Used by the retirement of places (floors module), inside its transaction.
export const lockSiteRetirement = repo.lockSiteRetirement;
export const setSiteRetirement = repo.setSiteRetirement;

/** The network's name, as reports print it. */
export async function networkName(db: Database, networkId: string): Promise<string> {
  return (await repo.findNetworkName(db, networkId)) ?? "";
}

export async function siteIdIfExists(
  db: Database,
  networkId: string,
  siteId: string,
): Promise<string | null> {
  return (await repo.findSite(db, networkId, siteId))?.id ?? null;
}

export async function requireSite(db: Database, networkId: string, siteId: string): Promise<Site> {
  const site = await repo.findSite(db, networkId, siteId);
  if (!site) throw notFound("That site");
  return site;
}

export function createSite(
  db: Database,
  networkId: string,
  input: CreateSiteBody,
  actor: Actor,
): Promise<Site> {
  return db.transaction(async (tx) => {
    if (await repo.findSiteByName(tx, networkId, input.name)) throw nameTaken();
    const site = await repo.insertSite(tx, networkId, input);
    await recordChange(tx, actor, {
      action: "site.created",
      entity: "site",
      entityId: site.id,
      siteId: site.id,
      after: site,
    });
    return site;
  });
}

export function updateSite(
  db: Database,
  networkId: string,
  siteId: string,
  input: UpdateSiteBody,
  actor: Actor,
): Promise<Site> {
  return db.transaction(async (tx) => {
    const before = await repo.findSite(tx, networkId, siteId, { forUpdate: true });
    if (!before) throw notFound("That site");
    const { reason, ...changes } = input;
    if (changes.name !== undefined && changes.name !== before.name) {
      const clash = await repo.findSiteByName(tx, networkId, changes.name);
      if (clash && clash.id !== siteId) throw nameTaken();
    }
    const after = await repo.updateSite(tx, siteId, changes);
    await recordChange(tx, actor, {
      action: "site.updated",
      entity: "site",
      entityId: siteId,
      siteId,
      before,
      after,
      reason: reason || null,
    });
    return after;
  });
}
