import { formatInZone } from "@shared/calc/due";
import { severityLabels, type Severity } from "@shared/calc/verdict";

import { mailLayout } from "../../lib/mail-layout";
import type { NewMail } from "../../outbox/outbox.repository";

/** What every action e-mail says about the action it is about. */
export interface ActionMailFacts {
  to: string;
  name: string;
  link: string;
  title: string;
  severity: Severity;
  spaceName: string;
  siteName: string;
  dueAt: Date;
  timeZone: string;
}

function actionMail(
  topic: string,
  facts: ActionMailFacts,
  subject: string,
  lines: string[],
  button: string,
): NewMail {
  const about = `${severityLabels[facts.severity]} finding in ${facts.spaceName}, ${facts.siteName}: ${facts.title}`;
  const due = `Due ${formatInZone(facts.dueAt, facts.timeZone)} (the site's time).`;
  const paragraphs = [`Hello ${facts.name},`, ...lines, about, due];
  const footnote =
    "You receive this because of your role at this site in Lintel. Sign in to see the photos, where it is on the floor plan, and its history.";
  return {
    topic,
    to: facts.to,
    subject,
    text: `${paragraphs.join("\n\n")}\n\n${button}: ${facts.link}\n\n${footnote}\n`,
    html: mailLayout(subject, paragraphs, { label: button, href: facts.link }, footnote),
  };
}

/** What opened an action nobody assigned by hand, in the owner's e-mail. */
const openedBy = {
  audit: "A failed audit item",
  observation: "A breach seen while observing putting-on or removal",
  pressure: "A room-pressure excursion longer than the site's action limit",
} as const;

export const assignedMail = (
  facts: ActionMailFacts,
  by: string | null,
  opened: keyof typeof openedBy = "audit",
) =>
  actionMail(
    "action_assigned",
    facts,
    `Corrective action for you: ${facts.spaceName}`,
    [
      by
        ? `${by} has made you the owner of a corrective action.`
        : `${openedBy[opened]} has opened a corrective action, and you are its owner.`,
    ],
    "Open the action",
  );

export const dueSoonMail = (facts: ActionMailFacts) =>
  actionMail(
    "action_due_soon",
    facts,
    `Due within a day: ${facts.spaceName}`,
    ["A corrective action you own is due within the next 24 hours."],
    "Open the action",
  );

export const overdueMail = (facts: ActionMailFacts) =>
  actionMail(
    "action_overdue",
    facts,
    `Overdue: ${facts.spaceName}`,
    [
      "A corrective action you own is past its due time. Fix it, add a photo of the fix and ask for a check.",
    ],
    "Open the action",
  );

export const reminderMail = (facts: ActionMailFacts, weeks: number) =>
  actionMail(
    "action_reminder",
    facts,
    `Still overdue: ${facts.spaceName}`,
    [
      `A corrective action you own is still not done, ${weeks === 1 ? "a week" : `${weeks} weeks`} after we told you it was overdue.`,
    ],
    "Open the action",
  );

export const checkAskedMail = (facts: ActionMailFacts, by: string, note: string) =>
  actionMail(
    "action_to_check",
    facts,
    `Fix to check: ${facts.spaceName}`,
    [
      `${by} has fixed a finding and asks an auditor of the site to check the fix.`,
      `Their note: ${note}`,
    ],
    "Check the fix",
  );

export const sentBackMail = (facts: ActionMailFacts, by: string, reason: string) =>
  actionMail(
    "action_sent_back",
    facts,
    `Fix sent back: ${facts.spaceName}`,
    [
      `${by} looked at the photos and sent the fix back to you: it needs more work and a new photo.`,
      `Reason: ${reason}`,
    ],
    "Open the action",
  );

export const reopenedMail = (facts: ActionMailFacts, by: string, reason: string) =>
  actionMail(
    "action_reopened",
    facts,
    `Action reopened: ${facts.spaceName}`,
    [
      `${by} has reopened a corrective action that was done: the fix did not hold. Its original due time stands.`,
      `Reason: ${reason}`,
    ],
    "Open the action",
  );
