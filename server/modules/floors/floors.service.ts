import { pointInPolygon, scaleFromReference } from "@shared/calc/plan-geometry";
import type {
  Fixture,
  FixtureBody,
  Floor,
  FloorDetail,
  ScaleBody,
  Space,
  SpaceBody,
  Suite,
} from "@shared/schemas/floors";

import type { Database } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { storeImage } from "../../lib/images";
import type { Storage } from "../../lib/storage";
import { lockSiteRetirement } from "../sites/sites.service";
import * as repo from "./floors.repository";

const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });
const retired = (what: string) =>
  new AppError(
    "conflict",
    409,
    `${what}. An administrator can restore it before anything is added.`,
  );

// Site resolution for the route registry: each returns the site a resource belongs to, or null.
export const siteOfFloor = async (db: Database, floorId: string) =>
  (await repo.findFloorRow(db, floorId))?.siteId ?? null;
export const siteOfSpace = async (db: Database, spaceId: string) =>
  (await repo.findSpace(db, spaceId))?.siteId ?? null;
export const siteOfFixture = async (db: Database, fixtureId: string) =>
  (await repo.findFixture(db, fixtureId))?.siteId ?? null;

export const listFloors = (db: Database, siteId: string) => repo.listFloors(db, siteId);

export async function floorDetail(db: Database, floorId: string): Promise<FloorDetail> {
  const row = await repo.findFloorRow(db, floorId);
  if (!row) throw notFound("That floor");
  return { floor: repo.toFloor(row), ...(await repo.floorContents(db, floorId)) };
}

/**
 * The floor a space is on, with everything on it: a QR code names only the space, and the phone
 * starts its audit from the space's facts while the audit screen's own code is still on its way.
 */
export async function floorOfSpace(db: Database, spaceId: string): Promise<FloorDetail> {
  const space = await repo.findSpace(db, spaceId);
  if (!space) throw notFound("That space");
  // A retired space is not on the floor it returns: the phone then waits for Lintel's answer to
  // the audit itself, which says why it cannot start.
  return floorDetail(db, space.floorId);
}

export function createFloor(
  db: Database,
  siteId: string,
  body: { building: string; level: number; name: string },
  actor: Actor,
): Promise<Floor> {
  return db.transaction(async (tx) => {
    // Shares the lock a retirement of the site takes, so no floor slips in beside it.
    const site = await lockSiteRetirement(tx, siteId);
    if (site?.retiredAt) throw retired(`${site.name} is retired`);
    const floor = await repo.insertFloor(tx, { siteId, ...body });
    await recordChange(tx, actor, {
      action: "floor.created",
      entity: "floor",
      entityId: floor.id,
      siteId,
      after: floor,
    });
    return floor;
  });
}

export function updateFloor(
  db: Database,
  floorId: string,
  body: Partial<{ building: string; level: number; name: string }>,
  actor: Actor,
): Promise<Floor> {
  return db.transaction(async (tx) => {
    const before = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!before) throw notFound("That floor");
    const floor = await repo.updateFloor(tx, floorId, body);
    await recordChange(tx, actor, {
      action: "floor.updated",
      entity: "floor",
      entityId: floorId,
      siteId: floor.siteId,
      before: repo.toFloor(before),
      after: floor,
    });
    return floor;
  });
}

/**
 * Stores a plan image for the floor. The first plan fixes the floor's coordinate space; a
 * replacement is shown stretched into the same space, so every position placed stays put.
 */
export async function uploadPlan(
  deps: { db: Database; storage: Storage },
  floorId: string,
  buffer: Buffer,
  actor: Actor,
): Promise<Floor> {
  const current = await repo.findFloorRow(deps.db, floorId);
  if (!current) throw notFound("That floor");
  const image = await storeImage(deps, {
    siteId: current.siteId,
    uploadedBy: actor.userId,
    buffer,
    field: "plan",
    maxSide: 4096,
  });
  return deps.db.transaction(async (tx) => {
    const before = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!before) throw notFound("That floor");
    const firstPlan = before.planWidth === null || before.planHeight === null;
    const floor = await repo.updateFloor(tx, floorId, {
      planImageId: image.id,
      ...(firstPlan ? { planWidth: image.width, planHeight: image.height } : {}),
    });
    await recordChange(tx, actor, {
      action: firstPlan ? "floor.plan_added" : "floor.plan_replaced",
      entity: "floor",
      entityId: floorId,
      siteId: floor.siteId,
      before: { planImageId: before.planImageId },
      after: { planImageId: image.id },
    });
    return floor;
  });
}

export function setScale(
  db: Database,
  floorId: string,
  body: ScaleBody,
  actor: Actor,
): Promise<Floor> {
  const metresPerUnit = scaleFromReference(body.a, body.b, body.distanceMetres);
  return db.transaction(async (tx) => {
    const before = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!before) throw notFound("That floor");
    const floor = await repo.updateFloor(tx, floorId, { metresPerUnit, scaleReference: body });
    await recordChange(tx, actor, {
      action: "floor.scale_set",
      entity: "floor",
      entityId: floorId,
      siteId: floor.siteId,
      before: { metresPerUnit: before.metresPerUnit },
      after: { metresPerUnit, reference: body },
    });
    return floor;
  });
}

export function createSuite(
  db: Database,
  floorId: string,
  name: string,
  actor: Actor,
): Promise<Suite> {
  return db.transaction(async (tx) => {
    const floor = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!floor) throw notFound("That floor");
    if (floor.retiredAt) throw retired(`${floor.name} is retired`);
    const suite = await repo.insertSuite(tx, floorId, name);
    await recordChange(tx, actor, {
      action: "suite.created",
      entity: "suite",
      entityId: suite.id,
      siteId: floor.siteId,
      after: suite,
    });
    return suite;
  });
}

/**
 * An isolation room's air changes are judged by its construction class, so it cannot be saved
 * without one. Other zone types may leave it empty.
 */
function assertConstructionClass(
  zoneType: SpaceBody["zoneType"],
  constructionClass: SpaceBody["constructionClass"],
) {
  if (zoneType === "isolation_room" && !constructionClass)
    throw invalid(
      "constructionClass",
      "An isolation room needs a construction class: new or renovated, or existing.",
    );
}

function assertPolygonOnPlan(
  polygon: [number, number][],
  floor: { planWidth: number | null; planHeight: number | null },
) {
  if (floor.planWidth === null || floor.planHeight === null) return;
  const outside = polygon.some(
    ([x, y]) => x < 0 || y < 0 || x > floor.planWidth! || y > floor.planHeight!,
  );
  if (outside) throw invalid("polygon", "Every corner must be on the floor plan.");
}

export function createSpace(
  db: Database,
  floorId: string,
  body: SpaceBody,
  actor: Actor,
): Promise<Space> {
  return db.transaction(async (tx) => {
    const floor = await repo.findFloorRow(tx, floorId, { lock: true });
    if (!floor) throw notFound("That floor");
    if (floor.retiredAt) throw retired(`${floor.name} is retired`);
    assertPolygonOnPlan(body.polygon, floor);
    if (body.suiteId && !(await repo.findSuite(tx, body.suiteId, floorId)))
      throw invalid("suiteId", "That suite is not on this floor.");
    assertConstructionClass(body.zoneType, body.constructionClass);
    const space = await repo.insertSpace(tx, { ...body, floorId, siteId: floor.siteId });
    await recordChange(tx, actor, {
      action: "space.created",
      entity: "space",
      entityId: space.id,
      siteId: floor.siteId,
      after: space,
    });
    return space;
  });
}

export function updateSpace(
  db: Database,
  spaceId: string,
  body: Partial<SpaceBody>,
  actor: Actor,
): Promise<Space> {
  return db.transaction(async (tx) => {
    // Locked: the class check below reads the stored zone type and class with this edit.
    const before = await repo.findSpace(tx, spaceId, { lock: true });
    if (!before) throw notFound("That space");
    const floor = (await repo.findFloorRow(tx, before.floorId))!;
    if (body.polygon) assertPolygonOnPlan(body.polygon, floor);
    assertConstructionClass(
      body.zoneType ?? before.zoneType,
      body.constructionClass !== undefined ? body.constructionClass : before.constructionClass,
    );
    if (body.suiteId && !(await repo.findSuite(tx, body.suiteId, before.floorId)))
      throw invalid("suiteId", "That suite is not on this floor.");
    const space = await repo.updateSpace(tx, spaceId, body);
    const { siteId, retiredAt: _retiredAt, retirementId: _retirementId, ...shownBefore } = before;
    await recordChange(tx, actor, {
      action: "space.updated",
      entity: "space",
      entityId: spaceId,
      siteId,
      before: shownBefore,
      after: space,
    });
    return space;
  });
}

function assertInside(space: Space, point: { x: number; y: number }) {
  if (!pointInPolygon(point, space.polygon))
    throw invalid("x", `The point is outside ${space.name}. Place the fixture inside the space.`);
}

export function createFixture(
  db: Database,
  spaceId: string,
  body: FixtureBody,
  actor: Actor,
): Promise<Fixture> {
  return db.transaction(async (tx) => {
    const space = await repo.findSpace(tx, spaceId);
    if (!space) throw notFound("That space");
    if (space.retiredAt) throw retired(`${space.name} is retired`);
    assertInside(space, body);
    const fixture = await repo.insertFixture(tx, { ...body, spaceId, siteId: space.siteId });
    await recordChange(tx, actor, {
      action: "fixture.created",
      entity: "fixture",
      entityId: fixture.id,
      siteId: space.siteId,
      after: fixture,
    });
    return fixture;
  });
}

export function updateFixture(
  db: Database,
  fixtureId: string,
  body: Partial<Omit<FixtureBody, "kind">>,
  actor: Actor,
): Promise<Fixture> {
  return db.transaction(async (tx) => {
    const before = await repo.findFixture(tx, fixtureId);
    if (!before) throw notFound("That fixture");
    const space = (await repo.findSpace(tx, before.spaceId))!;
    assertInside(space, { x: body.x ?? before.x, y: body.y ?? before.y });
    const fixture = await repo.updateFixture(tx, fixtureId, body);
    const { siteId, ...shownBefore } = before;
    await recordChange(tx, actor, {
      action: "fixture.updated",
      entity: "fixture",
      entityId: fixtureId,
      siteId,
      before: shownBefore,
      after: fixture,
    });
    return fixture;
  });
}

export function deleteFixture(db: Database, fixtureId: string, actor: Actor): Promise<void> {
  return db.transaction(async (tx) => {
    const before = await repo.findFixture(tx, fixtureId);
    if (!before) throw notFound("That fixture");
    await repo.deleteFixture(tx, fixtureId);
    const { siteId, ...shownBefore } = before;
    await recordChange(tx, actor, {
      action: "fixture.deleted",
      entity: "fixture",
      entityId: fixtureId,
      siteId,
      before: shownBefore,
    });
  });
}
