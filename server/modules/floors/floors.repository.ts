import { and, asc, eq } from "drizzle-orm";

import type { Fixture, Floor, Space, Suite } from "@shared/schemas/floors";

import type { DbOrTx } from "../../db/client";
import { fixtures, floors, spaces, suites } from "../../db/schema/index";

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
    .where(eq(floors.siteId, siteId))
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
  const [suiteRows, spaceRows, fixtureRows] = await Promise.all([
    db
      .select(suiteColumns)
      .from(suites)
      .where(eq(suites.floorId, floorId))
      .orderBy(asc(suites.name)),
    db
      .select(spaceColumns)
      .from(spaces)
      .where(eq(spaces.floorId, floorId))
      .orderBy(asc(spaces.name)),
    db
      .select(fixtureColumns)
      .from(fixtures)
      .innerJoin(spaces, eq(spaces.id, fixtures.spaceId))
      .where(eq(spaces.floorId, floorId))
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
): Promise<(Space & { siteId: string }) | null> {
  const [row] = await db
    .select({ ...spaceColumns, siteId: spaces.siteId })
    .from(spaces)
    .where(eq(spaces.id, spaceId));
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
