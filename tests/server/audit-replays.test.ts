import { count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { auditAnswers, auditPhotos, audits, changeLog } from "../../server/db/schema/index";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

// The phone's offline queue sends every change again until it hears back; these pin what such a
// replay gets once the audit is submitted, and what a clashing device id gets.
describe("audit replays", () => {
  let networkId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let auditor: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    const siteId = (await insertSite(db, networkId)).id;
    floor = await insertFloor(db, siteId);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  async function draft(fail: string[] = []) {
    const space = await insertSpace(testApp().deps.db, floor);
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail,
    });
    const detail = (await as(auditor).get(`/api/audits/${auditId}`)).body;
    return { auditId, detail };
  }

  const countOf = async (table: typeof auditAnswers | typeof auditPhotos, auditId: string) => {
    const [row] = await testApp()
      .deps.db.select({ n: count() })
      .from(table)
      .where(eq(table.auditId, auditId));
    return row!.n;
  };

  it("when an answer, a photo and the submission are sent again after the submit, then each gets 200 and nothing changes", async () => {
    const { auditId, detail } = await draft();
    const item = detail.items.find((i: { response: string }) => i.response === "check");
    const photoItem = detail.items[0];
    const answerId = crypto.randomUUID();
    const body = { id: answerId, outcome: "pass", note: "Checked twice" };
    expect(
      (await as(auditor).put(`/api/audits/${auditId}/answers/${item.id}`).send(body)).status,
    ).toBe(200);
    const picture = await jpegWithGps({ colour: "#123456" });
    const photoId = crypto.randomUUID();
    const upload = () =>
      as(auditor)
        .post(`/api/audits/${auditId}/photos`)
        .field("id", photoId)
        .field("itemId", photoItem.id)
        .attach("photo", picture, "item.jpg");
    expect((await upload()).status).toBe(201);
    const submitted = await as(auditor).post(`/api/audits/${auditId}/submit`);
    expect(submitted.status).toBe(200);
    const logBefore = await testApp()
      .deps.db.select({ n: count() })
      .from(changeLog)
      .where(eq(changeLog.entityId, auditId));

    const answerAgain = await as(auditor)
      .put(`/api/audits/${auditId}/answers/${item.id}`)
      .send(body);
    expect(answerAgain.status, JSON.stringify(answerAgain.body)).toBe(200);
    expect(answerAgain.body.answer).toMatchObject({ itemId: item.id, outcome: "pass" });
    const photoAgain = await upload();
    expect(photoAgain.status, JSON.stringify(photoAgain.body)).toBe(200);
    expect(photoAgain.body.photo).toMatchObject({ id: photoId, itemId: photoItem.id });
    const submitAgain = await as(auditor).post(`/api/audits/${auditId}/submit`);
    expect(submitAgain.status).toBe(200);
    expect(submitAgain.body.audit.submittedAt).toBe(submitted.body.audit.submittedAt);

    expect(await countOf(auditPhotos, auditId)).toBe(1);
    expect(await countOf(auditAnswers, auditId)).toBe(detail.items.length);
    const logAfter = await testApp()
      .deps.db.select({ n: count() })
      .from(changeLog)
      .where(eq(changeLog.entityId, auditId));
    expect(logAfter).toEqual(logBefore);
  });

  it("when a changed answer or a new photo arrives after the submit, then 409 and the stored audit is untouched", async () => {
    const { auditId, detail } = await draft();
    const item = detail.items[0];
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const before = await testApp()
      .deps.db.select()
      .from(auditAnswers)
      .where(eq(auditAnswers.auditId, auditId));

    const changed = await as(auditor)
      .put(`/api/audits/${auditId}/answers/${item.id}`)
      .send({ id: crypto.randomUUID(), outcome: "fail", note: "Seen later" });
    expect(changed.status).toBe(409);
    const photo = await as(auditor)
      .post(`/api/audits/${auditId}/photos`)
      .field("id", crypto.randomUUID())
      .field("itemId", item.id)
      .attach("photo", await jpegWithGps({ colour: "#654321" }), "late.jpg");
    expect(photo.status).toBe(409);

    const after = await testApp()
      .deps.db.select()
      .from(auditAnswers)
      .where(eq(auditAnswers.auditId, auditId));
    expect(after).toEqual(before);
    expect(await countOf(auditPhotos, auditId)).toBe(0);
    const [audit] = await testApp().deps.db.select().from(audits).where(eq(audits.id, auditId));
    expect(audit).toMatchObject({ status: "submitted", verdict: "all_clear" });
  });

  it("when an answer id already belongs to another audit, then 409 names the id field and nothing is stored", async () => {
    const first = await draft();
    const second = await draft();
    const [taken] = await testApp()
      .deps.db.select({ id: auditAnswers.id })
      .from(auditAnswers)
      .where(eq(auditAnswers.auditId, first.auditId))
      .limit(1);
    await testApp().deps.db.delete(auditAnswers).where(eq(auditAnswers.auditId, second.auditId));

    const response = await as(auditor)
      .put(`/api/audits/${second.auditId}/answers/${second.detail.items[0].id}`)
      .send({ id: taken!.id, outcome: "pass" });
    expect(response.status, JSON.stringify(response.body)).toBe(409);
    expect(response.body.error.fields).toHaveProperty("id");
    expect(await countOf(auditAnswers, second.auditId)).toBe(0);
  });

  it("when a photo id is sent again with other bytes, another item or for another audit, then 409 names the id field", async () => {
    const first = await draft();
    const second = await draft();
    const photoId = crypto.randomUUID();
    const picture = await jpegWithGps({ colour: "#0a0b0c" });
    const send = (auditId: string, itemId: string, bytes: Buffer) =>
      as(auditor)
        .post(`/api/audits/${auditId}/photos`)
        .field("id", photoId)
        .field("itemId", itemId)
        .attach("photo", bytes, "item.jpg");
    const itemA = first.detail.items[0].id;
    const itemB = first.detail.items[1].id;
    expect((await send(first.auditId, itemA, picture)).status).toBe(201);

    for (const [auditId, itemId, bytes] of [
      [first.auditId, itemA, await jpegWithGps({ colour: "#0c0b0a" })],
      [first.auditId, itemB, picture],
      [second.auditId, second.detail.items[0].id, picture],
    ] as const) {
      const response = await send(auditId, itemId, bytes);
      expect(response.status, JSON.stringify(response.body)).toBe(409);
      expect(response.body.error.fields).toHaveProperty("id");
    }
    expect(await countOf(auditPhotos, first.auditId)).toBe(1);
    expect(await countOf(auditPhotos, second.auditId)).toBe(0);
    const [stored] = await testApp()
      .deps.db.select()
      .from(auditPhotos)
      .where(eq(auditPhotos.id, photoId));
    expect(stored).toMatchObject({ auditId: first.auditId, itemId: itemA });
  });
});
