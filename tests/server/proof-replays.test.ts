import { count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { actionProofs, changeLog } from "../../server/db/schema/index";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

// Proof photos carry an id made on the phone, so an upload sent again after a lost answer is
// stored once.
describe("proof replays", () => {
  let networkId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let auditor: SignedInPerson;
  let lead: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db)).id;
    const siteId = (await insertSite(db, networkId)).id;
    floor = await insertFloor(db, siteId);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  /** An open action of its own, started by the lead. */
  async function startedAction() {
    const space = await insertSpace(testApp().deps.db, floor);
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: ["Spare clean gloves"],
    });
    expect((await as(auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const listed = await as(lead).get(`/api/sites/${space.siteId}/actions?spaceId=${space.id}`);
    const actionId = listed.body.actions[0].id as string;
    expect((await as(lead).post(`/api/actions/${actionId}/start`)).status).toBe(200);
    return actionId;
  }

  const send = (actionId: string, id: string, bytes: Buffer) =>
    as(lead)
      .post(`/api/actions/${actionId}/proofs`)
      .field("id", id)
      .attach("photo", bytes, "fix.jpg");

  const proofsOf = async (actionId: string) => {
    const [row] = await testApp()
      .deps.db.select({ n: count() })
      .from(actionProofs)
      .where(eq(actionProofs.actionId, actionId));
    return row!.n;
  };

  it("when the same proof upload is sent three times, then one proof is stored and each answer shows it", async () => {
    const actionId = await startedAction();
    const id = crypto.randomUUID();
    const picture = await jpegWithGps({ colour: "#3a5f7d" });
    const answers = [];
    for (let i = 0; i < 3; i += 1) answers.push(await send(actionId, id, picture));
    expect(answers.map((response) => response.status)).toEqual([201, 200, 200]);
    for (const response of answers) {
      expect(response.body.proofs).toHaveLength(1);
      expect(response.body.proofs[0].id).toBe(id);
    }
    expect(await proofsOf(actionId)).toBe(1);
    const mine = (
      await testApp().deps.db.select().from(changeLog).where(eq(changeLog.entityId, actionId))
    ).filter((entry) => entry.action === "action.proof_added");
    expect(mine).toHaveLength(1);
  });

  it("when three identical uploads race, then one proof is stored and none answers 5xx", async () => {
    const actionId = await startedAction();
    const id = crypto.randomUUID();
    const picture = await jpegWithGps({ colour: "#5d3a7f" });
    const answers = await Promise.all([0, 1, 2].map(() => send(actionId, id, picture)));
    expect(answers.map((response) => response.status).sort()).toEqual([200, 200, 201]);
    expect(await proofsOf(actionId)).toBe(1);
  });

  it("when a proof is sent again after the owner asked for a check, then the stored proof comes back", async () => {
    const actionId = await startedAction();
    const id = crypto.randomUUID();
    const picture = await jpegWithGps({ colour: "#7d5f3a" });
    expect((await send(actionId, id, picture)).status).toBe(201);
    const sent = await as(lead)
      .post(`/api/actions/${actionId}/ask-check`)
      .send({ note: "Glove boxes mounted" });
    expect(sent.status).toBe(200);
    const again = await send(actionId, id, picture);
    expect(again.status, JSON.stringify(again.body)).toBe(200);
    expect(again.body.action.state).toBe("to_check");
    expect(await proofsOf(actionId)).toBe(1);
  });

  it("when a proof id is reused with other bytes or for another action, or is missing, then 4xx names the id and nothing is stored", async () => {
    const actionId = await startedAction();
    const otherActionId = await startedAction();
    const id = crypto.randomUUID();
    expect((await send(actionId, id, await jpegWithGps({ colour: "#101010" }))).status).toBe(201);

    const otherBytes = await send(actionId, id, await jpegWithGps({ colour: "#202020" }));
    expect(otherBytes.status).toBe(409);
    expect(otherBytes.body.error.fields).toHaveProperty("id");
    const otherAction = await send(otherActionId, id, await jpegWithGps({ colour: "#101010" }));
    expect(otherAction.status).toBe(409);
    expect(otherAction.body.error.fields).toHaveProperty("id");
    const noId = await as(lead)
      .post(`/api/actions/${actionId}/proofs`)
      .attach("photo", await jpegWithGps({ colour: "#303030" }), "fix.jpg");
    expect(noId.status).toBe(400);
    expect(noId.body.error.fields).toHaveProperty("id");
    const badId = await send(actionId, "not-an-id", await jpegWithGps({ colour: "#404040" }));
    expect(badId.status).toBe(400);
    expect(badId.body.error.fields).toHaveProperty("id");

    expect(await proofsOf(actionId)).toBe(1);
    expect(await proofsOf(otherActionId)).toBe(0);
  });
});
