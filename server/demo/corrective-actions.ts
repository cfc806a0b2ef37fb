import { createHash, randomUUID } from "node:crypto";

import { TZDate } from "@date-fns/tz";
import { and, asc, eq, inArray, ne, notExists } from "drizzle-orm";
import sharp from "sharp";

import { daysToClose, defaultDuePolicy, dueAt, type DuePolicy } from "@shared/calc/due";
import { polygonCentroid } from "@shared/calc/plan-geometry";
import type { Severity } from "@shared/calc/verdict";
import { rolePermissions } from "@shared/permissions";
import type { Role } from "@shared/roles";
import {
  actionMoves,
  actionStates,
  moveAllowedFrom,
  moveTimelineKinds,
  ownerWorkStates,
  systemMoves,
  type ActionMoveName,
  type ActionState,
} from "@shared/workflow/action-workflow";

import type { Tx } from "../db/client";
import {
  actionNotices,
  actionProofs,
  auditAnswers,
  audits,
  changeLog,
  checklistItems,
  correctiveActions,
  findings,
  floors,
  siteDuePolicies,
  sites,
  spaces,
} from "../db/schema/index";
import { storeImage } from "../lib/images";
import type { Storage } from "../lib/storage";
import { peopleWithRoleAt } from "../modules/actions/actions.repository";
import { mulberry32 } from "./audit-history";
import type { DemoSiteKey } from "./people";

const hour = 60 * 60 * 1000;
const day = 24 * hour;
const entity = "corrective_action";
const requestId = "demo-data";

/** Typical days from opening to closing, before the site's own pace is applied. */
const typicalDays: Record<Severity, number> = { critical: 0.8, major: 4.5, minor: 12 };

/**
 * How each site keeps up over the year (progress 0 a year ago, 1 now): Orchard Hill gets quicker,
 * Wexley falls behind, the General stays steady. `slow` is the chance an action drags for weeks.
 */
const paces: Record<DemoSiteKey, (progress: number) => { factor: number; slow: number }> = {
  general: () => ({ factor: 1, slow: 0.03 }),
  orchard: (p) => ({ factor: 1.7 - 1.1 * p, slow: 0.08 - 0.06 * p }),
  wexley: (p) => ({ factor: 0.9 + 1.3 * p, slow: 0.03 + 0.12 * p }),
};

const sentNotes = [
  "Fixed and checked on the ward; photo attached.",
  "Put right this morning; photo attached.",
  "Replaced and checked with the nurse in charge.",
  "Done, see the photo.",
  "Sorted with the ward manager; photo attached.",
];
const verifiedNotes = [
  "Seen on the walk-round; fixed.",
  "Checked in person; as it should be.",
  "The photo matches what I saw on the ward.",
];
const rejectedNotes = [
  "The photo does not show the item clearly; please take it from the doorway.",
  "Still not right when I checked; please fix it and send a new photo.",
  "The photo is of a different bay.",
];
const reopenedNotes = [
  "Found the same gap again since the fix was confirmed; it did not hold.",
  "The replacement has been taken away again; reopening.",
];

interface Failure {
  auditId: string;
  auditorId: string;
  at: number;
  itemId: string;
  itemKey: string;
  itemText: string;
  severity: Severity;
  note: string | null;
}

/** The failures of one item in one space, oldest first: they share actions by the joining rule. */
interface Chain {
  key: string;
  siteKey: DemoSiteKey;
  siteId: string;
  spaceId: string;
  floorId: string;
  timeZone: string;
  policy: DuePolicy;
  leadId: string | null;
  auditorIds: string[];
  position: { x: number; y: number };
  failures: Failure[];
}

/** What the last action of a chain is made to be, so every site shows every state. */
type Fate = ActionState | "overdue" | "reopened";

/** Each step of an action's story is a person's move from the workflow table. */
type StepKind = Exclude<ActionMoveName, "assign">;
interface Step {
  kind: StepKind;
  at: number;
}

/** Who makes each move in the story, and the words they give when the move needs some. */
const storyMoves: Record<StepKind, { by: "lead" | "verifier"; words?: readonly string[] }> = {
  start: { by: "lead" },
  add_photo: { by: "lead" },
  ask_check: { by: "lead", words: sentNotes },
  confirm: { by: "verifier", words: verifiedNotes },
  send_back: { by: "verifier", words: rejectedNotes },
  reopen: { by: "verifier", words: reopenedNotes },
};
const storyRoles: Record<"lead" | "verifier", Role> = {
  lead: "facilities_lead",
  verifier: "auditor",
};

interface LogRow {
  action: string;
  at: number;
  actorId: string | null;
  before?: object;
  after: object;
  reason?: string | null;
}

interface SimAction {
  id: string;
  openedAt: number;
  due: number;
  severity: Severity;
  title: string;
  itemKey: string;
  state: ActionState;
  closedAt: number | null;
  proofRound: number;
  /** Typical days this action takes, kept for re-planning after a setback. */
  total: number;
  verifierId: string | null;
  findings: (Failure & { id: string })[];
  proofs: { id: string; round: number; at: number; picture: number }[];
  log: LogRow[];
  /** State changes, to tell when the time-based notices went out. */
  states: { at: number; state: ActionState }[];
  updatedAt: number;
}

/** A stable seed per chain, so one chain's story does not depend on how many others there are. */
function seedOf(key: string): number {
  return createHash("sha256").update(key).digest().readUInt32LE(0);
}

function pick<T>(list: readonly T[], random: () => number): T {
  return list[Math.floor(random() * list.length)]!;
}

/** People fix and check things in the daytime: a moment outside 08:00–18:00 moves into the day. */
function inWorkingHours(at: number, timeZone: string, random: () => number): number {
  // Drawn whether or not it is used, so the story does not depend on the hour the demo is made.
  const minutes = Math.floor(random() * 600);
  const local = new TZDate(at, timeZone);
  const localHour = local.getHours();
  if (localHour >= 8 && localHour < 18) return at;
  if (localHour >= 18) local.setDate(local.getDate() + 1);
  local.setHours(8, minutes, 0, 0);
  return local.getTime();
}

function simulateChain(chain: Chain, now: number, fate?: Fate): SimAction[] {
  const random = mulberry32(seedOf(chain.key));
  const yearAgo = now - 365 * day;
  const actions: SimAction[] = [];
  let current: SimAction | null = null;
  let pending: Step[] = [];
  // Off when a life must fit before now whatever the hour.
  let daytime = true;

  const schedule = (start: number) => {
    let last = start;
    return (at: number, shift = true): number => {
      let next = shift && daytime ? inWorkingHours(at, chain.timeZone, random) : at;
      if (shift && next >= now && at < now) next = at;
      next = Math.max(next, last + 5 * 60 * 1000);
      last = next;
      return next;
    };
  };

  /** A photo, asking for a check and the auditor's check, from an action being fixed at `from`. */
  const fixFrom = (from: number, total: number, rejectChance: number): Step[] => {
    const at = schedule(from);
    const steps: Step[] = [];
    const proof = at(from + total * day * (0.2 + random() * 0.3));
    steps.push({ kind: "add_photo", at: proof });
    const sent = at(proof + (10 + random() * 80) * 60 * 1000, false);
    steps.push({ kind: "ask_check", at: sent });
    const checked = at(sent + Math.max(2 * hour, total * day * (0.1 + random() * 0.3)));
    if (random() < rejectChance) {
      steps.push({ kind: "send_back", at: checked });
      steps.push(...fixFrom(checked, total * 0.6, 0));
    } else steps.push({ kind: "confirm", at: checked });
    return steps;
  };

  const naturalLife = (action: SimAction): Step[] => {
    const stall = random();
    const at = schedule(action.openedAt);
    const started = at(action.openedAt + action.total * day * (0.05 + random() * 0.15));
    // A very few are never picked up, or picked up and left: the oldest overdue work.
    if (stall < 0.004) return [];
    if (stall < 0.008) return [{ kind: "start", at: started }];
    return [{ kind: "start", at: started }, ...fixFrom(started, action.total, 0.06)];
  };

  /** The last action's life fitted between its opening and now. */
  const forcedLife = (action: SimAction, forced: Fate): Step[] => {
    const window = now - action.openedAt;
    const at = schedule(action.openedAt);
    const early = (low: number, high: number) =>
      at(action.openedAt + window * (low + random() * (high - low)));
    switch (forced) {
      case "to_fix":
        return [];
      case "fixing":
        return [{ kind: "start", at: early(0.2, 0.5) }];
      case "overdue": {
        const started = at(action.openedAt + Math.min(window, action.due - action.openedAt) * 0.3);
        const steps: Step[] = [{ kind: "start", at: started }];
        if (random() < 0.5)
          steps.push({ kind: "add_photo", at: at(started + (now - started) * 0.3, false) });
        return steps;
      }
      case "to_check": {
        const started = early(0.05, 0.15);
        const proof = at(started + (now - started) * (0.3 + random() * 0.3));
        const sent = at(proof + Math.min(40 * 60 * 1000, (now - proof) / 4), false);
        return [
          { kind: "start", at: started },
          { kind: "add_photo", at: proof },
          { kind: "ask_check", at: sent },
        ];
      }
      case "done": {
        daytime = false;
        action.total = Math.min(action.total, (window / day) * 0.5);
        const started = at(action.openedAt + action.total * day * 0.1);
        return [{ kind: "start", at: started }, ...fixFrom(started, action.total, 0)];
      }
      case "reopened": {
        const started = at(action.openedAt + action.total * day * 0.1);
        const first = fixFrom(started, action.total, 0);
        const closed = first[first.length - 1]!.at;
        const reopened = schedule(closed)(closed + (2 + random() * 4) * day);
        return [
          { kind: "start", at: started },
          ...first,
          { kind: "reopen", at: reopened },
          ...fixFrom(reopened, action.total, 0),
        ];
      }
    }
  };

  const setState = (action: SimAction, state: ActionState, at: number) => {
    action.state = state;
    action.states.push({ at, state });
  };

  /** Makes one move through the workflow table, as the server would, and logs it. */
  const apply = (action: SimAction, step: Step) => {
    const rule = actionMoves[step.kind];
    const story = storyMoves[step.kind];
    const actorId = story.by === "lead" ? chain.leadId : action.verifierId;
    if (
      !moveAllowedFrom(step.kind, action.state) ||
      !rolePermissions[storyRoles[story.by]].includes(rule.permission)
    ) {
      throw new Error(`The demo story broke the workflow: ${step.kind} from ${action.state}.`);
    }
    const before: Record<string, unknown> = { state: action.state };
    const after: Record<string, unknown> = { state: rule.to ?? action.state };
    action.updatedAt = step.at;
    if (step.kind === "add_photo") {
      const proof = {
        id: randomUUID(),
        round: action.proofRound,
        at: step.at,
        picture: action.itemKey.startsWith("doff.") ? 1 : 0,
      };
      action.proofs.push(proof);
      Object.assign(after, { proofId: proof.id, picture: proof.picture });
    }
    if (rule.needsProofOfAttempt && !action.proofs.some((p) => p.round === action.proofRound)) {
      throw new Error(`The demo story asked for a check without a photo of the fix.`);
    }
    if (rule.to === "done") {
      action.closedAt = step.at;
      after.daysToClose = daysToClose(new Date(action.openedAt), new Date(step.at));
    }
    if (action.state === "done" && rule.to !== null) {
      before.closedAt = new Date(action.closedAt!).toISOString();
      action.closedAt = null;
    }
    if (rule.newAttempt) action.proofRound += 1;
    action.log.push({
      action: `action.${moveTimelineKinds[step.kind]}`,
      at: step.at,
      actorId,
      ...(step.kind === "add_photo" ? {} : { before }),
      after,
      ...(story.words ? { reason: pick(story.words, random) } : {}),
    });
    if (rule.to !== null) setState(action, rule.to, step.at);
  };

  const applyUntil = (until: number) => {
    while (current && pending.length > 0 && pending[0]!.at < until && pending[0]!.at <= now)
      apply(current, pending.shift()!);
  };

  chain.failures.forEach((failure, index) => {
    applyUntil(failure.at);
    const finding = { ...failure, id: randomUUID() };
    if (current && systemMoves.joinsExisting(current.state)) {
      const before = current.state;
      current.findings.push(finding);
      current.updatedAt = failure.at;
      // Failing again while the fix waits for its check means the fix did not hold.
      const repeat = systemMoves.repeatFailure(before);
      if (repeat.to !== before) setState(current, repeat.to, failure.at);
      if (repeat.newAttempt) {
        current.proofRound += 1;
        pending = fixFrom(failure.at, current.total * 0.6, 0);
      }
      current.log.push({
        action: "action.finding_added",
        at: failure.at,
        actorId: failure.auditorId,
        before: { state: before },
        after: { state: current.state, auditId: failure.auditId },
        reason: failure.note,
      });
      return;
    }
    const progress = Math.min(1, Math.max(0, (failure.at - yearAgo) / (365 * day)));
    const pace = paces[chain.siteKey](progress);
    const total =
      typicalDays[failure.severity] *
      pace.factor *
      (0.6 + random() * 0.8) *
      (random() < pace.slow ? 4 + random() * 6 : 1);
    const due = dueAt(
      new Date(failure.at),
      failure.severity,
      chain.policy,
      chain.timeZone,
    ).getTime();
    current = {
      id: randomUUID(),
      openedAt: failure.at,
      due,
      severity: failure.severity,
      title: failure.itemText,
      itemKey: failure.itemKey,
      state: "to_fix",
      closedAt: null,
      proofRound: 0,
      total,
      verifierId: pick(chain.auditorIds, random) ?? null,
      findings: [finding],
      proofs: [],
      log: [
        {
          action: "action.opened",
          at: failure.at,
          actorId: failure.auditorId,
          after: {
            state: "to_fix",
            auditId: failure.auditId,
            severity: failure.severity,
            dueAt: new Date(due).toISOString(),
            assigneeId: chain.leadId,
          },
          reason: failure.note,
        },
      ],
      states: [{ at: failure.at, state: "to_fix" }],
      updatedAt: failure.at,
    };
    actions.push(current);
    const last = index === chain.failures.length - 1;
    pending = last && fate ? forcedLife(current, fate) : naturalLife(current);
  });
  applyUntil(Infinity);
  return actions;
}

/** The notices the scheduler would already have sent, so a fresh demo does not send a backlog. */
function sentNotices(action: SimAction, now: number): { kind: string; at: number }[] {
  const ownersTurn = (state: ActionState) =>
    (ownerWorkStates as readonly ActionState[]).includes(state);
  if (!ownersTurn(action.state)) return [];
  const notices: { kind: string; at: number }[] = [];
  const soon = action.due - day;
  if (action.openedAt < soon && soon <= now) notices.push({ kind: "due-soon", at: soon });
  if (action.due >= now) return notices;
  let from: number | null = null;
  for (const [index, change] of action.states.entries()) {
    const until = action.states[index + 1]?.at ?? now;
    if (ownersTurn(change.state) && until >= action.due) {
      from = Math.max(change.at, action.due);
      break;
    }
  }
  if (from === null) return notices;
  notices.push({ kind: "overdue", at: from });
  for (let week = 1; from + week * 7 * day <= now; week += 1)
    notices.push({ kind: `reminder-${week}`, at: from + week * 7 * day });
  return notices;
}

/** Two small proof photos of our own drawing: a refilled hand-rub station, a labelled dirty chair. */
function proofPictures(): string[] {
  const frame = (body: string) =>
    `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="480" viewBox="0 0 640 480"><rect width="640" height="480" fill="#e9e4d8"/><rect y="380" width="640" height="100" fill="#b9b2a3"/>${body}<circle cx="560" cy="80" r="36" fill="#2f7d4f"/><path d="M542 80 l12 12 l24 -26" fill="none" stroke="#fff" stroke-width="8" stroke-linecap="round" stroke-linejoin="round"/></svg>`;
  return [
    frame(
      `<rect x="250" y="90" width="120" height="200" rx="14" fill="#f7f7f4" stroke="#5b6470" stroke-width="6"/><rect x="272" y="120" width="76" height="110" rx="6" fill="#cfe6f2"/><rect x="272" y="178" width="76" height="52" fill="#7fb8d8"/><rect x="295" y="290" width="30" height="26" fill="#5b6470"/><rect x="262" y="244" width="96" height="24" rx="4" fill="#f2d16b"/>`,
    ),
    frame(
      `<rect x="200" y="250" width="220" height="24" rx="6" fill="#7a5a3a"/><rect x="210" y="120" width="24" height="150" fill="#7a5a3a"/><rect x="210" y="120" width="200" height="22" rx="6" fill="#7a5a3a"/><rect x="212" y="274" width="18" height="110" fill="#5c4330"/><rect x="392" y="274" width="18" height="110" fill="#5c4330"/><rect x="270" y="160" width="110" height="60" rx="6" fill="#d9534f"/><rect x="285" y="182" width="80" height="14" rx="3" fill="#fff"/><rect x="470" y="300" width="80" height="84" rx="8" fill="#8c959f"/><rect x="464" y="290" width="92" height="16" rx="4" fill="#6b737c"/>`,
    ),
  ];
}

const fates: Fate[] = ["done", "to_fix", "fixing", "to_check", "overdue"];

function holds(action: SimAction, fate: Fate, now: number): boolean {
  if (fate === "overdue") return systemMoves.joinsExisting(action.state) && action.due < now;
  return action.state === fate;
}

/** Whether the chain's last action could be given this fate in the time it has had. */
function suits(action: SimAction, fate: Fate, now: number): boolean {
  const age = now - action.openedAt;
  switch (fate) {
    case "overdue":
      return action.due < now - hour && action.due > now - 60 * day;
    case "done":
      return age > 2 * day;
    case "reopened":
      return age > 45 * day && age < 220 * day;
    default:
      return age > 4 * hour && age < 21 * day;
  }
}

/**
 * Findings and corrective actions for the demo audit history, as the live system would have made
 * them when each audit was submitted, then a year of work on them by the facilities leads and
 * auditors, every move made through the workflow table. Returns counts by site and state.
 */
export async function createDemoCorrectiveActions(
  tx: Tx,
  storage: Storage,
  siteIds: Record<DemoSiteKey, string>,
  now = new Date(),
): Promise<Record<string, Record<ActionState, number>>> {
  const nowMs = now.getTime();
  const siteKeys = Object.keys(siteIds) as DemoSiteKey[];
  const siteRows = await tx
    .select({ id: sites.id, timeZone: sites.timeZone, policy: siteDuePolicies.policy })
    .from(sites)
    .leftJoin(siteDuePolicies, eq(siteDuePolicies.siteId, sites.id))
    .where(inArray(sites.id, Object.values(siteIds)));
  const people = new Map<string, { lead: string | null; auditors: string[] }>();
  for (const key of siteKeys) {
    const [lead] = await peopleWithRoleAt(tx, siteIds[key], "facilities_lead");
    const auditors = await peopleWithRoleAt(tx, siteIds[key], "auditor");
    people.set(siteIds[key], { lead: lead?.id ?? null, auditors: auditors.map((a) => a.id) });
  }

  // Audits that already have findings were seen by the live system; leave them be.
  const failed = await tx
    .select({
      auditId: audits.id,
      auditorId: audits.auditorId,
      submittedAt: audits.submittedAt,
      siteId: audits.siteId,
      spaceId: audits.spaceId,
      floorId: spaces.floorId,
      level: floors.level,
      spaceName: spaces.name,
      polygon: spaces.polygon,
      itemId: checklistItems.id,
      itemKey: checklistItems.key,
      itemText: checklistItems.text,
      severity: checklistItems.severity,
      note: auditAnswers.note,
    })
    .from(auditAnswers)
    .innerJoin(audits, eq(audits.id, auditAnswers.auditId))
    .innerJoin(checklistItems, eq(checklistItems.id, auditAnswers.itemId))
    .innerJoin(spaces, eq(spaces.id, audits.spaceId))
    .innerJoin(floors, eq(floors.id, spaces.floorId))
    .where(
      and(
        inArray(audits.siteId, Object.values(siteIds)),
        eq(audits.status, "submitted"),
        eq(auditAnswers.outcome, "fail"),
        notExists(
          tx.select({ id: findings.id }).from(findings).where(eq(findings.auditId, audits.id)),
        ),
      ),
    )
    .orderBy(asc(audits.submittedAt), asc(checklistItems.position));
  const liveUnfinished = new Set(
    (
      await tx
        .select({ spaceId: correctiveActions.spaceId, itemKey: correctiveActions.itemKey })
        .from(correctiveActions)
        .where(
          and(
            inArray(correctiveActions.siteId, Object.values(siteIds)),
            ne(correctiveActions.state, "done"),
          ),
        )
    ).map((row) => `${row.spaceId}|${row.itemKey}`),
  );

  const chainsByKey = new Map<string, Chain>();
  for (const row of failed) {
    if (!row.submittedAt) continue;
    const siteKey = siteKeys.find((key) => siteIds[key] === row.siteId)!;
    const key = `${siteKey}|${row.level}|${row.spaceName}|${row.itemKey}`;
    let chain = chainsByKey.get(key);
    if (!chain) {
      const site = siteRows.find((s) => s.id === row.siteId)!;
      const who = people.get(row.siteId)!;
      chain = {
        key,
        siteKey,
        siteId: row.siteId,
        spaceId: row.spaceId,
        floorId: row.floorId,
        timeZone: site.timeZone,
        policy: site.policy ?? defaultDuePolicy,
        leadId: who.lead,
        auditorIds: who.auditors,
        position: polygonCentroid(row.polygon),
        failures: [],
      };
      chainsByKey.set(key, chain);
    }
    chain.failures.push({
      auditId: row.auditId,
      auditorId: row.auditorId,
      at: row.submittedAt.getTime(),
      itemId: row.itemId,
      itemKey: row.itemKey,
      itemText: row.itemText,
      severity: row.severity,
      note: row.note,
    });
  }
  const chains = [...chainsByKey.values()].sort((a, b) => a.key.localeCompare(b.key));
  const forced = new Map<number, Fate>();
  chains.forEach((chain, index) => {
    if (liveUnfinished.has(`${chain.spaceId}|${chain.failures[0]!.itemKey}`))
      forced.set(index, "done");
  });
  const results = chains.map((chain, index) => simulateChain(chain, nowMs, forced.get(index)));

  // Every site shows every state, and some overdue work: give a recent chain that fate when the
  // year's story did not, taking it only from a state the site has more of.
  for (const siteKey of siteKeys) {
    const mine = chains.map((_, index) => index).filter((i) => chains[i]!.siteKey === siteKey);
    const count = (fate: Fate) =>
      mine.reduce(
        (n, i) => n + results[i]!.filter((action) => holds(action, fate, nowMs)).length,
        0,
      );
    for (const fate of fates) {
      if (count(fate) > 0) continue;
      const candidates = mine
        .filter((i) => !forced.has(i))
        .filter((i) => {
          const last = results[i]!.at(-1)!;
          return (
            suits(last, fate, nowMs) &&
            fates.every((held) => !holds(last, held, nowMs) || count(held) > 1)
          );
        })
        .sort((a, b) =>
          fate === "overdue"
            ? results[b]!.at(-1)!.due - results[a]!.at(-1)!.due
            : results[b]!.at(-1)!.openedAt - results[a]!.at(-1)!.openedAt,
        );
      const chosen = candidates[0];
      if (chosen === undefined) continue;
      forced.set(chosen, fate);
      results[chosen] = simulateChain(chains[chosen]!, nowMs, fate);
    }
  }
  // One or two done actions that did not hold and were reopened.
  const pickReopened = mulberry32(20261204);
  for (const siteKey of ["wexley", "general"] as const) {
    const candidates = chains
      .map((_, index) => index)
      .filter((i) => chains[i]!.siteKey === siteKey && !forced.has(i))
      .filter((i) => {
        const last = results[i]!.at(-1)!;
        return last.state === "done" && suits(last, "reopened", nowMs);
      });
    if (candidates.length === 0) continue;
    const chosen = pick(candidates, pickReopened);
    forced.set(chosen, "reopened");
    results[chosen] = simulateChain(chains[chosen]!, nowMs, "reopened");
  }

  const pictures = await Promise.all(
    proofPictures().map((svg) => sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer()),
  );
  const pictureIds = new Map<string, string[]>();
  for (const key of siteKeys) {
    const ids: string[] = [];
    for (const buffer of pictures) {
      const image = await storeImage(
        { db: tx, storage },
        {
          siteId: siteIds[key],
          uploadedBy: people.get(siteIds[key])!.lead,
          buffer,
          field: "photo",
        },
      );
      ids.push(image.id);
    }
    pictureIds.set(siteIds[key], ids);
  }

  const actionRows: (typeof correctiveActions.$inferInsert)[] = [];
  const findingRows: (typeof findings.$inferInsert)[] = [];
  const proofRows: (typeof actionProofs.$inferInsert)[] = [];
  const logRows: (typeof changeLog.$inferInsert)[] = [];
  const noticeRows: (typeof actionNotices.$inferInsert)[] = [];
  const counts = Object.fromEntries(
    siteKeys.map((key) => [
      key,
      Object.fromEntries(actionStates.map((state) => [state, 0])) as Record<ActionState, number>,
    ]),
  );
  chains.forEach((chain, index) => {
    for (const action of results[index]!) {
      counts[chain.siteKey]![action.state] += 1;
      const closedAt = action.state === "done" ? new Date(action.closedAt!) : null;
      actionRows.push({
        id: action.id,
        siteId: chain.siteId,
        spaceId: chain.spaceId,
        floorId: chain.floorId,
        itemKey: action.itemKey,
        title: action.title,
        severity: action.severity,
        state: action.state,
        assigneeId: chain.leadId,
        openedAt: new Date(action.openedAt),
        dueAt: new Date(action.due),
        closedAt,
        closeReason: closedAt ? "confirmed" : null,
        daysToClose: closedAt ? daysToClose(new Date(action.openedAt), closedAt) : null,
        proofRound: action.proofRound,
        ...chain.position,
        createdAt: new Date(action.openedAt),
        updatedAt: new Date(action.updatedAt),
      });
      for (const finding of action.findings)
        findingRows.push({
          id: finding.id,
          actionId: action.id,
          auditId: finding.auditId,
          siteId: chain.siteId,
          spaceId: chain.spaceId,
          itemId: finding.itemId,
          itemKey: finding.itemKey,
          itemText: finding.itemText,
          severity: finding.severity,
          note: finding.note,
          ...chain.position,
          createdAt: new Date(finding.at),
        });
      const images = pictureIds.get(chain.siteId)!;
      for (const proof of action.proofs)
        proofRows.push({
          id: proof.id,
          actionId: action.id,
          imageId: images[proof.picture]!,
          round: proof.round,
          uploadedBy: chain.leadId,
          createdAt: new Date(proof.at),
        });
      for (const entry of action.log) {
        let after = entry.after as Record<string, unknown>;
        if ("picture" in after) {
          const { picture, ...rest } = after;
          after = { ...rest, imageId: images[picture as number] };
        }
        logRows.push({
          occurredAt: new Date(entry.at),
          actorId: entry.actorId,
          action: entry.action,
          entity,
          entityId: action.id,
          siteId: chain.siteId,
          before: entry.before ?? null,
          after,
          reason: entry.reason ?? null,
          requestId,
        });
      }
      for (const notice of sentNotices(action, nowMs))
        noticeRows.push({ actionId: action.id, kind: notice.kind, createdAt: new Date(notice.at) });
    }
  });

  const insertAll = async <T>(
    rows: T[],
    size: number,
    insert: (batch: T[]) => Promise<unknown>,
  ) => {
    for (let i = 0; i < rows.length; i += size) await insert(rows.slice(i, i + size));
  };
  await insertAll(actionRows, 500, (batch) => tx.insert(correctiveActions).values(batch));
  await insertAll(findingRows, 500, (batch) => tx.insert(findings).values(batch));
  await insertAll(proofRows, 1000, (batch) => tx.insert(actionProofs).values(batch));
  await insertAll(logRows, 1000, (batch) => tx.insert(changeLog).values(batch));
  await insertAll(noticeRows, 1000, (batch) => tx.insert(actionNotices).values(batch));
  return counts;
}
