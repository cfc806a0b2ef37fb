import path from "node:path";

import type { Browser, Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn, openSiteDueList } from "../helpers/browser";
import { keptOnPhone } from "../helpers/kept";
import { shot } from "../helpers/screens";

const password = "lintel-demo-2026";
const shots = process.env.LINTEL_SHOTS_DIR;
// The enhanced ensemble's removal: 12 steps, Lintel's draft from common practice.
const enhancedRemoval = /Removing PPE, enhanced ensemble/;

/** Nothing on the page is wider than the phone. */
async function fitsThePhone(page: Page) {
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
}

function thisMonth(): string {
  return new Date().toISOString().slice(0, 7);
}

async function committeeCounts(page: Page, siteName: string) {
  const month = thisMonth();
  const response = await page.request.get(
    `${baseUrl()}/api/committee/observations?from=${month}&to=${month}`,
  );
  expect(response.status()).toBe(200);
  const body = (await response.json()) as {
    network: { observations: number };
    sites: { siteName: string; observations: number }[];
  };
  return {
    network: body.network.observations,
    site: body.sites.find((site) => site.siteName === siteName)?.observations ?? 0,
  };
}

describe("observing a removal on a phone that loses its connection half-way (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the auditor records a 12-step removal with one breach and coaching, finishes offline and reconnects, then it arrives once and the committee counts it", async () => {
    const committee = await phonePage(browser);
    await signIn(committee.page, "committee@example.org", password);
    await committee.page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    const before = await committeeCounts(committee.page, "Wexley Rehabilitation Centre");

    const { page, problems } = await phonePage(browser);
    const context = page.context();
    let taps = 0;
    let typed = 0;
    const tap = async (target: Locator) => {
      await target.click();
      taps += 1;
    };
    const type = async (target: Locator, text: string) => {
      await target.fill(text);
      typed += 1;
    };

    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await openSiteDueList(page, /Wexley Rehabilitation Centre/);
    await page
      .getByRole("listitem", { name: "Doffing area 1", exact: true })
      .getByRole("link", { name: "Observe putting on or removal" })
      .waitFor();
    await fitsThePhone(page);
    await shot(page, "observe-0-due-list-auditor", { fullPage: true });
    // From the due list's entry for the doffing area (the first tap of the observation).
    await tap(
      page
        .getByRole("listitem", { name: "Doffing area 1", exact: true })
        .getByRole("link", { name: "Observe putting on or removal" }),
    );
    await page.getByRole("heading", { level: 1, name: "Doffing area 1" }).waitFor();
    await page.getByRole("heading", { level: 2, name: "Sequence" }).waitFor();
    const observationId = new URL(page.url()).pathname.split("/").pop()!;
    expect(page.url()).toContain(`/observations/${observationId}`);
    // A doffing area offers removal sequences only.
    const sequences = page.getByRole("group", { name: "Sequence" }).getByRole("button");
    expect(await sequences.allInnerTexts()).not.toContainEqual(
      expect.stringMatching(/^Putting on/),
    );
    await page.getByText("never a name", { exact: false }).waitFor();
    await fitsThePhone(page);
    await shot(page, "observe-1-setup-auditor", { fullPage: true });

    await tap(sequences.filter({ hasText: enhancedRemoval }));
    await type(page.getByLabel("Staff code"), "rn-4471");
    await tap(page.getByRole("group", { name: "Role" }).getByRole("button", { name: "Nurse" }));
    await shot(page, "observe-1-setup-filled-auditor", { fullPage: true });
    await tap(page.getByRole("button", { name: "Check the area" }));

    await page.getByRole("heading", { level: 2, name: "Check the area first" }).waitFor();
    for (const check of [
      "Waste container not over-full",
      "Hand rub within reach",
      "Clean and dirty sides marked",
    ]) {
      await tap(page.getByRole("group", { name: check }).getByRole("button", { name: "Yes" }));
    }
    await fitsThePhone(page);
    await shot(page, "observe-2-area-check-auditor", { fullPage: true });
    await tap(page.getByRole("button", { name: "Start the steps" }));

    const total = 12;
    for (let step = 1; step <= total; step += 1) {
      await page.getByText(`Step ${step} of ${total}`, { exact: true }).waitFor();
      if (step === 1) {
        await fitsThePhone(page);
        await shot(page, "observe-3-step-auditor", { fullPage: true });
      }
      if (step === 6) {
        // Half-way the connection goes: the browser is offline and the API cannot be reached.
        await context.setOffline(true);
        await context.route("**/api/**", (route) => route.abort());
        await page.getByText(/^Offline — /).waitFor();
        await shot(page, "observe-3-step-offline-auditor", { fullPage: true });
      }
      if (step === 8) {
        // Outer gloves went into the wrong container: the person's technique.
        await tap(page.getByRole("button", { name: "Breach…" }));
        await page.getByRole("group", { name: "What went wrong" }).waitFor();
        await tap(
          page
            .getByRole("group", { name: "What went wrong" })
            .getByRole("button", { name: "Item dropped or not into the right container" }),
        );
        await tap(
          page
            .getByRole("group", { name: "Cause" })
            .getByRole("button", { name: "The person's technique" }),
        );
        await page.getByLabel("Note (optional)").fill("Gloves into the linen bag");
        await fitsThePhone(page);
        await shot(page, "observe-4-breach-auditor", { fullPage: true });
        await tap(page.getByRole("button", { name: "Record breach" }));
        continue;
      }
      await tap(page.getByRole("button", { name: "Done", exact: true }));
    }

    await page.getByRole("heading", { level: 2, name: "Coaching on the spot" }).waitFor();
    await page.getByText("1 breach, at step 8").waitFor();
    await tap(
      page.getByRole("group", { name: "Coaching given" }).getByRole("button", { name: "Yes" }),
    );
    await page.getByLabel("What was coached (optional)").fill("Showed where the waste bin is");
    await fitsThePhone(page);
    await shot(page, "observe-5-coaching-auditor", { fullPage: true });
    await tap(page.getByRole("button", { name: "See the summary" }));

    await page.getByRole("heading", { level: 2, name: "Summary" }).waitFor();
    await page.getByText("Breaches seen — 1 breach, at step 8").waitFor();
    await fitsThePhone(page);
    await shot(page, "observe-6-summary-auditor", { fullPage: true });
    await tap(page.getByRole("button", { name: "Finish" }));

    await page.getByText("Saved on this phone only", { exact: true }).waitFor();
    await page.getByText("Breaches seen — 1 breach, at step 8").waitFor();
    await fitsThePhone(page);
    await shot(page, "observe-7-finished-offline-auditor", { fullPage: true });

    // Back online: the phone sends what it kept, by itself.
    await context.unroute("**/api/**");
    await context.setOffline(false);
    await page.getByText("Arrived in Lintel", { exact: true }).waitFor({ timeout: 30_000 });
    await page.getByText("All changes arrived in Lintel").waitFor({ timeout: 15_000 });
    await shot(page, "observe-8-arrived-auditor", { fullPage: true });

    const detail = await page.request.get(`${baseUrl()}/api/observations/${observationId}`);
    expect(detail.status()).toBe(200);
    const { observation } = await detail.json();
    expect(observation).toMatchObject({
      id: observationId,
      spaceName: "Doffing area 1",
      sequenceKind: "removal",
      staffCode: "RN-4471",
      staffRole: "nurse",
      outcome: "breaches_seen",
      breachCount: 1,
      breachedSteps: [8],
      coachingGiven: true,
      // A technique breach never opens a corrective action.
      findings: [],
    });
    const listed = await page.request.get(
      `${baseUrl()}/api/spaces/${observation.spaceId}/observations`,
    );
    const { observations } = await listed.json();
    expect(observations.filter((o: { id: string }) => o.id === observationId)).toHaveLength(1);

    // The committee member sees it counted, for the network and for the site.
    await expect
      .poll(() => committeeCounts(committee.page, "Wexley Rehabilitation Centre"))
      .toEqual({ network: before.network + 1, site: before.site + 1 });
    // And on the committee's own screen: this month's row of the network's observations.
    await committee.page.goto(`${baseUrl()}/committee`);
    const perMonth = committee.page.getByRole("table", { name: "Observations per month" }).first();
    await perMonth.waitFor();
    await expect
      .poll(() => perMonth.getByRole("row").last().getByRole("cell").last().textContent())
      .toBe((before.network + 1).toLocaleString("en-US"));
    await perMonth.scrollIntoViewIfNeeded();
    if (shots)
      await committee.page.screenshot({ path: path.join(shots, "committee-observations.png") });

    // 12 steps: 1 (from the due list) + 3 (sequence, role, "Check the area") + 4 (area check)
    // + 11 "Done" + 4 for the one breach + 2 (coaching, summary) + 1 "Finish".
    console.info(
      `A 12-step observation with one breach took ${taps} taps and ${typed} typed field (the staff code).`,
    );
    expect(taps).toBe(26);
    expect(typed).toBe(1);

    expect(
      problems.filter((problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED/.test(problem)),
    ).toEqual([]);
    expect(committee.problems).toEqual([]);
    await context.close();
    await committee.page.context().close();
  });

  it("when the auditor scans a doffing area's QR code, then the start screen offers to observe putting on or removal beside the audit", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    // What the phone keeps (due lists, floors, sequences) is written once the page settles.
    await expect
      .poll(async () => (await keptOnPhone(page))?.keptAt ?? null, { timeout: 30_000 })
      .not.toBeNull();
    const siteList = await page.request.get(`${baseUrl()}/api/sites`);
    const { sites } = (await siteList.json()) as { sites: { id: string; name: string }[] };
    const wexley = sites.find((site) => site.name === "Wexley Rehabilitation Centre")!;
    const due = (await (
      await page.request.get(`${baseUrl()}/api/sites/${wexley.id}/schedule`)
    ).json()) as { entries: { spaceId: string; spaceName: string }[] };
    const doffing = due.entries.find((entry) => entry.spaceName === "Doffing area 2")!;

    // A scan opens the space's address from outside the app.
    await page.goto(`${baseUrl()}/spaces/${doffing.spaceId}/audit`);
    await page.getByText("What are you here to do?").waitFor();
    await page.getByRole("button", { name: "Audit this space" }).waitFor();
    await fitsThePhone(page);
    await shot(page, "observe-0-qr-choice-auditor", { fullPage: true });
    await page.getByRole("link", { name: "Observe putting on or removal" }).click();
    await page.getByRole("heading", { level: 2, name: "Sequence" }).waitFor();
    await page.getByRole("heading", { level: 1, name: "Doffing area 2" }).waitFor();
    expect(
      await page.getByRole("group", { name: "Sequence" }).getByRole("button").count(),
    ).toBeGreaterThanOrEqual(2);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
