import pg from "pg";
import type { Browser, Route } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phoneContext, signIn } from "../helpers/browser";
import { shot } from "../helpers/screens";

const password = "lintel-demo-2026";

describe("a space's QR code on a phone that keeps nothing yet (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the auditor opens the QR link and Lintel has not yet answered the audit's start, then the checklist is already on screen, built on the phone from the space's floor and the published checklist, and the start arrives once", async () => {
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    let spaceId: string;
    try {
      // An isolation room (no choice to observe first) with no audit open.
      const { rows } = await db.query<{ id: string }>(`
        select sp.id from spaces sp
          join floors f on f.id = sp.floor_id
          join sites s on s.id = f.site_id
         where s.name = 'Tamsin Bay General Hospital' and sp.retired_at is null
           and sp.zone_type = 'isolation_room'
           and not exists (select 1 from audits a where a.space_id = sp.id and a.status = 'draft')
         order by sp.name limit 1`);
      spaceId = rows[0]!.id;
    } finally {
      await db.end();
    }

    const problems: string[] = [];
    const signedIn = await phoneContext(browser, undefined, problems);
    try {
      const first = await signedIn.newPage();
      await signIn(first, "auditor@example.org", password);
      await first.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      // The same session on a second phone context: none of the screens' files, nothing kept.
      const context = await phoneContext(browser, undefined, problems, signedIn);
      try {
        const asked: string[] = [];
        context.on("request", (request) => {
          const { pathname } = new URL(request.url());
          if (pathname.startsWith("/api/")) asked.push(`${request.method()} ${pathname}`);
        });
        // Lintel's answer to the start is held back until the screen has been checked.
        const held: Route[] = [];
        let starts = 0;
        await context.route("**/api/audits/*", async (route) => {
          if (route.request().method() !== "PUT") return route.continue();
          starts += 1;
          held.push(route);
        });
        const page = await context.newPage();
        await page.goto(`${baseUrl()}/spaces/${spaceId}/audit`);
        await page.getByText(/^Item 1 of \d+$/).waitFor();
        await shot(page, "auditor-qr-cold-start-before-lintel-answers");
        expect(asked).toContain(`GET /api/spaces/${spaceId}/floor`);
        expect(asked).toContain("GET /api/checklists");
        // The start was sent (or is on its way) but has not been answered.
        await expect.poll(() => starts).toBe(1);

        for (const route of held) await route.continue();
        await page
          .getByRole("status")
          .filter({ hasText: "All changes arrived in Lintel" })
          .waitFor();
        expect(starts).toBe(1);
      } finally {
        await context.close();
      }
    } finally {
      await signedIn.close();
    }
    expect(problems).toEqual([]);
  });

  it("when the QR code of a doffing area is opened on a phone that keeps nothing, then it asks whether to audit the space or observe, as it does on a phone that keeps the floor", async () => {
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    let space: { id: string; name: string };
    try {
      const { rows } = await db.query<{ id: string; name: string }>(`
        select sp.id, sp.name from spaces sp
          join floors f on f.id = sp.floor_id
          join sites s on s.id = f.site_id
         where s.name = 'Tamsin Bay General Hospital' and sp.retired_at is null
           and sp.zone_type = 'doffing_area'
         order by sp.name limit 1`);
      space = rows[0]!;
    } finally {
      await db.end();
    }

    const problems: string[] = [];
    const signedIn = await phoneContext(browser, undefined, problems);
    try {
      const first = await signedIn.newPage();
      await signIn(first, "auditor@example.org", password);
      await first.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      const context = await phoneContext(browser, undefined, problems, signedIn);
      try {
        const page = await context.newPage();
        await page.goto(`${baseUrl()}/spaces/${space.id}/audit`);
        await page.getByText("What are you here to do?").waitFor();
        await page.getByRole("heading", { level: 1, name: space.name }).waitFor();
        await page.getByRole("button", { name: "Audit this space" }).waitFor();
        await page.getByRole("link", { name: "Observe putting on or removal" }).waitFor();
        await shot(page, "auditor-qr-cold-start-doffing-choice");
      } finally {
        await context.close();
      }
    } finally {
      await signedIn.close();
    }
    expect(problems).toEqual([]);
  });
});
