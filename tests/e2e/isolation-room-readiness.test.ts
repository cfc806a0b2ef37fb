import { mkdirSync } from "node:fs";

import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, phonePage, signIn, openSiteDueList } from "../helpers/browser";

const shots = process.env.LINTEL_SHOTS_DIR;

// Lintel's own rule (readiness rules version 2) on top of the CDC 2005 TB guidelines, MMWR
// 54(RR-17): an isolation room's inward airflow is confirmed by a pressure reading or a visual test.
describe("an isolation room whose airflow nobody confirmed (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the auditor marks the pressure and the visual test not applicable, then the result says hold until fixed: inward airflow not confirmed", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "auditor@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await openSiteDueList(page, /Wexley Rehabilitation Centre/);
    await page
      .getByRole("listitem", { name: "Isolation room 1", exact: true })
      .getByRole("link", { name: "Start audit" })
      .click();
    await page.getByRole("heading", { level: 1, name: "Isolation room 1" }).waitFor();
    const total = Number(
      /of (\d+)$/.exec((await page.getByText(/^Item 1 of \d+$/).textContent())!)![1],
    );

    for (let index = 1; index <= total; index += 1) {
      await page.getByText(`Item ${index} of ${total}`, { exact: true }).waitFor();
      const text = (await page.getByRole("heading", { level: 2 }).first().textContent()) ?? "";
      const airflowItem = /^Pressure differential|^Visual \(smoke/.test(text);
      if (airflowItem || (await page.getByLabel("Reading").count()) > 0) {
        // Readings are not taken on this round: every one is marked not applicable with a note.
        await page.getByRole("button", { name: "Not applicable", exact: true }).click();
        await page.getByLabel("Note").fill("No instrument on the unit today");
      } else if ((await page.getByLabel("Count").count()) > 0) {
        await page.getByLabel("Count").fill("3");
      } else {
        await page.getByRole("button", { name: "Pass", exact: true }).click();
      }
      await page.getByRole("button", { name: "Next", exact: true }).click();
    }
    await page.getByRole("button", { name: "Submit audit" }).click();
    await page.getByRole("heading", { level: 2, name: "Hold until fixed" }).waitFor();
    const why = page.getByRole("list", { name: "Why" });
    await why.getByText(/^Inward airflow not confirmed/).waitFor();
    await page.getByText("All changes arrived in Lintel").waitFor({ timeout: 30_000 });
    await expect
      .poll(async () => page.getByText("On this phone only").count(), { timeout: 15_000 })
      .toBe(0);
    await why.getByText(/^Inward airflow not confirmed/).waitFor();
    await page.getByText("Decided by Lintel's readiness rules, version 2.").waitFor();
    const width = await page.evaluate(
      () =>
        (globalThis as unknown as { document: { documentElement: { scrollWidth: number } } })
          .document.documentElement.scrollWidth,
    );
    expect(width).toBeLessThanOrEqual(390);
    if (shots) {
      mkdirSync(shots, { recursive: true });
      await page.screenshot({ path: `${shots}/result-airflow-not-confirmed.png`, fullPage: true });
    }
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
