import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

import type { MailboxMessage } from "@shared/schemas/people";

import { chromiumArgs } from "../../scripts/lib/chromium";

export const baseUrl = () => {
  const url = process.env.LINTEL_E2E_URL;
  if (!url)
    throw new Error("LINTEL_E2E_URL is not set: the browser project's global setup provides it.");
  return url;
};

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.LINTEL_E2E_CHROMIUM, args: chromiumArgs });
}

/**
 * A phone's browser (390×844 unless told) that notes every console error and page error in
 * `problems`; `signedInAs` hands over the cookies of another context, so one sign-in serves both.
 */
export async function phoneContext(
  browser: Browser,
  viewport: { width: number; height: number } = { width: 390, height: 844 },
  problems: string[] = [],
  signedInAs: BrowserContext | null = null,
): Promise<BrowserContext> {
  const context = await browser.newContext({
    viewport,
    deviceScaleFactor: 2,
    isMobile: true,
    hasTouch: true,
    storageState: signedInAs ? await signedInAs.storageState() : undefined,
  });
  context.on("console", (message) => {
    if (message.type() === "error" && !/status of 401/.test(message.text()))
      problems.push(message.text());
  });
  context.on("weberror", (error) => problems.push(error.error().message));
  return context;
}

/** A phone-sized page (390×844) that fails the test on any console error or failed request. */
export async function phonePage(browser: Browser): Promise<{ page: Page; problems: string[] }> {
  const problems: string[] = [];
  const context = await phoneContext(browser, undefined, problems);
  const page = await context.newPage();
  return { page, problems };
}

/** Waits for an e-mail the local SMTP catcher received for `to` (and matching `accept`). */
export async function receivedMail(
  to: string,
  accept: (message: MailboxMessage) => boolean = () => true,
  timeoutMs = 15_000,
): Promise<MailboxMessage> {
  const dir = process.env.LINTEL_E2E_MAILBOX_DIR!;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    for (const file of readdirSync(dir)) {
      const message = JSON.parse(readFileSync(path.join(dir, file), "utf8")) as MailboxMessage;
      if (message.to.includes(to) && accept(message)) return message;
    }
    if (Date.now() > deadline) throw new Error(`no e-mail for ${to} within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/**
 * Signs in with a password on the sign-in page: opened first, unless a link has just led there
 * (`goTo` false). The page asks for the address first ("Continue"), then offers the password.
 */
export async function signIn(page: Page, email: string, password: string, goTo = true) {
  if (goTo) await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Continue" }).click();
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
}

/**
 * From "My sites", opens a site (the site itself, not a fix to verify there that the home page
 * may also list) and then its list of every space with its due date.
 */
export async function openSiteDueList(page: Page, site: RegExp) {
  await page.getByRole("list", { name: "Sites" }).getByRole("link", { name: site }).first().click();
  await page
    .getByRole("link", { name: /All spaces and due dates|every other space/ })
    .first()
    .click();
}
