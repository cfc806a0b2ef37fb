import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";
const bay = "Temporary doffing bay (No. C1)";

describe("retiring a space on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when an administrator retires a space, then it leaves the plan, is listed as retired with its history, an auditor sees it labelled Retired, and restoring brings it back", async () => {
    const admin = await phonePage(browser);
    await signIn(admin.page, "admin@example.org", password);
    await admin.page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await admin.page
      .getByRole("list", { name: "Sites" })
      .getByRole("link", { name: /Wexley Rehabilitation Centre/ })
      .first()
      .click();
    await admin.page
      .getByRole("heading", { level: 1, name: "Wexley Rehabilitation Centre" })
      .waitFor();
    const siteUrl = admin.page.url();
    await admin.page
      .getByRole("link", { name: /Ground floor/ })
      .first()
      .click();
    await admin.page.getByRole("button", { name: `Retire space ${bay}` }).click();
    const confirm = admin.page.getByRole("group", { name: `Retire ${bay}?` });
    await confirm.waitFor();
    await confirm.scrollIntoViewIfNeeded();
    await shot(admin.page, "admin-floor-retire-confirm");
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await confirm.getByRole("button", { name: "Retire space" }).click();
    await admin.page
      .getByRole("button", { name: `Retire space ${bay}` })
      .waitFor({ state: "detached" });

    await admin.page.goto(siteUrl);
    const retired = admin.page.getByRole("region", { name: "Retired floors and spaces" });
    await retired.getByRole("button", { name: "Restore space Temporary doffing bay" }).waitFor();
    await retired.scrollIntoViewIfNeeded();
    await shot(admin.page, "admin-site-retired-section");
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    const historyHref = await retired
      .getByRole("link", { name: "Audit history of Temporary doffing bay" })
      .getAttribute("href");

    await admin.page.getByRole("link", { name: "Edit site" }).click();
    await admin.page.getByRole("button", { name: "Retire site" }).click();
    await admin.page.getByRole("group", { name: "Retire Wexley Rehabilitation Centre?" }).waitFor();
    await admin.page
      .getByRole("group", { name: "Retire Wexley Rehabilitation Centre?" })
      .scrollIntoViewIfNeeded();
    await shot(admin.page, "admin-edit-site-retire-confirm");
    expect(await pageWidth(admin.page)).toBeLessThanOrEqual(390);
    await admin.page.getByRole("button", { name: "Cancel" }).click();

    const auditor = await phonePage(browser);
    await signIn(auditor.page, "auditor@example.org", password);
    await auditor.page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await auditor.page.goto(`${baseUrl()}${historyHref}`);
    await auditor.page.getByText("Retired", { exact: true }).waitFor();
    await shot(auditor.page, "auditor-retired-space-history");
    expect(await auditor.page.getByRole("link", { name: "Start audit" }).count()).toBe(0);
    await auditor.page.goto(siteUrl);
    await auditor.page
      .getByRole("link", { name: /Ground floor/ })
      .first()
      .click();
    await auditor.page.getByRole("heading", { level: 1, name: /Ground floor/ }).waitFor();
    expect(await auditor.page.getByText("Temporary doffing bay").count()).toBe(0);
    expect(await auditor.page.getByRole("button", { name: /^Retire/ }).count()).toBe(0);
    await shot(auditor.page, "auditor-floor-without-retired-space");

    await admin.page.goto(siteUrl);
    // The site page's other sections load after this one and push it down: let the page settle
    // before tapping, or the tap lands where the button was a moment ago.
    await admin.page.waitForLoadState("networkidle");
    const restore = retired.getByRole("button", { name: "Restore space Temporary doffing bay" });
    await restore.scrollIntoViewIfNeeded();
    await restore.click();
    await retired.getByRole("status").waitFor();
    expect(await retired.getByRole("status").textContent()).toContain(
      "Temporary doffing bay is back.",
    );
    await admin.page
      .getByRole("link", { name: /Ground floor/ })
      .first()
      .click();
    await admin.page.getByRole("button", { name: `Retire space ${bay}` }).waitFor();

    expect(admin.problems).toEqual([]);
    expect(auditor.problems).toEqual([]);
  });
});
