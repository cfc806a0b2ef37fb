import { count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { changeLog, fixtures, spaces } from "../../server/db/schema/index";
import { pngPlan } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const room: [number, number][] = [
  [100, 100],
  [400, 100],
  [400, 300],
  [100, 300],
];

describe("floors, spaces and fixtures", () => {
  let siteId = "";
  let admin: SignedInPerson;
  let auditor: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    const networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId }]);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
  const newFloor = async (name = "Level 1") =>
    (await as(admin).post(`/api/sites/${siteId}/floors`).send({ building: "Main", level: 1, name }))
      .body.floor;

  it("when a plan is uploaded and later replaced, then the floor keeps its coordinate space and everything placed", async () => {
    const floor = await newFloor();
    expect(floor.plan).toBeNull();
    const first = await as(admin)
      .put(`/api/floors/${floor.id}/plan`)
      .attach("plan", await pngPlan(800, 500), "plan.png");
    expect(first.status).toBe(200);
    expect(first.body.floor.plan).toMatchObject({ width: 800, height: 500 });

    const space = (
      await as(admin)
        .post(`/api/floors/${floor.id}/spaces`)
        .send({ zoneType: "doffing_area", name: "Doffing 1", polygon: room })
    ).body.space;
    const fixture = (
      await as(admin)
        .post(`/api/spaces/${space.id}/fixtures`)
        .send({ kind: "dirty_chair", x: 150, y: 150 })
    ).body.fixture;

    const replaced = await as(admin)
      .put(`/api/floors/${floor.id}/plan`)
      .attach("plan", await pngPlan(1600, 1000), "plan-v2.png");
    expect(replaced.status).toBe(200);
    expect(replaced.body.floor.plan.imageId).not.toBe(first.body.floor.plan.imageId);
    expect(replaced.body.floor.plan).toMatchObject({ width: 800, height: 500 });

    const detail = await as(auditor).get(`/api/floors/${floor.id}`);
    expect(detail.body.spaces).toEqual([expect.objectContaining({ id: space.id, polygon: room })]);
    expect(detail.body.fixtures).toEqual([
      expect.objectContaining({ id: fixture.id, x: 150, y: 150 }),
    ]);
    const plan = await as(auditor).get(`/api/images/${replaced.body.floor.plan.imageId}`);
    expect(plan.status).toBe(200);
  });

  it("when an auditor opens a space's QR code, then the space's floor comes whole from the space's id, and an unknown space is 404", async () => {
    const floor = await newFloor("Level 3");
    const made = async (name: string) =>
      (
        await as(admin)
          .post(`/api/floors/${floor.id}/spaces`)
          .send({ zoneType: "anteroom", name, polygon: room })
      ).body.space;
    const [first, second] = [await made("Anteroom 3.1"), await made("Anteroom 3.2")];

    const fromSpace = await as(auditor).get(`/api/spaces/${second.id}/floor`);
    expect(fromSpace.status).toBe(200);
    // The same answer as the floor's own address: the phone keeps it under that floor.
    const fromFloor = await as(auditor).get(`/api/floors/${floor.id}`);
    expect(fromSpace.body).toEqual(fromFloor.body);
    expect(fromSpace.body.floor.id).toBe(floor.id);
    expect(fromSpace.body.spaces.map((space: { id: string }) => space.id).sort()).toEqual(
      [first.id, second.id].sort(),
    );

    const unknown = await as(auditor).get(`/api/spaces/${crypto.randomUUID()}/floor`);
    expect(unknown.status).toBe(404);
  });

  it("when the scale is set from two points 250 units apart that are 5 m apart, then it is 0.02 m per unit", async () => {
    const floor = await newFloor("Scaled");
    const response = await as(admin)
      .put(`/api/floors/${floor.id}/scale`)
      .send({ a: { x: 100, y: 100 }, b: { x: 250, y: 300 }, distanceMetres: 5 });
    expect(response.status).toBe(200);
    expect(response.body.floor.metresPerUnit).toBe(0.02);
    expect(response.body.floor.scaleReference.distanceMetres).toBe(5);
    const [entry] = await testApp()
      .deps.db.select()
      .from(changeLog)
      .where(eq(changeLog.entityId, floor.id))
      .orderBy(changeLog.occurredAt);
    expect(entry!.action).toBe("floor.created");
  });

  it("when the two scale points are the same, then 400 names the second point", async () => {
    const floor = await newFloor("Bad scale");
    const response = await as(admin)
      .put(`/api/floors/${floor.id}/scale`)
      .send({ a: { x: 1, y: 1 }, b: { x: 1, y: 1 }, distanceMetres: 3 });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty("b");
  });

  it("when the scale is zero, negative, not a number, or works out to zero or infinity, then 400 names the distance and the scale already set stays", async () => {
    const floor = await newFloor("Scale kept");
    const good = await as(admin)
      .put(`/api/floors/${floor.id}/scale`)
      .send({ a: { x: 100, y: 100 }, b: { x: 250, y: 300 }, distanceMetres: 5 });
    expect(good.status).toBe(200);
    const bodies = [
      { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: 0 },
      { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: -5 },
      { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: "five" },
      { a: { x: 0, y: 0 }, b: { x: 100, y: 0 }, distanceMetres: null },
      // Points a hair apart: 5 m over 5e-324 units is an infinite scale.
      { a: { x: 0, y: 0 }, b: { x: 5e-324, y: 0 }, distanceMetres: 5 },
      // A vanishing distance over two million units rounds to a scale of zero.
      { a: { x: -1_000_000, y: 0 }, b: { x: 1_000_000, y: 0 }, distanceMetres: 5e-324 },
    ];
    for (const body of bodies) {
      const response = await as(admin).put(`/api/floors/${floor.id}/scale`).send(body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.fields).toHaveProperty("distanceMetres");
    }
    const detail = await as(admin).get(`/api/floors/${floor.id}`);
    expect(detail.body.floor.metresPerUnit).toBe(0.02);
  });

  it("when a fixture is placed outside its space, then 400 names the position and nothing is stored", async () => {
    const floor = await newFloor("Fixtures");
    const space = (
      await as(admin)
        .post(`/api/floors/${floor.id}/spaces`)
        .send({ zoneType: "donning_zone", name: "Donning", polygon: room })
    ).body.space;
    const response = await as(admin)
      .post(`/api/spaces/${space.id}/fixtures`)
      .send({ kind: "clean_chair", x: 500, y: 150 });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty("x");
    const [rows] = await testApp()
      .deps.db.select({ n: count() })
      .from(fixtures)
      .where(eq(fixtures.spaceId, space.id));
    expect(rows!.n).toBe(0);
    const moved = await as(admin)
      .post(`/api/spaces/${space.id}/fixtures`)
      .send({ kind: "clean_chair", x: 399, y: 299 });
    expect(moved.status).toBe(201);
  });

  it("when a space goes off the plan, has too few corners or a wrong zone type, then 400 names the field", async () => {
    const floor = await newFloor("Shapes");
    await as(admin)
      .put(`/api/floors/${floor.id}/plan`)
      .attach("plan", await pngPlan(500, 400), "plan.png");
    const cases: [object, string][] = [
      [
        {
          zoneType: "doffing_area",
          name: "Off",
          polygon: [
            [0, 0],
            [600, 0],
            [600, 100],
          ],
        },
        "polygon",
      ],
      [
        {
          zoneType: "doffing_area",
          name: "Line",
          polygon: [
            [0, 0],
            [100, 0],
          ],
        },
        "polygon",
      ],
      [{ zoneType: "sluice_room", name: "X", polygon: room }, "zoneType"],
      [
        { zoneType: "isolation_room", name: "X", polygon: room, constructionClass: "ancient" },
        "constructionClass",
      ],
      [{ zoneType: "isolation_room", name: "X", polygon: room, volumeM3: -5 }, "volumeM3"],
      [
        { zoneType: "isolation_room", name: "X", polygon: room, suiteId: crypto.randomUUID() },
        "suiteId",
      ],
    ];
    for (const [body, field] of cases) {
      const response = await as(admin).post(`/api/floors/${floor.id}/spaces`).send(body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.fields, JSON.stringify(body)).toHaveProperty([field]);
    }
    const [rows] = await testApp()
      .deps.db.select({ n: count() })
      .from(spaces)
      .where(eq(spaces.floorId, floor.id));
    expect(rows!.n).toBe(0);
  });

  it("when a suite groups a room with its anteroom, donning zone and doffing area, then each space names the suite", async () => {
    const floor = await newFloor("Suites");
    const suite = (
      await as(admin).post(`/api/floors/${floor.id}/suites`).send({ name: "Suite 12" })
    ).body.suite;
    for (const zoneType of ["isolation_room", "anteroom", "donning_zone", "doffing_area"]) {
      const response = await as(admin)
        .post(`/api/floors/${floor.id}/spaces`)
        .send({
          zoneType,
          name: `${zoneType} 12`,
          number: "12",
          polygon: room,
          suiteId: suite.id,
          ...(zoneType === "isolation_room" ? { constructionClass: "existing", volumeM3: 81 } : {}),
        });
      expect(response.status).toBe(201);
    }
    const detail = await as(auditor).get(`/api/floors/${floor.id}`);
    expect(detail.body.suites).toEqual([{ id: suite.id, floorId: floor.id, name: "Suite 12" }]);
    expect(
      detail.body.spaces.every((space: { suiteId: string }) => space.suiteId === suite.id),
    ).toBe(true);
    expect(
      detail.body.spaces.find((space: { zoneType: string }) => space.zoneType === "isolation_room"),
    ).toMatchObject({ constructionClass: "existing", volumeM3: 81 });
  });

  it("when an isolation room is created or edited without a construction class, then 400 names constructionClass and nothing changes", async () => {
    const floor = await newFloor("Classes");
    for (const body of [
      { zoneType: "isolation_room", name: "AIIR 1", polygon: room },
      { zoneType: "isolation_room", name: "AIIR 1", polygon: room, constructionClass: null },
    ]) {
      const response = await as(admin).post(`/api/floors/${floor.id}/spaces`).send(body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.fields, JSON.stringify(body)).toHaveProperty([
        "constructionClass",
      ]);
    }
    // Other zone types still need none.
    const anteroom = await as(admin)
      .post(`/api/floors/${floor.id}/spaces`)
      .send({ zoneType: "anteroom", name: "Ante 1", polygon: room });
    expect(anteroom.status).toBe(201);
    const isolation = await as(admin).post(`/api/floors/${floor.id}/spaces`).send({
      zoneType: "isolation_room",
      name: "AIIR 2",
      polygon: room,
      constructionClass: "existing",
    });
    expect(isolation.status).toBe(201);

    for (const [spaceId, body] of [
      [isolation.body.space.id, { constructionClass: null }],
      [anteroom.body.space.id, { zoneType: "isolation_room" }],
    ] as const) {
      const response = await as(admin).patch(`/api/spaces/${spaceId}`).send(body);
      expect(response.status, JSON.stringify(body)).toBe(400);
      expect(response.body.error.fields, JSON.stringify(body)).toHaveProperty([
        "constructionClass",
      ]);
    }
    const stored = await testApp()
      .deps.db.select({ zoneType: spaces.zoneType, constructionClass: spaces.constructionClass })
      .from(spaces)
      .where(eq(spaces.floorId, floor.id))
      .orderBy(spaces.zoneType);
    expect(stored).toEqual([
      { zoneType: "isolation_room", constructionClass: "existing" },
      { zoneType: "anteroom", constructionClass: null },
    ]);
    // Turning the anteroom into an isolation room with a class is an ordinary edit.
    const turned = await as(admin)
      .patch(`/api/spaces/${anteroom.body.space.id}`)
      .send({ zoneType: "isolation_room", constructionClass: "new_or_renovated" });
    expect(turned.status).toBe(200);
  });

  it("when an auditor tries to draw a space, then 403 and nothing is stored", async () => {
    const floor = await newFloor("Read only");
    const response = await as(auditor)
      .post(`/api/floors/${floor.id}/spaces`)
      .send({ zoneType: "doffing_area", name: "Nope", polygon: room });
    expect(response.status).toBe(403);
  });

  it("when a space is deleted, then its fixtures go with it", async () => {
    const floor = await newFloor("Deleting");
    const space = (
      await as(admin)
        .post(`/api/floors/${floor.id}/spaces`)
        .send({ zoneType: "doffing_area", name: "Gone", polygon: room })
    ).body.space;
    await as(admin)
      .post(`/api/spaces/${space.id}/fixtures`)
      .send({ kind: "mirror", x: 200, y: 200 });
    expect((await as(admin).delete(`/api/spaces/${space.id}`)).status).toBe(204);
    const [rows] = await testApp()
      .deps.db.select({ n: count() })
      .from(fixtures)
      .where(eq(fixtures.spaceId, space.id));
    expect(rows!.n).toBe(0);
  });
});
