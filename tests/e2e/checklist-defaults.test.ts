import pg from "pg";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { networkWithAdministrator, pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";

describe("the checklists page on a phone (390×844)", () => {
  let browser: Browser;
  let db: pg.Client;
  beforeAll(async () => {
    browser = await launchBrowser();
    db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
  });
  afterAll(async () => {
    await browser.close();
    await db.end();
  });

  it("when the network's own doffing checklist meets a newer default, then the administrator reads that it waits as a draft beside theirs", async () => {
    // A network whose administrator published its own doffing checklist before version 2 of the
    // defaults existed: its version 1, published by a person, with no record of a default revision.
    const { networkId, userId, email } = await networkWithAdministrator(db);
    const own = await db.query<{ id: string }>(
      `insert into checklist_versions (network_id, zone_type, version, status, title, published_at, published_by)
       values ($1, 'doffing_area', 1, 'published', 'Doffing area, our version', now(), $2) returning id`,
      [networkId, userId],
    );
    await db.query(
      `insert into checklist_items (version_id, key, position, text, severity, response)
       values ($1, 'doff.separate', 0, 'Separate from the donning zone', 'critical', 'check')`,
      [own.rows[0]!.id],
    );
    const ownVersion = { version: 1 };

    const admin = await phonePage(browser);
    await signIn(admin.page, email, password);
    await admin.page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
    await admin.page.goto(`${baseUrl()}/admin/checklists`);
    await admin.page.getByRole("heading", { level: 1, name: "Checklists" }).waitFor();

    const doffing = admin.page.locator("section", {
      has: admin.page.getByRole("heading", { name: "Doffing area" }),
    });
    await doffing.getByText("Lintel's default checklist has a version 2").waitFor();
    expect(await doffing.textContent()).toContain(
      `waits as the draft of version ${ownVersion.version + 1}, beside your version ${ownVersion.version}`,
    );
    await expect(
      admin.page
        .locator("section", { has: admin.page.getByRole("heading", { name: "Isolation room" }) })
        .getByText("Lintel's default checklist has a version 2")
        .count(),
    ).resolves.toBe(0);
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await shot(admin.page, "checklists-admin-offer", { fullPage: true });

    // The isolation room's items show their sources or "Common practice".
    const room = admin.page.locator("section", {
      has: admin.page.getByRole("heading", { name: "Isolation room" }),
    });
    await room.getByText(/Items in version/).click();
    await room
      .getByText("Visual (smoke or tissue) test at the door shows air moving into the room")
      .waitFor();
    expect(await room.getByText("Reference: Common practice").count()).toBeGreaterThan(3);
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await shot(admin.page, "checklists-admin-room-items", { fullPage: true });
    expect(admin.problems).toEqual([]);
  });
});
