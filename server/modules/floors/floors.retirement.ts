import type {
  RetiredPlaces,
  RetiredSpace,
  RetirementBody,
  RetirementResult,
} from "@shared/schemas/retirement";

import { readTogether, type Database, type Tx } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import {
  closeActionsOfRetiredSpaces,
  countActionsOfSpaces,
  reopenActionsOfRestoredSpaces,
} from "../actions/actions.service";
import { countAuditsOfSpaces } from "../audits/audits.service";
import { lockSiteRetirement, setSiteRetirement } from "../sites/sites.service";
import * as repo from "./floors.repository";

/*
 * Sites, floors and spaces with history are retired, never deleted: hidden from the map, the due
 * list, QR sheets and new audits, kept in audit history, exports and the committee's figures.
 * One retirement step carries one id; restoring brings back exactly what that step hid.
 */

const conflict = (message: string) => new AppError("conflict", 409, message);

function newRetirement(actor: Actor): repo.Retirement {
  return { id: crypto.randomUUID(), at: new Date(), by: actor.userId };
}

/** Audits (drafts too) and corrective actions of the spaces: any at all is history. */
async function historyOf(tx: Tx, spaceIds: readonly string[]) {
  const [audits, actions] = await readTogether(tx, [
    () => countAuditsOfSpaces(tx, spaceIds),
    () => countActionsOfSpaces(tx, spaceIds),
  ]);
  return { audits, actions };
}

function historyWords({ audits, actions }: { audits: number; actions: number }) {
  const parts = [
    audits > 0 ? `${audits} audit${audits === 1 ? "" : "s"}` : null,
    actions > 0 ? `${actions} corrective action${actions === 1 ? "" : "s"}` : null,
  ].filter(Boolean);
  return parts.join(" and ");
}

const result = (
  kind: RetirementResult["kind"],
  place: { id: string; name: string },
  retiredAt: Date | null,
  counts: { floors: number; spaces: number; actions: number },
): RetirementResult => ({
  kind,
  id: place.id,
  name: place.name,
  retiredAt: retiredAt?.toISOString() ?? null,
  ...counts,
});

// ── Spaces ──────────────────────────────────────────────────────────────────────────────────

/** Deletes a space that has no history; one with history answers 409 and is to be retired. */
export function deleteSpace(db: Database, spaceId: string, actor: Actor): Promise<void> {
  return db.transaction(async (tx) => {
    const before = await repo.findSpace(tx, spaceId, { lock: true });
    if (!before) throw notFound("That space");
    const history = await historyOf(tx, [spaceId]);
    if (history.audits + history.actions > 0) {
      throw conflict(
        `${before.name} has history (${historyWords(history)}), so it cannot be deleted. Retire it instead: it leaves the map and new audits, and its history is kept.`,
      );
    }
    // The database refuses too (foreign keys RESTRICT), should an audit arrive in between.
    await repo.deleteSpace(tx, spaceId);
    const { siteId, retiredAt: _retiredAt, retirementId: _retirementId, ...shownBefore } = before;
    await recordChange(tx, actor, {
      action: "space.deleted",
      entity: "space",
      entityId: spaceId,
      siteId,
      before: shownBefore,
    });
  });
}

export function retireSpace(
  db: Database,
  spaceId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const space = await repo.findSpace(tx, spaceId, { lock: true });
    if (!space) throw notFound("That space");
    if (space.retiredAt) {
      return result("space", space, space.retiredAt, { floors: 0, spaces: 0, actions: 0 });
    }
    const retirement = newRetirement(actor);
    await repo.retireSpacesWhere(tx, repo.spaceById(spaceId), retirement);
    const actions = await closeActionsOfRetiredSpaces(tx, actor, [spaceId], retirement.at);
    await recordChange(tx, actor, {
      action: "space.retired",
      entity: "space",
      entityId: spaceId,
      siteId: space.siteId,
      after: { retiredAt: retirement.at.toISOString(), retirementId: retirement.id, actions },
      reason: body.reason || null,
    });
    return result("space", space, retirement.at, { floors: 0, spaces: 1, actions });
  });
}

export function restoreSpace(
  db: Database,
  spaceId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const space = await repo.findSpace(tx, spaceId, { lock: true });
    if (!space) throw notFound("That space");
    if (!space.retiredAt || !space.retirementId) {
      return result("space", space, null, { floors: 0, spaces: 0, actions: 0 });
    }
    const floor = (await repo.findFloorRow(tx, space.floorId, { lock: true }))!;
    if (floor.retiredAt) {
      throw conflict(
        `${space.name} is on ${floor.name}, which is retired. Restore the floor first; the spaces retired with it come back with it.`,
      );
    }
    return restore(tx, "space", space, space.siteId, space.retiredAt, space.retirementId, {
      actor,
      reason: body.reason,
    });
  });
}

// ── Floors ──────────────────────────────────────────────────────────────────────────────────

/** Deletes a floor none of whose spaces has history; otherwise 409, to be retired. */
export function deleteFloor(db: Database, floorId: string, actor: Actor): Promise<void> {
  return db.transaction(async (tx) => {
    const floor = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!floor) throw notFound("That floor");
    const history = await historyOf(tx, await repo.allSpaceIdsOfFloor(tx, floorId));
    if (history.audits + history.actions > 0) {
      throw conflict(
        `${floor.name} has history (${historyWords(history)}), so it cannot be deleted. Retire it instead: it and its spaces leave the map and new audits, and their history is kept.`,
      );
    }
    await repo.deleteFloor(tx, floorId);
    await recordChange(tx, actor, {
      action: "floor.deleted",
      entity: "floor",
      entityId: floorId,
      siteId: floor.siteId,
      before: repo.toFloor(floor),
    });
  });
}

export function retireFloor(
  db: Database,
  floorId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const floor = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!floor) throw notFound("That floor");
    if (floor.retiredAt) {
      return result("floor", floor, floor.retiredAt, { floors: 0, spaces: 0, actions: 0 });
    }
    const retirement = newRetirement(actor);
    await repo.retireFloorsWhere(tx, repo.floorById(floorId), retirement);
    const spaceIds = await repo.retireSpacesWhere(tx, repo.spacesOfFloor(floorId), retirement);
    const actions = await closeActionsOfRetiredSpaces(tx, actor, spaceIds, retirement.at);
    await recordChange(tx, actor, {
      action: "floor.retired",
      entity: "floor",
      entityId: floorId,
      siteId: floor.siteId,
      after: {
        retiredAt: retirement.at.toISOString(),
        retirementId: retirement.id,
        spaceIds,
        actions,
      },
      reason: body.reason || null,
    });
    return result("floor", floor, retirement.at, { floors: 1, spaces: spaceIds.length, actions });
  });
}

export function restoreFloor(
  db: Database,
  floorId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const floor = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!floor) throw notFound("That floor");
    if (!floor.retiredAt || !floor.retirementId) {
      return result("floor", floor, null, { floors: 0, spaces: 0, actions: 0 });
    }
    const site = await lockSiteRetirement(tx, floor.siteId);
    if (site?.retiredAt) {
      throw conflict(
        `${floor.name} belongs to ${site.name}, which is retired. Restore the site first.`,
      );
    }
    return restore(tx, "floor", floor, floor.siteId, floor.retiredAt, floor.retirementId, {
      actor,
      reason: body.reason,
    });
  });
}

// ── Sites ───────────────────────────────────────────────────────────────────────────────────

export function retireSite(
  db: Database,
  networkId: string,
  siteId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const site = await lockSiteRetirement(tx, siteId, networkId);
    if (!site) throw notFound("That site");
    if (site.retiredAt) {
      return result("site", site, site.retiredAt, { floors: 0, spaces: 0, actions: 0 });
    }
    const retirement = newRetirement(actor);
    await setSiteRetirement(tx, siteId, retirement);
    const floorIds = await repo.retireFloorsWhere(tx, repo.floorsOfSite(siteId), retirement);
    const spaceIds = await repo.retireSpacesWhere(tx, repo.spacesOfSite(siteId), retirement);
    const actions = await closeActionsOfRetiredSpaces(tx, actor, spaceIds, retirement.at);
    await recordChange(tx, actor, {
      action: "site.retired",
      entity: "site",
      entityId: siteId,
      siteId,
      after: {
        retiredAt: retirement.at.toISOString(),
        retirementId: retirement.id,
        floorIds,
        spaceIds,
        actions,
      },
      reason: body.reason || null,
    });
    return result("site", site, retirement.at, {
      floors: floorIds.length,
      spaces: spaceIds.length,
      actions,
    });
  });
}

export function restoreSite(
  db: Database,
  networkId: string,
  siteId: string,
  body: RetirementBody,
  actor: Actor,
): Promise<RetirementResult> {
  return db.transaction(async (tx) => {
    const site = await lockSiteRetirement(tx, siteId, networkId);
    if (!site) throw notFound("That site");
    if (!site.retiredAt || !site.retirementId) {
      return result("site", site, null, { floors: 0, spaces: 0, actions: 0 });
    }
    await setSiteRetirement(tx, siteId, null);
    return restore(tx, "site", site, siteId, site.retiredAt, site.retirementId, {
      actor,
      reason: body.reason,
    });
  });
}

/** Brings back what one retirement hid, reopens the actions it closed, and logs it. */
async function restore(
  tx: Tx,
  kind: RetirementResult["kind"],
  place: { id: string; name: string },
  siteId: string,
  retiredAt: Date,
  retirementId: string,
  options: { actor: Actor; reason?: string },
): Promise<RetirementResult> {
  const { floorIds, spaceIds } = await repo.restoreRetirement(tx, retirementId);
  const actions = await reopenActionsOfRestoredSpaces(tx, options.actor, spaceIds, retiredAt);
  await recordChange(tx, options.actor, {
    action: `${kind}.restored`,
    entity: kind,
    entityId: place.id,
    siteId,
    before: { retiredAt: retiredAt.toISOString(), retirementId },
    after: { floorIds, spaceIds, actions },
    reason: options.reason || null,
  });
  return result(kind, place, null, { floors: floorIds.length, spaces: spaceIds.length, actions });
}

// ── Lists ───────────────────────────────────────────────────────────────────────────────────

export async function retiredPlaces(db: Database, siteId: string): Promise<RetiredPlaces> {
  const { floorRows, spaceRows } = await repo.retiredPlacesOfSite(db, siteId);
  return {
    floors: floorRows.map((row) => ({ ...row, retiredAt: row.retiredAt!.toISOString() })),
    spaces: spaceRows.map(({ floorRetiredAt, ...row }): RetiredSpace => ({
      ...row,
      retiredAt: row.retiredAt!.toISOString(),
      floorRetired: floorRetiredAt !== null,
    })),
  };
}
