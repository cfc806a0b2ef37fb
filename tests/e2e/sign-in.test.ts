import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";

describe("signing in on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the demo administrator signs in, then the home page lists the network's sites", async () => {
    const { page, problems } = await phonePage(browser);
    await page.goto(`${baseUrl()}/`);
    await page.waitForURL(/\/sign-in/);

    await signIn(page, "admin@example.org", "lintel-demo-2026", false);

    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    expect(new URL(page.url()).pathname).toBe("/");
    for (const site of [
      "Tamsin Bay General Hospital",
      "Orchard Hill Community Hospital",
      "Wexley Rehabilitation Centre",
    ]) {
      // The heading shows at once; the list arrives after its request.
      await page.getByText(site).first().waitFor();
    }
    // Phones get the bottom navigation.
    const nav = page.getByRole("navigation", { name: "Main" });
    const box = await nav.last().boundingBox();
    expect(box && box.y + box.height).toBeGreaterThan(800);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when a signed-in person opens sign-in with a next that collapses to another host, then they stay in the app", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "admin@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    const origin = new URL(baseUrl()).origin;

    for (const next of [
      "/.//elsewhere.invalid/x",
      "/..//elsewhere.invalid/x",
      "/%2e%2e//elsewhere.invalid",
    ]) {
      await page.goto(`${baseUrl()}/sign-in?next=${encodeURIComponent(next)}`);
      await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
      const url = new URL(page.url());
      expect(url.origin).toBe(origin);
      expect(url.pathname).toBe("/");
    }
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when the password is wrong, then an error is shown and the person stays on the sign-in page", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "admin@example.org", "not-the-password");

    const alert = page.getByRole("alert");
    await alert.waitFor();
    expect(await alert.textContent()).toContain("do not match");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when an auditor of one site signs in, then only that site is listed, and signing out returns to sign-in", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "auditor2@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page.getByText("Orchard Hill Community Hospital").first().waitFor();
    expect(await page.getByText("Tamsin Bay General Hospital").count()).toBe(0);

    await page.getByRole("link", { name: "Account" }).last().click();
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in/);
    const me = await page.request.get(`${baseUrl()}/api/auth/me`);
    expect(me.status()).toBe(401);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when a page does not exist, then the app shows its not-found page", async () => {
    const { page } = await phonePage(browser);
    const response = await page.goto(`${baseUrl()}/no/such/page`);
    expect(response?.status()).toBe(200);
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toMatch(
      /not found|can.t find|no page/i,
    );
    await page.context().close();
  });
});
