import type { Answer, AnswerBody, AuditDetail, StartAuditBody } from "@shared/schemas/audits";
import type { Observation, ObservationBody } from "@shared/schemas/observations";

import { isApiError, isTemporarilyUnavailable } from "@/lib/api-client";

import type {
  AuditStore,
  ChangeCounts,
  ChangeKind,
  ChangeProblem,
  LocalAnswer,
  QueuedChange,
} from "./offline-store";

/** The calls the queue makes; all idempotent on the device-made ids. */
export interface SyncTransport {
  startAudit(auditId: string, body: StartAuditBody): Promise<AuditDetail>;
  saveAnswer(auditId: string, itemId: string, body: AnswerBody): Promise<Answer>;
  uploadPhoto(
    auditId: string,
    photo: { id: string; itemId: string; file: Blob; fileName: string },
  ): Promise<{ id: string; itemId: string | null; imageId: string }>;
  submitAudit(auditId: string): Promise<AuditDetail>;
  /** An observation, sent whole once finished; the same body again changes nothing. */
  putObservation(observationId: string, body: ObservationBody): Promise<Observation>;
}

const kindOrder: Record<ChangeKind, number> = {
  start: 0,
  answer: 1,
  photo: 2,
  submit: 3,
  observation: 4,
};

/**
 * The order to send changes in: audit by audit (in the order they were first touched), and
 * within an audit start → answers → photos → submit, each in the order they were made.
 */
export function orderForSending(changes: readonly QueuedChange[]): QueuedChange[] {
  const firstSeen = new Map<string, number>();
  for (const change of changes) {
    const seen = firstSeen.get(change.auditId);
    if (seen === undefined || change.seq < seen) firstSeen.set(change.auditId, change.seq);
  }
  return [...changes].sort(
    (a, b) =>
      firstSeen.get(a.auditId)! - firstSeen.get(b.auditId)! ||
      kindOrder[a.kind] - kindOrder[b.kind] ||
      a.seq - b.seq,
  );
}

export type SyncRun =
  | { kind: "done"; sent: number }
  /** No connection, or the server failed: try again later (not before `retryAfterMs`). */
  | { kind: "retry"; sent: number; away?: ServerAway; retryAfterMs?: number }
  /** The session has ended; the changes wait for the person to sign in again. */
  | { kind: "signed-out"; sent: number };

type Failure = "retry" | "signed-out" | "refused";

/** Who is away when the server answers "not now": its database (503 unavailable) or the server. */
export type ServerAway = "database" | "server";

function retryOf(error: unknown, sent: number): SyncRun {
  if (!isTemporarilyUnavailable(error)) return { kind: "retry", sent };
  return {
    kind: "retry",
    sent,
    away: error.code === "unavailable" ? "database" : "server",
    ...(error.retryAfterSeconds ? { retryAfterMs: error.retryAfterSeconds * 1000 } : {}),
  };
}

function classify(error: unknown): Failure {
  if (!isApiError(error)) return "retry";
  if (error.status === 401) return "signed-out";
  if (error.status === 0 || error.status >= 500) return "retry";
  // 408 and 429 say "not now", not "never".
  if (error.status === 408 || error.status === 429) return "retry";
  return "refused";
}

function problemOf(error: unknown): ChangeProblem {
  if (isApiError(error)) {
    return {
      status: error.status,
      message: error.message,
      ...(Object.keys(error.fields).length > 0 ? { fields: { ...error.fields } } : {}),
    };
  }
  return { status: 0, message: "This change could not be sent." };
}

/** Messages per item from a refused submission (`items.<itemId>`). */
function itemRefusals(fields: Readonly<Record<string, string>>): Record<string, string> {
  const refusals: Record<string, string> = {};
  for (const [key, message] of Object.entries(fields)) {
    const match = /^(?:body\.)?items\.([^.]+)$/.exec(key);
    if (match) refusals[match[1]!] = message;
  }
  return refusals;
}

function answerBody(answer: LocalAnswer): AnswerBody {
  return {
    id: answer.id,
    outcome: answer.outcome,
    value: answer.value,
    unit: answer.unit,
    count: answer.count,
    choice: answer.choice,
    note: answer.note?.trim() ? answer.note.trim() : null,
  };
}

/** The server's reply to a submission, once the phone has recorded it. */
export type SubmittedListener = (detail: AuditDetail) => void;

async function send(
  store: AuditStore,
  transport: SyncTransport,
  change: QueuedChange,
): Promise<AuditDetail | void> {
  switch (change.kind) {
    case "start": {
      const audit = await store.getAudit(change.auditId);
      if (!audit) return;
      // Begun from the checklist the phone keeps: the server pins that version, even if the
      // checklist was republished while the phone had no signal.
      const versionId = audit.detail?.audit.checklistVersionId;
      const detail = await transport.startAudit(audit.auditId, {
        spaceId: audit.spaceId,
        startedAt: audit.startedAt,
        ...(versionId ? { checklistVersionId: versionId } : {}),
      });
      await store.saveDetail(audit.auditId, detail);
      return;
    }
    case "answer": {
      const answer = await store.getAnswer(change.auditId, change.target);
      if (!answer) return;
      const saved = await transport.saveAnswer(change.auditId, change.target, answerBody(answer));
      await store.applyServerAnswer(change.auditId, answer.id, saved);
      return;
    }
    case "photo": {
      const photo = await store.getPhoto(change.target);
      if (!photo || photo.bytes === null) return;
      const uploaded = await transport.uploadPhoto(change.auditId, {
        id: photo.id,
        itemId: photo.itemId,
        file: new Blob([photo.bytes], { type: photo.type || "image/jpeg" }),
        fileName: photo.name || `${photo.id}.jpg`,
      });
      await store.markPhotoUploaded(photo.id, uploaded.imageId);
      return;
    }
    case "submit": {
      const detail = await transport.submitAudit(change.auditId);
      await store.recordSubmitted(change.auditId, detail, new Date());
      return detail;
    }
    case "observation": {
      const local = await store.getObservation(change.auditId);
      if (!local?.body) return;
      const observation = await transport.putObservation(local.observationId, local.body);
      await store.recordObservationArrived(observation, new Date());
      return;
    }
  }
}

/**
 * Sends what is waiting, in order. Stops at the first connection or server failure (the rest
 * waits for the next try); a refusal (4xx) holds that change with the server's message and
 * carries on, except that an audit whose start was refused sends nothing more, and a submit
 * waits while any other change of its audit is held. Each submission the server accepts is told to
 * `onSubmitted`, so what it changed elsewhere (actions, due dates, figures) can be fetched again.
 */
export async function syncOnce(
  store: AuditStore,
  transport: SyncTransport,
  {
    onSubmitted,
    stopped = () => false,
  }: {
    onSubmitted?: SubmittedListener;
    /** Asked before each change: the person signed out, so nothing more goes. */
    stopped?: () => boolean;
  } = {},
): Promise<SyncRun> {
  const changes = orderForSending(await store.queuedChanges());
  const stuck = new Set<string>();
  const unsettled = new Set<string>();
  let sent = 0;

  for (const change of changes) {
    if (stopped()) return { kind: "done", sent };
    if (stuck.has(change.auditId)) continue;
    if (change.problem) {
      unsettled.add(change.auditId);
      if (change.kind === "start") stuck.add(change.auditId);
      continue;
    }
    if (change.kind === "submit" && unsettled.has(change.auditId)) continue;

    let submitted: AuditDetail | void;
    try {
      submitted = await send(store, transport, change);
    } catch (error) {
      const failure = classify(error);
      if (failure === "retry") return retryOf(error, sent);
      if (failure === "signed-out") return { kind: failure, sent };
      const refusals = isApiError(error) ? itemRefusals(error.fields) : {};
      if (change.kind === "submit" && Object.keys(refusals).length > 0) {
        await store.recordSubmitRefused(change.auditId, refusals, new Date());
        continue;
      }
      await store.holdChange(change, problemOf(error));
      unsettled.add(change.auditId);
      if (change.kind === "start") stuck.add(change.auditId);
      continue;
    }
    await store.completeChange(change);
    sent += 1;
    if (submitted) onSubmitted?.(submitted);
  }
  return { kind: "done", sent };
}

export interface SyncStatus extends ChangeCounts {
  online: boolean;
  syncing: boolean;
  signedOut: boolean;
  /** The last try found Lintel (or its database) away: changes wait on the phone meanwhile. */
  away: ServerAway | null;
}

export interface SyncScheduler {
  /** Try now (or right after the run in progress). */
  kick(): Promise<void>;
  /** After the connection returns: forget the backoff and try at once. */
  reconnected(): Promise<void>;
  /** The browser says the connection changed: show it, without sending anything yet. */
  connectionChanged(): void;
  status(): SyncStatus;
  subscribe(listener: (status: SyncStatus) => void): () => void;
  stop(): void;
}

export interface SyncSchedulerOptions {
  store: AuditStore;
  transport: SyncTransport;
  isOnline?: () => boolean;
  /** Waits after consecutive failures; the last repeats. */
  retryDelaysMs?: readonly number[];
  /** While anything waits, look again this often even without a failure (a blocked network can
   * leave the browser believing it is online). */
  pollMs?: number;
  signedOutRetryMs?: number;
  onSubmitted?: SubmittedListener;
}

export function createSyncScheduler({
  store,
  transport,
  isOnline = () => navigator.onLine,
  retryDelaysMs = [1_000, 2_000, 4_000, 5_000],
  pollMs = 5_000,
  signedOutRetryMs = 30_000,
  onSubmitted,
}: SyncSchedulerOptions): SyncScheduler {
  const listeners = new Set<(status: SyncStatus) => void>();
  let current: SyncStatus = {
    waiting: 0,
    held: 0,
    online: isOnline(),
    syncing: false,
    signedOut: false,
    away: null,
  };
  let running: Promise<void> | null = null;
  let again = false;
  let failures = 0;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let stopped = false;

  const publish = (next: Partial<SyncStatus>) => {
    current = { ...current, ...next };
    for (const listener of [...listeners]) listener(current);
  };

  const refreshCounts = async () => {
    if (stopped) return;
    const counts = await store.countChanges();
    if (!stopped) publish({ ...counts, online: isOnline() });
  };

  const later = (ms: number) => {
    clearTimeout(timer);
    if (stopped) return;
    timer = setTimeout(() => void kick(), ms);
  };

  async function runLoop() {
    let last: SyncRun | null = null;
    do {
      again = false;
      if (!isOnline()) break;
      publish({ syncing: true, online: true });
      last = await syncOnce(store, transport, { onSubmitted, stopped: () => stopped });
      if (last.kind !== "done") break;
    } while (again && !stopped);

    if (last?.kind === "retry") failures += 1;
    else if (last?.kind === "done") failures = 0;
    publish({
      syncing: false,
      signedOut: last ? last.kind === "signed-out" : current.signedOut,
      away: last ? (last.kind === "retry" ? (last.away ?? null) : null) : current.away,
    });
    await refreshCounts();
    if (stopped || current.waiting === 0) return;
    if (last?.kind === "signed-out") later(signedOutRetryMs);
    else if (failures > 0) {
      const backoff = retryDelaysMs[Math.min(failures, retryDelaysMs.length) - 1] ?? pollMs;
      // The server said how long to wait (Retry-After): not sooner.
      const asked = last?.kind === "retry" ? (last.retryAfterMs ?? 0) : 0;
      later(Math.max(backoff, asked));
    } else later(pollMs);
  }

  function kick(): Promise<void> {
    if (stopped) return Promise.resolve();
    if (running) {
      again = true;
      return running;
    }
    clearTimeout(timer);
    running = runLoop()
      .catch(() => {
        // The phone's own storage failed; try again on the next change or tick.
        later(pollMs);
      })
      .then(() => {
        running = null;
        // A change that arrived while this run was finishing goes now, not at the next tick; whoever
        // waits on this run waits for that one too.
        if (again && !stopped) {
          again = false;
          return kick();
        }
      });
    return running;
  }

  const unsubscribe = store.subscribe(() => {
    void refreshCounts().catch(() => undefined);
    void kick();
  });
  void refreshCounts().catch(() => undefined);

  return {
    kick,
    reconnected() {
      failures = 0;
      publish({ online: isOnline() });
      return kick();
    },
    connectionChanged() {
      if (!stopped) publish({ online: isOnline() });
    },
    status: () => current,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    stop() {
      stopped = true;
      clearTimeout(timer);
      unsubscribe();
      listeners.clear();
    },
  };
}
