import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage } from "../helpers/browser";
import { shot } from "../helpers/screens";

const providerName = "Tamsin Bay Health";

/** The sign-in page's first step: the address, then Continue. */
async function continueWith(page: Page, email: string) {
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Continue" }).click();
}

describe("signing in through the network's identity provider on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the demo committee member signs in through the local provider, then they land on the committee view; signing out ends the provider's session too, so the provider asks who is signing in again", async () => {
    const { page, problems } = await phonePage(browser);
    const origin = new URL(baseUrl()).origin;

    // A link to the committee view, opened signed out: sign in first, then come back to it.
    await page.goto(`${baseUrl()}/committee`);
    await page.waitForURL(/\/sign-in\?next=%2Fcommittee$/);
    await shot(page, "signed-out-sign-in-address");
    await continueWith(page, "committee@example.org");

    const providerLink = page.getByRole("link", { name: `Sign in with ${providerName}` });
    await providerLink.waitFor();
    // The demo network keeps passwords too.
    await page.getByLabel("Password").waitFor();
    await page.getByRole("link", { name: "Forgot your password?" }).waitFor();
    expect(await page.evaluate<number>("document.documentElement.scrollWidth")).toBeLessThanOrEqual(
      390,
    );
    await shot(page, "signed-out-sign-in-choices");

    await providerLink.click();
    await page.getByRole("heading", { name: "Who is signing in?" }).waitFor();
    expect(new URL(page.url()).origin).not.toBe(origin);
    await page.getByRole("button", { name: /committee@example\.org/ }).click();

    await page.getByRole("heading", { level: 1, name: "Committee view" }).waitFor();
    expect(new URL(page.url()).origin).toBe(origin);
    expect(new URL(page.url()).pathname).toBe("/committee");
    const me = await page.request.get(`${baseUrl()}/api/auth/me`);
    expect(me.status()).toBe(200);
    expect((await me.json()).user.email).toBe("committee@example.org");

    await page.getByRole("link", { name: "Account" }).last().click();
    await page.getByRole("button", { name: "Sign out" }).click();
    // Through the provider's own sign-out, back to Lintel's sign-in page.
    await page.waitForURL((url) => url.origin === origin && url.pathname === "/sign-in");
    await page.getByRole("heading", { level: 1, name: "Sign in to Lintel" }).waitFor();
    expect((await page.request.get(`${baseUrl()}/api/auth/me`)).status()).toBe(401);

    // The provider's session ended too: it asks who is signing in rather than letting them in.
    await continueWith(page, "committee@example.org");
    await page.getByRole("link", { name: `Sign in with ${providerName}` }).click();
    await page.getByRole("heading", { name: "Who is signing in?" }).waitFor();
    expect((await page.request.get(`${baseUrl()}/api/auth/me`)).status()).toBe(401);

    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when the person cancels at the provider, then Lintel's page says so in words with a reference for the help desk and a way back", async () => {
    const { page, problems } = await phonePage(browser);
    await page.goto(`${baseUrl()}/sign-in`);
    await continueWith(page, "committee@example.org");
    await page.getByRole("link", { name: `Sign in with ${providerName}` }).click();
    await page.getByRole("button", { name: "Cancel and go back" }).click();

    await page.getByRole("heading", { level: 1, name: "Signing in was cancelled" }).waitFor();
    const url = new URL(page.url());
    expect(url.pathname).toBe("/sign-in/problem");
    expect(url.searchParams.get("reason")).toBe("cancelled");
    const reference = await page.getByTestId("request-id").textContent();
    expect(reference).toBe(url.searchParams.get("request"));
    expect(reference).toMatch(/^[A-Za-z0-9._-]{8,64}$/);
    expect(await page.evaluate<number>("document.documentElement.scrollWidth")).toBeLessThanOrEqual(
      390,
    );
    await shot(page, "signed-out-sign-in-problem-cancelled");
    expect((await page.request.get(`${baseUrl()}/api/auth/me`)).status()).toBe(401);

    await page.getByRole("link", { name: "Back to sign in" }).click();
    await page.getByRole("heading", { level: 1, name: "Sign in to Lintel" }).waitFor();
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
