import pg from "pg";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { networkWithAdministrator, pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";

describe("the observation steps page on a phone (390×844)", () => {
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

  it("when an administrator rewords a removal step and confirms publishing, then version 2 carries it and version 1 stays as it was", async () => {
    // A network of its own, so the demo network's sequences stay as other tests expect them.
    const { networkId, email } = await networkWithAdministrator(db);

    const admin = await phonePage(browser);
    await signIn(admin.page, email, password);
    await admin.page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
    await admin.page.goto(`${baseUrl()}/admin`);
    await admin.page.getByRole("link", { name: "Observation steps" }).click();
    await admin.page.getByRole("heading", { level: 1, name: "Observation steps" }).waitFor();
    // The enhanced ensemble's removal is Lintel's own draft, and says so (common practice).
    await admin.page.getByText(/^Lintel's draft, common practice/).waitFor();
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await shot(admin.page, "sequences-admin-list");

    const example1 = admin.page.locator("section", {
      has: admin.page.getByRole("heading", { name: "Removing PPE, example 1 (gloves first)" }),
    });
    await example1.getByRole("button", { name: /Edit draft/ }).click();
    await admin.page.getByText("Draft of version 2. Version 1 stays in use").waitFor();
    const first = admin.page.getByLabel("Read aloud").first();
    const reworded =
      "Take off the gloves: peel the first off by the outside, hold it in the gloved hand, slide bare fingers under the second. Into the waste.";
    await first.fill(reworded);
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await shot(admin.page, "sequences-admin-editor");

    await admin.page.getByRole("button", { name: "Publish version 2" }).click();
    const confirm = admin.page.getByRole("group", {
      name: "Publish version 2 of Removing PPE, example 1 (gloves first)?",
    });
    await confirm.waitFor();
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await shot(admin.page, "sequences-admin-confirm");
    await confirm.getByRole("button", { name: "Publish version 2" }).click();
    await admin.page
      .getByText(
        "Removing PPE, example 1 (gloves first), version 2, is published. Observations started from now on follow it.",
      )
      .waitFor();

    const versions = await db.query<{ version: number; status: string; text: string }>(
      `select v.version, v.status, s.text
         from sequence_versions v join sequence_steps s on s.version_id = v.id
        where v.network_id = $1 and v.key = 'standard-removal-1' and s.key = 'gloves'
        order by v.version`,
      [networkId],
    );
    expect(versions.rows.map((row) => [row.version, row.status])).toEqual([
      [1, "published"],
      [2, "published"],
    ]);
    expect(versions.rows[0]!.text).toMatch(/^Take off the gloves: .*Put them in the waste\.$/);
    expect(versions.rows[1]!.text).toBe(reworded);
    await shot(admin.page, "sequences-admin-published");
    await admin.page
      .locator("section", {
        has: admin.page.getByRole("heading", { name: "Removing PPE, example 1 (gloves first)" }),
      })
      .getByText(/version 2, published/)
      .waitFor();
    expect(admin.problems).toEqual([]);
  });
});
