import { describe, expect, it } from "vitest";

import { defaultDuePolicy, dueAt } from "@shared/calc/due";
import type { Severity } from "@shared/calc/verdict";
import { rolePermissions } from "@shared/permissions";
import {
  actionMoves,
  moveAllowedFrom,
  ownerWorkStates,
  systemMoves,
  type ActionState,
} from "@shared/workflow/action-workflow";

import {
  demoPaces,
  demoReopenAt,
  isOverdue,
  tellChainStory,
  tellStories,
  type StoryAction,
  type StoryChain,
  type StoryInput,
} from "../../server/demo/action-stories";
import { mulberry32 } from "../../server/demo/random";

// The stories are checked against Lintel's own workflow table (shared/workflow/action-workflow.ts)
// and role permissions (shared/permissions.ts). Due times follow the site's policy; the default
// (critical 24 hours, major 7 days, minor 30 days) is common practice, not a published rule.

const hour = 60 * 60 * 1000;
const day = 24 * hour;
const now = Date.UTC(2026, 10, 16, 11, 30);

const items: { key: string; severity: Severity; chance: number }[] = [
  { key: "room.pressure", severity: "critical", chance: 0.04 },
  { key: "room.door-closed", severity: "major", chance: 0.12 },
  { key: "ante.hand-rub", severity: "major", chance: 0.1 },
  { key: "doff.bin", severity: "minor", chance: 0.15 },
  { key: "doff.chair-label", severity: "minor", chance: 0.12 },
];

/**
 * A year of failed answers at the demo's three sites: each space audited about every two weeks,
 * each item failing now and then. Made from its own seed, so every test reads the same year.
 */
function aYearOfFailures(): StoryChain[] {
  const random = mulberry32(14);
  const chains: StoryChain[] = [];
  for (const site of ["general", "orchard", "wexley"]) {
    const leadId = `lead-${site}`;
    const auditorIds = [`auditor-${site}-1`, `auditor-${site}-2`];
    for (let space = 0; space < 24; space += 1) {
      const audits: number[] = [];
      for (let at = now - 365 * day + random() * 14 * day; at < now - hour;) {
        audits.push(Math.round(at));
        at += (10 + random() * 8) * day;
      }
      for (const item of items) {
        const failures = audits
          .filter(() => random() < item.chance)
          .map((at, n) => ({
            auditId: `${site}-${space}-${at}`,
            auditorId: auditorIds[n % 2]!,
            at,
            itemId: `item-${item.key}`,
            itemKey: item.key,
            itemText: `The ${item.key} is as it should be`,
            severity: item.severity,
            note: n % 3 === 0 ? "Seen on the round." : null,
          }));
        if (failures.length === 0) continue;
        chains.push({
          key: `${site}|1|Bay ${space}|${item.key}`,
          site,
          timeZone: site === "wexley" ? "America/New_York" : "Europe/London",
          policy: defaultDuePolicy,
          leadId,
          auditorIds,
          failures,
        });
      }
    }
  }
  return chains;
}

const input = (seed = 7): StoryInput => ({
  chains: aYearOfFailures(),
  now,
  paces: demoPaces,
  seed,
  reopenAt: demoReopenAt,
});
const stories = tellStories(input());
const everyAction = stories.flatMap((story) =>
  story.actions.map((action) => ({ site: story.chain.site, action })),
);

/**
 * Replays an action's timeline through Lintel's own workflow table: each person's move must be
 * allowed from the state it was made in, by a role holding its permission, and each failure that
 * joins must find the action unfinished. Returns the state and attempt it ends in.
 */
function replay(action: StoryAction): { state: ActionState; round: number } {
  let state: ActionState = "to_fix";
  let round = 0;
  const [opened, ...rest] = action.log;
  expect(opened!.kind).toBe("opened");
  expect(opened!.at).toBe(action.openedAt);
  let last = opened!.at;
  for (const entry of rest) {
    expect(entry.at).toBeGreaterThanOrEqual(last);
    expect(entry.at).toBeLessThanOrEqual(now);
    last = entry.at;
    if (entry.before) expect(entry.before.state, entry.kind).toBe(state);
    if (entry.kind === "finding_added") {
      expect(entry.move).toBeUndefined();
      expect(systemMoves.joinsExisting(state)).toBe(true);
      const repeat = systemMoves.repeatFailure(state);
      state = repeat.to;
      if (repeat.newAttempt) round += 1;
    } else {
      const move = entry.move!;
      const rule = actionMoves[move];
      expect(moveAllowedFrom(move, state), `${move} from ${state}`).toBe(true);
      expect(rolePermissions[entry.role!], `${entry.role} making ${move}`).toContain(
        rule.permission,
      );
      if (rule.needsProofOfAttempt)
        expect(action.proofs.some((proof) => proof.round === round && proof.at <= entry.at)).toBe(
          true,
        );
      if (rule.newAttempt) round += 1;
      state = rule.to ?? state;
    }
    expect(entry.after.state, entry.kind).toBe(state);
  }
  return { state, round };
}

describe("demo action stories", () => {
  it("when the same failures are told twice with the same seed, in any order, then the stories are the same; another seed tells another", () => {
    const again = input();
    const shuffled = tellStories({ ...again, chains: [...again.chains].reverse() });
    expect(shuffled).toEqual(stories);
    expect(tellStories(input(8))).not.toEqual(stories);
  });

  it("when a year of failures is told, then every site has work in each of Lintel's states and some overdue", () => {
    for (const site of ["general", "orchard", "wexley"]) {
      const mine = everyAction.filter((entry) => entry.site === site).map((entry) => entry.action);
      expect(new Set(mine.map((action) => action.state)), site).toEqual(
        new Set(["to_fix", "fixing", "to_check", "done"]),
      );
      expect(mine.filter((action) => isOverdue(action, now)).length, site).toBeGreaterThan(0);
    }
  });

  it("when the stories are replayed through Lintel's own workflow table, then every step is a move allowed from its state, by a role holding the move's permission", () => {
    expect(everyAction.length).toBeGreaterThan(300);
    for (const { action } of everyAction) {
      const { state, round } = replay(action);
      expect(state).toBe(action.state);
      expect(round).toBe(action.proofRound);
    }
    // The stories use every person's move of the demo, including the rarer ones.
    const moves = new Set(everyAction.flatMap(({ action }) => action.log.map((e) => e.move)));
    for (const move of ["start", "add_photo", "ask_check", "confirm", "send_back", "reopen"])
      expect(moves, move).toContain(move);
  });

  it("when an action is done, then its fix was confirmed at its closing time and it knows its days to close; unfinished ones have neither", () => {
    const done = everyAction.filter(({ action }) => action.state === "done");
    expect(done.length).toBeGreaterThan(100);
    for (const { action } of done) {
      const confirmed = action.log.filter((entry) => entry.kind === "fix_confirmed").at(-1);
      expect(confirmed?.at).toBe(action.closedAt);
      expect(action.daysToClose).toBeCloseTo((action.closedAt! - action.openedAt) / day, 1);
      expect(confirmed!.role).toBe("auditor");
    }
    for (const { action } of everyAction.filter(({ action }) => action.state !== "done")) {
      expect(action.closedAt).toBeNull();
      expect(action.daysToClose).toBeNull();
    }
  });

  it("when an action opens, then it is due by the site's policy (common practice: critical 24 hours, major 7 days, minor 30 days)", () => {
    for (const { chain, actions } of stories)
      for (const action of actions) {
        expect(action.dueAt).toBe(
          dueAt(new Date(action.openedAt), action.severity, chain.policy, chain.timeZone).getTime(),
        );
        if (action.severity === "critical") expect(action.dueAt - action.openedAt).toBe(day);
      }
  });

  it("when notices were already sent, then only while it is the owner's turn (Lintel's owner-work states), and overdue ones after the due time", () => {
    const withNotices = everyAction.filter(({ action }) => action.notices.length > 0);
    expect(withNotices.length).toBeGreaterThan(0);
    for (const { action } of withNotices) {
      expect(ownerWorkStates as readonly ActionState[]).toContain(action.state);
      for (const notice of action.notices) {
        expect(notice.at).toBeLessThanOrEqual(now);
        if (notice.kind !== "due-soon") expect(notice.at).toBeGreaterThanOrEqual(action.dueAt);
      }
    }
    expect(
      everyAction.some(({ action }) => action.notices.some((n) => n.kind === "reminder-1")),
    ).toBe(true);
  });

  it("when the same item fails again while its fix waits for a check, then Lintel's workflow table sends the action back for a new attempt", () => {
    const chain = aYearOfFailures().find((c) => c.site === "general")!;
    const first = { ...chain, failures: [{ ...chain.failures[0]!, at: now - 200 * day }] };
    const options = { now, pace: demoPaces.general, seed: 7 };
    const [alone] = tellChainStory(first, options);
    const asked = alone!.log.find((entry) => entry.kind === "check_asked")!;
    const checked = alone!.log.find((entry) => entry.kind === "fix_confirmed")!;
    expect(asked.at).toBeLessThan(checked.at);
    const again = { ...chain.failures[0]!, auditId: "again", at: (asked.at + checked.at) / 2 };

    const [action, ...more] = tellChainStory(
      { ...first, failures: [...first.failures, again] },
      options,
    );
    expect(more).toEqual([]);
    expect(action!.findings.map((finding) => finding.auditId)).toContain("again");
    const joined = action!.log.find((entry) => entry.kind === "finding_added")!;
    expect(joined.at).toBe(again.at);
    expect(joined.before).toEqual({ state: "to_check" });
    expect(joined.after).toMatchObject({ state: "fixing", auditId: "again" });
    // A new attempt: the next check is asked with a photo of the new round.
    const next = action!.log.filter((entry) => entry.at > again.at);
    expect(next.map((entry) => entry.kind)).toEqual([
      "proof_added",
      "check_asked",
      "fix_confirmed",
    ]);
    expect(action!.proofs.at(-1)!.round).toBe(1);
    expect(action!.proofRound).toBe(1);
    expect(replay(action!).state).toBe("done");
  });

  it("when the live system already has an unfinished action for the item in that space, then the chain's last action ends done (one unfinished action per item and space)", () => {
    const chains = aYearOfFailures();
    const story = (mustEndDone: boolean) =>
      tellStories({ ...input(), chains: chains.map((chain) => ({ ...chain, mustEndDone })) });
    const unfinishedLast = story(false).filter((s) => s.actions.at(-1)!.state !== "done");
    expect(unfinishedLast.length).toBeGreaterThan(0);
    for (const { actions } of story(true)) {
      expect(actions.at(-1)!.state).toBe("done");
      expect(replay(actions.at(-1)!).state).toBe("done");
    }
  });
});
