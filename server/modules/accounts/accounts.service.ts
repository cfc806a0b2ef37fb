import { createHash, randomBytes } from "node:crypto";

import type { MeResponse } from "@shared/schemas/auth";
import type { ChangePasswordBody, UpdateProfileBody } from "@shared/schemas/people";

import { hashPassword, verifyPassword } from "../../auth/password";
import { assertAcceptablePassword } from "../../auth/password-policy";
import type { DbOrTx } from "../../db/client";
import { AppError } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { AppDeps, SignedIn } from "../../lib/context";
import { enqueueMail } from "../../outbox/outbox.repository";
import { loadGrants } from "../auth/auth.service";
import { assertPasswordAllowed } from "../identity/identity.service";
import { passwordResetMail } from "./accounts.emails";
import * as repo from "./accounts.repository";

const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");

const linkInvalid = (message: string) => new AppError("link_invalid", 410, message);

/**
 * Makes a one-time link for the person, replacing any open link of the same purpose.
 * Call inside the transaction that also queues the e-mail carrying it.
 */
export async function issueLink(
  tx: DbOrTx,
  deps: Pick<AppDeps, "env">,
  input: { userId: string; purpose: repo.TokenPurpose; createdBy: string | null },
): Promise<{ link: string; expiresAt: Date }> {
  const token = randomBytes(32).toString("base64url");
  const lifetimeMs =
    input.purpose === "invitation"
      ? deps.env.LINTEL_INVITATION_DAYS * 24 * 60 * 60 * 1000
      : deps.env.LINTEL_PASSWORD_RESET_MINUTES * 60 * 1000;
  const expiresAt = new Date(Date.now() + lifetimeMs);
  await repo.revokeOpenTokens(tx, input.userId, input.purpose);
  await repo.insertToken(tx, {
    userId: input.userId,
    purpose: input.purpose,
    tokenHash: hashToken(token),
    expiresAt,
    createdBy: input.createdBy,
  });
  const route = input.purpose === "invitation" ? "welcome" : "reset-password";
  return { link: new URL(`/${route}/${token}`, deps.env.publicUrl).toString(), expiresAt };
}

export function revokeOpenLinks(tx: DbOrTx, userId: string, purpose: repo.TokenPurpose) {
  return repo.revokeOpenTokens(tx, userId, purpose);
}

/** The token's row when it can still be used; otherwise a 410 saying why. */
function assertUsable(row: repo.TokenWithUser | null, what: string): repo.TokenWithUser {
  if (!row) throw linkInvalid(`This ${what} link is not valid. Ask for a new one.`);
  if (row.usedAt)
    throw linkInvalid(`This ${what} link has already been used. Sign in, or ask for a new link.`);
  if (row.revokedAt)
    throw linkInvalid(`A newer ${what} link was sent; use the one in the latest e-mail.`);
  if (row.expiresAt.getTime() <= Date.now())
    throw linkInvalid(`This ${what} link has expired. Ask for a new one.`);
  if (row.deactivatedAt) throw linkInvalid(`This account is deactivated. Ask an administrator.`);
  return row;
}

export async function describeInvitation(deps: AppDeps, token: string) {
  const row = assertUsable(
    await repo.findToken(deps.db, hashToken(token), "invitation"),
    "invitation",
  );
  return { email: row.email, name: row.name, expiresAt: row.expiresAt.toISOString() };
}

export async function describePasswordReset(deps: AppDeps, token: string) {
  const row = assertUsable(
    await repo.findToken(deps.db, hashToken(token), "password_reset"),
    "reset",
  );
  return { email: row.email, expiresAt: row.expiresAt.toISOString() };
}

/**
 * Sets the password through a one-time link (invitation or reset), in one transaction with the
 * link's use and the change-log row; then ends every other session and signs the person in.
 */
async function setPasswordThroughLink(
  deps: AppDeps,
  token: string,
  password: string,
  purpose: repo.TokenPurpose,
  requestId: string,
): Promise<{ me: MeResponse; setCookie: string }> {
  const what = purpose === "invitation" ? "invitation" : "reset";
  const preview = assertUsable(await repo.findToken(deps.db, hashToken(token), purpose), what);
  await assertPasswordAllowed(deps, preview.email, "password");
  assertAcceptablePassword(password, { email: preview.email, name: preview.name }, "password");
  const passwordHash = await hashPassword(password);

  const person = await deps.db.transaction(async (tx) => {
    // Locked and checked again: two tabs submitting the same link must not both succeed.
    const row = assertUsable(
      await repo.findToken(tx, hashToken(token), purpose, { lock: true }),
      what,
    );
    await repo.markTokenUsed(tx, row.tokenId);
    await repo.setPasswordHash(tx, row.userId, passwordHash);
    if (purpose === "invitation") await repo.revokeOpenTokens(tx, row.userId, "invitation");
    await recordChange(
      tx,
      { userId: row.userId, requestId },
      {
        action: purpose === "invitation" ? "user.joined" : "user.password_reset",
        entity: "user",
        entityId: row.userId,
        siteId: null,
      },
    );
    return row;
  });

  await deps.sessions.endAllFor(person.userId);
  const { setCookie } = await deps.sessions.create(person.userId);
  const roles = await loadGrants(deps, person.userId);
  return {
    me: { user: { id: person.userId, email: person.email, name: person.name }, roles },
    setCookie,
  };
}

export const acceptInvitation = (
  deps: AppDeps,
  token: string,
  password: string,
  requestId: string,
) => setPasswordThroughLink(deps, token, password, "invitation", requestId);

export const resetPassword = (deps: AppDeps, token: string, password: string, requestId: string) =>
  setPasswordThroughLink(deps, token, password, "password_reset", requestId);

export const passwordResetAnswer =
  "If that address belongs to an active Lintel account, a reset link is on its way. It works once, for a limited time.";

/** Same answer and similar timing whether or not the address has an account. */
export async function requestPasswordReset(
  deps: AppDeps,
  email: string,
  clientAddress: string,
  requestId: string,
): Promise<void> {
  await assertPasswordAllowed(deps, email, "email");
  if (!(await deps.resetLimiter.allow(email, clientAddress))) return;
  const queued = await deps.db.transaction(async (tx) => {
    const person = await repo.findActiveUserByEmail(tx, email);
    if (!person) return false;
    const { link } = await issueLink(tx, deps, {
      userId: person.id,
      purpose: "password_reset",
      createdBy: null,
    });
    await enqueueMail(
      tx,
      passwordResetMail({
        to: person.email,
        name: person.name,
        link,
        minutes: deps.env.LINTEL_PASSWORD_RESET_MINUTES,
      }),
      person,
    );
    await recordChange(
      tx,
      { userId: null, requestId },
      {
        action: "user.password_reset_requested",
        entity: "user",
        entityId: person.id,
        siteId: null,
      },
    );
    return true;
  });
  if (queued) deps.notifyOutbox();
}

export async function updateProfile(
  deps: AppDeps,
  auth: SignedIn,
  body: UpdateProfileBody,
  actor: Actor,
): Promise<MeResponse> {
  await deps.db.transaction(async (tx) => {
    const { before } = await repo.updateDisplayName(tx, auth.user.id, body.name);
    await recordChange(tx, actor, {
      action: "user.renamed",
      entity: "user",
      entityId: auth.user.id,
      siteId: null,
      before: { name: before },
      after: { name: body.name },
    });
  });
  return {
    user: { id: auth.user.id, email: auth.user.email, name: body.name },
    roles: auth.grants,
  };
}

/**
 * Changes the password after checking the current one; every other session is signed out. Wrong
 * current passwords count against the same limits as failed sign-ins.
 */
export async function changePassword(
  deps: AppDeps,
  auth: SignedIn,
  body: ChangePasswordBody,
  clientAddress: string,
  actor: Actor,
): Promise<string> {
  const { email } = auth.user;
  await deps.signInLimiter.assertAllowed(email, clientAddress, "password-change");
  const current = await repo.findPasswordHash(deps.db, auth.user.id);
  if (!(await verifyPassword(current, body.currentPassword))) {
    await deps.signInLimiter.recordFailure(email, clientAddress);
    throw new AppError("validation_failed", 400, "That is not your current password.", {
      fields: { currentPassword: "That is not your current password." },
    });
  }
  await deps.signInLimiter.recordSuccess(email);
  assertAcceptablePassword(
    body.newPassword,
    { email: auth.user.email, name: auth.user.name },
    "newPassword",
  );
  const passwordHash = await hashPassword(body.newPassword);
  await deps.db.transaction(async (tx) => {
    await repo.setPasswordHash(tx, auth.user.id, passwordHash);
    await repo.revokeOpenTokens(tx, auth.user.id, "password_reset");
    await recordChange(tx, actor, {
      action: "user.password_changed",
      entity: "user",
      entityId: auth.user.id,
      siteId: null,
    });
  });
  await deps.sessions.endAllFor(auth.user.id);
  const { setCookie } = await deps.sessions.create(auth.user.id);
  return setCookie;
}
