import { mailLayout as layout } from "../../lib/mail-layout";
import type { NewMail } from "../../outbox/outbox.repository";

const formatWhen = (date: Date) =>
  date.toLocaleString("en-GB", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" }) + " UTC";

export function invitationMail(input: {
  to: string;
  name: string;
  inviterName: string;
  roles: string[];
  link: string;
  expiresAt: Date;
}): NewMail {
  const subject = "You have been invited to Lintel";
  const lines = [
    `Hello ${input.name},`,
    `${input.inviterName} has invited you to Lintel, where your infection prevention team keeps isolation rooms, anterooms, donning zones and doffing areas ready.`,
    `Your roles: ${input.roles.join("; ")}.`,
    `Choose your password to join. The link works once and until ${formatWhen(input.expiresAt)}.`,
  ];
  const footnote =
    "If you did not expect this invitation, you can ignore this e-mail; nothing happens until the link is used.";
  return {
    topic: "invitation",
    to: input.to,
    subject,
    text: `${lines.join("\n\n")}\n\nJoin Lintel: ${input.link}\n\n${footnote}\n`,
    html: layout(subject, lines, { label: "Choose a password", href: input.link }, footnote),
  };
}

export function passwordResetMail(input: {
  to: string;
  name: string;
  link: string;
  minutes: number;
}): NewMail {
  const subject = "Reset your Lintel password";
  const lines = [
    `Hello ${input.name},`,
    `Someone asked to reset the password of your Lintel account. Use the link within ${input.minutes} minutes to choose a new password; it works once.`,
    "After the change, every other device signed in to your account is signed out.",
  ];
  const footnote = "If you did not ask for this, ignore this e-mail: your password stays as it is.";
  return {
    topic: "password_reset",
    to: input.to,
    subject,
    text: `${lines.join("\n\n")}\n\nChoose a new password: ${input.link}\n\n${footnote}\n`,
    html: layout(subject, lines, { label: "Choose a new password", href: input.link }, footnote),
  };
}
