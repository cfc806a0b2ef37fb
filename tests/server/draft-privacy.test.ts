import { beforeAll, describe, expect, it } from "vitest";

import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

// A draft is the auditor's own work in progress: lists already hide it, and reading it by id
// must not show it either.
describe("draft privacy", () => {
  let networkId = "";
  let siteId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let auditor: SignedInPerson;
  let colleague: SignedInPerson;
  let committee: SignedInPerson;
  let siteAdmin: SignedInPerson;
  let networkAdmin: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    floor = await insertFloor(db, siteId);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    colleague = await signInAs(networkId, [{ role: "auditor", siteId }]);
    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    siteAdmin = await signInAs(networkId, [{ role: "administrator", siteId }]);
    networkAdmin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  /** A draft with one photo of its own (bytes no other record uses). */
  async function draftWithPhoto() {
    const space = await insertSpace(testApp().deps.db, floor);
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: [],
    });
    const detail = (await as(auditor).get(`/api/audits/${auditId}`)).body;
    const uploaded = await as(auditor)
      .post(`/api/audits/${auditId}/photos`)
      .field("id", crypto.randomUUID())
      .field("itemId", detail.items[0].id)
      .attach(
        "photo",
        await jpegWithGps({ colour: `#${crypto.randomUUID().slice(0, 6)}` }),
        "a.jpg",
      );
    expect(uploaded.status).toBe(201);
    return { auditId, detail, imageId: uploaded.body.photo.imageId as string };
  }

  it("when another auditor or a committee member opens a draft or its photo by id, then 404", async () => {
    const { auditId, imageId } = await draftWithPhoto();
    for (const person of [colleague, committee]) {
      const audit = await as(person).get(`/api/audits/${auditId}`);
      expect(audit.status, audit.body.audit?.status).toBe(404);
      expect(JSON.stringify(audit.body)).not.toContain(auditor.user.displayName);
      expect((await as(person).get(`/api/images/${imageId}?variant=thumb`)).status).toBe(404);
      expect((await as(person).get(`/api/images/${imageId}`)).status).toBe(404);
    }
  });

  it("when the auditor or an administrator opens the draft, then they see it and its photo", async () => {
    const { auditId, imageId } = await draftWithPhoto();
    for (const person of [auditor, siteAdmin, networkAdmin]) {
      const audit = await as(person).get(`/api/audits/${auditId}`);
      expect(audit.status).toBe(200);
      expect(audit.body.audit.status).toBe("draft");
      expect((await as(person).get(`/api/images/${imageId}?variant=thumb`)).status).toBe(200);
    }
  });

  it("when another auditor writes to a draft by id, then 404 and the draft is unchanged", async () => {
    const { auditId, detail } = await draftWithPhoto();
    const answer = await as(colleague)
      .put(`/api/audits/${auditId}/answers/${detail.items[0].id}`)
      .send({ id: crypto.randomUUID(), outcome: "fail", note: "not mine" });
    expect(answer.status).toBe(404);
    const photo = await as(colleague)
      .post(`/api/audits/${auditId}/photos`)
      .field("id", crypto.randomUUID())
      .attach("photo", await jpegWithGps({ colour: "#777777" }), "b.jpg");
    expect(photo.status).toBe(404);
    expect((await as(colleague).post(`/api/audits/${auditId}/submit`)).status).toBe(404);
    const reread = await as(auditor).get(`/api/audits/${auditId}`);
    expect(reread.body.audit.status).toBe("draft");
    expect(reread.body.photos).toHaveLength(1);
    expect(reread.body.answers.every((a: { outcome: string }) => a.outcome === "pass")).toBe(true);
  });

  it("when the draft is submitted, then everyone at the site may read it and its photo", async () => {
    const { auditId, imageId } = await draftWithPhoto();
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    for (const person of [colleague, committee]) {
      expect((await as(person).get(`/api/audits/${auditId}`)).status).toBe(200);
      expect((await as(person).get(`/api/images/${imageId}?variant=thumb`)).status).toBe(200);
    }
  });
});
