import pg from "pg";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { waitForKept } from "../helpers/kept";

const password = "lintel-demo-2026";
const shots = "/tmp/shots/i15-offline";

interface DueEntry {
  spaceId: string;
  spaceName: string;
  zoneType: string;
  siteName: string;
}

/** Answers the first `count` items of the audit on screen: pass, or the count or choice asked. */
async function answerItems(page: Page, count: number) {
  for (let index = 1; index <= count; index += 1) {
    await page.getByText(new RegExp(`^Item ${index} of \\d+$`)).waitFor();
    const text = (await page.getByRole("heading", { level: 2 }).first().textContent()) ?? "";
    if (text.startsWith("Number of working")) await page.getByLabel("Count").fill("2");
    else if (text.startsWith("Mirror or observer")) {
      await page.getByRole("button", { name: "Mirror", exact: true }).click();
    } else await page.getByRole("button", { name: "Pass", exact: true }).click();
    await page.getByRole("button", { name: "Next", exact: true }).click();
  }
}

async function goOffline(context: BrowserContext) {
  await context.setOffline(true);
  await context.route("**/api/**", (route) => route.abort());
}

async function goOnline(context: BrowserContext) {
  await context.unroute("**/api/**");
  await context.setOffline(false);
}

/** Opens the account page through the app's own links (the page is already loaded). */
async function openAccount(page: Page) {
  await page.getByRole("link", { name: "Account" }).first().click();
  await page.getByRole("heading", { level: 1, name: "Account" }).waitFor();
}

/**
 * From home, with no signal: the site, its due list, and "Start audit" on the space — all from
 * what the phone keeps.
 */
async function startFromDueList(page: Page, space: DueEntry) {
  await page
    .getByRole("list", { name: "Sites" })
    .getByRole("link", { name: new RegExp(space.siteName) })
    .first()
    .click();
  await page
    .getByRole("link", { name: /All spaces and due dates|every other space/ })
    .first()
    .click();
  await page.getByRole("heading", { level: 1, name: "Due for audit" }).waitFor();
  await page
    .getByRole("listitem", { name: space.spaceName, exact: true })
    .getByRole("link", { name: "Start audit" })
    .click();
  await page.getByRole("heading", { level: 1, name: space.spaceName }).waitFor();
}

describe("a phone shared by two auditors (390×844)", () => {
  let browser: Browser;
  let db: pg.Client;
  let spaces: DueEntry[] = [];

  beforeAll(async () => {
    browser = await launchBrowser();
    db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
  });
  afterAll(async () => {
    await db.end();
    await browser.close();
  });

  const auditRows = async (auditId: string) =>
    (
      await db.query<{ auditor: string; answers: number }>(
        `select u.email as auditor, (select count(*)::int from audit_answers a where a.audit_id = au.id) as answers
           from audits au join users u on u.id = au.auditor_id where au.id = $1`,
        [auditId],
      )
    ).rows;

  /** With no signal, starts an audit of the space on the phone and answers two items. */
  async function startAndAnswerOffline(page: Page, space: DueEntry): Promise<string> {
    await waitForKept(page);
    await goOffline(page.context());
    await startFromDueList(page, space);
    await page.getByText(/^Item 1 of \d+$/).waitFor();
    const auditId = new URL(page.url()).pathname.split("/").pop()!;
    await answerItems(page, 2);
    await page.getByText(/^Offline — \d+ changes? saved on this phone only/).waitFor();
    return auditId;
  }

  async function freeDoffingAreas(page: Page): Promise<DueEntry[]> {
    const entries = (await (await page.request.get(`${baseUrl()}/api/my/due`)).json())
      .entries as DueEntry[];
    return entries.filter(
      (entry) =>
        entry.zoneType === "doffing_area" &&
        !(entry.spaceName === "Doffing area 1" && entry.siteName.startsWith("Wexley")),
    );
  }

  it("when one auditor signs out keeping unsent work, then the next person neither sees nor sends it, and it arrives under the first auditor's name when they sign in again", async () => {
    const { page, problems } = await phonePage(browser);
    const context = page.context();
    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    spaces = await freeDoffingAreas(page);
    expect(spaces.length).toBeGreaterThanOrEqual(2);
    const startedAt = new Date();

    const auditId = await startAndAnswerOffline(page, spaces[0]!);
    // Still offline: sign out, and keep the work.
    await page.getByRole("link", { name: "My sites" }).click();
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await openAccount(page);
    await page.getByRole("button", { name: "Sign out" }).click();
    const choice = page.getByRole("group", { name: "Not yet in Lintel" });
    await choice.getByText(/^1 audit with \d+ changes is saved only on this phone\.$/).waitFor();
    await choice.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${shots}/sign-out-choice-auditor.png`, fullPage: false });
    await choice
      .getByRole("button", { name: "Keep it and send it when I sign in here again" })
      .click();
    await page.getByRole("heading", { level: 1, name: "Sign in to Lintel" }).waitFor();
    await page.getByText("Lintel could not be reached, so your session there").waitFor();
    await page.getByText("Your unsent work stays on this phone").waitFor();
    await page.screenshot({ path: `${shots}/signed-out-offline.png` });

    // The signal returns and someone else signs in on the same phone.
    await goOnline(context);
    await signIn(page, "auditor2@example.org", password, false);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    // The other person's draft is not on this phone for them, and Lintel has never heard of it.
    await page.goto(`${baseUrl()}/audits/${auditId}`);
    await page.getByRole("heading", { level: 1, name: "This audit is not available" }).waitFor();
    await page.waitForTimeout(7_000); // longer than the queue's poll: it would have sent by now
    expect(await auditRows(auditId)).toEqual([]);
    const byB = await db.query(
      `select count(*)::int as n from audits au join users u on u.id = au.auditor_id
        where u.email = 'auditor2@example.org' and au.created_at >= $1`,
      [startedAt],
    );
    expect(byB.rows[0].n).toBe(0);
    await page.goto(`${baseUrl()}/account`);
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.getByRole("heading", { level: 1, name: "Sign in to Lintel" }).waitFor();

    // The first auditor again: their work goes, once, under their name.
    await signIn(page, "auditor@example.org", password, false);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await expect
      .poll(async () => auditRows(auditId), { timeout: 30_000 })
      .toEqual([{ auditor: "auditor@example.org", answers: 2 }]);
    await page.goto(`${baseUrl()}/audits/${auditId}`);
    await page.getByText(/^Item 3 of \d+$/).waitFor();
    expect(
      problems.filter(
        // The second person asking for the first one's audit is told it does not exist (404).
        (problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED|status of 404/.test(problem),
      ),
    ).toEqual([]);
    await context.close();
  });

  it("when an auditor discards unsent work at sign-out, then they confirm what is lost first, and it never arrives", async () => {
    const { page, problems } = await phonePage(browser);
    const context = page.context();
    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    const space = (spaces.length > 1 ? spaces : await freeDoffingAreas(page))[1]!;

    const auditId = await startAndAnswerOffline(page, space);
    await page.getByRole("link", { name: "My sites" }).click();
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await openAccount(page);
    await page.getByRole("button", { name: "Sign out" }).click();
    const choice = page.getByRole("group", { name: "Not yet in Lintel" });
    await choice.getByRole("button", { name: "Discard it" }).click();
    const confirm = page.getByRole("group", { name: /^Discard 1 audit with \d+ changes\?$/ });
    await confirm.getByText("cannot be recovered", { exact: false }).waitFor();
    await page.screenshot({ path: `${shots}/sign-out-discard-confirm.png` });
    // Going back loses nothing.
    await confirm.getByRole("button", { name: "Go back" }).click();
    await choice.getByRole("button", { name: "Discard it" }).click();
    await page
      .getByRole("group", { name: /^Discard 1 audit/ })
      .getByRole("button", { name: "Discard and sign out" })
      .click();
    await page.getByRole("heading", { level: 1, name: "Sign in to Lintel" }).waitFor();

    await goOnline(context);
    await signIn(page, "auditor@example.org", password, false);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page.waitForTimeout(7_000);
    expect(await auditRows(auditId)).toEqual([]);
    expect(
      problems.filter((problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED/.test(problem)),
    ).toEqual([]);
    await context.close();
  });
});
