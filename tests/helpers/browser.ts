import { chromium, type Browser, type Page } from "playwright-core";

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

/** A phone-sized page (390×844) that fails the test on any console error or failed request. */
export async function phonePage(browser: Browser): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({
    viewport: { width: 390, height: 844 },
    deviceScaleFactor: 2,
    isMobile: true,
    hasTouch: true,
  });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on("console", (message) => {
    if (message.type() === "error" && !/status of 401/.test(message.text()))
      problems.push(message.text());
  });
  page.on("pageerror", (error) => problems.push(error.message));
  return { page, problems };
}
