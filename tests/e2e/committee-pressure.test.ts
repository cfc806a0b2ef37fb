import pg from "pg";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phoneContext, signIn } from "../helpers/browser";
import { networkWithAdministrator, pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";

/** Sums layout shifts from the first paint on, leaving out those that follow input. */
const layoutShiftCounter = `
  window.__layoutShift = 0;
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) if (!entry.hadRecentInput) window.__layoutShift += entry.value;
  }).observe({ type: "layout-shift", buffered: true });
`;

interface Seeded {
  committeeEmail: string;
  adminEmail: string;
  siteId: string;
  siteName: string;
  emptySiteName: string;
}

/**
 * A network of its own (so the demo network's screens stay as other tests expect): a site with
 * three monitored isolation rooms, a month and a half of one-minute roll-ups and a handful of
 * excursions, one across the month boundary; a second site with no monitor.
 */
async function seed(db: pg.Client): Promise<Seeded> {
  const { networkId, email: adminEmail } = await networkWithAdministrator(db);
  const tag = adminEmail.slice(6, 12);
  const site = await db.query<{ id: string; name: string }>(
    `insert into sites (network_id, name, address, time_zone, latitude, longitude)
     values ($1, $2, '1 Quay Street, Harbourside', 'Europe/London', 50.4, -4.1) returning id, name`,
    [networkId, `Harbourside Infirmary ${tag}`],
  );
  const empty = await db.query<{ name: string }>(
    `insert into sites (network_id, name, address, time_zone, latitude, longitude)
     values ($1, $2, '8 Hill Road, Upton', 'Europe/London', 50.5, -4.2) returning name`,
    [networkId, `Upton Cottage Hospital ${tag}`],
  );
  const siteId = site.rows[0]!.id;
  const floor = await db.query<{ id: string }>(
    `insert into floors (site_id, building, level, name) values ($1, 'Main block', 2, 'Ward 7') returning id`,
    [siteId],
  );
  const rooms = [
    "Isolation room 7A",
    "Isolation room 7B",
    "Isolation room 7C (negative pressure suite)",
  ];
  for (const [index, name] of rooms.entries()) {
    const space = await db.query<{ id: string }>(
      `insert into spaces (floor_id, site_id, zone_type, name, polygon)
       values ($1, $2, 'isolation_room', $3, '[[100,100],[300,100],[300,200],[100,200]]') returning id`,
      [floor.rows[0]!.id, siteId, name],
    );
    const monitorId = `h5-shot-${tag}-${index}`;
    const monitor = await db.query<{ id: string }>(
      `insert into pressure_monitors (monitor_id, site_id, space_id) values ($1, $2, $3) returning id`,
      [monitorId, siteId, space.rows[0]!.id],
    );
    // Minutes with a reading from 1 October to 14 November, a day's silence in room B.
    await db.query(
      `insert into pressure_minutes (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa)
       select $1, g, 12, -72, -7, -5
         from generate_series('2026-10-01T00:00Z'::timestamptz, '2026-11-14T23:59Z', interval '1 minute') g
        where not ($2 and g >= '2026-10-20T00:00Z' and g < '2026-10-21T00:00Z')`,
      [monitorId, index === 1],
    );
    // Their hours, each counting its minutes with a reading, as storing readings keeps them.
    await db.query(
      `insert into pressure_hours (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa, minutes_with_readings)
       select monitor_id, date_trunc('hour', bucket_start, 'UTC'), sum(readings), sum(sum_pa), min(min_pa), max(max_pa), count(*)
         from pressure_minutes where monitor_id = $1 group by 1, 2`,
      [monitorId],
    );
    const excursions: [string, string][] =
      index === 0
        ? [
            ["2026-10-03T09:10Z", "2026-10-03T09:25Z"],
            ["2026-10-31T23:40Z", "2026-11-01T01:05Z"],
            ["2026-11-09T14:00Z", "2026-11-09T14:04Z"],
          ]
        : index === 1
          ? [["2026-10-12T06:00Z", "2026-10-12T08:30Z"]]
          : [];
    for (const [startedAt, endedAt] of excursions)
      await db.query(
        `insert into pressure_alarms (monitor_row_id, monitor_id, site_id, space_id, kind, started_at,
                                      alarm_at, ended_at, worst_value, worst_unit, worst_pa, worst_at)
         values ($1, $2, $3, $4, 'out_of_range', $5, $5::timestamptz + interval '1 minute', $6,
                 1.2, 'Pa', 1.2, $5)`,
        [monitor.rows[0]!.id, monitorId, siteId, space.rows[0]!.id, startedAt, endedAt],
      );
  }
  const committeeEmail = `committee-${tag}@example.org`;
  const person = await db.query<{ id: string }>(
    `insert into users (network_id, email, display_name, password_hash)
     select $1, $2, 'Morwenna Tregear', password_hash from users where email = 'admin@example.org'
     returning id`,
    [networkId, committeeEmail],
  );
  await db.query(
    `insert into role_grants (user_id, role, site_id) values ($1, 'committee_member', null)`,
    [person.rows[0]!.id],
  );
  return {
    committeeEmail,
    adminEmail,
    siteId,
    siteName: site.rows[0]!.name,
    emptySiteName: empty.rows[0]!.name,
  };
}

describe("room pressure on the committee's screens", () => {
  let browser: Browser;
  let seeded: Seeded;
  beforeAll(async () => {
    browser = await launchBrowser();
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    try {
      seeded = await seed(db);
    } finally {
      await db.end();
    }
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when a committee member and an administrator open the committee view and the site's page on a phone, then the Room pressure figures show inside the phone's width and the page does not shift", async () => {
    const period = "from=2026-10&to=2026-11";
    for (const [role, email] of [
      ["committee", seeded.committeeEmail],
      ["administrator", seeded.adminEmail],
    ] as const) {
      const problems: string[] = [];
      const context = await phoneContext(browser, undefined, problems);
      const page = await context.newPage();
      await signIn(page, email, password);
      await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      await context.addInitScript(layoutShiftCounter);

      for (const [screen, href] of [
        ["committee-view", `/committee?${period}`],
        ["committee-site", `/committee/sites/${seeded.siteId}?${period}`],
      ] as const) {
        await page.goto(`${baseUrl()}${href}`);
        const section = page.getByRole("region", { name: "Room pressure" });
        const months = section.getByRole("table", { name: "Excursions month by month" });
        await months.waitFor();
        // October on the site's clock: three excursions started (room A's last one at 23:40 on
        // the 31st, after the clocks went back), over 3 × 744 monitored hours less room B's
        // silent day: 2,208.0 hours.
        const october = months.getByRole("row", { name: /Oct 2026/ });
        const cells = october.getByRole("cell");
        expect(await cells.nth(0).textContent()).toBe("3 in 2,208.0 h");
        expect(await cells.nth(1).textContent()).toMatch(/^1\.4 \(\d\.\d+ to \d\.\d\)$/);
        // The figures fit the phone: the table needs no sideways scrolling.
        expect(
          await months.evaluate((table) => table.scrollWidth <= table.parentElement!.clientWidth),
        ).toBe(true);
        const rooms = section.getByRole("table", { name: /^Hours out of range by room/ });
        await rooms.waitFor();
        if (screen === "committee-view")
          await section.getByText(`${seeded.emptySiteName}`).first().waitFor();
        await page.waitForLoadState("networkidle");
        expect(await pageWidth(page)).toBeLessThanOrEqual(390);
        expect(await page.evaluate<number>("window.__layoutShift")).toBeLessThanOrEqual(0.1);
        await shot(page, `${screen}-${role}`, { fullPage: true });
        await section.scrollIntoViewIfNeeded();
        await shot(page, `${screen}-${role}-pressure`);
        await section.getByText(/not a life-safety alarm system/).scrollIntoViewIfNeeded();
        await shot(page, `${screen}-${role}-pressure-end`);
      }
      expect(problems).toEqual([]);
      await context.close();
    }
  });
});
