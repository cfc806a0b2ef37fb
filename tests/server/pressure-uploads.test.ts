import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import { changeLog, pressureUploadTokens } from "../../server/db/schema/index";
import { hashUploadToken } from "../../server/modules/pressure/upload-tokens.service";
import { insertMonitor, insertUploadToken, newMonitorId } from "../factories/pressure-h1";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs } from "../helpers/auth";
import { eq } from "drizzle-orm";

const db = () => testApp().deps.db;

/** A site with its administrator and a token for it. */
async function siteWithToken() {
  const network = await insertNetwork(db());
  const site = await insertSite(db(), network.id);
  const admin = await signInAs(network.id, [{ role: "administrator", siteId: site.id }]);
  const { token, secret } = await insertUploadToken(db(), site.id, admin.user.id);
  return { network, site, admin, token, secret };
}

/** As a building's script sends: no browser Origin, no cookie, the token as a bearer. */
const upload = (secret: string | null) => {
  const request = api(testApp().app, { origin: null }).post("/api/pressure/readings");
  if (secret !== null) request.set("Authorization", `Bearer ${secret}`);
  return request;
};

const minutesAgo = (minutes: number) => new Date(Date.now() - minutes * 60_000).toISOString();

async function stored(monitorId: string) {
  const { rows } = await db().execute<{ measured_at: string; pressure_pa: number }>(
    sql`select measured_at, pressure_pa from pressure_readings where monitor_id = ${monitorId} order by measured_at`,
  );
  return rows.map((row) => ({ at: new Date(row.measured_at).toISOString(), pa: row.pressure_pa }));
}

describe("uploading pressure readings over HTTP", () => {
  it("when a JSON batch comes with a site's token, then good readings are stored once, bad ones are named by field, and the token's last use is kept", async () => {
    const { site, token, secret } = await siteWithToken();
    const monitor = (await insertMonitor(db(), site.id)).monitorId;
    const unmapped = newMonitorId();
    const readings = [
      { monitorId: monitor, measuredAt: minutesAgo(3), pressure: -6.2, unit: "Pa" },
      { monitorId: monitor, measuredAt: minutesAgo(2), pressure: "low", unit: "Pa" },
      {
        monitorId: unmapped,
        measuredAt: minutesAgo(2),
        pressure: -0.012,
        unit: "inH2O",
        door: "open",
      },
      { monitorId: monitor, measuredAt: minutesAgo(1), pressure: -5.8, unit: "mbar" },
      { monitorId: monitor, measuredAt: minutesAgo(-5), pressure: -5.8, unit: "Pa" },
    ];
    const first = await upload(secret).send({ readings });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body).toEqual({
      received: 5,
      stored: 2,
      duplicates: 0,
      refused: [
        { index: 1, field: "readings.1.pressure", message: expect.any(String), reason: "invalid" },
        {
          index: 3,
          field: "readings.3.unit",
          message: "Use Pa or inH2O (in. w.c.).",
          reason: "invalid",
        },
        {
          index: 4,
          field: "readings.4.measuredAt",
          message: expect.stringContaining("ahead of Lintel's clock"),
          reason: "future",
        },
      ],
    });
    expect(await stored(monitor)).toEqual([{ at: readings[0]!.measuredAt, pa: -6.2 }]);
    expect(await stored(unmapped)).toHaveLength(1);

    // The same upload again (a retry): nothing new, counted as duplicates.
    const again = await upload(secret).send({ readings: readings.slice(0, 1) });
    expect(again.body).toMatchObject({ received: 1, stored: 0, duplicates: 1, refused: [] });
    const [row] = await db()
      .select()
      .from(pressureUploadTokens)
      .where(eq(pressureUploadTokens.id, token.id));
    expect(row!.lastUsedAt).not.toBeNull();
    expect(row!.tokenHash).toBe(hashUploadToken(secret));
    expect(row!.tokenHash).not.toContain(secret);
  });

  it("when a CSV file is uploaded, then its good rows are stored and each bad row is named by line and column", async () => {
    const { site, secret } = await siteWithToken();
    const monitor = (await insertMonitor(db(), site.id)).monitorId;
    const csv = [
      "monitor_id,measured_at,pressure,unit,door",
      `${monitor},${minutesAgo(4)},-7.5,Pa,closed`,
      `${monitor},${minutesAgo(3)},"-3,1",Pa,`,
      `${monitor},${minutesAgo(2)},-0.02,in. w.c.,open`,
      `${monitor},${minutesAgo(1)},-6,Pa,ajar`,
    ].join("\r\n");
    const response = await upload(secret).set("Content-Type", "text/csv").send(csv);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    expect(response.body).toEqual({
      received: 4,
      stored: 2,
      duplicates: 0,
      refused: [
        {
          line: 3,
          field: "pressure",
          message: "Use a point for decimals, such as -3.1.",
          reason: "invalid",
        },
        {
          line: 5,
          field: "door",
          message: expect.stringContaining("open or closed"),
          reason: "invalid",
        },
      ],
    });
    expect((await stored(monitor)).map((row) => row.pa)).toEqual([-7.5, expect.closeTo(-4.98, 2)]);
  });

  it("when a CSV's header is wrong, then the whole upload is refused with 422 naming the column, and nothing is stored", async () => {
    const { secret } = await siteWithToken();
    const monitor = newMonitorId();
    const response = await upload(secret)
      .set("Content-Type", "text/csv")
      .send(`monitor,measured_at,pressure,unit\n${monitor},${minutesAgo(1)},-5,Pa\n`);
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual([
      "line 1.monitor",
      "line 1.monitor_id",
    ]);
    expect(await stored(monitor)).toEqual([]);
  });

  it("when a reading is for a monitor mapped to another site, then it is refused as wrong_site and the rest are stored", async () => {
    const { network, site, secret } = await siteWithToken();
    const other = await insertSite(db(), network.id);
    const theirs = (await insertMonitor(db(), other.id)).monitorId;
    const ours = (await insertMonitor(db(), site.id)).monitorId;
    const response = await upload(secret).send({
      readings: [
        { monitorId: theirs, measuredAt: minutesAgo(1), pressure: -5, unit: "Pa" },
        { monitorId: ours, measuredAt: minutesAgo(1), pressure: -5, unit: "Pa" },
      ],
    });
    expect(response.body.refused).toEqual([
      {
        index: 0,
        field: "readings.0.monitorId",
        message: expect.stringContaining("another site"),
        reason: "wrong_site",
      },
    ]);
    expect(await stored(theirs)).toEqual([]);
    expect(await stored(ours)).toHaveLength(1);

    // Only readings for the other site's monitor: nothing to store, refused whole, nothing written.
    const alone = await upload(secret).send({
      readings: [{ monitorId: theirs, measuredAt: minutesAgo(2), pressure: -5, unit: "Pa" }],
    });
    expect(alone.status).toBe(422);
    expect(alone.body.error.fields).toEqual({
      "readings.0.monitorId": expect.stringContaining("another site"),
    });
    expect(await stored(theirs)).toEqual([]);
  });

  it("when the token is missing, unknown or revoked, then 401 and nothing is stored", async () => {
    const { site, admin, token, secret } = await siteWithToken();
    const monitor = newMonitorId();
    const body = {
      readings: [{ monitorId: monitor, measuredAt: minutesAgo(1), pressure: -5, unit: "Pa" }],
    };
    expect((await upload(null).send(body)).status).toBe(401);
    expect((await upload("lintel_pu_not-a-real-token").send(body)).status).toBe(401);
    // A session is no upload token.
    const withSession = await api(testApp().app, { cookie: admin.cookie })
      .post("/api/pressure/readings")
      .send(body);
    expect(withSession.status).toBe(401);

    const revoke = await api(testApp().app, { cookie: admin.cookie }).delete(
      `/api/sites/${site.id}/pressure-upload-tokens/${token.id}`,
    );
    expect(revoke.status).toBe(200);
    const revoked = await upload(secret).send(body);
    expect(revoked.status).toBe(401);
    expect(revoked.body.error.code).toBe("unauthenticated");
    expect(await stored(monitor)).toEqual([]);
  });

  it("when the body is not a batch, then 400 naming the field, and nothing is stored", async () => {
    const { secret } = await siteWithToken();
    const empty = await upload(secret).send({ readings: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty("readings");
    const extra = await upload(secret).send({ readings: [{}], site: "x" });
    expect(extra.body.error.fields).toHaveProperty("site");
    const form = await upload(secret).type("form").send("monitor=1");
    expect(form.status).toBe(400);
  });
});

describe("administering upload tokens", () => {
  it("when an administrator makes a token, then it is shown once, listed without it, and the change is logged", async () => {
    const { site, admin } = await siteWithToken();
    const made = await api(testApp().app, { cookie: admin.cookie })
      .post(`/api/sites/${site.id}/pressure-upload-tokens`)
      .send({ name: "  Building 2 gateway " });
    expect(made.status).toBe(201);
    expect(made.body.secret).toMatch(/^lintel_pu_[A-Za-z0-9_-]{43}$/);
    expect(made.body.token).toMatchObject({
      name: "Building 2 gateway",
      revokedAt: null,
      lastUsedAt: null,
    });

    const list = await api(testApp().app, { cookie: admin.cookie }).get(
      `/api/sites/${site.id}/pressure-upload-tokens`,
    );
    expect(list.body.tokens.map((t: { name: string }) => t.name)).toEqual([
      "Building 2 gateway",
      "Gateway",
    ]);
    expect(JSON.stringify(list.body)).not.toContain(made.body.secret);
    expect(JSON.stringify(list.body)).not.toContain(hashUploadToken(made.body.secret));
    const logged = await db()
      .select()
      .from(changeLog)
      .where(eq(changeLog.entityId, made.body.token.id));
    expect(logged.map((entry) => entry.action)).toEqual(["pressure_upload_token.created"]);
  });

  it("when a token is revoked twice, then the second changes nothing and it lists as revoked", async () => {
    const { site, admin, token } = await siteWithToken();
    const client = api(testApp().app, { cookie: admin.cookie });
    const first = await client.delete(`/api/sites/${site.id}/pressure-upload-tokens/${token.id}`);
    const second = await api(testApp().app, { cookie: admin.cookie }).delete(
      `/api/sites/${site.id}/pressure-upload-tokens/${token.id}`,
    );
    expect(second.body.revokedAt).toBe(first.body.revokedAt);
    const logged = await db().select().from(changeLog).where(eq(changeLog.entityId, token.id));
    expect(logged.map((entry) => entry.action).sort()).toEqual([
      "pressure_upload_token.created",
      "pressure_upload_token.revoked",
    ]);
  });

  it("when someone who is not the site's administrator asks, then tokens are neither listed nor made", async () => {
    const { network, site } = await siteWithToken();
    const auditor = await signInAs(network.id, [{ role: "auditor", siteId: site.id }]);
    const otherAdmin = await signInAs(network.id, [
      { role: "administrator", siteId: (await insertSite(db(), network.id)).id },
    ]);
    const path = `/api/sites/${site.id}/pressure-upload-tokens`;
    expect((await api(testApp().app, { cookie: auditor.cookie }).get(path)).status).toBe(403);
    expect(
      (await api(testApp().app, { cookie: auditor.cookie }).post(path).send({ name: "x" })).status,
    ).toBe(403);
    expect((await api(testApp().app, { cookie: otherAdmin.cookie }).get(path)).status).toBe(404);
  });
});
