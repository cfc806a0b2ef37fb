import "fake-indexeddb/auto";

import { openDB } from "idb";
import { afterEach, beforeEach, describe, expect, it } from "vitest";

import { describeSync } from "@/features/walkthroughs/components/sync-status";
import {
  newObservationDraft,
  type ObservationDraft,
  type ObservationEvent,
  observationBody,
  observationReducer,
} from "@/features/walkthroughs/lib/observation-flow";
import {
  type AuditStore,
  ObservationFinishedError,
  openAuditStore,
} from "@/features/walkthroughs/lib/offline-store";
import { createSyncScheduler, syncOnce } from "@/features/walkthroughs/lib/sync-queue";

import { connectionLost, doffingItems, FakeLintel, testId } from "./support/audit-data";
import { doffingAreaSpaceId, removalSequence } from "./support/observation-data";

const observerId = "2d8b4c1e-5f6a-4b7c-8d9e-0f1a2b3c4d5e";
const at = (minute: number) => new Date(Date.UTC(2026, 2, 2, 9, minute));

let store: AuditStore;
let databaseNumber = 0;

beforeEach(async () => {
  databaseNumber += 1;
  store = await openAuditStore({ name: `observations-test-${databaseNumber}`, newId: testId });
});

afterEach(() => {
  store.close();
});

/** A removal observation with one breach at step 2 and coaching, at its summary. */
function recorded(observationId = testId()): ObservationDraft {
  const events: ObservationEvent[] = [
    { type: "choose-sequence", sequence: removalSequence() },
    { type: "set-person", staffCode: "HCA-17", staffRole: "healthcare_assistant" },
    { type: "begin", now: at(0) },
    { type: "precheck", key: "waste_not_overfull", ok: true },
    { type: "precheck", key: "hand_rub_within_reach", ok: true },
    { type: "precheck", key: "sides_marked", ok: true },
    { type: "precheck-done" },
    { type: "step-done" },
    { type: "open-breach" },
    {
      type: "record-breach",
      breach: {
        kind: "item_dropped_or_wrong_container",
        cause: "space",
        spaceProblem: "bin_full",
        note: null,
      },
    },
    { type: "step-done" },
    { type: "step-done" },
    { type: "step-done" },
    { type: "coaching", given: true, note: "" },
    { type: "coaching-done" },
  ];
  return events.reduce(
    observationReducer,
    newObservationDraft({
      observationId,
      spaceId: doffingAreaSpaceId,
      spaceName: "Doffing area 1",
      zoneType: "doffing_area",
    }),
  );
}

async function finish(draft: ObservationDraft) {
  await store.saveObservationDraft(draft, observerId, at(8));
  await store.finishObservation(draft.observationId, observationBody(draft, at(9))!, at(9));
}

describe("an observation in the phone's store and the audits' queue", () => {
  it("when an observation is being recorded, then it is kept on the phone but nothing is queued until it is finished", async () => {
    const draft = recorded();
    await store.saveObservationDraft(draft, observerId, at(5));

    expect(await store.getObservation(draft.observationId)).toMatchObject({
      state: "recording",
      observerId,
      draft: { phase: "summary" },
    });
    expect(await store.queuedChanges()).toEqual([]);
    expect(await store.unsentWork()).toEqual({ audits: 0, observations: 1, changes: 0 });
  });

  it("when an observation is finished with no signal, then it waits as one change and the status says it is saved on this phone only", async () => {
    const draft = recorded();
    await finish(draft);
    // Finishing twice (a double tap) queues nothing more.
    await store.finishObservation(draft.observationId, observationBody(draft, at(10))!, at(10));

    const changes = await store.queuedChanges();
    expect(changes).toHaveLength(1);
    expect(changes[0]).toMatchObject({ kind: "observation", auditId: draft.observationId });
    expect((await store.getObservation(draft.observationId))!.body!.finishedAt).toBe(
      at(9).toISOString(),
    );
    await expect(store.saveObservationDraft(draft, observerId, at(11))).rejects.toBeInstanceOf(
      ObservationFinishedError,
    );

    const sync = createSyncScheduler({
      store,
      transport: new FakeLintel(doffingItems()),
      isOnline: () => false,
      pollMs: 60_000,
    });
    await sync.kick();
    await expect.poll(() => sync.status().waiting).toBe(1);
    expect(describeSync(sync.status()).text).toBe(
      "Offline — 1 change saved on this phone only, sent when there is signal",
    );
    sync.stop();
  });

  it("when the reply is lost on the way back, then the same observation is sent again under its id and Lintel keeps it once", async () => {
    const server = new FakeLintel(doffingItems());
    const draft = recorded();
    await finish(draft);
    let lose = true;
    server.after = (call) => {
      if (lose && call.startsWith("observation")) throw connectionLost();
    };

    expect((await syncOnce(store, server)).kind).toBe("retry");
    expect(server.observations.stored.size).toBe(1);
    expect((await store.getObservation(draft.observationId))!.state).toBe("finished");

    lose = false;
    expect(await syncOnce(store, server)).toEqual({ kind: "done", sent: 1 });

    expect(server.calls).toEqual([
      `observation ${draft.observationId}`,
      `observation ${draft.observationId}`,
    ]);
    expect(server.observations.stored.size).toBe(1);
    expect(await store.queuedChanges()).toEqual([]);
    const arrived = await store.getObservation(draft.observationId);
    expect(arrived).toMatchObject({
      state: "arrived",
      observation: { id: draft.observationId, breachCount: 1, breachedSteps: [2] },
    });
    expect(await store.unsentWork()).toEqual({ audits: 0, observations: 0, changes: 0 });
    // Nothing left: a later run sends nothing more.
    expect(await syncOnce(store, server)).toEqual({ kind: "done", sent: 0 });
  });

  it("when Lintel refuses the observation, then it is held with Lintel's words and not sent again by itself", async () => {
    const server = new FakeLintel(doffingItems());
    const draft = recorded();
    // Another phone already sent different content under the same id.
    server.observations.stored.set(draft.observationId, {
      ...observationBody(draft, at(9))!,
      staffCode: "OTHER-1",
    });
    await finish(draft);

    expect(await syncOnce(store, server)).toEqual({ kind: "done", sent: 0 });
    const [held] = await store.queuedChanges();
    expect(held!.problem).toMatchObject({
      status: 409,
      message: "An observation with this id was already recorded with other content.",
    });
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 1 });
    await syncOnce(store, server);
    expect(server.calls).toHaveLength(1);
  });

  it("when an audit and an observation wait together, then each goes in the order it was first kept, the audit's changes together", async () => {
    const server = new FakeLintel(doffingItems());
    const draft = recorded();
    await finish(draft);
    const auditId = testId();
    await store.openDraft({
      spaceId: doffingAreaSpaceId,
      spaceName: "Doffing area 1",
      auditorId: observerId,
      auditId,
      now: at(12),
    });

    await store.saveAnswer(
      auditId,
      doffingItems()[0]!.id,
      { outcome: "pass", value: null, unit: null, count: null, choice: null, note: null },
      at(13),
    );

    await syncOnce(store, server);
    expect(server.calls.map((call) => call.split(" ")[0])).toEqual([
      "observation",
      "start",
      "answer",
    ]);
  });

  it("when two observations of the same space are recorded, then each is kept and sent under its own id", async () => {
    const server = new FakeLintel(doffingItems());
    const first = recorded();
    const second = recorded();
    await finish(first);
    await finish(second);
    expect(await store.observationsForSpace(doffingAreaSpaceId)).toHaveLength(2);
    expect(await syncOnce(store, server)).toEqual({ kind: "done", sent: 2 });
    expect(server.observations.stored.size).toBe(2);
  });

  it("when a phone still holds a person's store from before observations, then it opens with the drafts it held and keeps observations too", async () => {
    const name = `observations-upgrade-${databaseNumber}`;
    const old = await openDB(name, 1, {
      upgrade(db) {
        db.createObjectStore("audits", { keyPath: "auditId" }).createIndex("bySpace", "spaceId");
        db.createObjectStore("answers", { keyPath: ["auditId", "itemId"] }).createIndex(
          "byAudit",
          "auditId",
        );
        db.createObjectStore("photos", { keyPath: "id" }).createIndex("byAudit", "auditId");
        const changes = db.createObjectStore("changes", { keyPath: "seq", autoIncrement: true });
        changes.createIndex("byTarget", ["auditId", "kind", "target"]);
        changes.createIndex("byAudit", "auditId");
      },
    });
    const auditId = testId();
    await old.put("audits", {
      auditId,
      spaceId: doffingAreaSpaceId,
      spaceName: "Doffing area 1",
      auditorId: observerId,
      startedAt: at(0).toISOString(),
      detail: null,
      state: "draft",
      submitRefusals: null,
      updatedAt: at(0).toISOString(),
    });
    await old.add("changes", {
      auditId,
      kind: "start",
      target: "",
      revision: 0,
      problem: null,
      queuedAt: at(0).toISOString(),
    });
    old.close();

    const upgraded = await openAuditStore({ name, newId: testId });
    try {
      expect(await upgraded.getAudit(auditId)).toMatchObject({ state: "draft" });
      const draft = recorded();
      await upgraded.saveObservationDraft(draft, observerId, at(1));
      await upgraded.finishObservation(draft.observationId, observationBody(draft, at(2))!, at(2));
      expect((await upgraded.queuedChanges()).map((change) => change.kind)).toEqual([
        "start",
        "observation",
      ]);
    } finally {
      upgraded.close();
    }
  });
});
