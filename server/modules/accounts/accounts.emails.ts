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

/**
 * To the holder of an address that another network tried to invite: accounts belong to one
 * network, so the invitation cannot be taken up. The inviting network is never told.
 */
export function invitationElsewhereMail(input: {
  to: string;
  inviterName: string;
  networkName: string;
  roles: string[];
  signInLink: string;
}): NewMail {
  const subject = "An invitation to another Lintel network";
  const lines = [
    "Hello,",
    `${input.inviterName} of ${input.networkName} tried to invite this address to their Lintel network (${input.roles.join("; ")}).`,
    "Your Lintel account is tied to one network, so this invitation cannot be accepted, and nothing about your account has changed. They were not told that this address already has an account.",
    `If you are meant to work with ${input.networkName} as well, contact ${input.inviterName} and ask them to invite another address of yours, or ask your own network's administrator.`,
  ];
  const footnote = "If you did not expect this, you can ignore this e-mail.";
  return {
    topic: "invitation",
    to: input.to,
    subject,
    text: `${lines.join("\n\n")}\n\nSign in to your own network: ${input.signInLink}\n\n${footnote}\n`,
    html: layout(subject, lines, { label: "Sign in to Lintel", href: input.signInLink }, footnote),
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
