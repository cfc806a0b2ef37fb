import type { NewMail } from "../../outbox/outbox.repository";

const escapeHtml = (value: string) =>
  value.replace(
    /[&<>"']/g,
    (char) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[char]!,
  );

function layout(
  title: string,
  paragraphs: string[],
  action: { label: string; href: string },
  footnote: string,
): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join("");
  return `<!doctype html><html lang="en"><body style="margin:0;background:#f3f5f6;font-family:'Noto Sans',Arial,sans-serif;color:#17212b">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px">
<table role="presentation" width="100%" style="max-width:560px;background:#ffffff;border-radius:12px;padding:24px" cellpadding="0" cellspacing="0"><tr><td>
<p style="margin:0 0 16px;font-weight:700;color:#1a4a4d;font-size:18px">Lintel</p>
<h1 style="margin:0 0 16px;font-size:20px">${escapeHtml(title)}</h1>
${body}
<p style="margin:24px 0"><a href="${escapeHtml(action.href)}" style="background:#1f5c5f;color:#ffffff;padding:12px 20px;border-radius:8px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>
<p style="margin:0 0 8px;font-size:13px;color:#4a5866">If the button does not work, copy this address into your browser:<br>${escapeHtml(action.href)}</p>
<p style="margin:16px 0 0;font-size:13px;color:#4a5866">${escapeHtml(footnote)}</p>
</td></tr></table></td></tr></table></body></html>`;
}

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
