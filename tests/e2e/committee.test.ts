import { readFileSync } from "node:fs";

import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, phonePage, signIn } from "../helpers/browser";

const demoSites = [
  "Tamsin Bay General Hospital",
  "Orchard Hill Community Hospital",
  "Wexley Rehabilitation Centre",
];

describe("the committee view", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the demo committee member opens the comparison, then three sites show intervals, the page fits the phone, and the PDF and CSV download", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "committee@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page.getByRole("link", { name: "Committee" }).last().click();
    await page.getByRole("heading", { level: 1, name: "Committee view" }).waitFor();

    const table = page.getByRole("table", { name: "Readiness by site" });
    await table.waitFor();
    for (const site of demoSites) {
      const row = table.getByRole("row").filter({ hasText: site });
      await expect.poll(() => row.count()).toBe(1);
      // A 95% interval such as "81.2% – 90.4%" on each site's row.
      expect(await row.innerText()).toMatch(/\d+(\.\d)?% – \d+(\.\d)?%/);
    }
    // Wide tables scroll inside their frames: the page itself is never wider than the phone.
    await page.waitForLoadState("networkidle");
    await page.getByRole("table", { name: /^Median days/ }).waitFor();
    // (A phone widens its layout to fit overflowing content, so compare with the screen's width.)
    expect(await page.evaluate<number>("document.documentElement.scrollWidth")).toBeLessThanOrEqual(
      page.viewportSize()!.width,
    );

    const pdfDownload = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download the monthly report (PDF)" }).click();
    const pdf = await pdfDownload;
    expect(pdf.suggestedFilename()).toMatch(/^committee-report-.*\.pdf$/);
    const pdfBytes = readFileSync((await pdf.path())!);
    expect(pdfBytes.subarray(0, 5).toString()).toBe("%PDF-");
    expect(pdfBytes.toString("latin1")).toContain(
      "(Tamsin Bay Health: infection prevention readiness",
    );
    await page.getByText(/^Saved committee-report-.*\.pdf/).waitFor();

    const csvDownload = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download the comparison (CSV)" }).click();
    const csv = readFileSync((await (await csvDownload).path())!, "utf8").replace(/^\uFEFF/, "");
    const lines = csv.trim().split("\n");
    expect(lines[0]).toMatch(
      /^site,measure,all-clear audits or items passed,audits or items answered,share \(0 to 1\),95% interval low \(Wilson\),95% interval high \(Wilson\)/,
    );
    for (const site of demoSites)
      expect(lines.some((line) => line.startsWith(`${site},Readiness`))).toBe(true);
    expect(problems).toEqual([]);
  });
});
