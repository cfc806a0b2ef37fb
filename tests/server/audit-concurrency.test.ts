import { randomInt } from "node:crypto";

import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { readinessOf, scoreOf, type Severity } from "@shared/calc/verdict";

import { createApp } from "../../server/app";
import { connectDatabase, type DatabaseHandle } from "../../server/db/client";
import { auditAnswers, auditPhotos, audits, findings } from "../../server/db/schema/index";
import { buildDeps } from "../../server/deps";
import { storeImage } from "../../server/lib/images";
import { createLogger } from "../../server/lib/logger";
import type { AppDeps } from "../../server/lib/routes";
import { createStorage } from "../../server/lib/storage";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { testEnv } from "../helpers/test-env";

interface Item {
  id: string;
  key: string;
  severity: Severity;
  response: string;
  text: string;
}

// Submit and a dozen answer writes sent at once over HTTP, with a pool large enough that none of
// them waits for a connection: what the verdict was decided from must be what stays stored.
describe("audit submit racing answer writes", () => {
  let database: DatabaseHandle;
  let deps: AppDeps;
  let app: ReturnType<typeof createApp>;
  let networkId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let auditor: SignedInPerson;
  let imageId = "";

  beforeAll(async () => {
    const env = testEnv();
    database = connectDatabase(env.DATABASE_URL, { max: 20 });
    deps = buildDeps(env, database, createLogger(env.LOG_LEVEL), createStorage(env));
    app = createApp(deps);
    networkId = (await insertNetwork(deps.db)).id;
    const siteId = (await insertSite(deps.db, networkId)).id;
    floor = await insertFloor(deps.db, siteId);
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    imageId = (
      await storeImage(deps, {
        siteId,
        uploadedBy: auditor.user.id,
        buffer: await jpegWithGps({ colour: "#2b4c6f" }),
        field: "photo",
      })
    ).id;
  });

  afterAll(async () => {
    await database.close();
  });

  const as = () => api(app, { cookie: auditor.cookie });

  async function raceOnce(round: number) {
    const space = await insertSpace(deps.db, floor);
    const { auditId } = await answeredDraftAudit(deps, {
      networkId,
      space,
      auditorId: auditor.user.id,
      fail: [],
    });
    const detail = (await as().get(`/api/audits/${auditId}`)).body as {
      audit: { zoneType: string };
      items: Item[];
    };
    const checks = detail.items.filter((item) => item.response === "check");
    // Eight items may turn to fail; each already has its photo, so a fail never blocks the submit.
    const changing = checks.slice(0, 8);
    const replaying = checks.slice(8, 12);
    expect(changing).toHaveLength(8);
    expect(replaying).toHaveLength(4);
    await deps.db
      .insert(auditPhotos)
      .values(
        changing.map((item) => ({ id: crypto.randomUUID(), auditId, itemId: item.id, imageId })),
      );

    const change = (item: Item) => ({
      kind: "change" as const,
      item,
      body: { id: crypto.randomUUID(), outcome: "fail", note: `Round ${round}: ${item.text}` },
    });
    const replay = (item: Item) => ({
      kind: "replay" as const,
      item,
      body: { id: crypto.randomUUID(), outcome: "pass" },
    });
    const writes = [...changing.map(change), ...replaying.map(replay)];
    const pause = () => new Promise((resolve) => setTimeout(resolve, randomInt(0, 12)));
    const submitAt = round % (writes.length + 1);

    const requests = writes.map(async (write, index) => {
      await pause();
      const response = await as()
        .put(`/api/audits/${auditId}/answers/${write.item.id}`)
        .send(write.body);
      return { write, index, status: response.status, body: response.body };
    });
    const submitting = (async () => {
      await new Promise((resolve) => setTimeout(resolve, submitAt));
      return as().post(`/api/audits/${auditId}/submit`);
    })();
    const [submit, ...results] = await Promise.all([submitting, ...requests]);

    expect(submit.status, JSON.stringify(submit.body)).toBe(200);
    const [audit] = await deps.db.select().from(audits).where(eq(audits.id, auditId));
    const stored = await deps.db
      .select()
      .from(auditAnswers)
      .where(eq(auditAnswers.auditId, auditId));
    const byItem = new Map(stored.map((answer) => [answer.itemId, answer]));

    // The verdict and score, worked out again from what is stored, are the ones recorded.
    const scored = detail.items.map((item) => ({
      key: item.key,
      text: item.text,
      severity: item.severity,
      outcome: byItem.get(item.id)!.outcome!,
    }));
    expect(audit!.status).toBe("submitted");
    expect(audit!.verdict).toBe(readinessOf(detail.audit.zoneType, scored).verdict);
    expect(audit!.score).toBeCloseTo(scoreOf(scored)!, 12);
    // Nothing stored after the submit; every stored fail has its finding.
    for (const answer of stored) {
      expect(answer.updatedAt.getTime()).toBeLessThanOrEqual(audit!.submittedAt!.getTime());
    }
    const found = await deps.db
      .select({ itemId: findings.itemId })
      .from(findings)
      .where(and(eq(findings.auditId, auditId)));
    expect(found.map((finding) => finding.itemId).sort()).toEqual(
      stored
        .filter((answer) => answer.outcome === "fail")
        .map((answer) => answer.itemId)
        .sort(),
    );

    // Each write either landed before the submit or was refused, except replays, which always
    // answer 200; none answers anything else.
    for (const result of results) {
      const answer = byItem.get(result.write.item.id)!;
      if (result.write.kind === "replay") {
        expect(result.status, JSON.stringify(result.body)).toBe(200);
        expect(answer.outcome).toBe("pass");
      } else if (result.status === 200) {
        expect(answer).toMatchObject({ outcome: "fail", note: result.write.body.note });
      } else {
        expect(result.status, JSON.stringify(result.body)).toBe(409);
        expect(answer).toMatchObject({ outcome: "pass", note: null });
      }
    }

    // After the submit: a change is refused, the same answer again is accepted.
    const landed = results.find(
      (result) => result.write.kind === "change" && result.status === 200,
    );
    const refused = results.find(
      (result) => result.write.kind === "change" && result.status === 409,
    );
    if (landed) {
      const again = await as()
        .put(`/api/audits/${auditId}/answers/${landed.write.item.id}`)
        .send(landed.write.body);
      expect(again.status).toBe(200);
    }
    if (refused) {
      const again = await as()
        .put(`/api/audits/${auditId}/answers/${refused.write.item.id}`)
        .send(refused.write.body);
      expect(again.status).toBe(409);
    }
    return results.filter((result) => result.status === 409).length;
  }

  it("when a submit races a dozen answer writes, then the stored answers are those the verdict was decided from", async () => {
    const refusals: number[] = [];
    for (let round = 0; round < 6; round += 1) refusals.push(await raceOnce(round));
    // The race is real: in at least one round some writes arrived after the submit.
    expect(
      refusals.some((n) => n > 0),
      JSON.stringify(refusals),
    ).toBe(true);
  }, 60_000);
});
