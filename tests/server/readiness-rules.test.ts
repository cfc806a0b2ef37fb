import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { airflowNotConfirmedReason } from "@shared/calc/verdict";
import type { AuditDetail } from "@shared/schemas/audits";

import { auditAnswers, audits, changeLog } from "../../server/db/schema/index";
import { jpegWithGps } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const square: [number, number][] = [
  [0, 0],
  [100, 0],
  [100, 100],
  [0, 100],
];

// The verdict rules are Lintel's own (shared/calc/verdict.ts, version 2) on top of the CDC 2005 TB
// guidelines, MMWR 54(RR-17): at least 0.01 in. w.c. / 2.5 Pa negative to the corridor, checked
// by smoke tube or monitor (document confirmed; clauses from memory).
describe("readiness of an isolation room through the real routes", () => {
  let siteId = "";
  let floorId = "";
  let auditor: SignedInPerson;
  let admin: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    const networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    auditor = await signInAs(networkId, [{ role: "auditor", siteId }]);
    admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    floorId = (
      await api(undefined, { cookie: admin.cookie })
        .post(`/api/sites/${siteId}/floors`)
        .send({ building: "B", level: 1, name: "L1" })
    ).body.floor.id;
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  async function startIsolationRoom() {
    const space = await as(admin)
      .post(`/api/floors/${floorId}/spaces`)
      .send({
        zoneType: "isolation_room",
        name: `Isolation ${Math.random()}`,
        polygon: square,
        constructionClass: "new_or_renovated",
        volumeM3: 80,
      });
    expect(space.status, JSON.stringify(space.body)).toBe(201);
    const auditId = crypto.randomUUID();
    const started = await as(auditor)
      .put(`/api/audits/${auditId}`)
      .send({ spaceId: space.body.space.id, startedAt: new Date().toISOString() });
    return { auditId, detail: started.body as AuditDetail };
  }

  const byKey = (detail: AuditDetail, key: string) => {
    const found = detail.items.find((item) => item.key === key);
    if (!found) throw new Error(`no item ${key}`);
    return found;
  };

  const answer = (auditId: string, itemId: string, body: object) =>
    as(auditor)
      .put(`/api/audits/${auditId}/answers/${itemId}`)
      .send({ id: crypto.randomUUID(), ...body });

  /** Every item passes (readings comfortably inside their limits) except those in `except`. */
  async function answerAll(auditId: string, detail: AuditDetail, except: Record<string, object>) {
    for (const item of detail.items) {
      const body =
        except[item.key] ??
        (item.response === "reading"
          ? item.quantity === "pressure"
            ? { outcome: "pass", value: -8, unit: "Pa" }
            : item.quantity === "air_changes"
              ? { outcome: "pass", value: 14, unit: "ach" }
              : item.quantity === "percent"
                ? { outcome: "pass", value: 70, unit: "percent" }
                : item.quantity === "minutes"
                  ? { outcome: "pass", value: 5, unit: "min" }
                  : { outcome: "pass", value: 1200, unit: "m3/h" }
          : item.response === "count"
            ? { outcome: "pass", count: 3 }
            : item.response === "choice"
              ? { outcome: "pass", choice: item.choices!.find((c) => c.passes)!.value }
              : { outcome: "pass" });
      const response = await answer(auditId, item.id, body);
      expect(response.status, `${item.key}: ${JSON.stringify(response.body)}`).toBe(200);
    }
  }

  const submit = (auditId: string) => as(auditor).post(`/api/audits/${auditId}/submit`);

  it("when pressure and the visual test are both not applicable and everything else passes, then hold until fixed: inward airflow not confirmed", async () => {
    const { auditId, detail } = await startIsolationRoom();
    await answerAll(auditId, detail, {
      "room.pressure": { outcome: "not_applicable", note: "Monitor out of service" },
      "room.smoke-test": { outcome: "not_applicable", note: "No smoke tube on the unit" },
    });
    const submitted = await submit(auditId);
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
    expect(submitted.body.audit).toMatchObject({
      verdict: "hold",
      verdictReasons: [airflowNotConfirmedReason],
      rulesVersion: 2,
    });
    expect(airflowNotConfirmedReason).toContain("Inward airflow not confirmed");
    // The page reading the audit later gets the same reasons.
    const read = await as(auditor).get(`/api/audits/${auditId}`);
    expect(read.body.audit.verdictReasons).toEqual([airflowNotConfirmedReason]);
  });

  it("when the visual test fails while the pressure reading passes, then hold until fixed, the visual test named", async () => {
    const { auditId, detail } = await startIsolationRoom();
    await answerAll(auditId, detail, {
      "room.smoke-test": { outcome: "fail", note: "Smoke drifts out under the door" },
    });
    const submitted = await submit(auditId);
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
    expect(submitted.body.audit.verdict).toBe("hold");
    expect(submitted.body.audit.verdictReasons).toEqual([
      expect.stringContaining(byKey(detail, "room.smoke-test").text),
    ]);
  });

  it("when −0.010 in. w.c. is entered, then the pressure passes and confirms inward airflow: ready", async () => {
    const { auditId, detail } = await startIsolationRoom();
    const pressure = byKey(detail, "room.pressure");
    await answerAll(auditId, detail, {
      "room.pressure": { outcome: "fail", value: -0.01, unit: "inH2O" },
      "room.smoke-test": { outcome: "not_applicable", note: "Monitor reading used instead" },
    });
    const [stored] = await testApp()
      .deps.db.select()
      .from(auditAnswers)
      .where(and(eq(auditAnswers.auditId, auditId), eq(auditAnswers.itemId, pressure.id)));
    expect(stored).toMatchObject({ outcome: "pass", unit: "inH2O", enteredValue: -0.01 });
    expect(stored!.value).toBeCloseTo(-2.4908891, 6);
    const submitted = await submit(auditId);
    expect(submitted.body.audit).toMatchObject({ verdict: "all_clear", verdictReasons: [] });
  });

  it("when −2.4 Pa is entered, then the pressure fails; −2.5 Pa passes", async () => {
    const { auditId, detail } = await startIsolationRoom();
    const pressure = byKey(detail, "room.pressure");
    const short = await answer(auditId, pressure.id, { outcome: "pass", value: -2.4, unit: "Pa" });
    expect(short.body.answer).toMatchObject({ outcome: "fail", enteredValue: -2.4, unit: "Pa" });
    const enough = await answer(auditId, pressure.id, {
      outcome: "fail",
      value: -2.5,
      unit: "Pa",
    });
    expect(enough.body.answer).toMatchObject({ outcome: "pass", value: -2.5, enteredValue: -2.5 });
  });

  it("when the pressure fails at −2.4 Pa and the visual test is not applicable, then hold until fixed, naming both", async () => {
    const { auditId, detail } = await startIsolationRoom();
    await answerAll(auditId, detail, {
      "room.pressure": { outcome: "pass", value: -2.4, unit: "Pa", note: "Reading low" },
      "room.smoke-test": { outcome: "not_applicable", note: "No smoke tube" },
    });
    const photo = await as(auditor)
      .post(`/api/audits/${auditId}/photos`)
      .field("id", crypto.randomUUID())
      .field("itemId", byKey(detail, "room.pressure").id)
      .attach("photo", await jpegWithGps({ colour: "#5050a0" }), "gauge.jpg");
    expect(photo.status).toBe(201);
    const submitted = await submit(auditId);
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
    expect(submitted.body.audit.verdict).toBe("hold");
    expect(submitted.body.audit.verdictReasons).toEqual([
      `Critical item failed: ${byKey(detail, "room.pressure").text}`,
      airflowNotConfirmedReason,
    ]);
  });

  it("when a verdict decided by version 1 is amended, then it is decided again under version 2 and the change log says so", async () => {
    const { auditId, detail } = await startIsolationRoom();
    await answerAll(auditId, detail, {
      "room.smoke-test": { outcome: "not_applicable", note: "Monitor reading used instead" },
    });
    expect((await submit(auditId)).body.audit.verdict).toBe("all_clear");
    // As a verdict stored before version 2 is: version 1, no reasons kept.
    await testApp()
      .deps.db.update(audits)
      .set({ rulesVersion: 1, verdictReasons: null })
      .where(eq(audits.id, auditId));

    const amended = await as(admin)
      .post(`/api/audits/${auditId}/amendments`)
      .send({
        itemId: byKey(detail, "room.pressure").id,
        outcome: "not_applicable",
        note: "The monitor had not been calibrated",
        reason: "The reading came from an uncalibrated monitor",
      });
    expect(amended.status, JSON.stringify(amended.body)).toBe(200);
    expect(amended.body.audit).toMatchObject({
      verdict: "hold",
      rulesVersion: 2,
      verdictReasons: [airflowNotConfirmedReason],
    });
    const [entry] = await testApp()
      .deps.db.select()
      .from(changeLog)
      .where(and(eq(changeLog.entityId, auditId), eq(changeLog.action, "audit.amended")));
    expect(entry!.before).toMatchObject({ verdict: "all_clear", rulesVersion: 1 });
    expect(entry!.after).toMatchObject({ verdict: "hold", rulesVersion: 2 });
  });
});
