import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import { rolePermissions } from "@shared/permissions";
import { roles, type Role } from "@shared/roles";
import {
  actionMoveNames,
  actionMoves,
  actionStates,
  availableMoves,
  moveAllowedFrom,
  systemMoves,
  wrongStateMessage,
  type ActionMoveName,
  type ActionState,
} from "@shared/workflow/action-workflow";

import { actionProofs, correctiveActions } from "../../server/db/schema/index";
import { storeImage } from "../../server/lib/images";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { jpegWithGps, pngPlan } from "../factories/images";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

// The workflow table in shared/workflow/action-workflow.ts is the only place that says which
// move is allowed from which state and by whom. This walks every (state, move, role) against the
// server and checks the answer is the one the table gives.
describe("the corrective-action workflow, every state, move and role", () => {
  let siteId = "";
  let floor: Awaited<ReturnType<typeof insertFloor>>;
  let imageId = "";
  const people = {} as Record<Role, SignedInPerson>;
  let otherLead: SignedInPerson;

  beforeAll(async () => {
    const { db } = testApp().deps;
    const networkId = (await insertNetwork(db)).id;
    siteId = (await insertSite(db, networkId)).id;
    floor = await insertFloor(db, siteId);
    for (const role of roles) people[role] = await signInAs(networkId, [{ role, siteId }]);
    otherLead = await signInAs(networkId, [{ role: "facilities_lead", siteId }]);
    imageId = (
      await storeImage(testApp().deps, {
        siteId,
        uploadedBy: null,
        buffer: await pngPlan(64, 48),
        field: "photo",
      })
    ).id;
  });

  /** An action of its own in the given state, with a photo of the current attempt. */
  async function actionIn(state: ActionState) {
    const { db } = testApp().deps;
    const space = await insertSpace(db, floor);
    const now = new Date();
    const [action] = await db
      .insert(correctiveActions)
      .values({
        siteId,
        spaceId: space.id,
        floorId: floor.id,
        itemKey: "workflow-item",
        title: "Hand rub within reach of each removal step",
        severity: "major",
        state,
        assigneeId: people.facilities_lead.user.id,
        openedAt: now,
        dueAt: new Date(now.getTime() + 7 * 24 * 3600 * 1000),
        closedAt: state === "done" ? now : null,
        closeReason: state === "done" ? "confirmed" : null,
        x: 10,
        y: 10,
      })
      .returning();
    await db.insert(actionProofs).values({ actionId: action!.id, imageId, round: 0 });
    return action!.id;
  }

  /** Makes the move with what the table says it needs. */
  async function make(move: ActionMoveName, actionId: string, person: SignedInPerson) {
    const as = api(undefined, { cookie: person.cookie });
    const url = `/api/actions/${actionId}/${actionMoves[move].path}`;
    switch (actionMoves[move].needs) {
      case "photo":
        return as
          .post(url)
          .field("id", crypto.randomUUID())
          .attach("photo", await jpegWithGps({ width: 32, height: 24 }), "fix.jpg");
      case "owner":
        return as.put(url).send({ assigneeId: otherLead.user.id });
      case "note":
        return as.post(url).send({ note: "Seen on the ward, in place." });
      case "reason":
        return as.post(url).send({ reason: "The photo shows another bay." });
      case "nothing":
        return as.post(url);
    }
  }

  const stateOf = async (actionId: string) => {
    const [row] = await testApp()
      .deps.db.select({ state: correctiveActions.state })
      .from(correctiveActions)
      .where(eq(correctiveActions.id, actionId));
    return row!.state;
  };

  const cases = actionStates.flatMap((state) =>
    actionMoveNames.flatMap((move) => roles.map((role) => ({ state, move, role }))),
  );

  it.each(cases)(
    "when a $role makes $move on an action in $state, then the server answers as the workflow table says",
    async ({ state, move, role }) => {
      const actionId = await actionIn(state);
      const response = await make(move, actionId, people[role]);
      const permitted = rolePermissions[role].includes(actionMoves[move].permission);
      const allowed = moveAllowedFrom(move, state);
      if (!permitted) {
        expect(response.status, JSON.stringify(response.body)).toBe(403);
        expect(await stateOf(actionId)).toBe(state);
      } else if (!allowed) {
        expect(response.status, JSON.stringify(response.body)).toBe(409);
        expect(response.body.error.message).toBe(wrongStateMessage(move, state));
        expect(await stateOf(actionId)).toBe(state);
      } else {
        expect([200, 201], JSON.stringify(response.body)).toContain(response.status);
        expect(response.body.action.state).toBe(actionMoves[move].to ?? state);
        expect(await stateOf(actionId)).toBe(actionMoves[move].to ?? state);
      }
      // What the action page offers this person is exactly what the server accepted.
      const offered = availableMoves(state, (p) => rolePermissions[role].includes(p));
      expect(offered.includes(move)).toBe(permitted && allowed);
    },
  );

  it("when an item fails again while its fix waits for a check, then the failure joins the action and sends it back to its owner for a new attempt", async () => {
    expect(systemMoves.repeatFailure("to_check")).toEqual({ to: "fixing", newAttempt: true });
    const { db } = testApp().deps;
    const space = await insertSpace(db, floor);
    const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
    const failOnce = async () => {
      const { auditId } = await answeredDraftAudit(testApp().deps, {
        networkId: people.auditor.user.networkId,
        space,
        auditorId: people.auditor.user.id,
        fail: ["Spare clean gloves"],
      });
      expect((await as(people.auditor).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    };
    await failOnce();
    const listed = await as(people.facilities_lead).get(
      `/api/sites/${siteId}/actions?spaceId=${space.id}`,
    );
    const actionId = listed.body.actions[0].id as string;
    await make("start", actionId, people.facilities_lead);
    await make("add_photo", actionId, people.facilities_lead);
    expect((await make("ask_check", actionId, people.facilities_lead)).status).toBe(200);

    await failOnce();
    const detail = (await as(people.auditor).get(`/api/actions/${actionId}`)).body;
    expect(detail.action).toMatchObject({ state: "fixing", findingCount: 2 });
    // The photo sent for the check belongs to the earlier attempt now.
    expect(detail.proofs.map((p: { current: boolean }) => p.current)).toEqual([false]);
    expect(detail.timeline.at(-1)).toMatchObject({
      kind: "finding_added",
      fromState: "to_check",
      toState: "fixing",
    });
  });
});
