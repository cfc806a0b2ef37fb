import { TZDate } from "@date-fns/tz";

import { daysToClose, dueAt, type DuePolicy } from "@shared/calc/due";
import type { Severity } from "@shared/calc/verdict";
import { rolePermissions } from "@shared/permissions";
import type { Role } from "@shared/roles";
import {
  actionMoves,
  moveAllowedFrom,
  moveTimelineKinds,
  ownerWorkStates,
  systemMoves,
  type ActionMoveName,
  type ActionState,
  type TimelineKind,
} from "@shared/workflow/action-workflow";

import { mulberry32, pick, seedOf } from "./random";

/**
 * A year of work on the demo's corrective actions, told as stories: pure and seeded. Given the
 * failed answers (grouped into chains), the moment "now" and each site's pace, it says which
 * actions the live system would have opened, every move the facilities leads and auditors made
 * on them through the workflow table, the photos they sent and the notices already sent. The same
 * input and seed always tell the same stories; nothing here touches the database or storage.
 */

const hour = 60 * 60 * 1000;
const day = 24 * hour;

/** A failed answer of a submitted audit. */
export interface StoryFailure {
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
export interface StoryChain {
  /** Stable words naming the chain (site, floor, space, item): its story's seed and its order. */
  key: string;
  /** The site's key in `paces`. */
  site: string;
  timeZone: string;
  policy: DuePolicy;
  leadId: string | null;
  auditorIds: readonly string[];
  failures: readonly StoryFailure[];
  /**
   * The live system already has an unfinished action for this item in this space, so this
   * chain's last action must be done (one unfinished action per item and space).
   */
  mustEndDone?: boolean;
}

/**
 * How a site keeps up at a point of the year (progress 0 a year ago, 1 now): `factor` stretches
 * the typical days to close, `slow` is the chance an action drags for weeks.
 */
export type Pace = (progress: number) => { factor: number; slow: number };

export interface StoryInput {
  chains: readonly StoryChain[];
  now: number;
  paces: Readonly<Record<string, Pace>>;
  seed: number;
  /** Sites where one done action that did not hold is reopened. */
  reopenAt?: readonly string[];
}

/** A person's move on an action; "assign" is not part of the demo's stories. */
export type StoryMove = Exclude<ActionMoveName, "assign">;

/** One change-log entry of an action's timeline. */
export interface StoryEntry {
  kind: TimelineKind;
  at: number;
  actorId: string | null;
  /** The person's move, and the role they made it in; absent for what the system records. */
  move?: StoryMove;
  role?: Role;
  before?: Record<string, unknown>;
  /** For a photo: `proof` is its index in the action's proofs and `picture` the picture drawn. */
  after: Record<string, unknown>;
  reason?: string | null;
}

export interface StoryProof {
  round: number;
  at: number;
  /** Which of the proof pictures (see proof-pictures.ts) the photo shows. */
  picture: number;
}

export interface StoryNotice {
  kind: string;
  at: number;
}

export interface StoryAction {
  openedAt: number;
  dueAt: number;
  severity: Severity;
  title: string;
  itemKey: string;
  state: ActionState;
  closedAt: number | null;
  daysToClose: number | null;
  proofRound: number;
  updatedAt: number;
  findings: StoryFailure[];
  proofs: StoryProof[];
  log: StoryEntry[];
  notices: StoryNotice[];
}

export interface ChainStory {
  chain: StoryChain;
  actions: StoryAction[];
}

/** Typical days from opening to closing, before the site's own pace is applied. */
const typicalDays: Record<Severity, number> = { critical: 0.8, major: 4.5, minor: 12 };

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

/** Who makes each move in the story, and the words they give when the move needs some. */
const storyMoves: Record<StoryMove, { by: "lead" | "verifier"; words?: readonly string[] }> = {
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

/** What the last action of a chain is made to be, so every site shows every state. */
export type Fate = ActionState | "overdue" | "reopened";

interface Step {
  kind: StoryMove;
  at: number;
}

interface Working extends Omit<StoryAction, "notices" | "daysToClose"> {
  /** Typical days this action takes, kept for re-planning after a setback. */
  total: number;
  verifierId: string | null;
  /** State changes, to tell when the time-based notices went out. */
  states: { at: number; state: ActionState }[];
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

/**
 * One chain's story: an action opens on a failure unless one is unfinished (the failure then
 * joins it), and each action lives its life through the workflow table until now. `fate`, when
 * given, decides how the chain's last action ends up.
 */
export function tellChainStory(
  chain: StoryChain,
  options: { now: number; pace: Pace; seed: number; fate?: Fate },
): StoryAction[] {
  const { now, pace: paceAt, fate } = options;
  const random = mulberry32(seedOf(`${options.seed}|${chain.key}`));
  const yearAgo = now - 365 * day;
  const actions: Working[] = [];
  let current: Working | null = null;
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

  const naturalLife = (action: Working): Step[] => {
    const stall = random();
    const at = schedule(action.openedAt);
    const started = at(action.openedAt + action.total * day * (0.05 + random() * 0.15));
    // A very few are never picked up, or picked up and left: the oldest overdue work.
    if (stall < 0.004) return [];
    if (stall < 0.008) return [{ kind: "start", at: started }];
    return [{ kind: "start", at: started }, ...fixFrom(started, action.total, 0.06)];
  };

  /**
   * The rest of an action's life, from its state at `from` to done, spread evenly before now: for
   * a chain that must end done when its last failure is recent or joins an unfinished action.
   */
  const finishWithin = (action: Working, from: number): Step[] => {
    const rest: Record<ActionState, StoryMove[]> = {
      to_fix: ["start", "add_photo", "ask_check", "confirm"],
      fixing: ["add_photo", "ask_check", "confirm"],
      to_check: ["confirm"],
      done: [],
    };
    const moves = rest[action.state];
    return moves.map((kind, index) => ({
      kind,
      at: Math.floor(from + ((now - from) * (index + 1)) / (moves.length + 1)),
    }));
  };

  /** The last action's life fitted between its opening and now. */
  const forcedLife = (action: Working, forced: Fate): Step[] => {
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
        const started = at(
          action.openedAt + Math.min(window, action.dueAt - action.openedAt) * 0.3,
        );
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
        if (window < day) return finishWithin(action, action.openedAt);
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

  const setState = (action: Working, state: ActionState, at: number) => {
    action.state = state;
    action.states.push({ at, state });
  };

  /** Makes one move through the workflow table, as the server would, and logs it. */
  const apply = (action: Working, step: Step) => {
    const rule = actionMoves[step.kind];
    const story = storyMoves[step.kind];
    const role = storyRoles[story.by];
    const actorId = story.by === "lead" ? chain.leadId : action.verifierId;
    if (
      !moveAllowedFrom(step.kind, action.state) ||
      !rolePermissions[role].includes(rule.permission)
    ) {
      throw new Error(`The demo story broke the workflow: ${step.kind} from ${action.state}.`);
    }
    const before: Record<string, unknown> = { state: action.state };
    const after: Record<string, unknown> = { state: rule.to ?? action.state };
    action.updatedAt = step.at;
    if (step.kind === "add_photo") {
      const picture = action.itemKey.startsWith("doff.") ? 1 : 0;
      action.proofs.push({ round: action.proofRound, at: step.at, picture });
      Object.assign(after, { proof: action.proofs.length - 1, picture });
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
      kind: moveTimelineKinds[step.kind],
      at: step.at,
      actorId,
      move: step.kind,
      role,
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
    if (current && systemMoves.joinsExisting(current.state)) {
      const before = current.state;
      current.findings.push(failure);
      current.updatedAt = failure.at;
      // Failing again while the fix waits for its check means the fix did not hold.
      const repeat = systemMoves.repeatFailure(before);
      if (repeat.to !== before) setState(current, repeat.to, failure.at);
      if (repeat.newAttempt) {
        current.proofRound += 1;
        pending = fixFrom(failure.at, current.total * 0.6, 0);
      }
      // A chain that must end done cannot leave its last failure on an unfinished action.
      if (index === chain.failures.length - 1 && fate === "done")
        pending = finishWithin(current, failure.at);
      current.log.push({
        kind: "finding_added",
        at: failure.at,
        actorId: failure.auditorId,
        before: { state: before },
        after: { state: current.state, auditId: failure.auditId },
        reason: failure.note,
      });
      return;
    }
    const progress = Math.min(1, Math.max(0, (failure.at - yearAgo) / (365 * day)));
    const pace = paceAt(progress);
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
      openedAt: failure.at,
      dueAt: due,
      severity: failure.severity,
      title: failure.itemText,
      itemKey: failure.itemKey,
      state: "to_fix",
      closedAt: null,
      proofRound: 0,
      total,
      verifierId: pick(chain.auditorIds, random) ?? null,
      findings: [failure],
      proofs: [],
      log: [
        {
          kind: "opened",
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
  return actions.map((action) => ({
    openedAt: action.openedAt,
    dueAt: action.dueAt,
    severity: action.severity,
    title: action.title,
    itemKey: action.itemKey,
    state: action.state,
    closedAt: action.closedAt,
    daysToClose:
      action.closedAt === null
        ? null
        : daysToClose(new Date(action.openedAt), new Date(action.closedAt)),
    proofRound: action.proofRound,
    updatedAt: action.updatedAt,
    findings: action.findings,
    proofs: action.proofs,
    log: action.log,
    notices: sentNotices(action, now),
  }));
}

const ownersTurn = (state: ActionState) =>
  (ownerWorkStates as readonly ActionState[]).includes(state);

/**
 * The notices the scheduler would already have sent, so a fresh demo does not send a backlog:
 * due soon a day before the due time, then overdue and a weekly reminder, only while it is the
 * owner's turn to act.
 */
function sentNotices(action: Working, now: number): StoryNotice[] {
  if (!ownersTurn(action.state)) return [];
  const notices: StoryNotice[] = [];
  const soon = action.dueAt - day;
  if (action.openedAt < soon && soon <= now) notices.push({ kind: "due-soon", at: soon });
  if (action.dueAt >= now) return notices;
  let from: number | null = null;
  for (const [index, change] of action.states.entries()) {
    const until = action.states[index + 1]?.at ?? now;
    if (ownersTurn(change.state) && until >= action.dueAt) {
      from = Math.max(change.at, action.dueAt);
      break;
    }
  }
  if (from === null) return notices;
  notices.push({ kind: "overdue", at: from });
  for (let week = 1; from + week * 7 * day <= now; week += 1)
    notices.push({ kind: `reminder-${week}`, at: from + week * 7 * day });
  return notices;
}

const fates: Fate[] = ["done", "to_fix", "fixing", "to_check", "overdue"];

/** Unfinished and past its due time. */
export const isOverdue = (action: StoryAction, now: number) =>
  systemMoves.joinsExisting(action.state) && action.dueAt < now;

function holds(action: StoryAction, fate: Fate, now: number): boolean {
  if (fate === "overdue") return isOverdue(action, now);
  return action.state === fate;
}

/** Whether the chain's last action could be given this fate in the time it has had. */
function suits(action: StoryAction, fate: Fate, now: number): boolean {
  const age = now - action.openedAt;
  switch (fate) {
    case "overdue":
      return action.dueAt < now - hour && action.dueAt > now - 60 * day;
    case "done":
      return age > 2 * day;
    case "reopened":
      return age > 45 * day && age < 220 * day;
    default:
      return age > 4 * hour && age < 21 * day;
  }
}

/**
 * Every chain's story, in the order of their keys. Then, so every site shows every state and
 * some overdue work, a recent chain is given the missing fate when the year's story did not,
 * taken only from a state the site has more of; and at each of `reopenAt` one done action that
 * did not hold is reopened.
 */
export function tellStories(input: StoryInput): ChainStory[] {
  const { now, seed } = input;
  const chains = [...input.chains].sort((a, b) => a.key.localeCompare(b.key));
  const paceOf = (chain: StoryChain) => {
    const pace = input.paces[chain.site];
    if (!pace) throw new Error(`No pace given for the site "${chain.site}".`);
    return pace;
  };
  const forced = new Map<number, Fate>();
  chains.forEach((chain, index) => {
    if (chain.mustEndDone) forced.set(index, "done");
  });
  const tell = (index: number) =>
    tellChainStory(chains[index]!, {
      now,
      seed,
      pace: paceOf(chains[index]!),
      fate: forced.get(index),
    });
  const results = chains.map((_, index) => tell(index));

  const sites = [...new Set(chains.map((chain) => chain.site))].sort();
  for (const site of sites) {
    const mine = chains.map((_, index) => index).filter((i) => chains[i]!.site === site);
    const count = (fate: Fate) =>
      mine.reduce((n, i) => n + results[i]!.filter((action) => holds(action, fate, now)).length, 0);
    for (const fate of fates) {
      if (count(fate) > 0) continue;
      const candidates = mine
        .filter((i) => !forced.has(i))
        .filter((i) => {
          const last = results[i]!.at(-1)!;
          return (
            suits(last, fate, now) &&
            fates.every((held) => !holds(last, held, now) || count(held) > 1)
          );
        })
        .sort((a, b) =>
          fate === "overdue"
            ? results[b]!.at(-1)!.dueAt - results[a]!.at(-1)!.dueAt
            : results[b]!.at(-1)!.openedAt - results[a]!.at(-1)!.openedAt,
        );
      const chosen = candidates[0];
      if (chosen === undefined) continue;
      forced.set(chosen, fate);
      results[chosen] = tell(chosen);
    }
  }
  const pickReopened = mulberry32(seed);
  for (const site of input.reopenAt ?? []) {
    const candidates = chains
      .map((_, index) => index)
      .filter((i) => chains[i]!.site === site && !forced.has(i))
      .filter((i) => {
        const last = results[i]!.at(-1)!;
        return last.state === "done" && suits(last, "reopened", now);
      });
    if (candidates.length === 0) continue;
    const chosen = pick(candidates, pickReopened);
    forced.set(chosen, "reopened");
    results[chosen] = tell(chosen);
  }
  return chains.map((chain, index) => ({ chain, actions: results[index]! }));
}

/**
 * The demo's three sites over the year: Orchard Hill gets quicker, Wexley falls behind, the
 * General stays steady.
 */
export const demoPaces = {
  general: () => ({ factor: 1, slow: 0.03 }),
  orchard: (p) => ({ factor: 1.7 - 1.1 * p, slow: 0.08 - 0.06 * p }),
  wexley: (p) => ({ factor: 0.9 + 1.3 * p, slow: 0.03 + 0.12 * p }),
} as const satisfies Record<string, Pace>;

/** The demo's seed, and the sites where a done action is reopened. */
export const demoStorySeed = 20261204;
export const demoReopenAt = ["wexley", "general"] as const;
