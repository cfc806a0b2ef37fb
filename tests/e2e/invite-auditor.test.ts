import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, receivedMail, signIn } from "../helpers/browser";

async function signInHome(page: Page, email: string, password: string) {
  await signIn(page, email, password);
  await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
}

describe("inviting an auditor on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the administrator invites an auditor for one site, then the invitee joins from the e-mail and sees only that site", async () => {
    const invitee = `new.auditor.${Date.now()}@example.org`;
    const admin = await phonePage(browser);
    await signInHome(admin.page, "admin@example.org", "lintel-demo-2026");

    // On a phone the administrator's pages gather under one entry of the bottom bar.
    await admin.page.getByRole("link", { name: "Admin" }).click();
    await admin.page.getByRole("heading", { level: 1, name: "Admin" }).waitFor();
    await admin.page.getByRole("link", { name: "People" }).click();
    await admin.page.getByRole("heading", { level: 1, name: "People" }).waitFor();
    await admin.page.getByRole("link", { name: "Invite someone" }).click();
    await admin.page.getByRole("heading", { level: 1, name: "Invite someone" }).waitFor();
    await admin.page.getByLabel("Name").fill("Odile Marchbank");
    await admin.page.getByLabel("E-mail").fill(invitee);
    await admin.page.getByLabel("Role", { exact: true }).selectOption({ label: "Auditor" });
    await admin.page
      .getByLabel("Site", { exact: true })
      .selectOption({ label: "Wexley Rehabilitation Centre" });
    await admin.page.getByRole("button", { name: "Send invitation" }).click();
    await admin.page.getByText(`Invitation sent to ${invitee}`).waitFor();
    expect(admin.problems).toEqual([]);

    const mail = await receivedMail(invitee);
    expect(mail.subject).toBe("You have been invited to Lintel");
    const link = /https?:\/\/\S+\/welcome\/\S+/.exec(mail.text)?.[0];
    expect(link).toBeTruthy();

    const newcomer = await phonePage(browser);
    await newcomer.page.goto(link!);
    await newcomer.page
      .getByRole("heading", { level: 1, name: "Welcome, Odile Marchbank" })
      .waitFor();
    await newcomer.page.getByLabel("New password").fill("morning rounds on the rehab ward");
    await newcomer.page.getByLabel("Repeat password").fill("morning rounds on the rehab ward");
    await newcomer.page.getByRole("button", { name: "Set password and sign in" }).click();
    await newcomer.page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await newcomer.page.getByText("Wexley Rehabilitation Centre").first().waitFor();
    expect(await newcomer.page.getByText("Tamsin Bay General Hospital").count()).toBe(0);
    expect(await newcomer.page.getByText("Orchard Hill Community Hospital").count()).toBe(0);

    // Signed out, the new password works from the sign-in page too.
    await newcomer.page.context().clearCookies();
    await signInHome(newcomer.page, invitee, "morning rounds on the rehab ward");
    expect(await newcomer.page.getByText("Tamsin Bay General Hospital").count()).toBe(0);
    expect(newcomer.problems).toEqual([]);

    // The link worked once: opening it again says so.
    await newcomer.page.goto(link!);
    await newcomer.page.getByRole("heading", { name: "This link no longer works" }).waitFor();

    await admin.page.context().close();
    await newcomer.page.context().close();
  });

  it("when an administrator opens the mailbox page, then the invitation e-mail is listed", async () => {
    const admin = await phonePage(browser);
    await signInHome(admin.page, "admin@example.org", "lintel-demo-2026");
    await admin.page.goto(`${baseUrl()}/admin/mail`);
    await admin.page.getByRole("heading", { level: 1, name: "Demo e-mails" }).waitFor();
    await admin.page
      .getByRole("button", { name: /You have been invited to Lintel/ })
      .first()
      .waitFor();
    expect(admin.problems).toEqual([]);
    await admin.page.context().close();
  });
});
