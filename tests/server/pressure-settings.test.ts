import { and, desc, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import { changeLog, pressureAlarmRecipients } from "../../server/db/schema/index";
import { insertMonitoredRoom } from "../factories/pressure-h2";
import { insertNetwork, insertSite, insertUser, insertGrant } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { sessionCookieFor, signInAs } from "../helpers/auth";

const db = () => testApp().deps.db;

async function world() {
  const room = await insertMonitoredRoom(db(), { mappedAt: new Date("2026-11-01T08:00:00Z") });
  const cookie = await sessionCookieFor(room.admin.id);
  const url = `/api/sites/${room.site.id}/pressure-settings`;
  return { room, cookie, url };
}

describe("a site's room-pressure alarm settings", () => {
  it("when nothing is set, then the defaults apply and the facilities leads and auditors are told", async () => {
    const { room, cookie, url } = await world();
    const reply = await api(undefined, { cookie }).get(url).expect(200);
    expect(reply.body).toMatchObject({
      graceSeconds: null,
      doorGraceSeconds: null,
      actionLimitMinutes: null,
      effective: { graceSeconds: 60, doorGraceSeconds: 300, actionLimitMinutes: 15 },
      recipients: "default",
    });
    expect(reply.body.notified.map((p: { id: string }) => p.id).sort()).toEqual(
      [room.lead.id, room.auditor.id].sort(),
    );
    expect(reply.body.people.map((p: { id: string }) => p.id).sort()).toEqual(
      [room.lead.id, room.auditor.id, room.admin.id].sort(),
    );
  });

  it("when the administrator chooses graces and people, then they are saved with a change-log row, and 'default' goes back to the leads and auditors", async () => {
    const { room, cookie, url } = await world();
    const saved = await api(undefined, { cookie })
      .put(url)
      .send({
        graceSeconds: 90,
        doorGraceSeconds: 600,
        actionLimitMinutes: 10,
        recipients: [room.admin.id],
      })
      .expect(200);
    expect(saved.body).toMatchObject({
      graceSeconds: 90,
      effective: { graceSeconds: 90, doorGraceSeconds: 600, actionLimitMinutes: 10 },
      recipients: [room.admin.id],
      notified: [{ id: room.admin.id }],
    });
    const [entry] = await db()
      .select()
      .from(changeLog)
      .where(
        and(
          eq(changeLog.entityId, room.site.id),
          eq(changeLog.action, "site.pressure_settings_set"),
        ),
      )
      .orderBy(desc(changeLog.occurredAt));
    expect(entry).toMatchObject({ actorId: room.admin.id, siteId: room.site.id });

    const back = await api(undefined, { cookie })
      .put(url)
      .send({
        graceSeconds: null,
        doorGraceSeconds: null,
        actionLimitMinutes: null,
        recipients: "default",
      })
      .expect(200);
    expect(back.body.recipients).toBe("default");
    expect(back.body.notified).toHaveLength(2);
    expect(
      await db()
        .select()
        .from(pressureAlarmRecipients)
        .where(eq(pressureAlarmRecipients.siteId, room.site.id)),
    ).toEqual([]);
  });

  it("when the input is wrong, then a 400 names the field and nothing changes", async () => {
    const { room, cookie, url } = await world();
    const elsewhere = await insertSite(db(), room.network.id);
    const stranger = await insertUser(db(), room.network.id);
    await insertGrant(db(), stranger.id, "auditor", elsewhere.id);
    const cases: [Record<string, unknown>, string][] = [
      [
        {
          graceSeconds: 120,
          doorGraceSeconds: 60,
          actionLimitMinutes: null,
          recipients: "default",
        },
        "doorGraceSeconds",
      ],
      [
        {
          graceSeconds: -1,
          doorGraceSeconds: null,
          actionLimitMinutes: null,
          recipients: "default",
        },
        "graceSeconds",
      ],
      [
        {
          graceSeconds: null,
          doorGraceSeconds: null,
          actionLimitMinutes: 0,
          recipients: "default",
        },
        "actionLimitMinutes",
      ],
      [
        {
          graceSeconds: 1.5,
          doorGraceSeconds: null,
          actionLimitMinutes: null,
          recipients: "default",
        },
        "graceSeconds",
      ],
      [
        {
          graceSeconds: null,
          doorGraceSeconds: null,
          actionLimitMinutes: null,
          recipients: "everyone",
        },
        "recipients",
      ],
      [
        {
          graceSeconds: null,
          doorGraceSeconds: null,
          actionLimitMinutes: null,
          recipients: [stranger.id],
        },
        "recipients.0",
      ],
      [
        {
          graceSeconds: null,
          doorGraceSeconds: null,
          actionLimitMinutes: null,
          recipients: [room.lead.id, room.lead.id],
        },
        "recipients",
      ],
    ];
    for (const [body, field] of cases) {
      const reply = await api(undefined, { cookie }).put(url).send(body).expect(400);
      expect(Object.keys(reply.body.error.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    const after = await api(undefined, { cookie }).get(url).expect(200);
    expect(after.body).toMatchObject({ graceSeconds: null, recipients: "default" });
  });

  it("when a facilities lead of the site or an administrator of another network asks, then they are refused", async () => {
    const { room, url } = await world();
    const lead = await sessionCookieFor(room.lead.id);
    await api(undefined, { cookie: lead }).get(url).expect(403);
    const other = await insertNetwork(db());
    const outsider = await signInAs(other.id, [{ role: "administrator", siteId: null }]);
    await api(undefined, { cookie: outsider.cookie }).get(url).expect(404);
  });
});
