import type { Answer, AuditDetail } from "@shared/schemas/audits";
import type { Observation, ObservationBody } from "@shared/schemas/observations";
import {
  type DBSchema,
  deleteDB,
  type IDBPDatabase,
  type IDBPObjectStore,
  openDB,
  type StoreNames,
} from "idb";

import { newDeviceId } from "@/lib/device-ids";

import type { AnswerFields } from "./answer-rules";
import type { ObservationDraft } from "./observation-flow";
import { fromStoredUnit } from "./reading-units";

/**
 * Everything an auditor does is written here first, then sent by the sync queue. Ids are made on
 * the phone and every call is idempotent, so sending a change twice never stores it twice.
 */

export type AuditState = "draft" | "submitting" | "submitted";

export interface LocalAudit {
  auditId: string;
  spaceId: string;
  /** Known before the server answers when the audit was started from a list. */
  spaceName: string | null;
  /** Who started it here: on a shared phone each person resumes only their own drafts. */
  auditorId: string | null;
  startedAt: string;
  /** The pinned checklist and room facts, once the server has answered the start. */
  detail: AuditDetail | null;
  /** draft → submitting (submit asked for on the phone) → submitted (the server confirmed). */
  state: AuditState;
  /** Per item: why the server refused the submission. */
  submitRefusals: Record<string, string> | null;
  updatedAt: string;
}

export interface LocalAnswer extends AnswerFields {
  auditId: string;
  itemId: string;
  /** A new id for every different answer, so a resend of the same answer is recognised. */
  id: string;
  savedAt: string;
}

export interface LocalPhoto {
  id: string;
  auditId: string;
  itemId: string;
  /** The picture itself until the audit is confirmed; null for photos only on the server. */
  bytes: ArrayBuffer | null;
  type: string;
  name: string;
  /** Set once uploaded. */
  imageId: string | null;
  takenAt: string;
}

/**
 * An observation of putting on or removal: recorded step by step on the phone (`recording`),
 * then finished and queued to be sent whole (`finished`), until Lintel confirms it (`arrived`).
 */
export type ObservationState = "recording" | "finished" | "arrived";

export interface LocalObservation {
  observationId: string;
  spaceId: string;
  /** Who observes: on a shared phone each person resumes only their own. */
  observerId: string | null;
  draft: ObservationDraft;
  state: ObservationState;
  /** What is sent, fixed when the observer taps "Finish". */
  body: ObservationBody | null;
  /** Lintel's reply once it arrived (with the outcome it decided). */
  observation: Observation | null;
  updatedAt: string;
}

export type ChangeKind = "start" | "answer" | "photo" | "submit" | "observation";

export interface ChangeProblem {
  status: number;
  message: string;
  fields?: Record<string, string>;
}

export interface QueuedChange {
  seq: number;
  /** The audit the change belongs to; for an observation, the observation's id. */
  auditId: string;
  kind: ChangeKind;
  /** The item (answer), the photo id (photo), or "" (start, submit, observation). */
  target: string;
  /** Raised when the change is edited while waiting, so a send in flight does not retire it. */
  revision: number;
  /** Set when the server refused it (4xx); it then waits for the auditor, not for a retry. */
  problem: ChangeProblem | null;
  queuedAt: string;
}

interface AuditDb extends DBSchema {
  audits: { key: string; value: LocalAudit; indexes: { bySpace: string } };
  answers: { key: [string, string]; value: LocalAnswer; indexes: { byAudit: string } };
  photos: { key: string; value: LocalPhoto; indexes: { byAudit: string } };
  observations: { key: string; value: LocalObservation; indexes: { bySpace: string } };
  changes: {
    key: number;
    value: QueuedChange;
    indexes: { byTarget: [string, ChangeKind, string]; byAudit: string };
  };
}

type ChangesStore = IDBPObjectStore<
  AuditDb,
  ArrayLike<StoreNames<AuditDb>>,
  "changes",
  "readwrite"
>;

/**
 * The database every person on the phone once shared. Each person now has their own
 * (`lintel-audits:<personId>`); drafts left here move to their auditor's on first open.
 */
export const sharedAuditDatabaseName = "lintel-audits";

export interface ChangeCounts {
  /** Changes still to send. */
  waiting: number;
  /** Changes the server refused, waiting for the auditor. */
  held: number;
}

export interface OpenDraftInput {
  spaceId: string;
  spaceName: string | null;
  auditorId: string | null;
  auditId: string;
  now: Date;
  /**
   * The checklist and room facts as the phone keeps them, so the auditor can begin with no signal;
   * the start sent later names this checklist version, which the server then keeps.
   */
  detail?: AuditDetail | null;
}

/** What waits on this phone for its person: shown before they sign out. */
export interface UnsentWork {
  /** Audits not yet submitted to Lintel, or with changes still to send. */
  audits: number;
  /** Observations being recorded, or finished and not yet arrived in Lintel. */
  observations: number;
  /** Changes still to send (or refused and waiting for the auditor). */
  changes: number;
}

export interface AuditStore {
  close(): void;
  /** Called after every change written here, from any caller. */
  subscribe(listener: () => void): () => void;

  getAudit(auditId: string): Promise<LocalAudit | undefined>;
  auditsForSpace(spaceId: string): Promise<LocalAudit[]>;
  /** The person's open draft for the space, or a new one (queued to start on the server). */
  openDraft(input: OpenDraftInput): Promise<LocalAudit>;
  /** Takes in an audit begun elsewhere (another phone, or this one before its data was cleared). */
  adoptAudit(detail: AuditDetail, now: Date): Promise<LocalAudit>;
  saveDetail(auditId: string, detail: AuditDetail): Promise<void>;

  getAnswers(auditId: string): Promise<LocalAnswer[]>;
  getAnswer(auditId: string, itemId: string): Promise<LocalAnswer | undefined>;
  saveAnswer(
    auditId: string,
    itemId: string,
    fields: AnswerFields,
    now: Date,
  ): Promise<LocalAnswer>;
  /**
   * The server's stored answer to the one sent as `sentId`: its decided outcome replaces ours
   * unless the auditor has changed the answer since. (The server keeps the id of the item's
   * first answer, so the reply is matched by what was sent, not by its id.)
   */
  applyServerAnswer(auditId: string, sentId: string, answer: Answer): Promise<void>;

  getPhotos(auditId: string): Promise<LocalPhoto[]>;
  getPhoto(photoId: string): Promise<LocalPhoto | undefined>;
  addPhoto(photo: Omit<LocalPhoto, "imageId">): Promise<void>;
  /** Only a photo not yet uploaded can be taken back. */
  removePhoto(photoId: string): Promise<boolean>;
  markPhotoUploaded(photoId: string, imageId: string): Promise<void>;

  requestSubmit(auditId: string, now: Date): Promise<void>;
  recordSubmitted(auditId: string, detail: AuditDetail, now: Date): Promise<void>;
  recordSubmitRefused(auditId: string, refusals: Record<string, string>, now: Date): Promise<void>;

  getObservation(observationId: string): Promise<LocalObservation | undefined>;
  observationsForSpace(spaceId: string): Promise<LocalObservation[]>;
  /** Keeps the observation as recorded so far; refused once it is finished. */
  saveObservationDraft(
    draft: ObservationDraft,
    observerId: string | null,
    now: Date,
  ): Promise<LocalObservation>;
  /** Fixes what is sent and queues it, once; a second finish changes nothing. */
  finishObservation(observationId: string, body: ObservationBody, now: Date): Promise<void>;
  recordObservationArrived(observation: Observation, now: Date): Promise<void>;

  /** Every queued change, oldest first. */
  queuedChanges(): Promise<QueuedChange[]>;
  changesForAudit(auditId: string): Promise<QueuedChange[]>;
  countChanges(): Promise<ChangeCounts>;
  /** Removes a sent change, unless it was edited while in flight. */
  completeChange(change: QueuedChange): Promise<void>;
  holdChange(change: QueuedChange, problem: ChangeProblem): Promise<void>;
  unsentWork(): Promise<UnsentWork>;
}

export class ObservationFinishedError extends Error {
  override readonly name = "ObservationFinishedError";
  constructor() {
    super("This observation is finished and can no longer be changed.");
  }
}

export class AuditNotEditableError extends Error {
  override readonly name = "AuditNotEditableError";
  constructor() {
    super("This audit has been submitted and can no longer be changed.");
  }
}

function upgrade(db: IDBPDatabase<AuditDb>, oldVersion: number) {
  if (oldVersion < 1) {
    db.createObjectStore("audits", { keyPath: "auditId" }).createIndex("bySpace", "spaceId");
    db.createObjectStore("answers", { keyPath: ["auditId", "itemId"] }).createIndex(
      "byAudit",
      "auditId",
    );
    db.createObjectStore("photos", { keyPath: "id" }).createIndex("byAudit", "auditId");
    const changes = db.createObjectStore("changes", { keyPath: "seq", autoIncrement: true });
    changes.createIndex("byTarget", ["auditId", "kind", "target"]);
    changes.createIndex("byAudit", "auditId");
  }
  if (oldVersion < 2) {
    db.createObjectStore("observations", { keyPath: "observationId" }).createIndex(
      "bySpace",
      "spaceId",
    );
  }
}

/** Version 2 added observations of putting on and removal. */
const storeVersion = 2;

function answerFromServer(answer: Answer, auditId: string, now: Date): LocalAnswer {
  return {
    auditId,
    itemId: answer.itemId,
    id: answer.id,
    outcome: answer.outcome,
    // The server keeps SI; the phone keeps what the auditor read.
    value:
      answer.value !== null && answer.unit !== null
        ? fromStoredUnit(answer.value, answer.unit)
        : answer.value,
    unit: answer.unit,
    count: answer.count,
    choice: answer.choice,
    note: answer.note,
    savedAt: now.toISOString(),
  };
}

function sameFields(a: AnswerFields, b: AnswerFields): boolean {
  return (
    a.outcome === b.outcome &&
    a.value === b.value &&
    a.unit === b.unit &&
    a.count === b.count &&
    a.choice === b.choice &&
    (a.note ?? "") === (b.note ?? "")
  );
}

export interface AuditStoreOptions {
  /** The database to open (each person has their own). */
  name: string;
  /**
   * Whose store it is: their drafts left in the database once shared by everyone on the phone
   * move here (and drafts nobody claimed, started before anyone was known).
   */
  personId?: string;
  /** Where the shared drafts are looked for (a separate one in tests). */
  sharedName?: string;
  newId?: () => string;
}

async function databaseExists(name: string): Promise<boolean> {
  // Opening a database that is not there would make it: ask first where the browser can say.
  if (typeof indexedDB.databases !== "function") return true;
  return (await indexedDB.databases()).some((info) => info.name === name);
}

/** Moves the person's drafts (with their answers, photos and queued changes) out of the shared database. */
export async function moveSharedDrafts(
  target: IDBPDatabase<AuditDb>,
  personId: string,
  sharedName: string,
): Promise<number> {
  if (!(await databaseExists(sharedName))) return 0;
  // Opened at the current version (an older one is upgraded; it never held observations).
  const shared = await openDB<AuditDb>(sharedName, storeVersion, { upgrade });
  try {
    const tx = shared.transaction(["audits", "answers", "photos", "changes"], "readwrite");
    const audits = (await tx.objectStore("audits").getAll()).filter(
      (audit) => audit.auditorId === personId || audit.auditorId === null,
    );
    const moving = new Set(audits.map((audit) => audit.auditId));
    const answers = (await tx.objectStore("answers").getAll()).filter((a) => moving.has(a.auditId));
    const photos = (await tx.objectStore("photos").getAll()).filter((p) => moving.has(p.auditId));
    const changes = (await tx.objectStore("changes").getAll()).filter((c) => moving.has(c.auditId));
    const remaining = (await tx.objectStore("audits").count()) - audits.length;
    await tx.done;
    if (audits.length > 0) {
      const into = target.transaction(["audits", "answers", "photos", "changes"], "readwrite");
      for (const audit of audits) {
        await into.objectStore("audits").put({ ...audit, auditorId: personId });
      }
      for (const answer of answers) await into.objectStore("answers").put(answer);
      for (const photo of photos) await into.objectStore("photos").put(photo);
      // New sequence numbers, in the same order.
      for (const change of changes.sort((a, b) => a.seq - b.seq)) {
        const { seq: _seq, ...rest } = change;
        await into.objectStore("changes").add(rest as QueuedChange);
      }
      await into.done;
      const out = shared.transaction(["audits", "answers", "photos", "changes"], "readwrite");
      for (const audit of audits) await out.objectStore("audits").delete(audit.auditId);
      for (const answer of answers) {
        await out.objectStore("answers").delete([answer.auditId, answer.itemId]);
      }
      for (const photo of photos) await out.objectStore("photos").delete(photo.id);
      for (const change of changes) await out.objectStore("changes").delete(change.seq);
      await out.done;
    }
    if (remaining === 0) {
      shared.close();
      // Not waited for: a tab still holding it open lets go when asked (see `blocking`).
      void deleteDB(sharedName).catch(() => undefined);
    }
    return audits.length;
  } finally {
    shared.close();
  }
}

export async function openAuditStore({
  name,
  personId,
  sharedName = sharedAuditDatabaseName,
  newId = newDeviceId,
}: AuditStoreOptions): Promise<AuditStore> {
  const db = await openDB<AuditDb>(name, storeVersion, {
    upgrade,
    // Another tab is upgrading the database: let it.
    blocking: () => db.close(),
  });
  if (personId) await moveSharedDrafts(db, personId, sharedName);
  const listeners = new Set<() => void>();
  const changed = () => {
    for (const listener of [...listeners]) listener();
  };

  /** Adds the change, or marks the waiting one for the same thing as edited. */
  async function queue(
    store: ChangesStore,
    change: Omit<QueuedChange, "seq" | "revision" | "problem">,
  ): Promise<void> {
    const existing = await store
      .index("byTarget")
      .get([change.auditId, change.kind, change.target]);
    if (existing) {
      await store.put({ ...existing, revision: existing.revision + 1, problem: null });
    } else {
      await store.add({ ...change, revision: 0, problem: null } as QueuedChange);
    }
  }

  async function requireDraft(
    audits: { get(key: string): Promise<LocalAudit | undefined> },
    auditId: string,
  ): Promise<LocalAudit> {
    const audit = await audits.get(auditId);
    if (!audit) throw new Error("This audit is not on this phone.");
    if (audit.state !== "draft") throw new AuditNotEditableError();
    return audit;
  }

  const store: AuditStore = {
    close() {
      listeners.clear();
      db.close();
    },

    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },

    getAudit: (auditId) => db.get("audits", auditId),

    async auditsForSpace(spaceId) {
      const audits = await db.getAllFromIndex("audits", "bySpace", spaceId);
      return audits.sort((a, b) => b.startedAt.localeCompare(a.startedAt));
    },

    async openDraft({ spaceId, spaceName, auditorId, auditId, now, detail = null }) {
      const tx = db.transaction(["audits", "changes"], "readwrite");
      const audits = tx.objectStore("audits");
      const open = (await audits.index("bySpace").getAll(spaceId)).find(
        (audit) =>
          audit.state === "draft" && (audit.auditorId === null || audit.auditorId === auditorId),
      );
      if (open) {
        await tx.done;
        return open;
      }
      const audit: LocalAudit = {
        auditId,
        spaceId,
        spaceName,
        auditorId,
        startedAt: now.toISOString(),
        detail: detail
          ? {
              ...detail,
              audit: { ...detail.audit, id: auditId, startedAt: now.toISOString() },
            }
          : null,
        state: "draft",
        submitRefusals: null,
        updatedAt: now.toISOString(),
      };
      await audits.add(audit);
      await queue(tx.objectStore("changes"), {
        auditId,
        kind: "start",
        target: "",
        queuedAt: now.toISOString(),
      });
      await tx.done;
      changed();
      return audit;
    },

    async adoptAudit(detail, now) {
      const tx = db.transaction(["audits", "answers", "photos"], "readwrite");
      const audits = tx.objectStore("audits");
      const known = await audits.get(detail.audit.id);
      if (known) {
        await tx.done;
        return known;
      }
      const audit: LocalAudit = {
        auditId: detail.audit.id,
        spaceId: detail.audit.spaceId,
        spaceName: detail.audit.spaceName,
        auditorId: detail.audit.auditorId,
        startedAt: detail.audit.startedAt,
        detail,
        state: detail.audit.status === "submitted" ? "submitted" : "draft",
        submitRefusals: null,
        updatedAt: now.toISOString(),
      };
      await audits.add(audit);
      for (const answer of detail.answers) {
        await tx.objectStore("answers").put(answerFromServer(answer, audit.auditId, now));
      }
      for (const photo of detail.photos) {
        if (!photo.itemId) continue;
        await tx.objectStore("photos").put({
          id: photo.id,
          auditId: audit.auditId,
          itemId: photo.itemId,
          bytes: null,
          type: "",
          name: "",
          imageId: photo.imageId,
          takenAt: now.toISOString(),
        });
      }
      await tx.done;
      changed();
      return audit;
    },

    async saveDetail(auditId, detail) {
      const tx = db.transaction(["audits", "answers"], "readwrite");
      const audit = await tx.objectStore("audits").get(auditId);
      if (!audit) {
        await tx.done;
        return;
      }
      await tx.objectStore("audits").put({
        ...audit,
        detail,
        spaceName: detail.audit.spaceName,
        auditorId: audit.auditorId ?? detail.audit.auditorId,
      });
      // Answers already on the server (a start repeated after this phone lost its copy) fill only
      // the items not answered here.
      const answers = tx.objectStore("answers");
      for (const answer of detail.answers) {
        if (!(await answers.get([auditId, answer.itemId]))) {
          await answers.put(answerFromServer(answer, auditId, new Date()));
        }
      }
      await tx.done;
      changed();
    },

    getAnswers: (auditId) => db.getAllFromIndex("answers", "byAudit", auditId),

    getAnswer: (auditId, itemId) => db.get("answers", [auditId, itemId]),

    async saveAnswer(auditId, itemId, fields, now) {
      const tx = db.transaction(["audits", "answers", "changes"], "readwrite");
      await requireDraft(tx.objectStore("audits"), auditId);
      const answers = tx.objectStore("answers");
      const previous = await answers.get([auditId, itemId]);
      if (previous && sameFields(previous, fields)) {
        await tx.done;
        return previous;
      }
      const answer: LocalAnswer = {
        ...fields,
        auditId,
        itemId,
        id: newId(),
        savedAt: now.toISOString(),
      };
      await answers.put(answer);
      await queue(tx.objectStore("changes"), {
        auditId,
        kind: "answer",
        target: itemId,
        queuedAt: now.toISOString(),
      });
      await tx.done;
      changed();
      return answer;
    },

    async applyServerAnswer(auditId, sentId, answer) {
      const tx = db.transaction("answers", "readwrite");
      const local = await tx.store.get([auditId, answer.itemId]);
      if (local && local.id === sentId && local.outcome !== answer.outcome) {
        await tx.store.put({ ...local, outcome: answer.outcome });
        await tx.done;
        changed();
        return;
      }
      await tx.done;
    },

    getPhotos: async (auditId) =>
      (await db.getAllFromIndex("photos", "byAudit", auditId)).sort((a, b) =>
        a.takenAt.localeCompare(b.takenAt),
      ),

    getPhoto: (photoId) => db.get("photos", photoId),

    async addPhoto(photo) {
      const tx = db.transaction(["audits", "photos", "changes"], "readwrite");
      await requireDraft(tx.objectStore("audits"), photo.auditId);
      await tx.objectStore("photos").put({ ...photo, imageId: null });
      await queue(tx.objectStore("changes"), {
        auditId: photo.auditId,
        kind: "photo",
        target: photo.id,
        queuedAt: photo.takenAt,
      });
      await tx.done;
      changed();
    },

    async removePhoto(photoId) {
      const tx = db.transaction(["audits", "photos", "changes"], "readwrite");
      const photo = await tx.objectStore("photos").get(photoId);
      if (!photo || photo.imageId !== null) {
        await tx.done;
        return false;
      }
      await requireDraft(tx.objectStore("audits"), photo.auditId);
      const change = await tx
        .objectStore("changes")
        .index("byTarget")
        .get([photo.auditId, "photo", photoId]);
      // A photo already on its way is left to arrive; the server has no way to take one back.
      if (!change) {
        await tx.done;
        return false;
      }
      await tx.objectStore("changes").delete(change.seq);
      await tx.objectStore("photos").delete(photoId);
      await tx.done;
      changed();
      return true;
    },

    async markPhotoUploaded(photoId, imageId) {
      const tx = db.transaction("photos", "readwrite");
      const photo = await tx.store.get(photoId);
      if (photo) await tx.store.put({ ...photo, imageId });
      await tx.done;
      changed();
    },

    async requestSubmit(auditId, now) {
      const tx = db.transaction(["audits", "changes"], "readwrite");
      const audit = await requireDraft(tx.objectStore("audits"), auditId);
      await tx.objectStore("audits").put({
        ...audit,
        state: "submitting",
        submitRefusals: null,
        updatedAt: now.toISOString(),
      });
      await queue(tx.objectStore("changes"), {
        auditId,
        kind: "submit",
        target: "",
        queuedAt: now.toISOString(),
      });
      await tx.done;
      changed();
    },

    async recordSubmitted(auditId, detail, now) {
      const tx = db.transaction(["audits", "photos"], "readwrite");
      const audit = await tx.objectStore("audits").get(auditId);
      if (audit) {
        await tx.objectStore("audits").put({
          ...audit,
          detail,
          spaceName: detail.audit.spaceName,
          state: "submitted",
          submitRefusals: null,
          updatedAt: now.toISOString(),
        });
      }
      // The server has the pictures now; the phone keeps only their ids.
      const photos = tx.objectStore("photos");
      for (const photo of await photos.index("byAudit").getAll(auditId)) {
        if (photo.imageId !== null && photo.bytes !== null) {
          await photos.put({ ...photo, bytes: null });
        }
      }
      await tx.done;
      changed();
    },

    async recordSubmitRefused(auditId, refusals, now) {
      const tx = db.transaction(["audits", "changes"], "readwrite");
      const audit = await tx.objectStore("audits").get(auditId);
      if (audit) {
        await tx.objectStore("audits").put({
          ...audit,
          state: "draft",
          submitRefusals: refusals,
          updatedAt: now.toISOString(),
        });
      }
      const submit = await tx.objectStore("changes").index("byTarget").get([auditId, "submit", ""]);
      if (submit) await tx.objectStore("changes").delete(submit.seq);
      await tx.done;
      changed();
    },

    getObservation: (observationId) => db.get("observations", observationId),

    async observationsForSpace(spaceId) {
      const observations = await db.getAllFromIndex("observations", "bySpace", spaceId);
      return observations.sort((a, b) => b.updatedAt.localeCompare(a.updatedAt));
    },

    async saveObservationDraft(draft, observerId, now) {
      const tx = db.transaction("observations", "readwrite");
      const known = await tx.store.get(draft.observationId);
      if (known && known.state !== "recording") {
        await tx.done;
        throw new ObservationFinishedError();
      }
      const local: LocalObservation = {
        observationId: draft.observationId,
        spaceId: draft.spaceId,
        observerId: known?.observerId ?? observerId,
        draft,
        state: "recording",
        body: null,
        observation: null,
        updatedAt: now.toISOString(),
      };
      await tx.store.put(local);
      await tx.done;
      changed();
      return local;
    },

    async finishObservation(observationId, body, now) {
      const tx = db.transaction(["observations", "changes"], "readwrite");
      const known = await tx.objectStore("observations").get(observationId);
      if (!known) {
        await tx.done;
        throw new Error("This observation is not on this phone.");
      }
      if (known.state !== "recording") {
        await tx.done;
        return;
      }
      await tx.objectStore("observations").put({
        ...known,
        state: "finished",
        body,
        updatedAt: now.toISOString(),
      });
      await queue(tx.objectStore("changes"), {
        auditId: observationId,
        kind: "observation",
        target: "",
        queuedAt: now.toISOString(),
      });
      await tx.done;
      changed();
    },

    async recordObservationArrived(observation, now) {
      const tx = db.transaction("observations", "readwrite");
      const known = await tx.store.get(observation.id);
      if (known) {
        await tx.store.put({
          ...known,
          state: "arrived",
          observation,
          updatedAt: now.toISOString(),
        });
      }
      await tx.done;
      changed();
    },

    queuedChanges: () => db.getAll("changes"),

    changesForAudit: (auditId) => db.getAllFromIndex("changes", "byAudit", auditId),

    async countChanges() {
      const changes = await db.getAll("changes");
      const held = changes.filter((change) => change.problem !== null).length;
      return { waiting: changes.length - held, held };
    },

    async completeChange(change) {
      const tx = db.transaction("changes", "readwrite");
      const current = await tx.store.get(change.seq);
      if (current && current.revision === change.revision) await tx.store.delete(change.seq);
      await tx.done;
      changed();
    },

    async unsentWork() {
      const [audits, observations, changes] = await Promise.all([
        db.getAll("audits"),
        db.getAll("observations"),
        db.getAll("changes"),
      ]);
      const observationIds = new Set(observations.map((o) => o.observationId));
      const open = new Set(
        changes.map((change) => change.auditId).filter((id) => !observationIds.has(id)),
      );
      for (const audit of audits) if (audit.state !== "submitted") open.add(audit.auditId);
      const unsent = observations.filter((o) => o.state !== "arrived").length;
      return { audits: open.size, observations: unsent, changes: changes.length };
    },

    async holdChange(change, problem) {
      const tx = db.transaction("changes", "readwrite");
      const current = await tx.store.get(change.seq);
      // Edited while in flight: the new version gets its own chance.
      if (current && current.revision === change.revision) {
        await tx.store.put({ ...current, problem });
      }
      await tx.done;
      changed();
    },
  };
  return store;
}
