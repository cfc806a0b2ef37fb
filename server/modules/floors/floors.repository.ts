import { and, asc, desc, eq, isNotNull, isNull, type SQL } from "drizzle-orm";

import type { Fixture, Floor, Space, Suite } from "@shared/schemas/floors";

import { readTogether, type DbOrTx } from "../../db/client";
import { fixtures, floors, spaces, suites, users } from "../../db/schema/index";

type FloorRow = typeof floors.$inferSelect;

export function toFloor(row: FloorRow): Floor {
  return {
    id: row.id,
    siteId: row.siteId,
    building: row.building,
    level: row.level,
    name: row.name,
    plan:
      row.planImageId && row.planWidth && row.planHeight
        ? { imageId: row.planImageId, width: row.planWidth, height: row.planHeight }
        : null,
    metresPerUnit: row.metresPerUnit,
    scaleReference: row.scaleReference ?? null,
  };
}

export async function listFloors(db: DbOrTx, siteId: string): Promise<Floor[]> {
  const rows = await db
    .select()
    .from(floors)
    .where(and(eq(floors.siteId, siteId), isNull(floors.retiredAt)))
    .orderBy(asc(floors.building), asc(floors.level), asc(floors.name));
  return rows.map(toFloor);
}

export async function findFloorRow(
  db: DbOrTx,
  floorId: string,
  options: { lock?: boolean } = {},
): Promise<FloorRow | null> {
  const query = db.select().from(floors).where(eq(floors.id, floorId));
  const [row] = options.lock ? await query.for("update") : await query;
  return row ?? null;
}

export async function insertFloor(db: DbOrTx, values: typeof floors.$inferInsert): Promise<Floor> {
  const [row] = await db.insert(floors).values(values).returning();
  return toFloor(row!);
}

export async function updateFloor(
  db: DbOrTx,
  floorId: string,
  values: Partial<typeof floors.$inferInsert>,
): Promise<Floor> {
  const [row] = await db
    .update(floors)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(floors.id, floorId))
    .returning();
  return toFloor(row!);
}

const spaceColumns = {
  id: spaces.id,
  floorId: spaces.floorId,
  zoneType: spaces.zoneType,
  name: spaces.name,
  number: spaces.number,
  polygon: spaces.polygon,
  suiteId: spaces.suiteId,
  constructionClass: spaces.constructionClass,
  volumeM3: spaces.volumeM3,
  floorAreaM2: spaces.floorAreaM2,
  ceilingHeightM: spaces.ceilingHeightM,
};
const fixtureColumns = {
  id: fixtures.id,
  spaceId: fixtures.spaceId,
  kind: fixtures.kind,
  x: fixtures.x,
  y: fixtures.y,
  label: fixtures.label,
};
const suiteColumns = { id: suites.id, floorId: suites.floorId, name: suites.name };

export async function floorContents(
  db: DbOrTx,
  floorId: string,
): Promise<{ suites: Suite[]; spaces: Space[]; fixtures: Fixture[] }> {
  const [suiteRows, spaceRows, fixtureRows] = await readTogether(db, [
    () =>
      db
        .select(suiteColumns)
        .from(suites)
        .where(eq(suites.floorId, floorId))
        .orderBy(asc(suites.name)),
    // Retired spaces leave the map; their history is read through their audits and actions.
    () =>
      db
        .select(spaceColumns)
        .from(spaces)
        .where(and(eq(spaces.floorId, floorId), isNull(spaces.retiredAt)))
        .orderBy(asc(spaces.name)),
    () =>
      db
        .select(fixtureColumns)
        .from(fixtures)
        .innerJoin(spaces, eq(spaces.id, fixtures.spaceId))
        .where(and(eq(spaces.floorId, floorId), isNull(spaces.retiredAt)))
        .orderBy(asc(fixtures.createdAt)),
  ]);
  return { suites: suiteRows, spaces: spaceRows, fixtures: fixtureRows };
}

export async function insertSuite(db: DbOrTx, floorId: string, name: string): Promise<Suite> {
  const [row] = await db.insert(suites).values({ floorId, name }).returning(suiteColumns);
  return row!;
}

export async function findSuite(
  db: DbOrTx,
  suiteId: string,
  floorId: string,
): Promise<Suite | null> {
  const [row] = await db
    .select(suiteColumns)
    .from(suites)
    .where(and(eq(suites.id, suiteId), eq(suites.floorId, floorId)));
  return row ?? null;
}

export async function findSpace(
  db: DbOrTx,
  spaceId: string,
  options: { lock?: boolean } = {},
): Promise<
  (Space & { siteId: string; retiredAt: Date | null; retirementId: string | null }) | null
> {
  const query = db
    .select({
      ...spaceColumns,
      siteId: spaces.siteId,
      retiredAt: spaces.retiredAt,
      retirementId: spaces.retirementId,
    })
    .from(spaces)
    .where(eq(spaces.id, spaceId));
  const [row] = options.lock ? await query.for("update") : await query;
  return row ?? null;
}

export async function insertSpace(db: DbOrTx, values: typeof spaces.$inferInsert): Promise<Space> {
  const [row] = await db.insert(spaces).values(values).returning(spaceColumns);
  return row!;
}

export async function updateSpace(
  db: DbOrTx,
  spaceId: string,
  values: Partial<typeof spaces.$inferInsert>,
): Promise<Space> {
  const [row] = await db
    .update(spaces)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(spaces.id, spaceId))
    .returning(spaceColumns);
  return row!;
}

export async function deleteSpace(db: DbOrTx, spaceId: string): Promise<void> {
  await db.delete(spaces).where(eq(spaces.id, spaceId));
}

export async function findFixture(
  db: DbOrTx,
  fixtureId: string,
): Promise<(Fixture & { siteId: string }) | null> {
  const [row] = await db
    .select({ ...fixtureColumns, siteId: fixtures.siteId })
    .from(fixtures)
    .where(eq(fixtures.id, fixtureId));
  return row ?? null;
}

export async function insertFixture(
  db: DbOrTx,
  values: typeof fixtures.$inferInsert,
): Promise<Fixture> {
  const [row] = await db.insert(fixtures).values(values).returning(fixtureColumns);
  return row!;
}

export async function updateFixture(
  db: DbOrTx,
  fixtureId: string,
  values: Partial<typeof fixtures.$inferInsert>,
): Promise<Fixture> {
  const [row] = await db
    .update(fixtures)
    .set(values)
    .where(eq(fixtures.id, fixtureId))
    .returning(fixtureColumns);
  return row!;
}

export async function deleteFixture(db: DbOrTx, fixtureId: string): Promise<void> {
  await db.delete(fixtures).where(eq(fixtures.id, fixtureId));
}

export interface Retirement {
  id: string;
  at: Date;
  by: string | null;
}

const retiredValues = (retirement: Retirement | null) => ({
  retiredAt: retirement?.at ?? null,
  retiredBy: retirement?.by ?? null,
  retirementId: retirement?.id ?? null,
  updatedAt: new Date(),
});

/** Retires the floors that match and are not retired yet; returns their ids. */
export async function retireFloorsWhere(db: DbOrTx, where: SQL, retirement: Retirement) {
  const rows = await db
    .update(floors)
    .set(retiredValues(retirement))
    .where(and(where, isNull(floors.retiredAt)))
    .returning({ id: floors.id });
  return rows.map((row) => row.id);
}

/** Retires the spaces that match and are not retired yet; returns their ids. */
export async function retireSpacesWhere(db: DbOrTx, where: SQL, retirement: Retirement) {
  const rows = await db
    .update(spaces)
    .set(retiredValues(retirement))
    .where(and(where, isNull(spaces.retiredAt)))
    .returning({ id: spaces.id });
  return rows.map((row) => row.id);
}

export const floorsOfSite = (siteId: string) => eq(floors.siteId, siteId);
export const floorById = (floorId: string) => eq(floors.id, floorId);
export const spacesOfSite = (siteId: string) => eq(spaces.siteId, siteId);
export const spacesOfFloor = (floorId: string) => eq(spaces.floorId, floorId);
export const spaceById = (spaceId: string) => eq(spaces.id, spaceId);

/** Brings back exactly what one retirement hid; returns the floor and space ids restored. */
export async function restoreRetirement(db: DbOrTx, retirementId: string) {
  const floorRows = await db
    .update(floors)
    .set(retiredValues(null))
    .where(eq(floors.retirementId, retirementId))
    .returning({ id: floors.id });
  const spaceRows = await db
    .update(spaces)
    .set(retiredValues(null))
    .where(eq(spaces.retirementId, retirementId))
    .returning({ id: spaces.id });
  return { floorIds: floorRows.map((row) => row.id), spaceIds: spaceRows.map((row) => row.id) };
}

/** Every space of the floor, retired ones too (for history checks). */
export async function allSpaceIdsOfFloor(db: DbOrTx, floorId: string) {
  const rows = await db.select({ id: spaces.id }).from(spaces).where(eq(spaces.floorId, floorId));
  return rows.map((row) => row.id);
}

export async function deleteFloor(db: DbOrTx, floorId: string): Promise<void> {
  await db.delete(floors).where(eq(floors.id, floorId));
}

export async function retiredPlacesOfSite(db: DbOrTx, siteId: string) {
  const [floorRows, spaceRows] = await readTogether(db, [
    () =>
      db
        .select({
          id: floors.id,
          name: floors.name,
          building: floors.building,
          level: floors.level,
          retiredAt: floors.retiredAt,
          retiredByName: users.displayName,
        })
        .from(floors)
        .leftJoin(users, eq(users.id, floors.retiredBy))
        .where(and(eq(floors.siteId, siteId), isNotNull(floors.retiredAt)))
        .orderBy(desc(floors.retiredAt), asc(floors.name)),
    () =>
      db
        .select({
          id: spaces.id,
          name: spaces.name,
          zoneType: spaces.zoneType,
          floorId: spaces.floorId,
          floorName: floors.name,
          floorRetiredAt: floors.retiredAt,
          retiredAt: spaces.retiredAt,
          retiredByName: users.displayName,
        })
        .from(spaces)
        .innerJoin(floors, eq(floors.id, spaces.floorId))
        .leftJoin(users, eq(users.id, spaces.retiredBy))
        .where(and(eq(spaces.siteId, siteId), isNotNull(spaces.retiredAt)))
        .orderBy(desc(spaces.retiredAt), asc(spaces.name)),
  ]);
  return { floorRows, spaceRows };
}
