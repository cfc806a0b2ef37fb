import sharp from "sharp";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn, openSiteDueList } from "../helpers/browser";
import { answerDoffingItem } from "../helpers/doffing-steps";

describe("an audit on a phone that loses its connection half-way (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the auditor finishes offline and reconnects, then the audit arrives once with its photo and says hold until fixed", async () => {
    const { page, problems } = await phonePage(browser);
    const context = page.context();
    await signIn(page, "auditor@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();

    await openSiteDueList(page, /Wexley Rehabilitation Centre/);
    await page
      .getByRole("listitem", { name: "Doffing area 1", exact: true })
      .getByRole("link", { name: "Start audit" })
      .click();
    await page.getByRole("heading", { level: 1, name: "Doffing area 1" }).waitFor();
    const total = Number(
      /of (\d+)$/.exec((await page.getByText(/^Item 1 of \d+$/).textContent())!)![1],
    );
    expect(total).toBeGreaterThanOrEqual(15);
    const auditId = new URL(page.url()).pathname.split("/").pop()!;

    const chairPhoto = await sharp({
      create: { width: 800, height: 600, channels: 3, background: "#9a4f22" },
    })
      .png()
      .toBuffer();
    for (let index = 1; index <= total; index += 1) {
      await page.getByText(`Item ${index} of ${total}`, { exact: true }).waitFor();
      if (index === Math.ceil(total / 2)) {
        // Half-way the connection goes: the browser is offline and the API cannot be reached.
        await context.setOffline(true);
        await context.route("**/api/**", (route) => route.abort());
        await page.getByText(/^Offline — /).waitFor();
      }
      await answerDoffingItem(page, {
        note: "No dirty chair; staff sit on the bin lid",
        photo: { name: "chair.png", buffer: chairPhoto },
      });
    }

    await page.getByRole("button", { name: "Submit audit" }).click();
    await page.getByRole("heading", { level: 2, name: "Hold until fixed" }).waitFor();
    await page.getByText("On this phone only").first().waitFor();

    // Back online: the phone sends what it kept, by itself.
    await context.unroute("**/api/**");
    await context.setOffline(false);
    await page.getByText("All changes arrived in Lintel").waitFor({ timeout: 30_000 });
    await expect
      .poll(async () => page.getByText("On this phone only").count(), { timeout: 15_000 })
      .toBe(0);

    const detail = await (await page.request.get(`${baseUrl()}/api/audits/${auditId}`)).json();
    expect(detail.audit).toMatchObject({ status: "submitted", verdict: "hold" });
    expect(detail.photos).toHaveLength(1);
    expect(detail.answers).toHaveLength(total);
    const history = await (
      await page.request.get(`${baseUrl()}/api/spaces/${detail.audit.spaceId}/audits`)
    ).json();
    expect(history.audits.filter((audit: { id: string }) => audit.id === auditId)).toHaveLength(1);
    // While the API was blocked but the browser thought it was online, retries log failed loads.
    expect(
      problems.filter((problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED/.test(problem)),
    ).toEqual([]);
    await context.close();
  });
});
