/** What each kind of e-mail is about, in words for the list of e-mail that may not have arrived. */
const topicLabels: Record<string, string> = {
  invitation: "Invitation to Lintel",
  password_reset: "Password reset link",
  action_assigned: "Corrective action assigned",
  action_due_soon: "Corrective action due soon",
  action_overdue: "Corrective action overdue",
  action_reminder: "Overdue reminder",
  action_to_check: "Fix to check",
  action_sent_back: "Fix sent back",
  action_reopened: "Corrective action reopened",
};

export function mailTopicLabel(topic: string): string {
  return topicLabels[topic] ?? "E-mail";
}

/** E-mail whose link works once and for a short time: a copy sent much later may not open. */
export function carriesOneTimeLink(topic: string): boolean {
  return topic === "invitation" || topic === "password_reset";
}
