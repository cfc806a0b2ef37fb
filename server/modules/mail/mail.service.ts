import type { ResendResult, UndeliveredMail } from "@shared/schemas/mail";

import { notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { AppDeps, SignedIn } from "../../lib/context";
import * as repo from "./mail.repository";

export function listUndelivered(deps: AppDeps, auth: SignedIn): Promise<UndeliveredMail[]> {
  return repo.listUndelivered(deps.db, auth.user.networkId);
}

/**
 * Puts an uncertain or failed e-mail back in the outbox, once: the row is locked, so of two
 * clicks the second finds it already queued (or sent) and changes nothing. The e-mail keeps its
 * id, and so its Message-ID: a receiver that did get the first copy can tell it is the same one.
 */
export async function resend(
  deps: AppDeps,
  auth: SignedIn,
  mailId: string,
  actor: Actor,
): Promise<ResendResult> {
  const result = await deps.db.transaction(async (tx): Promise<ResendResult> => {
    const mail = await repo.lockMail(tx, auth.user.networkId, mailId);
    if (!mail) throw notFound("That e-mail");
    if (mail.rawStatus !== "uncertain" && mail.rawStatus !== "failed") {
      return { id: mail.id, status: mail.rawStatus as ResendResult["status"], resent: false };
    }
    await repo.requeue(tx, mail.id);
    await recordChange(tx, actor, {
      action: "mail.resent",
      entity: "mail",
      entityId: mail.id,
      siteId: null,
      before: {
        status: mail.status,
        attempts: mail.attempts,
        topic: mail.topic,
        recipient: mail.recipient,
        subject: mail.subject,
      },
      after: { status: "pending" },
      reason: mail.problem,
    });
    return { id: mail.id, status: "pending", resent: true };
  });
  if (result.resent) deps.notifyOutbox();
  return result;
}
