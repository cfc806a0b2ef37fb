import type { Permission } from "../permissions";

/**
 * The corrective-action workflow, in one place: the states an action can be in, the moves people
 * make between them, who may make each, and what each move needs. The server enforces it, the
 * action page draws its buttons from it and the demo generator plays its stories through it.
 *
 * States are named after what has to happen next, in Lintel's words:
 *   to_fix    raised from a finding; nobody has started on it
 *   fixing    its owner is working on it
 *   to_check  proof of the fix has been sent; an auditor must look
 *   done      an auditor confirmed the fix (or its space was retired, which is not a fix)
 */
export const actionStates = ["to_fix", "fixing", "to_check", "done"] as const;
export type ActionState = (typeof actionStates)[number];

export const actionStateLabels: Record<ActionState, string> = {
  to_fix: "To fix",
  fixing: "Being fixed",
  to_check: "Fix to check",
  done: "Done",
};

/** One sentence on each state, for keys and hints. */
export const actionStateHints: Record<ActionState, string> = {
  to_fix: "Raised from a finding; nobody has started on it yet.",
  fixing: "Its owner is working on the fix.",
  to_check: "Proof of the fix was sent; an auditor of the site must look at it.",
  done: "An auditor confirmed the fix, or its space was retired.",
};

/** The states that still need someone's work: everything but done. */
export const unfinishedStates = [
  "to_fix",
  "fixing",
  "to_check",
] as const satisfies readonly ActionState[];
export const isUnfinished = (state: ActionState) => state !== "done";

/**
 * The states in which it is the owner's turn to act (start, or fix and ask for a check): due-soon,
 * overdue and reminder e-mails go out only then, not while an auditor has the fix to check.
 */
export const ownerWorkStates = ["to_fix", "fixing"] as const satisfies readonly ActionState[];

/** What a move asks of the person making it, beyond the permission. */
export type MoveNeeds =
  /** Nothing more. */
  | "nothing"
  /** A short note saying what was done or seen. */
  | "note"
  /** A reason, kept with the move and sent to the owner. */
  | "reason"
  /** A photo of the fix. */
  | "photo"
  /** The person who will own it. */
  | "owner";

export interface ActionMove {
  /** The button's words. */
  label: string;
  /** What the move does, in one sentence for the person about to make it. */
  hint: string;
  /** The states the move can be made from. */
  from: readonly ActionState[];
  /** The state it leads to; null when the action stays where it is. */
  to: ActionState | null;
  permission: Permission;
  needs: MoveNeeds;
  /** Sending for a check needs at least one photo of the fix from the current attempt. */
  needsProofOfAttempt: boolean;
  /** The move starts a new attempt: proof sent before it no longer counts. */
  newAttempt: boolean;
  /** The last segment of the move's route: POST /api/actions/:actionId/<path> (PUT for owner). */
  path: string;
}

export const actionMoves = {
  start: {
    label: "Start fixing",
    hint: "Tell the site you are working on it.",
    from: ["to_fix"],
    to: "fixing",
    permission: "work:action:site",
    needs: "nothing",
    needsProofOfAttempt: false,
    newAttempt: false,
    path: "start",
  },
  add_photo: {
    label: "Add a photo of the fix",
    hint: "A photo that shows the gap is fixed; an auditor looks at it before the action is done.",
    from: ["to_fix", "fixing"],
    to: null,
    permission: "work:action:site",
    needs: "photo",
    needsProofOfAttempt: false,
    newAttempt: false,
    path: "proofs",
  },
  ask_check: {
    label: "Ask for a check",
    hint: "Send the photos and a note to the site's auditors, who check the fix.",
    from: ["fixing"],
    to: "to_check",
    permission: "work:action:site",
    needs: "note",
    needsProofOfAttempt: true,
    newAttempt: false,
    path: "ask-check",
  },
  confirm: {
    label: "Confirm the fix",
    hint: "You saw the fix in place: the action is done and its days to close are kept.",
    from: ["to_check"],
    to: "done",
    permission: "verify:action:site",
    needs: "note",
    needsProofOfAttempt: false,
    newAttempt: false,
    path: "confirm",
  },
  send_back: {
    label: "Send back",
    hint: "The proof does not show a fix: it goes back to its owner, who needs a new photo.",
    from: ["to_check"],
    to: "fixing",
    permission: "verify:action:site",
    needs: "reason",
    needsProofOfAttempt: false,
    newAttempt: true,
    path: "send-back",
  },
  reopen: {
    label: "Reopen",
    hint: "The fix did not hold: it goes back to its owner with its history and first due time.",
    from: ["done"],
    to: "fixing",
    permission: "verify:action:site",
    needs: "reason",
    needsProofOfAttempt: false,
    newAttempt: true,
    path: "reopen",
  },
  assign: {
    label: "Change owner",
    hint: "Hand the action to another facilities lead of the site, who is told by e-mail.",
    from: ["to_fix", "fixing", "to_check"],
    to: null,
    permission: "assign:action:site",
    needs: "owner",
    needsProofOfAttempt: false,
    newAttempt: false,
    path: "assignee",
  },
} as const satisfies Record<string, ActionMove>;

export type ActionMoveName = keyof typeof actionMoves;
export const actionMoveNames = Object.keys(actionMoves) as ActionMoveName[];

/** Whether the move can be made from this state at all, whoever asks. */
export const moveAllowedFrom = (move: ActionMoveName, state: ActionState) =>
  (actionMoves[move].from as readonly ActionState[]).includes(state);

/**
 * The moves this person can make on an action in this state, in the table's order. `can` says
 * whether they hold a permission at the action's site.
 */
export function availableMoves(
  state: ActionState,
  can: (permission: Permission) => boolean,
): ActionMoveName[] {
  return actionMoveNames.filter(
    (name) => moveAllowedFrom(name, state) && can(actionMoves[name].permission),
  );
}

/** Why a move cannot be made from a state, in words for the person who tried. */
export function wrongStateMessage(move: ActionMoveName, state: ActionState): string {
  const from = actionMoves[move].from.map((s) => `"${actionStateLabels[s]}"`);
  const list = from.length === 1 ? from[0] : `${from.slice(0, -1).join(", ")} or ${from.at(-1)}`;
  return `This action is "${actionStateLabels[state]}"; "${actionMoves[move].label}" needs it to be ${list}.`;
}

/**
 * The moves the system makes, not a person: they are in the same table so nothing else decides
 * where an action goes.
 */
export const systemMoves = {
  /**
   * The same item fails again in the same space while an action for it is unfinished: the failure
   * joins that action. If the fix was waiting for its check, it did not hold: the action goes back
   * to its owner and a new attempt starts. Otherwise the state stays.
   */
  repeatFailure(state: ActionState): { to: ActionState; newAttempt: boolean } {
    if (state === "to_check") return { to: "fixing", newAttempt: true };
    return { to: state, newAttempt: false };
  },
  /** A repeat failure joins an action only while it is unfinished; a done one is not reopened. */
  joinsExisting: (state: ActionState) => isUnfinished(state),
  /** A retired space's unfinished actions become done, with the reason "space retired". */
  retire: (state: ActionState): ActionState | null => (isUnfinished(state) ? "done" : null),
  /** Restoring the space puts each such action back where it was (never done). */
  restore: (before: ActionState | null): ActionState =>
    before === null || before === "done" ? "to_fix" : before,
};

/** Why a done action is done. */
export const actionCloseReasons = ["confirmed", "space_retired"] as const;
export type ActionCloseReason = (typeof actionCloseReasons)[number];
export const actionCloseReasonLabels: Record<ActionCloseReason, string> = {
  confirmed: "Fix confirmed",
  space_retired: "Space retired (not a fix)",
};

/** What happened on an action's timeline (the change log's `action.<kind>` entries). */
export const timelineKinds = [
  "opened",
  "finding_added",
  "assigned",
  "started",
  "proof_added",
  "check_asked",
  "fix_confirmed",
  "sent_back",
  "reopened",
  "space_retired",
  "space_restored",
] as const;
export type TimelineKind = (typeof timelineKinds)[number];

export const timelineKindLabels: Record<TimelineKind, string> = {
  opened: "Raised from a finding",
  finding_added: "Failed again",
  assigned: "Owner changed",
  started: "Started fixing",
  proof_added: "Photo of the fix added",
  check_asked: "Check asked for",
  fix_confirmed: "Fix confirmed",
  sent_back: "Sent back",
  reopened: "Reopened",
  space_retired: "Space retired",
  space_restored: "Space restored",
};

/** The timeline entry each person's move writes. */
export const moveTimelineKinds: Record<ActionMoveName, TimelineKind> = {
  start: "started",
  add_photo: "proof_added",
  ask_check: "check_asked",
  confirm: "fix_confirmed",
  send_back: "sent_back",
  reopen: "reopened",
  assign: "assigned",
};

/**
 * The change log is append-only and never rewritten: entries written before the states were
 * renamed keep their old codes, and are read through these two translations.
 */
const earlierStateCodes: Record<string, ActionState> = {
  open: "to_fix",
  in_progress: "fixing",
  awaiting_verification: "to_check",
  closed: "done",
};
const earlierTimelineCodes: Record<string, TimelineKind> = {
  sent_for_verification: "check_asked",
  verified: "fix_confirmed",
  rejected: "sent_back",
};

/** A state code as stored in any change-log entry, old or new; null when it is none. */
export function stateFromLog(code: unknown): ActionState | null {
  if (typeof code !== "string") return null;
  if ((actionStates as readonly string[]).includes(code)) return code as ActionState;
  return earlierStateCodes[code] ?? null;
}

/**
 * The state recorded in a change-log entry's before/after object: `state` since the rename,
 * `status` (with the earlier codes) before it.
 */
export function stateOfLogEntry(entry: unknown): ActionState | null {
  if (typeof entry !== "object" || entry === null) return null;
  const { state, status } = entry as { state?: unknown; status?: unknown };
  return stateFromLog(state ?? status);
}

/** A timeline kind as stored in any change-log entry, old or new; null when it is none. */
export function timelineKindFromLog(code: string): TimelineKind | null {
  if ((timelineKinds as readonly string[]).includes(code)) return code as TimelineKind;
  return earlierTimelineCodes[code] ?? null;
}
