import "fake-indexeddb/auto";

import { afterEach, beforeEach, describe, expect, it } from "vitest";

import { describeSync } from "@/features/walkthroughs/components/sync-status";
import { emptyAnswer } from "@/features/walkthroughs/lib/answer-rules";
import { type AuditStore, openAuditStore } from "@/features/walkthroughs/lib/offline-store";
import {
  createSyncScheduler,
  orderForSending,
  syncOnce,
} from "@/features/walkthroughs/lib/sync-queue";
import { ApiError } from "@/lib/api-client";

import {
  connectionLost,
  doffingItems,
  doffingSpaceId,
  FakeLintel,
  testId,
} from "./support/audit-data";

const auditorId = "2d8b4c1e-5f6a-4b7c-8d9e-0f1a2b3c4d5e";
const at = (minute: number) => new Date(Date.UTC(2026, 2, 2, 9, minute));

let store: AuditStore;
let databaseNumber = 0;

beforeEach(async () => {
  databaseNumber += 1;
  store = await openAuditStore({ name: `audits-test-${databaseNumber}`, newId: testId });
});

afterEach(() => {
  store.close();
});

async function startDraft(auditId = testId()) {
  return store.openDraft({
    spaceId: doffingSpaceId,
    spaceName: "Doffing area 1",
    auditorId,
    auditId,
    now: at(0),
  });
}

function photoBytes(): ArrayBuffer {
  return new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4]).buffer;
}

describe("the phone's audit store and its sync queue", () => {
  it("when an audit is answered without a connection, then the queue sends start, answers, photos and submit in that order", async () => {
    const items = doffingItems();
    const [chair, stations, mirror, poster] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    // A photo taken before the answer it belongs to still goes after the answers.
    const photoId = testId();
    await store.addPhoto({
      id: photoId,
      auditId: audit.auditId,
      itemId: chair!.id,
      bytes: photoBytes(),
      type: "image/jpeg",
      name: "chair.jpg",
      takenAt: at(1).toISOString(),
    });
    await store.saveAnswer(audit.auditId, chair!.id, { ...emptyAnswer, outcome: "fail" }, at(2));
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "pass", count: 3 },
      at(3),
    );
    await store.saveAnswer(
      audit.auditId,
      mirror!.id,
      { ...emptyAnswer, outcome: "pass", choice: "mirror" },
      at(4),
    );
    await store.saveAnswer(audit.auditId, poster!.id, { ...emptyAnswer, outcome: "pass" }, at(5));
    await store.requestSubmit(audit.auditId, at(6));

    expect(await store.countChanges()).toEqual({ waiting: 7, held: 0 });
    const run = await syncOnce(store, server);

    expect(run).toEqual({ kind: "done", sent: 7 });
    expect(server.calls.map((call) => call.split(" ")[0])).toEqual([
      "start",
      "answer",
      "answer",
      "answer",
      "answer",
      "photo",
      "submit",
    ]);
    expect(server.calls.slice(1, 5).map((call) => call.split(" ")[1])).toEqual([
      chair!.id,
      stations!.id,
      mirror!.id,
      poster!.id,
    ]);
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 0 });
    const after = await store.getAudit(audit.auditId);
    expect(after?.state).toBe("submitted");
    expect(after?.detail?.audit.verdict).toBe("hold");
    // The server has the picture; the phone keeps only its id.
    expect((await store.getPhoto(photoId))?.bytes).toBeNull();
    expect((await store.getPhoto(photoId))?.imageId).not.toBeNull();
  });

  it("when a reply is lost and the sync runs again, then the same ids are sent again and the server keeps one of each", async () => {
    const items = doffingItems();
    const [chair] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    await store.saveAnswer(audit.auditId, chair!.id, { ...emptyAnswer, outcome: "fail" }, at(1));
    const photoId = testId();
    await store.addPhoto({
      id: photoId,
      auditId: audit.auditId,
      itemId: chair!.id,
      bytes: photoBytes(),
      type: "image/jpeg",
      name: "chair.jpg",
      takenAt: at(2).toISOString(),
    });
    // The server stores the photo, but the connection drops before its reply arrives.
    let lose = true;
    server.after = (call) => {
      if (call.startsWith("photo") && lose) {
        lose = false;
        throw connectionLost();
      }
    };

    expect((await syncOnce(store, server)).kind).toBe("retry");
    expect(await store.countChanges()).toEqual({ waiting: 1, held: 0 });
    expect((await syncOnce(store, server)).kind).toBe("done");

    const photoCalls = server.calls.filter((call) => call.startsWith("photo"));
    expect(photoCalls).toEqual([`photo ${photoId}`, `photo ${photoId}`]);
    expect(server.photos.size).toBe(1);
    expect(server.audits.size).toBe(1);
    expect(server.answers.size).toBe(1);
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 0 });
  });

  it("when two syncs run at once, then every change goes with the same id both times and nothing is stored twice", async () => {
    const items = doffingItems();
    const server = new FakeLintel(items);
    const audit = await startDraft();
    for (const [index, item] of items.entries()) {
      await store.saveAnswer(
        audit.auditId,
        item.id,
        {
          ...emptyAnswer,
          outcome: "pass",
          count: item.response === "count" ? 2 : null,
          choice: item.response === "choice" ? "mirror" : null,
        },
        at(index + 1),
      );
    }
    await store.requestSubmit(audit.auditId, at(9));

    await Promise.all([syncOnce(store, server), syncOnce(store, server)]);

    const answerIds = server.calls.filter((call) => call.startsWith("answer"));
    expect(new Set(answerIds).size).toBe(items.length);
    expect(server.audits.size).toBe(1);
    expect(server.answers.size).toBe(items.length);
    expect(server.submitted.size).toBe(1);
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 0 });
  });

  it("when a second tab sends what it read before the first tab submitted, then every replay is accepted and nothing is held", async () => {
    const items = doffingItems();
    const [chair, stations] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    await store.saveAnswer(
      audit.auditId,
      chair!.id,
      { ...emptyAnswer, outcome: "fail", note: "  No dirty chair  " },
      at(1),
    );
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "pass", count: 3 },
      at(2),
    );
    const photoId = testId();
    await store.addPhoto({
      id: photoId,
      auditId: audit.auditId,
      itemId: chair!.id,
      bytes: photoBytes(),
      type: "image/jpeg",
      name: "chair.jpg",
      takenAt: at(3).toISOString(),
    });
    await store.requestSubmit(audit.auditId, at(4));
    // The other tab read the queue, then this one sent everything and submitted.
    const readByOtherTab = await store.queuedChanges();
    expect((await syncOnce(store, server)).kind).toBe("done");
    expect(server.submitted.has(audit.auditId)).toBe(true);

    const otherTab = { ...store, queuedChanges: async () => readByOtherTab };
    expect(await syncOnce(otherTab, server)).toEqual({ kind: "done", sent: 5 });

    // Each went again with the same id and content, so the submitted audit took them as replays
    // (the photo's bytes were let go once the server confirmed it, so it is not sent again).
    const sent = server.calls.filter((call) => !call.startsWith("start"));
    expect(sent.slice(4)).toEqual(sent.slice(0, 4).filter((call) => !call.startsWith("photo")));
    expect(sent.slice(4)).toHaveLength(3);
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 0 });
    expect((await store.getAudit(audit.auditId))?.state).toBe("submitted");
  });

  it("when the connection fails part-way, then what was not sent waits, in order, for the next sync", async () => {
    const items = doffingItems();
    const [chair, stations] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    await store.saveAnswer(audit.auditId, chair!.id, { ...emptyAnswer, outcome: "pass" }, at(1));
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "pass", count: 2 },
      at(2),
    );
    server.before = (call) => {
      if (call.includes(stations!.id)) throw connectionLost();
    };

    expect((await syncOnce(store, server)).kind).toBe("retry");
    expect(await store.countChanges()).toEqual({ waiting: 1, held: 0 });

    server.before = () => {};
    expect((await syncOnce(store, server)).kind).toBe("done");
    expect(server.answers.get(`${audit.auditId}/${stations!.id}`)?.count).toBe(2);
  });

  it("when an answer is changed while it waits, then only its latest version is sent, once", async () => {
    const items = doffingItems();
    const [, stations] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "fail", count: 1 },
      at(1),
    );
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "pass", count: 3 },
      at(2),
    );

    await syncOnce(store, server);

    expect(server.calls.filter((call) => call.startsWith("answer"))).toHaveLength(1);
    expect(server.answers.get(`${audit.auditId}/${stations!.id}`)).toMatchObject({
      outcome: "pass",
      count: 3,
    });
  });

  it("when the server refuses an answer, then that change is held with its message, the rest is sent and the submit waits", async () => {
    const items = doffingItems();
    const [chair, stations] = items;
    const server = new FakeLintel(items);
    const audit = await startDraft();
    await store.saveAnswer(
      audit.auditId,
      chair!.id,
      { ...emptyAnswer, outcome: "pass", value: 500, unit: "Pa" },
      at(1),
    );
    await store.saveAnswer(
      audit.auditId,
      stations!.id,
      { ...emptyAnswer, outcome: "pass", count: 2 },
      at(2),
    );
    await store.requestSubmit(audit.auditId, at(3));

    expect((await syncOnce(store, server)).kind).toBe("done");

    expect(server.answers.has(`${audit.auditId}/${stations!.id}`)).toBe(true);
    expect(server.submitted.size).toBe(0);
    const changes = await store.changesForAudit(audit.auditId);
    const held = changes.find((change) => change.problem);
    expect(held?.target).toBe(chair!.id);
    expect(held?.problem?.fields?.value).toBe(
      "A pressure differential beyond ±100 Pa is not a plausible room reading.",
    );
    expect(await store.countChanges()).toEqual({ waiting: 1, held: 1 });
  });

  it("when the server refuses the submission naming items, then the audit is a draft again with those messages", async () => {
    const items = doffingItems();
    const [chair] = items;
    const server = new FakeLintel(items);
    server.submitAudit = async () => {
      throw new ApiError({
        status: 400,
        code: "validation_failed",
        message: "1 item(s) need attention before submitting.",
        fields: { [`items.${chair!.id}`]: "Add a photo of what failed." },
      });
    };
    const audit = await startDraft();
    await store.saveAnswer(audit.auditId, chair!.id, { ...emptyAnswer, outcome: "fail" }, at(1));
    await store.requestSubmit(audit.auditId, at(2));

    await syncOnce(store, server);

    const after = await store.getAudit(audit.auditId);
    expect(after?.state).toBe("draft");
    expect(after?.submitRefusals).toEqual({ [chair!.id]: "Add a photo of what failed." });
    expect(await store.countChanges()).toEqual({ waiting: 0, held: 0 });
  });

  it("when the same space is opened twice, then the person's open draft is resumed rather than a second one started", async () => {
    const first = await startDraft();
    const second = await startDraft();

    expect(second.auditId).toBe(first.auditId);
    expect((await store.queuedChanges()).filter((change) => change.kind === "start")).toHaveLength(
      1,
    );
  });

  it("when changes are listed for sending, then audits keep the order they were first touched in", () => {
    const change = (
      seq: number,
      auditId: string,
      kind: "start" | "answer" | "photo" | "submit",
    ) => ({
      seq,
      auditId,
      kind,
      target: "",
      revision: 0,
      problem: null,
      queuedAt: "",
    });
    const ordered = orderForSending([
      change(1, "a", "start"),
      change(2, "b", "start"),
      change(3, "a", "submit"),
      change(4, "b", "photo"),
      change(5, "a", "photo"),
      change(6, "b", "answer"),
      change(7, "a", "answer"),
    ]);
    expect(ordered.map((entry) => `${entry.auditId}:${entry.kind}`)).toEqual([
      "a:start",
      "a:answer",
      "a:photo",
      "a:submit",
      "b:start",
      "b:answer",
      "b:photo",
    ]);
  });
});

describe("the sync schedule", () => {
  it("when the phone is offline, then nothing is sent; when it comes back, then what waits goes at once", async () => {
    const items = doffingItems();
    const server = new FakeLintel(items);
    let online = false;
    const sync = createSyncScheduler({
      store,
      transport: server,
      isOnline: () => online,
      pollMs: 60_000,
    });
    const audit = await startDraft();
    await store.saveAnswer(audit.auditId, items[0]!.id, { ...emptyAnswer, outcome: "pass" }, at(1));
    await sync.kick();

    expect(server.calls).toEqual([]);
    expect(sync.status()).toMatchObject({ online: false, waiting: 2 });

    online = true;
    await sync.reconnected();

    expect(server.calls.map((call) => call.split(" ")[0])).toEqual(["start", "answer"]);
    await expect.poll(() => sync.status()).toMatchObject({ online: true, waiting: 0 });
    sync.stop();
  });

  it("when the server cannot be reached though the phone thinks it is online, then it tries again by itself", async () => {
    const items = doffingItems();
    const server = new FakeLintel(items);
    let blocked = true;
    server.before = () => {
      if (blocked) throw connectionLost();
    };
    const sync = createSyncScheduler({
      store,
      transport: server,
      isOnline: () => true,
      retryDelaysMs: [20],
      pollMs: 20,
    });
    await startDraft();
    await sync.kick();
    expect(server.audits.size).toBe(0);

    blocked = false;

    await expect.poll(() => server.audits.size, { timeout: 2000 }).toBe(1);
    await expect.poll(() => sync.status().waiting).toBe(0);
    sync.stop();
  });

  it("when the server answers 503 because its database is away, then the changes stay on the phone, the status says so in words, and they go once it answers again", async () => {
    const items = doffingItems();
    const server = new FakeLintel(items);
    let databaseAway = true;
    server.before = () => {
      if (databaseAway) {
        throw new ApiError({
          status: 503,
          code: "unavailable",
          message: "Lintel cannot reach its database just now.",
          retryAfterSeconds: 0.05,
        });
      }
    };
    const sync = createSyncScheduler({
      store,
      transport: server,
      isOnline: () => true,
      retryDelaysMs: [20],
      pollMs: 20,
    });
    const audit = await startDraft();
    await store.saveAnswer(audit.auditId, items[0]!.id, { ...emptyAnswer, outcome: "pass" }, at(1));
    await sync.kick();

    expect(server.audits.size).toBe(0);
    await expect.poll(() => sync.status()).toMatchObject({ waiting: 2, held: 0, away: "database" });
    expect(describeSync(sync.status()).text).toBe(
      "Lintel cannot reach its database — 2 changes kept on this phone, sent when it is back",
    );
    expect(await store.countChanges()).toEqual({ waiting: 2, held: 0 });

    databaseAway = false;

    await expect
      .poll(() => sync.status(), { timeout: 2000 })
      .toMatchObject({ waiting: 0, away: null });
    expect(server.answers.get(`${audit.auditId}/${items[0]!.id}`)?.outcome).toBe("pass");
    expect(describeSync(sync.status()).text).toBe("All changes arrived in Lintel");
    sync.stop();
  });
});
