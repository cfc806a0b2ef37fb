import { and, asc, eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";

import { defaultChecklists } from "@shared/checklists/defaults";
import { defaultChecklistsV1 } from "@shared/checklists/defaults-v1";
import type { ChecklistsResponse } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import { checklistItems, checklistVersions } from "../../server/db/schema/index";
import { insertVersion, replaceItems } from "../../server/modules/checklists/checklists.repository";
import { ensureDefaultChecklists } from "../../server/modules/checklists/checklists.service";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const square: [number, number][] = [
  [0, 0],
  [100, 0],
  [100, 100],
  [0, 100],
];

const keysOf = (list: { key: string }[]) => list.map((item) => item.key);

describe("default checklists, version 2", () => {
  let networkId = "";
  let siteId = "";
  let admin: SignedInPerson;
  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
  const list = async () => {
    const response = await as(admin).get("/api/checklists");
    expect(response.status).toBe(200);
    return response.body as ChecklistsResponse;
  };
  const entryOf = (body: ChecklistsResponse, zoneType: ZoneType) =>
    body.checklists.find((entry) => entry.zoneType === zoneType)!;
  const itemsOfVersion = async (zoneType: ZoneType, version: number) => {
    const { db } = testApp().deps;
    const rows = await db
      .select({ key: checklistItems.key })
      .from(checklistItems)
      .innerJoin(checklistVersions, eq(checklistVersions.id, checklistItems.versionId))
      .where(
        and(
          eq(checklistVersions.networkId, networkId),
          eq(checklistVersions.zoneType, zoneType),
          eq(checklistVersions.version, version),
        ),
      )
      .orderBy(asc(checklistItems.position));
    return keysOf(rows);
  };

  /** A version of the network's own, written as the routes wrote it before version 2 existed. */
  const ownVersion = async (zoneType: ZoneType, title: string, status: "published" | "draft") => {
    const { db } = testApp().deps;
    const version = await insertVersion(db, {
      networkId,
      zoneType,
      version: 2,
      status,
      title,
      publishedAt: status === "published" ? new Date() : null,
      publishedBy: status === "published" ? admin.user.id : null,
    });
    await replaceItems(db, version.id, [
      {
        key: "own-1",
        position: 0,
        text: `${title}: our item`,
        severity: "major",
        response: "check",
      },
    ]);
  };

  beforeEach(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
  });

  it("when a network never edited its version 1 defaults, then version 2 is published over them and version 1 stays as it was", async () => {
    await ensureDefaultChecklists(testApp().deps.db, networkId, 1);

    const body = await list();
    for (const entry of body.checklists) {
      expect(entry.published.version, entry.zoneType).toBe(2);
      expect(keysOf(entry.published.items)).toEqual(
        keysOf(defaultChecklists[entry.zoneType].items),
      );
      expect(entry.draft).toBeNull();
      expect(entry.defaultUpdate).toBeNull();
      expect(await itemsOfVersion(entry.zoneType, 1)).toEqual(
        keysOf(defaultChecklistsV1[entry.zoneType].items),
      );
    }
    // Asking again changes nothing.
    const again = await list();
    expect(again.checklists.map((entry) => entry.published.id)).toEqual(
      body.checklists.map((entry) => entry.published.id),
    );
  });

  it("when a new network opens its checklists, then it starts on version 2's content as its version 1", async () => {
    const body = await list();
    for (const entry of body.checklists) {
      expect(entry.published.version).toBe(1);
      expect(keysOf(entry.published.items)).toEqual(
        keysOf(defaultChecklists[entry.zoneType].items),
      );
      expect(entry.draft).toBeNull();
    }
  });

  it("when a network published its own version, then version 2 of the default waits as a draft beside it and is not offered again once discarded", async () => {
    await ensureDefaultChecklists(testApp().deps.db, networkId, 1);
    const { db } = testApp().deps;
    await ownVersion("doffing_area", "Our doffing checks", "published");

    const body = await list();
    const doffing = entryOf(body, "doffing_area");
    expect(doffing.published.version).toBe(2);
    expect(doffing.published.title).toBe("Our doffing checks");
    expect(doffing.draft?.version).toBe(3);
    expect(keysOf(doffing.draft!.items)).toEqual(keysOf(defaultChecklists.doffing_area.items));
    expect(doffing.defaultUpdate).toEqual({ revision: 2 });
    // The kinds of space it never edited get version 2 published.
    expect(entryOf(body, "anteroom").published.version).toBe(2);
    expect(entryOf(body, "anteroom").draft).toBeNull();

    // Asking again keeps the one draft.
    expect(entryOf(await list(), "doffing_area").draft?.id).toBe(doffing.draft!.id);
    // Discarded, it is not offered again.
    expect((await as(admin).delete("/api/checklists/doffing_area/draft")).status).toBe(204);
    const after = entryOf(await list(), "doffing_area");
    expect(after.draft).toBeNull();
    expect(after.published.version).toBe(2);
    await ensureDefaultChecklists(db, networkId);
    expect(entryOf(await list(), "doffing_area").draft).toBeNull();
  });

  it("when a network has a draft of its own open, then version 2 waits until that draft is published and then opens beside it", async () => {
    await ensureDefaultChecklists(testApp().deps.db, networkId, 1);
    await ownVersion("anteroom", "Anteroom, ours", "draft");
    const before = entryOf(await list(), "anteroom");
    expect(before.published.version).toBe(1);
    expect(before.draft?.title).toBe("Anteroom, ours");
    expect(before.defaultUpdate).toBeNull();

    expect((await as(admin).post("/api/checklists/anteroom/publish")).status).toBe(200);
    const after = entryOf(await list(), "anteroom");
    expect(after.published.title).toBe("Anteroom, ours");
    expect(after.draft?.version).toBe(3);
    expect(keysOf(after.draft!.items)).toEqual(keysOf(defaultChecklists.anteroom.items));
    expect(after.defaultUpdate).toEqual({ revision: 2 });
  });

  it("when an isolation-room draft leaves out the pressure or the visual test, then it is refused naming them and nothing is saved", async () => {
    const published = entryOf(await list(), "isolation_room").published;
    const items = published.items.map((item) => ({
      key: item.key,
      text: item.text,
      severity: item.severity,
      response: item.response,
      quantity: item.quantity,
      threshold: item.threshold,
      choices: item.choices,
      reference: item.reference,
      photoOnFail: item.photoOnFail,
    }));
    const without = async (...keys: string[]) =>
      as(admin)
        .put("/api/checklists/isolation_room/draft")
        .send({
          title: "Isolation room checks",
          items: items.filter((i) => !keys.includes(i.key)),
        });

    const noSmoke = await without("room.smoke-test");
    expect(noSmoke.status).toBe(400);
    expect(noSmoke.body.error.fields.items).toMatch(/room\.smoke-test/);
    expect(noSmoke.body.error.fields.items).not.toMatch(/room\.pressure/);
    const neither = await without("room.pressure", "room.smoke-test");
    expect(neither.status).toBe(400);
    expect(neither.body.error.fields.items).toMatch(/room\.pressure and room\.smoke-test/);
    expect(entryOf(await list(), "isolation_room").draft).toBeNull();

    // Other kinds of space may drop any item; the room keeps its with both.
    expect((await without("room.signage")).status).toBe(200);
  });

  it("when the dirty chair is marked not applicable without a note, then the answer is refused naming the note", async () => {
    const floorId = (
      await as(admin)
        .post(`/api/sites/${siteId}/floors`)
        .send({ building: "B", level: 1, name: "L1" })
    ).body.floor.id as string;
    const spaceId = (
      await as(admin)
        .post(`/api/floors/${floorId}/spaces`)
        .send({ zoneType: "doffing_area", name: "Doffing 1", polygon: square })
    ).body.space.id as string;
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    const auditId = crypto.randomUUID();
    const started = await as(auditor)
      .put(`/api/audits/${auditId}`)
      .send({ spaceId, startedAt: new Date().toISOString() });
    expect(started.status).toBe(201);
    const chair = (started.body.items as { id: string; key: string }[]).find(
      (item) => item.key === "doff.dirty-chair",
    )!;
    const bins = (started.body.items as { id: string; key: string }[]).find(
      (item) => item.key === "doff.bins-fill",
    )!;

    const bare = await as(auditor)
      .put(`/api/audits/${auditId}/answers/${chair.id}`)
      .send({ id: crypto.randomUUID(), outcome: "not_applicable" });
    expect(bare.status).toBe(400);
    expect(Object.keys(bare.body.error.fields)).toEqual(["note"]);
    const noted = await as(auditor).put(`/api/audits/${auditId}/answers/${chair.id}`).send({
      id: crypto.randomUUID(),
      outcome: "not_applicable",
      note: "Chair-free removal area",
    });
    expect(noted.status).toBe(200);
    // Items without the flag are still marked not applicable without a note.
    const other = await as(auditor)
      .put(`/api/audits/${auditId}/answers/${bins.id}`)
      .send({ id: crypto.randomUUID(), outcome: "not_applicable" });
    expect(other.status).toBe(200);
  });
});
