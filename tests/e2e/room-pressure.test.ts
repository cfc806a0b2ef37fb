import { and, eq, sql } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { connectDatabase, type DatabaseHandle } from "../../server/db/client";
import { pressureAlarms, pressureMonitors, users } from "../../server/db/schema/index";
import { insertPressureAlarm, mapMonitorTo, storeTimeline } from "../factories/pressure-h3";
import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";
const minute = 60_000;
const hour = 60 * minute;

/** Who can see an Orchard Hill room's page, by the demo's people. */
const readers = [
  { role: "administrator", email: "admin@example.org", manages: true },
  { role: "auditor", email: "auditor@example.org", manages: false },
  { role: "facilities-lead", email: "facilities.orchard@example.org", manages: false },
  { role: "committee-member", email: "committee@example.org", manages: false },
] as const;

describe("a room's pressure on its space page, on a phone (390×844)", () => {
  let browser: Browser;
  let handle: DatabaseHandle;
  let spaceId: string;
  let monitorRowId: string;
  let mappedHere = false;

  beforeAll(async () => {
    browser = await launchBrowser();
    handle = connectDatabase(process.env.LINTEL_E2E_DATABASE_URL!, { max: 2 });
    const { db } = handle;
    // An Orchard Hill isolation room (Wexley's two are the alarm test's), with the demo's monitor
    // (mapped here only if the demo has none).
    const { rows } = await db.execute<{ id: string; site_id: string }>(sql`
      select sp.id, sp.site_id from spaces sp join sites s on s.id = sp.site_id
       where s.name = 'Orchard Hill Community Hospital' and sp.zone_type = 'isolation_room'
         and sp.retired_at is null
       order by sp.name limit 1`);
    const room = { id: rows[0]!.id, siteId: rows[0]!.site_id };
    spaceId = room.id;
    const [demoMonitor] = await db
      .select()
      .from(pressureMonitors)
      .where(eq(pressureMonitors.spaceId, room.id));
    mappedHere = !demoMonitor;
    const monitor =
      demoMonitor ?? (await mapMonitorTo(db, room, { monitorId: `orchard-e2e-${Date.now()}` }));
    monitorRowId = monitor.id;
    const now = Date.now();
    // Ten days of a reading every 5 minutes, then the last three hours every 30 seconds, with a
    // stretch positive for 18 minutes that began 80 minutes ago.
    await storeTimeline(db, monitor.monitorId, {
      from: new Date(now - 10 * 24 * hour),
      count: 10 * 24 * 12 - 40,
      everySeconds: 300,
      pressureAt: (i) => -6 - (i % 5) * 0.3,
    });
    const driftFrom = now - 80 * minute;
    await storeTimeline(db, monitor.monitorId, {
      from: new Date(now - 3 * hour),
      count: 3 * 120 - 2,
      everySeconds: 30,
      pressureAt: (i) => {
        const at = now - 3 * hour + i * 30_000;
        return at >= driftFrom && at < driftFrom + 18 * minute
          ? 1.2 + (i % 4) * 0.3
          : -5.5 - (i % 3) * 0.4;
      },
      doorAt: () => "closed",
    });
    const [lead] = await db
      .select({ id: users.id })
      .from(users)
      .where(eq(users.email, "facilities.orchard@example.org"));
    await insertPressureAlarm(db, monitor, {
      startedAt: new Date(driftFrom),
      endedAt: new Date(driftFrom + 18 * minute),
      worst: { value: 2.1, unit: "Pa", pa: 2.1, at: new Date(driftFrom + 9 * minute) },
      criticalAt: new Date(driftFrom + 15 * minute),
      acknowledged: {
        by: lead!.id,
        at: new Date(driftFrom + 5 * minute),
        note: "Exhaust fan tripped; reset at the panel.",
      },
    });
  });

  afterAll(async () => {
    // The demo's other tests see Orchard Hill as it was: the alarm goes, and the mapping if made here.
    await handle.db.delete(pressureAlarms).where(eq(pressureAlarms.monitorRowId, monitorRowId));
    if (mappedHere)
      await handle.db
        .delete(pressureMonitors)
        .where(and(eq(pressureMonitors.id, monitorRowId), eq(pressureMonitors.spaceId, spaceId)));
    await handle.close();
    await browser.close();
  });

  async function openRoom(page: Page) {
    await page.goto(`${baseUrl()}/spaces/${spaceId}/audits`);
    const section = page.getByRole("region", { name: "Room pressure" });
    await section.getByTestId("pressure-live").waitFor();
    return section;
  }

  for (const reader of readers) {
    it(`when the ${reader.role} opens the room's page, then the live value and its state in words, the chart with its table and the acknowledged excursion show, for 24 hours and 30 days, no wider than the phone`, async () => {
      const { page, problems } = await phonePage(browser);
      await signIn(page, reader.email, password);
      await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      const section = await openRoom(page);

      const live = section.getByTestId("pressure-live");
      expect(await live.getByRole("status").textContent()).toContain("In range");
      expect(await live.textContent()).toMatch(/−\d\.\d Pa/);
      // The chart is drawn (its line and the shaded excursion), lazily, with its legend in words.
      const chart = section.getByTestId("pressure-chart");
      await chart.locator(".recharts-line path").first().waitFor();
      expect(await chart.locator(".recharts-reference-area").count()).toBe(1);
      expect(await section.getByText("Excursion (shaded)").count()).toBe(1);
      const rows = section.getByTestId("pressure-table").locator("tbody tr");
      expect(await rows.count()).toBeGreaterThanOrEqual(24);
      expect(await rows.nth(1).textContent()).toMatch(/−\d\.\d to [−+]\d\.\d/);
      const log = section.getByTestId("pressure-alarms");
      expect(await log.textContent()).toContain("Lasted 18 min");
      expect(await log.textContent()).toContain("Critical");
      expect(await log.textContent()).toContain("Exhaust fan tripped; reset at the panel.");
      expect(await section.getByText("Change or unmap the monitor").count()).toBe(
        reader.manages ? 1 : 0,
      );
      expect(await pageWidth(page)).toBeLessThanOrEqual(390);
      await section.getByRole("heading", { name: "Room pressure" }).scrollIntoViewIfNeeded();
      await page.evaluate(() => globalThis.scrollBy(0, -80));
      await shot(page, `${reader.role}-room-pressure-24h`);
      await section.getByTestId("pressure-table").scrollIntoViewIfNeeded();
      await shot(page, `${reader.role}-room-pressure-24h-table`);

      await section.getByRole("button", { name: "30 days" }).click();
      await section.getByText(/Each day/).waitFor();
      expect(await rows.count()).toBeGreaterThanOrEqual(31);
      await chart.locator(".recharts-line path").first().waitFor();
      expect(await pageWidth(page)).toBeLessThanOrEqual(390);
      await chart.scrollIntoViewIfNeeded();
      await shot(page, `${reader.role}-room-pressure-30d`);
      await section.getByTestId("pressure-alarms").scrollIntoViewIfNeeded();
      await shot(page, `${reader.role}-room-pressure-30d-log`);
      expect(problems).toEqual([]);
      await page.context().close();
    });
  }
});
