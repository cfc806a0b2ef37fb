import pg from "pg";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { pageWidth, shot } from "../helpers/screens";

/**
 * The amendment form is its own piece of the app, fetched when an administrator opens the panel,
 * so that the audit screen an auditor answers on carries none of it.
 */
describe("amending a submitted audit on a phone (390×844)", () => {
  let browser: Browser;
  let auditId: string;
  beforeAll(async () => {
    browser = await launchBrowser();
    const db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
    try {
      const { rows } = await db.query<{ id: string }>(
        `select a.id from audits a join sites s on s.id = a.site_id
          where s.name = 'Tamsin Bay General Hospital' and a.status = 'submitted'
          order by a.submitted_at desc limit 1`,
      );
      auditId = rows[0]!.id;
    } finally {
      await db.end();
    }
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the administrator opens a submitted audit, then the form's code is fetched only once the panel is opened, and the form fits the phone", async () => {
    const { page, problems } = await phonePage(browser);
    const formCode: string[] = [];
    page.on("request", (request) => {
      if (/\/amend-audit-form-body-[\w-]+\.js$/.test(new URL(request.url()).pathname))
        formCode.push(request.url());
    });
    await signIn(page, "admin@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page.goto(`${baseUrl()}/audits/${auditId}`);
    const panel = page.getByText("Amend an answer", { exact: true });
    await panel.waitFor();
    await page.waitForLoadState("networkidle");
    expect(formCode).toEqual([]);
    await shot(page, "audit-submitted-amend-closed-administrator", { fullPage: true });

    await panel.click();
    await page.getByRole("button", { name: "Record amendment" }).waitFor();
    expect(formCode).toHaveLength(1);
    await page.getByLabel("Reason for the amendment").waitFor();
    expect(await pageWidth(page)).toBeLessThanOrEqual(390);
    await page.getByRole("button", { name: "Record amendment" }).scrollIntoViewIfNeeded();
    await shot(page, "audit-submitted-amend-open-administrator");
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
