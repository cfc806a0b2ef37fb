import { count, eq, sql } from "drizzle-orm";

import { beforeAll, describe, expect, it } from "vitest";

import {
  changeLog,
  correctiveActions,
  findings,
  observationBreaches,
  observations,
  observationSteps,
  users,
} from "../../server/db/schema/index";
import { purgeObservationDetail } from "../../server/modules/observations/observations.service";
import { insertFloor, insertSpace } from "../factories/audits";
import {
  buildObservation,
  publishedSequence,
  spaceBreach,
  techniqueBreach,
  type PublishedSequence,
} from "../factories/observations";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
const db = () => testApp().deps.db;

async function countWhere(
  table: typeof observations | typeof observationSteps | typeof observationBreaches,
  observationId: string,
) {
  const column = "observationId" in table ? table.observationId : table.id;
  const [row] = await db().select({ n: count() }).from(table).where(eq(column, observationId));
  return row!.n;
}

describe("observations of putting-on and removal", () => {
  let networkId = "";
  let siteA = "";
  let siteB = "";
  let floorA: Awaited<ReturnType<typeof insertFloor>>;
  let auditorA: SignedInPerson;
  let auditorB: SignedInPerson;
  let adminA: SignedInPerson;
  let committee: SignedInPerson;
  let removal: PublishedSequence;

  beforeAll(async () => {
    networkId = (await insertNetwork(db())).id;
    siteA = (await insertSite(db(), networkId)).id;
    siteB = (await insertSite(db(), networkId)).id;
    floorA = await insertFloor(db(), siteA);
    auditorA = await signInAs(networkId, [{ role: "auditor", siteId: siteA }]);
    auditorB = await signInAs(networkId, [{ role: "auditor", siteId: siteB }]);
    adminA = await signInAs(networkId, [{ role: "administrator", siteId: siteA }]);
    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    removal = await publishedSequence(db(), networkId, "standard-removal-1");
  });

  it("when an observation is sent, then sent again three times, then it is stored once and every reply is the same", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const id = crypto.randomUUID();
    const body = buildObservation(space.id, removal, {
      breaches: {
        gown: [techniqueBreach("touched_face_or_clean_clothing", "Cuff brushed the neck")],
      },
      coachingNote: "Showed how to roll the gown away from the body",
    });
    const first = await as(auditorA).put(`/api/observations/${id}`).send(body);
    expect(first.status).toBe(201);
    expect(first.body.observation).toMatchObject({
      id,
      outcome: "breaches_seen",
      breachCount: 1,
      breachedSteps: [3],
      handHygiene: { performed: 1, expected: 1 },
      staffCode: "RN-4471",
      coachingGiven: true,
      findings: [],
    });
    for (let attempt = 0; attempt < 3; attempt += 1) {
      const again = await as(auditorA).put(`/api/observations/${id}`).send(body);
      expect(again.status).toBe(200);
      expect(again.body).toEqual(first.body);
    }
    expect(await countWhere(observations, id)).toBe(1);
    expect(await countWhere(observationSteps, id)).toBe(removal.steps.length);
    expect(await countWhere(observationBreaches, id)).toBe(1);
    const [logged] = await db()
      .select({ n: count() })
      .from(changeLog)
      .where(eq(changeLog.entityId, id));
    expect(logged!.n).toBe(1);
  });

  it("when the same observation arrives four times at once, then one reply is 201, the others 200, and it is stored once", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const id = crypto.randomUUID();
    const body = buildObservation(space.id, removal, {
      breaches: { gown: [spaceBreach("item_dropped_or_wrong_container", "bin_full")] },
    });
    const replies = await Promise.all(
      Array.from({ length: 4 }, () => as(auditorA).put(`/api/observations/${id}`).send(body)),
    );
    expect(replies.map((reply) => reply.status).sort()).toEqual([200, 200, 200, 201]);
    for (const reply of replies) expect(reply.body).toEqual(replies[0]!.body);
    expect(await countWhere(observations, id)).toBe(1);
    expect(await countWhere(observationBreaches, id)).toBe(1);
    const [actions] = await db()
      .select({ n: count() })
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(actions!.n).toBe(1);
  });

  it("when the same id comes with other content, then 409 and the first stays as it was", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const id = crypto.randomUUID();
    const body = buildObservation(space.id, removal);
    expect((await as(auditorA).put(`/api/observations/${id}`).send(body)).status).toBe(201);
    const other = { ...body, staffCode: "RN-9999" };
    const clash = await as(auditorA).put(`/api/observations/${id}`).send(other);
    expect(clash.status).toBe(409);
    const [row] = await db().select().from(observations).where(eq(observations.id, id));
    expect(row!.staffCode).toBe("RN-4471");
    expect(row!.outcome).toBe("clean_run");
  });

  it("when a staff code is recorded, then it appears as no person: not in people, accounts, assignees, who is signed in, or the change log", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const staffCode = `ZQ-${crypto.randomUUID().slice(0, 6).toUpperCase()}`;
    const id = crypto.randomUUID();
    const sent = await as(auditorA)
      .put(`/api/observations/${id}`)
      .send(buildObservation(space.id, removal, { staffCode }));
    expect(sent.status).toBe(201);
    expect(sent.body.observation.staffCode).toBe(staffCode);

    const seen = [
      await as(adminA).get("/api/people"),
      await as(adminA).get(`/api/sites/${siteA}/action-assignees`),
      await as(auditorA).get("/api/auth/me"),
      await as(adminA).get("/api/auth/me"),
    ];
    for (const reply of seen) {
      expect(reply.status).toBe(200);
      expect(JSON.stringify(reply.body)).not.toContain(staffCode);
    }
    const [asUser] = await db()
      .select({ n: count() })
      .from(users)
      .where(
        sql`${users.email} ilike ${`%${staffCode}%`} or ${users.displayName} ilike ${`%${staffCode}%`}`,
      );
    expect(asUser!.n).toBe(0);
    const [logged] = await db()
      .select({ n: count() })
      .from(changeLog)
      .where(sql`${changeLog}::text ilike ${`%${staffCode}%`}`);
    expect(logged!.n).toBe(0);
  });

  it("when an auditor of another site records at this site's space, then it is refused (404 where the site is not theirs, 403 where they only read there) and nothing is stored", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const id = crypto.randomUUID();
    const body = buildObservation(space.id, removal);
    // Site A is not theirs at all: as everywhere in Lintel, it does not exist for them.
    const hidden = await as(auditorB).put(`/api/observations/${id}`).send(body);
    expect(hidden.status).toBe(404);
    expect(await countWhere(observations, id)).toBe(0);
    // An auditor of site B who may read site A (a committee member there) is refused outright.
    const reader = await signInAs(networkId, [
      { role: "auditor", siteId: siteB },
      { role: "committee_member", siteId: siteA },
    ]);
    const refused = await as(reader).put(`/api/observations/${id}`).send(body);
    expect(refused.status).toBe(403);
    expect(await countWhere(observations, id)).toBe(0);
    // An administrator of the site may read but not observe.
    const byAdmin = await as(adminA).put(`/api/observations/${id}`).send(body);
    expect(byAdmin.status).toBe(403);
    expect(await countWhere(observations, id)).toBe(0);
  });

  it("when a committee member or another site's auditor reads an observation, then the committee member sees no staff code and the other auditor gets nothing", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const id = crypto.randomUUID();
    await as(auditorA).put(`/api/observations/${id}`).send(buildObservation(space.id, removal));
    const byCommittee = await as(committee).get(`/api/observations/${id}`);
    expect(byCommittee.status).toBe(200);
    expect(byCommittee.body.observation.staffCode).toBeNull();
    expect(byCommittee.body.observation.outcome).toBe("clean_run");
    const list = await as(committee).get(`/api/spaces/${space.id}/observations`);
    expect(list.body.observations.map((o: { staffCode: string | null }) => o.staffCode)).toEqual([
      null,
    ]);
    const byAdmin = await as(adminA).get(`/api/spaces/${space.id}/observations`);
    expect(byAdmin.body.observations[0].staffCode).toBe("RN-4471");
    expect((await as(auditorB).get(`/api/observations/${id}`)).status).toBe(404);
  });

  it("when input is wrong, then 400 naming the field and nothing stored", async () => {
    const doffing = await insertSpace(db(), floorA, "doffing_area");
    const room = await insertSpace(db(), floorA, "isolation_room");
    const good = buildObservation(doffing.id, removal);
    const cases: [string, object][] = [
      ["steps", { ...good, steps: good.steps.slice(1) }],
      [
        "steps.1.stepId",
        { ...good, steps: [good.steps[0], good.steps[0], ...good.steps.slice(2)] },
      ],
      ["staffCode", { ...good, staffCode: "Jane Smith" }],
      ["spaceId", { ...good, spaceId: room.id }],
      ["sequenceVersionId", { ...good, sequenceVersionId: crypto.randomUUID() }],
      ["finishedAt", { ...good, finishedAt: "2020-01-01T00:00:00Z" }],
      [
        "steps.0.breaches",
        {
          ...good,
          steps: [{ ...good.steps[0], done: false, breaches: [] }, ...good.steps.slice(1)],
        },
      ],
      [
        "steps.0.breaches.0.spaceProblem",
        {
          ...good,
          steps: [
            {
              ...good.steps[0],
              breaches: [{ kind: "out_of_order", cause: "space", spaceProblem: null, note: null }],
            },
            ...good.steps.slice(1),
          ],
        },
      ],
    ];
    for (const [field, body] of cases) {
      const id = crypto.randomUUID();
      const reply = await as(auditorA).put(`/api/observations/${id}`).send(body);
      expect(reply.status, field).toBe(400);
      expect(Object.keys(reply.body.error.fields ?? {}), field).toContain(field);
      expect(await countWhere(observations, id)).toBe(0);
    }
  });

  it("when a sequence version of another network is named, then 400 naming the sequence version", async () => {
    const otherNetwork = (await insertNetwork(db())).id;
    const theirs = await publishedSequence(db(), otherNetwork, "standard-removal-1");
    const space = await insertSpace(db(), floorA, "doffing_area");
    const reply = await as(auditorA)
      .put(`/api/observations/${crypto.randomUUID()}`)
      .send(buildObservation(space.id, theirs));
    expect(reply.status).toBe(400);
    expect(reply.body.error.fields).toHaveProperty("sequenceVersionId");
  });

  it("when a breach is caused by the space, then it opens the matching item's corrective action, and a second such breach joins it", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const first = crypto.randomUUID();
    const reply = await as(auditorA)
      .put(`/api/observations/${first}`)
      .send(
        buildObservation(space.id, removal, {
          breaches: {
            "hand-hygiene": [spaceBreach("hand_hygiene_missed", "no_hand_rub_within_reach")],
          },
        }),
      );
    expect(reply.status).toBe(201);
    expect(reply.body.observation.handHygiene).toEqual({ performed: 0, expected: 1 });
    const opened = await db()
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(opened.map((a) => [a.itemKey, a.state])).toEqual([["doff.hand-rub-reach", "to_fix"]]);
    expect(reply.body.observation.findings).toEqual([
      { itemKey: "doff.hand-rub-reach", actionId: opened[0]!.id },
    ]);
    // The action's timeline says where it came from, in Lintel's words.
    const detail = await as(adminA).get(`/api/actions/${opened[0]!.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.timeline[0].text).toContain("no hand rub within reach");

    const second = crypto.randomUUID();
    const again = await as(auditorA)
      .put(`/api/observations/${second}`)
      .send(
        buildObservation(space.id, removal, {
          breaches: {
            gloves: [spaceBreach("item_dropped_or_wrong_container", "no_hand_rub_within_reach")],
          },
        }),
      );
    expect(again.status).toBe(201);
    const after = await db()
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(after).toHaveLength(1);
    expect(again.body.observation.findings).toEqual([
      { itemKey: "doff.hand-rub-reach", actionId: opened[0]!.id },
    ]);
    // Observations write no audit finding rows: the breach holds the link.
    const [auditFindings] = await db()
      .select({ n: count() })
      .from(findings)
      .where(eq(findings.spaceId, space.id));
    expect(auditFindings!.n).toBe(0);
  });

  it("when the area check before the observation fails, then that is a finding against the same checklist item of the space, joined by a space-caused breach of the same kind", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const body = buildObservation(space.id, removal, {
      breaches: { gloves: [spaceBreach("item_dropped_or_wrong_container", "bin_full")] },
    });
    body.precheck = [
      { key: "waste_not_overfull", ok: false },
      { key: "hand_rub_within_reach", ok: false },
      { key: "sides_marked", ok: true },
    ];
    const reply = await as(auditorA).put(`/api/observations/${crypto.randomUUID()}`).send(body);
    expect(reply.status).toBe(201);
    const opened = await db()
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    // The over-full bin was seen twice (area check and breach): one action for it.
    expect(opened.map((a) => a.itemKey).sort()).toEqual(["doff.bins-fill", "doff.hand-rub-reach"]);
    const idOf = (key: string) => opened.find((a) => a.itemKey === key)!.id;
    expect(
      [...reply.body.observation.findings].sort((a: { itemKey: string }, b: { itemKey: string }) =>
        a.itemKey.localeCompare(b.itemKey),
      ),
    ).toEqual([
      { itemKey: "doff.bins-fill", actionId: idOf("doff.bins-fill") },
      { itemKey: "doff.hand-rub-reach", actionId: idOf("doff.hand-rub-reach") },
    ]);
    // Read back later, the findings are the same.
    const read = await as(auditorA).get(`/api/observations/${reply.body.observation.id}`);
    expect(read.body.observation.findings).toHaveLength(2);
  });

  it("when a breach is the person's technique, then no corrective action is opened, whatever the kind", async () => {
    const space = await insertSpace(db(), floorA, "doffing_area");
    const reply = await as(auditorA)
      .put(`/api/observations/${crypto.randomUUID()}`)
      .send(
        buildObservation(space.id, removal, {
          breaches: {
            gloves: [techniqueBreach("out_of_order")],
            "hand-hygiene": [techniqueBreach("hand_hygiene_missed")],
          },
        }),
      );
    expect(reply.status).toBe(201);
    expect(reply.body.observation.breachCount).toBe(2);
    expect(reply.body.observation.findings).toEqual([]);
    const [actions] = await db()
      .select({ n: count() })
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, space.id));
    expect(actions!.n).toBe(0);
  });
});

describe("observation settings and retention", () => {
  it("when an administrator sets the retention, then it is kept; 29 days or a committee member is refused", async () => {
    const networkId = (await insertNetwork(db())).id;
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    const committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    expect((await as(admin).get("/api/observation-settings")).body).toEqual({ retentionDays: 730 });
    const saved = await as(admin).put("/api/observation-settings").send({ retentionDays: 90 });
    expect(saved.status).toBe(200);
    expect(saved.body).toEqual({ retentionDays: 90 });
    const short = await as(admin).put("/api/observation-settings").send({ retentionDays: 29 });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty("retentionDays");
    expect(
      (await as(committee).put("/api/observation-settings").send({ retentionDays: 60 })).status,
    ).toBe(403);
    expect((await as(admin).get("/api/observation-settings")).body).toEqual({ retentionDays: 90 });
  });

  it("when an observation is older than the network keeps detail, then the purge removes the staff code, notes, breaches and pre-check, and keeps the outcome and counts", async () => {
    const networkId = (await insertNetwork(db())).id;
    const siteId = (await insertSite(db(), networkId)).id;
    const floor = await insertFloor(db(), siteId);
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    const removal = await publishedSequence(db(), networkId, "standard-removal-1");
    expect(
      (await as(admin).put("/api/observation-settings").send({ retentionDays: 30 })).status,
    ).toBe(200);
    const space = await insertSpace(db(), floor, "doffing_area");
    const day = 24 * 60 * 60 * 1000;
    const record = async (daysAgo: number) => {
      const id = crypto.randomUUID();
      const reply = await as(auditor)
        .put(`/api/observations/${id}`)
        .send(
          buildObservation(space.id, removal, {
            finishedAt: new Date(Date.now() - daysAgo * day),
            breaches: {
              gown: [techniqueBreach("touched_face_or_clean_clothing", "Touched the collar")],
            },
            coachingNote: "Talked it through",
          }),
        );
      expect(reply.status).toBe(201);
      return id;
    };
    const old = await record(31);
    const recent = await record(29);

    expect(await purgeObservationDetail(db())).toBeGreaterThanOrEqual(1);
    const [gone] = await db().select().from(observations).where(eq(observations.id, old));
    expect(gone).toMatchObject({
      staffCode: null,
      coachingNote: null,
      precheck: null,
      outcome: "breaches_seen",
      breachCount: 1,
      handHygienePerformed: 1,
      handHygieneExpected: 1,
      coachingGiven: true,
    });
    expect(gone!.detailRemovedAt).not.toBeNull();
    expect(await countWhere(observationBreaches, old)).toBe(0);
    expect(await countWhere(observationSteps, old)).toBe(removal.steps.length);
    const reread = await as(auditor).get(`/api/observations/${old}`);
    expect(reread.body.observation).toMatchObject({
      staffCode: null,
      breachedSteps: [3],
      breachCount: 1,
    });

    const [kept] = await db().select().from(observations).where(eq(observations.id, recent));
    expect(kept).toMatchObject({ staffCode: "RN-4471", coachingNote: "Talked it through" });
    expect(kept!.detailRemovedAt).toBeNull();
    expect(await countWhere(observationBreaches, recent)).toBe(1);

    // A second round finds nothing more to remove here.
    await purgeObservationDetail(db());
    const [still] = await db().select().from(observations).where(eq(observations.id, old));
    expect(still!.detailRemovedAt).toEqual(gone!.detailRemovedAt);
  });
});

describe("sequences", () => {
  it("when an auditor lists sequences, then Lintel's four defaults are published as version 1; a facilities lead is refused", async () => {
    const networkId = (await insertNetwork(db())).id;
    const siteId = (await insertSite(db(), networkId)).id;
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    const lead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
    const reply = await as(auditor).get("/api/sequences");
    expect(reply.status).toBe(200);
    expect(
      reply.body.sequences.map((s: { key: string; published: { version: number } }) => [
        s.key,
        s.published.version,
      ]),
    ).toEqual([
      ["standard-putting-on", 1],
      ["standard-removal-1", 1],
      ["standard-removal-2", 1],
      ["enhanced-removal", 1],
    ]);
    expect((await as(lead).get("/api/sequences")).status).toBe(403);
  });

  it("when an administrator drafts and publishes a sequence, then it is version 2 and an observation with version 1 still records", async () => {
    const networkId = (await insertNetwork(db())).id;
    const siteId = (await insertSite(db(), networkId)).id;
    const floor = await insertFloor(db(), siteId);
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    const auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    const v1 = await publishedSequence(db(), networkId, "standard-removal-1");
    const draft = await as(admin)
      .put("/api/sequences/standard-removal-1/draft")
      .send({
        title: "Removing PPE, our order",
        kind: "removal",
        steps: [
          { key: "gloves", text: "Gloves off", handHygiene: false, watchFor: ["out_of_order"] },
          {
            key: "hand-hygiene",
            text: "Hand hygiene",
            handHygiene: true,
            watchFor: ["hand_hygiene_missed"],
          },
        ],
      });
    expect(draft.status).toBe(200);
    expect(draft.body.sequence).toMatchObject({ version: 2, status: "draft" });
    const wrongKind = await as(admin)
      .put("/api/sequences/standard-removal-1/draft")
      .send({
        title: "x",
        kind: "putting_on",
        steps: [{ text: "x", handHygiene: false, watchFor: [] }],
      });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields).toHaveProperty("kind");
    const published = await as(admin).post("/api/sequences/standard-removal-1/publish");
    expect(published.status).toBe(200);
    expect(published.body.published).toMatchObject({ version: 2, status: "published" });
    expect((await as(admin).post("/api/sequences/standard-removal-1/publish")).status).toBe(404);

    const space = await insertSpace(db(), floor, "doffing_area");
    const old = await as(auditor)
      .put(`/api/observations/${crypto.randomUUID()}`)
      .send(buildObservation(space.id, v1));
    expect(old.status).toBe(201);
    expect(old.body.observation.sequenceVersionId).toBe(v1.id);

    const fresh = await as(admin)
      .put("/api/sequences/site-specific-removal/draft")
      .send({
        title: "Our removal",
        kind: "removal",
        steps: [{ text: "Gloves", handHygiene: false, watchFor: [] }],
      });
    expect(fresh.body.sequence).toMatchObject({ key: "site-specific-removal", version: 1 });
    expect((await as(admin).delete("/api/sequences/site-specific-removal/draft")).status).toBe(204);
  });
});
