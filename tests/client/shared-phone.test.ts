import "fake-indexeddb/auto";

import type { StartAuditBody } from "@shared/schemas/audits";
import { IDBFactory } from "fake-indexeddb";
import { afterEach, describe, expect, it, vi } from "vitest";

import { describeUnsent } from "@/app/sign-out-panel";
import { describeSync } from "@/features/walkthroughs/components/sync-status";
import { auditDevice, closeAuditDevice } from "@/features/walkthroughs/lib/audit-device";
import { emptyAnswer } from "@/features/walkthroughs/lib/answer-rules";
import { openAuditStore } from "@/features/walkthroughs/lib/offline-store";
import { prepareAuditDetail } from "@/features/walkthroughs/lib/prepared-audit";
import { syncOnce } from "@/features/walkthroughs/lib/sync-queue";
import { forgetPhonePerson, rememberPhonePerson } from "@/lib/phone-person";

import {
  doffingItems,
  doffingSpaceId,
  FakeLintel,
  isolationSpaceId,
  testId,
} from "./support/audit-data";

const personA = "0a1b2c3d-4e5f-4061-8a7b-8c9d0e1f2a3b";
const personB = "1b2c3d4e-5f60-4172-9b8c-9d0e1f2a3b4c";
const siteId = "5e6f7a8b-9c0d-4e1f-8a2b-3c4d5e6f7a8b";
const at = (minute: number) => new Date(Date.UTC(2026, 2, 2, 9, minute));

afterEach(async () => {
  await closeAuditDevice();
  forgetPhonePerson();
  globalThis.indexedDB = new IDBFactory();
  vi.unstubAllGlobals();
});

const publishedDoffing = (id = testId()) => ({
  id,
  version: 3,
  zoneType: "doffing_area" as const,
  status: "published" as const,
  items: doffingItems(),
});

const doffingSpace = {
  id: doffingSpaceId,
  siteId,
  name: "Doffing area 2",
  zoneType: "doffing_area" as const,
  constructionClass: null,
  volumeM3: null,
};

describe("the audit kept on a phone built from what it keeps", () => {
  it("when the space and its checklist are kept, then the audit carries that checklist version, its items and no room facts for a doffing area", () => {
    const checklist = publishedDoffing();
    const detail = prepareAuditDetail({
      auditId: "a",
      space: doffingSpace,
      checklist,
      auditor: { id: personA, name: "Rafael Dunmore" },
      startedAt: at(0),
    })!;
    expect(detail.audit).toMatchObject({
      spaceId: doffingSpaceId,
      siteId,
      checklistVersionId: checklist.id,
      checklistVersion: 3,
      auditorId: personA,
      status: "draft",
      startedAt: at(0).toISOString(),
    });
    expect(detail.items.map((item) => item.id)).toEqual(checklist.items.map((item) => item.id));
    expect(detail.room).toBeNull();
  });

  it("when the space is an isolation room, then the room facts carry its volume and the air changes its class needs; another zone's checklist makes nothing", () => {
    const room = {
      ...doffingSpace,
      id: isolationSpaceId,
      zoneType: "isolation_room" as const,
      constructionClass: "existing" as const,
      volumeM3: 42,
    };
    const detail = prepareAuditDetail({
      auditId: "a",
      space: room,
      checklist: { ...publishedDoffing(), zoneType: "isolation_room" },
      auditor: { id: personA, name: "Rafael Dunmore" },
      startedAt: at(0),
    })!;
    expect(detail.room).toEqual({
      volumeM3: 42,
      constructionClass: "existing",
      minimumAirChanges: 6,
    });
    expect(
      prepareAuditDetail({
        auditId: "a",
        space: room,
        checklist: publishedDoffing(),
        auditor: { id: personA, name: "Rafael Dunmore" },
        startedAt: at(0),
      }),
    ).toBeNull();
  });

  it("when an audit begun from the kept checklist is sent, then its start names that version", async () => {
    const store = await openAuditStore({ name: "kept-start" });
    const checklist = publishedDoffing();
    const auditId = testId();
    const detail = prepareAuditDetail({
      auditId,
      space: doffingSpace,
      checklist,
      auditor: { id: personA, name: "Rafael Dunmore" },
      startedAt: at(0),
    });
    const audit = await store.openDraft({
      spaceId: doffingSpaceId,
      spaceName: null,
      auditorId: personA,
      auditId,
      now: at(1),
      detail,
    });
    // The items are there before Lintel has heard of the audit.
    expect(audit.detail?.items).toHaveLength(checklist.items.length);
    const server = new FakeLintel(checklist.items);
    const sent: StartAuditBody[] = [];
    const startAudit = server.startAudit.bind(server);
    server.startAudit = (id: string, body: StartAuditBody) => {
      sent.push(body);
      return startAudit(id, body);
    };
    expect(await syncOnce(store, server)).toEqual({ kind: "done", sent: 1 });
    expect(sent).toEqual([
      { spaceId: doffingSpaceId, startedAt: at(1).toISOString(), checklistVersionId: checklist.id },
    ]);
    store.close();
  });
});

describe("a phone shared by several people", () => {
  it("when drafts sit in the store everyone once shared, then each person's move to their own store on first open and nobody else's come with them", async () => {
    const shared = await openAuditStore({ name: "lintel-audits-shared-test", newId: testId });
    const items = doffingItems();
    const mine = await shared.openDraft({
      spaceId: doffingSpaceId,
      spaceName: "Doffing area 1",
      auditorId: personA,
      auditId: testId(),
      now: at(0),
    });
    await shared.saveAnswer(mine.auditId, items[0]!.id, { ...emptyAnswer, outcome: "pass" }, at(1));
    const theirs = await shared.openDraft({
      spaceId: isolationSpaceId,
      spaceName: "Isolation room 1",
      auditorId: personB,
      auditId: testId(),
      now: at(2),
    });
    shared.close();

    const storeA = await openAuditStore({
      name: "a",
      personId: personA,
      sharedName: "lintel-audits-shared-test",
    });
    expect((await storeA.getAudit(mine.auditId))?.auditorId).toBe(personA);
    expect(await storeA.getAudit(theirs.auditId)).toBeUndefined();
    expect((await storeA.getAnswer(mine.auditId, items[0]!.id))?.outcome).toBe("pass");
    expect((await storeA.queuedChanges()).map((change) => change.kind)).toEqual([
      "start",
      "answer",
    ]);
    expect(await storeA.unsentWork()).toEqual({ audits: 1, observations: 0, changes: 2 });

    const storeB = await openAuditStore({
      name: "b",
      personId: personB,
      sharedName: "lintel-audits-shared-test",
    });
    expect(await storeB.getAudit(mine.auditId)).toBeUndefined();
    expect(await storeB.getAudit(theirs.auditId)).toBeDefined();
    await vi.waitFor(async () =>
      expect((await indexedDB.databases()).map((info) => info.name)).not.toContain(
        "lintel-audits-shared-test",
      ),
    );
    storeA.close();
    storeB.close();
  });

  it("when another person signs in on the phone, then the first person's queue is neither opened nor sent under the new session", async () => {
    const calls: string[] = [];
    vi.stubGlobal(
      "fetch",
      vi.fn(async (input: RequestInfo | URL) => {
        calls.push(String(input));
        throw new TypeError("Failed to fetch");
      }),
    );
    rememberPhonePerson(personA);
    const deviceA = await auditDevice();
    const auditId = testId();
    await deviceA.store.openDraft({
      spaceId: doffingSpaceId,
      spaceName: "Doffing area 1",
      auditorId: personA,
      auditId,
      now: at(0),
    });
    await vi.waitFor(() => expect(calls.some((url) => url.includes(auditId))).toBe(true));

    rememberPhonePerson(personB);
    const sentBefore = calls.length;
    const deviceB = await auditDevice();
    expect(deviceB.personId).toBe(personB);
    expect(await deviceB.store.getAudit(auditId)).toBeUndefined();
    expect(await deviceB.store.unsentWork()).toEqual({ audits: 0, observations: 0, changes: 0 });
    await deviceB.sync.kick();
    // The first person's queue, had it still been running, would have retried by now.
    await deviceA.sync.kick().catch(() => undefined);
    expect(calls.slice(sentBefore).filter((url) => url.includes(auditId))).toEqual([]);

    // Back to the first person: their work is still there, waiting.
    rememberPhonePerson(personA);
    const again = await auditDevice();
    expect(await again.store.unsentWork()).toEqual({ audits: 1, observations: 0, changes: 1 });
  });
});

describe("what the phone says about work not yet in Lintel", () => {
  it("when changes wait with no signal, then the status says they are saved only on this phone; once sent, that they arrived", () => {
    const base = { held: 0, syncing: false, signedOut: false, away: null };
    expect(describeSync({ ...base, waiting: 3, online: false }).text).toBe(
      "Offline — 3 changes saved on this phone only, sent when there is signal",
    );
    expect(describeSync({ ...base, waiting: 1, online: true }).text).toBe(
      "1 change saved on this phone only — sending to Lintel",
    );
    expect(describeSync({ ...base, waiting: 0, online: true }).text).toBe(
      "All changes arrived in Lintel",
    );
  });

  it("when someone signs out with unsent work, then it is counted in words", () => {
    expect(describeUnsent({ audits: 2, observations: 0, changes: 14 })).toBe(
      "2 audits with 14 changes",
    );
    expect(describeUnsent({ audits: 1, observations: 0, changes: 1 })).toBe(
      "1 audit with 1 change",
    );
    expect(describeUnsent({ audits: 1, observations: 0, changes: 0 })).toBe(
      "1 audit not yet submitted",
    );
    // An observation finished offline is one queued change of its own.
    expect(describeUnsent({ audits: 0, observations: 1, changes: 1 })).toBe("1 observation");
    expect(describeUnsent({ audits: 1, observations: 2, changes: 3 })).toBe(
      "1 audit and 2 observations",
    );
  });
});
