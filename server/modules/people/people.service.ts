import { canGrant } from "@shared/permissions";
import { roleLabels, type RoleGrant } from "@shared/roles";
import type { GrantInput, InviteBody, PeopleListResponse, Person } from "@shared/schemas/people";

import type { DbOrTx } from "../../db/client";
import { AppError, forbidden, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import type { AppDeps, SignedIn } from "../../lib/context";
import { enqueueMail } from "../../outbox/outbox.repository";
import { invitationElsewhereMail, invitationMail } from "../accounts/accounts.emails";
import { issueLink, revokeOpenLinks } from "../accounts/accounts.service";
import * as repo from "./people.repository";

/** The sites where the caller manages people; null means every site (network-wide administrator). */
function managedScope(grants: readonly RoleGrant[]): string[] | null {
  if (canGrant(grants, { role: "administrator", siteId: null })) return null;
  return [
    ...new Set(
      grants.filter((g) => g.role === "administrator" && g.siteId !== null).map((g) => g.siteId!),
    ),
  ];
}

export async function listPeople(deps: AppDeps, auth: SignedIn): Promise<PeopleListResponse> {
  const scope = managedScope(auth.grants);
  const [people, manageableSites] = await Promise.all([
    repo.listPeople(deps.db, auth.user.networkId, scope),
    repo.sitesOfNetwork(deps.db, auth.user.networkId, scope),
  ]);
  return { people, manageableSites, canGrantNetworkWide: scope === null };
}

/** The person when the caller manages them; 404 otherwise (not theirs to see). */
export async function requirePerson(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
): Promise<Person> {
  const [person] = await repo.listPeople(
    deps.db,
    auth.user.networkId,
    managedScope(auth.grants),
    userId,
  );
  if (!person) throw notFound("That person");
  return person;
}

async function personAfterChange(deps: AppDeps, auth: SignedIn, userId: string): Promise<Person> {
  // After a role is taken away the person may fall outside the caller's sites; show the result anyway.
  const [person] = await repo.listPeople(deps.db, auth.user.networkId, null, userId);
  return person!;
}

/** Every grant must name a site of the network and be within what the caller may give. */
async function assertGrantable(
  deps: AppDeps,
  auth: SignedIn,
  grants: GrantInput[],
  field: (index: number) => string,
) {
  const known = new Set(
    (await repo.sitesOfNetwork(deps.db, auth.user.networkId, null)).map((site) => site.id),
  );
  grants.forEach((grant, index) => {
    if (grant.siteId !== null && !known.has(grant.siteId)) {
      throw new AppError("validation_failed", 400, "That site does not exist.", {
        fields: { [field(index)]: "That site does not exist." },
      });
    }
    if (!canGrant(auth.grants, grant)) {
      const message = "You cannot give this role here: it is beyond the sites you administer.";
      throw new AppError("forbidden", 403, message, { fields: { [field(index)]: message } });
    }
  });
}

function describeGrants(grants: GrantInput[], siteNames: Map<string, string>): string[] {
  return grants.map(
    (grant) =>
      `${roleLabels[grant.role]}, ${grant.siteId ? siteNames.get(grant.siteId) : "all sites"}`,
  );
}

/** An identical invitation within this time is a duplicate (a double tap, a retried request). */
const duplicateInvitationMs = 60_000;

/**
 * Issues the invitation link and queues its e-mail. For a placeholder (the address belongs to an
 * account in another network) the link is made all the same, so the inviting network sees an
 * ordinary pending invitation, but the address holder gets a notice instead of the link.
 */
async function queueInvitation(
  tx: DbOrTx,
  deps: AppDeps,
  auth: SignedIn,
  person: { id: string; email: string; name: string; heldElsewhere: boolean },
  grants: GrantInput[],
) {
  const { link, expiresAt } = await issueLink(tx, deps, {
    userId: person.id,
    purpose: "invitation",
    createdBy: auth.user.id,
  });
  const siteNames = new Map(
    (await repo.sitesOfNetwork(tx, auth.user.networkId, null)).map((site) => [site.id, site.name]),
  );
  const roles = describeGrants(grants, siteNames);
  await enqueueMail(
    tx,
    person.heldElsewhere
      ? invitationElsewhereMail({
          to: person.email,
          inviterName: auth.user.name,
          networkName: await repo.networkName(tx, auth.user.networkId),
          roles,
          signInLink: new URL("/sign-in", deps.env.publicUrl).toString(),
        })
      : invitationMail({
          to: person.email,
          name: person.name,
          inviterName: auth.user.name,
          roles,
          link,
          expiresAt,
        }),
    person,
  );
}

/**
 * Invites by address, or invites again someone still pending. An address whose account is in
 * another network gets exactly the answer a new address gets; see `queueInvitation`.
 */
export async function invite(
  deps: AppDeps,
  auth: SignedIn,
  body: InviteBody,
  actor: Actor,
): Promise<Person> {
  await assertGrantable(deps, auth, body.grants, (index) => `grants.${index}.siteId`);
  const userId = await deps.db.transaction(async (tx) => {
    const { here, heldElsewhere } = await repo.findAddress(tx, auth.user.networkId, body.email);
    if (here && (here.hasPassword || here.deactivatedAt)) {
      const message = here.deactivatedAt
        ? "This address belongs to a deactivated account. Reactivate it from the person's page."
        : "This address already has a Lintel account. Find the person in the list to give them a role.";
      throw new AppError("conflict", 409, message, { fields: { email: message } });
    }
    if (here) {
      const [held] = await repo.listPeople(tx, auth.user.networkId, null, here.id);
      assertWhollyWithinReach(auth, held!.grants, "email");
      await assertNotDuplicate(tx, here, held!, body);
    }
    const id =
      here?.id ??
      (await repo.insertUser(tx, {
        networkId: auth.user.networkId,
        email: body.email,
        name: body.name,
        heldElsewhere,
      }));
    if (here) await repo.renameUser(tx, id, body.name);
    for (const grant of body.grants) {
      if (
        await repo.addGrant(tx, {
          userId: id,
          role: grant.role,
          siteId: grant.siteId,
          grantedBy: auth.user.id,
        })
      ) {
        await recordChange(tx, actor, {
          action: "role.granted",
          entity: "user",
          entityId: id,
          siteId: grant.siteId,
          after: grant,
        });
      }
    }
    await queueInvitation(
      tx,
      deps,
      auth,
      {
        id,
        email: body.email,
        name: body.name,
        heldElsewhere: here ? await repo.isHeldElsewhere(tx, id) : heldElsewhere,
      },
      body.grants,
    );
    await recordChange(tx, actor, {
      action: here ? "user.reinvited" : "user.invited",
      entity: "user",
      entityId: id,
      siteId: null,
      after: { email: body.email, name: body.name, grants: body.grants },
    });
    return id;
  });
  deps.notifyOutbox();
  return requirePerson(deps, auth, userId);
}

/** The same invitation again moments after the last one changes nothing: 409, no second e-mail. */
async function assertNotDuplicate(
  tx: DbOrTx,
  here: { id: string; name: string },
  held: Person,
  body: InviteBody,
) {
  const issuedAt = await repo.openInvitationIssuedAt(tx, here.id);
  const same =
    here.name === body.name &&
    body.grants.every((grant) =>
      held.grants.some((h) => h.role === grant.role && h.siteId === grant.siteId),
    );
  if (same && issuedAt && Date.now() - issuedAt.getTime() < duplicateInvitationMs) {
    const message =
      "This invitation was sent less than a minute ago. Wait for it, or send a new link from the person's page.";
    throw new AppError("conflict", 409, message, { fields: { email: message } });
  }
}

/** Sends a new invitation link; the previous one stops working. */
export async function resendInvitation(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
  actor: Actor,
): Promise<Person> {
  const person = await requirePerson(deps, auth, userId);
  assertWhollyWithinReach(auth, person.grants);
  if (person.status !== "invited") {
    throw new AppError(
      "conflict",
      409,
      person.status === "active"
        ? "This person has already joined."
        : "This account is deactivated.",
    );
  }
  await deps.db.transaction(async (tx) => {
    const heldElsewhere = await repo.isHeldElsewhere(tx, userId);
    await queueInvitation(tx, deps, auth, { ...person, heldElsewhere }, person.grants);
    await recordChange(tx, actor, {
      action: "user.reinvited",
      entity: "user",
      entityId: userId,
      siteId: null,
    });
  });
  deps.notifyOutbox();
  return requirePerson(deps, auth, userId);
}

export async function giveRole(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
  grant: GrantInput,
  actor: Actor,
): Promise<Person> {
  const person = await requirePerson(deps, auth, userId);
  if (person.status === "deactivated")
    throw new AppError("conflict", 409, "Reactivate this person before giving them a role.");
  await assertGrantable(deps, auth, [grant], () => "siteId");
  await deps.db.transaction(async (tx) => {
    const added = await repo.addGrant(tx, {
      userId,
      role: grant.role,
      siteId: grant.siteId,
      grantedBy: auth.user.id,
    });
    if (!added)
      throw new AppError("conflict", 409, "This person already holds that role there.", {
        fields: { role: "Already held." },
      });
    await recordChange(tx, actor, {
      action: "role.granted",
      entity: "user",
      entityId: userId,
      siteId: grant.siteId,
      after: grant,
    });
  });
  return requirePerson(deps, auth, userId);
}

export async function takeRole(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
  grantId: string,
  actor: Actor,
): Promise<Person> {
  await requirePerson(deps, auth, userId);
  const grant = await repo.findGrant(deps.db, userId, grantId);
  if (!grant) throw notFound("That role");
  if (!canGrant(auth.grants, grant)) throw forbidden();
  if (userId === auth.user.id && grant.role === "administrator") {
    throw new AppError(
      "bad_request",
      400,
      "You cannot remove your own administrator role. Ask another administrator.",
    );
  }
  await deps.db.transaction(async (tx) => {
    await repo.deleteGrant(tx, grantId);
    await recordChange(tx, actor, {
      action: "role.revoked",
      entity: "user",
      entityId: userId,
      siteId: grant.siteId,
      before: grant,
    });
  });
  return personAfterChange(deps, auth, userId);
}

/**
 * The one rule for reaching a person: the caller must administer every role they hold, so a site
 * administrator cannot switch off, rename, re-invite or re-link someone wider than themself.
 * Together with `assertGrantable` (every role asked for) it is "never beyond your own reach".
 */
function assertWhollyWithinReach(auth: SignedIn, held: readonly RoleGrant[], field?: string) {
  if (held.every((grant) => canGrant(auth.grants, grant))) return;
  const message =
    "This person also holds roles you do not administer. Ask a network administrator.";
  throw new AppError("forbidden", 403, message, field ? { fields: { [field]: message } } : {});
}

async function requireWhollyManaged(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
): Promise<Person> {
  if (userId === auth.user.id)
    throw new AppError("bad_request", 400, "You cannot deactivate or reactivate yourself.");
  const person = await requirePerson(deps, auth, userId);
  assertWhollyWithinReach(auth, person.grants);
  return person;
}

export async function deactivate(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
  reason: string | undefined,
  actor: Actor,
): Promise<Person> {
  const person = await requireWhollyManaged(deps, auth, userId);
  if (person.status === "deactivated") return person;
  await deps.db.transaction(async (tx) => {
    await repo.lockUser(tx, userId);
    await repo.setDeactivated(tx, userId, new Date());
    await revokeOpenLinks(tx, userId, "invitation");
    await revokeOpenLinks(tx, userId, "password_reset");
    await recordChange(tx, actor, {
      action: "user.deactivated",
      entity: "user",
      entityId: userId,
      siteId: null,
      reason: reason || null,
    });
  });
  await deps.sessions.endAllFor(userId);
  return requirePerson(deps, auth, userId);
}

export async function reactivate(
  deps: AppDeps,
  auth: SignedIn,
  userId: string,
  actor: Actor,
): Promise<Person> {
  const person = await requireWhollyManaged(deps, auth, userId);
  if (person.status !== "deactivated") return person;
  await deps.db.transaction(async (tx) => {
    await repo.setDeactivated(tx, userId, null);
    await recordChange(tx, actor, {
      action: "user.reactivated",
      entity: "user",
      entityId: userId,
      siteId: null,
    });
  });
  return requirePerson(deps, auth, userId);
}
