import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, phonePage, signIn } from "../helpers/browser";
import { pageWidth, shot } from "../helpers/screens";

const password = "lintel-demo-2026";
const site = /Orchard Hill Community Hospital/;

describe("a site's room-pressure alarm settings on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when an administrator chooses who is told and a longer door grace, then the site keeps them, and going back to the default names the leads and auditors", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "admin@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page
      .getByRole("list", { name: "Sites" })
      .getByRole("link", { name: site })
      .first()
      .click();
    await page.getByRole("link", { name: "Edit site" }).click();
    const section = page.getByRole("heading", { name: "Room-pressure alarms" });
    await section.waitFor();
    await page.getByText(/^Told now: /).waitFor();
    await section.scrollIntoViewIfNeeded();
    await shot(page, "admin-site-edit-pressure-alarms-default");
    expect(await pageWidth(page)).toBeLessThanOrEqual(390);

    await page.getByLabel("Grace while the door is open (seconds)").fill("420");
    await page.getByRole("radio", { name: "People I choose" }).check();
    const people = page.getByRole("list", { name: "People of this site" });
    const boxes = people.getByRole("checkbox");
    // The leads and auditors start ticked; the administrator adds no one and unticks all but one.
    const count = await boxes.count();
    expect(count).toBeGreaterThan(1);
    for (let index = 1; index < count; index += 1) await boxes.nth(index).uncheck();
    await boxes.first().check();
    await people.scrollIntoViewIfNeeded();
    await shot(page, "admin-site-edit-pressure-alarms-chosen");
    expect(await pageWidth(page)).toBeLessThanOrEqual(390);
    await page.getByRole("button", { name: "Save alarm settings" }).click();
    await page.getByText("The alarm settings are saved.").waitFor();

    await page.reload();
    await page.getByRole("heading", { name: "Room-pressure alarms" }).waitFor();
    await expect
      .poll(() => page.getByLabel("Grace while the door is open (seconds)").inputValue())
      .toBe("420");
    expect(await page.getByRole("radio", { name: "People I choose" }).isChecked()).toBe(true);
    expect(
      await page
        .getByRole("list", { name: "People of this site" })
        .getByRole("checkbox", { checked: true })
        .count(),
    ).toBe(1);

    // A door grace shorter than the grace is refused beside the field.
    await page.getByLabel("Grace, door shut (seconds)").fill("600");
    await page.getByRole("button", { name: "Save alarm settings" }).click();
    const refusal = page.getByText("The door grace cannot be shorter than the grace.");
    await refusal.waitFor();
    await refusal.scrollIntoViewIfNeeded();
    await shot(page, "admin-site-edit-pressure-alarms-error");

    await page.getByLabel("Grace, door shut (seconds)").fill("");
    await page.getByLabel("Grace while the door is open (seconds)").fill("");
    await page.getByRole("radio", { name: /facilities leads and auditors/ }).check();
    await page.getByRole("button", { name: "Save alarm settings" }).click();
    await page.getByText("The alarm settings are saved.").waitFor();
    await page.getByText(/^Told now: /).waitFor();
    // The one refusal above is the browser's only complaint.
    expect(problems).toEqual([
      "Failed to load resource: the server responded with a status of 400 (Bad Request)",
    ]);
  });
});
