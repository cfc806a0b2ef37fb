import pg from "pg";
import type { Browser } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, receivedMail, signIn } from "../helpers/browser";

const password = "lintel-demo-2026";

/** A photo of the fix, drawn for the test. */
function fixPhoto(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600">
    <rect width="100%" height="100%" fill="#e8ecef"/>
    <rect x="300" y="120" width="120" height="260" rx="12" fill="#2a7275"/>
    <rect x="500" y="140" width="120" height="260" rx="12" fill="#2a7275"/>
  </svg>`;
  return sharp(Buffer.from(svg)).jpeg().toBuffer();
}

describe("a corrective action from e-mail to confirmed fix, on phones (390×844)", () => {
  let browser: Browser;
  let db: pg.Client;
  beforeAll(async () => {
    browser = await launchBrowser();
    db = new pg.Client({ connectionString: process.env.LINTEL_E2E_DATABASE_URL });
    await db.connect();
  });
  afterAll(async () => {
    await browser.close();
    await db.end();
  });

  it("when the facilities lead follows the overdue e-mail, proves the fix and the auditor confirms it, then the pin leaves the floor plan", async () => {
    // The demo's overdue action at the General, on a floor with a plan.
    const { rows } = await db.query<{
      id: string;
      title: string;
      space_name: string;
      site_id: string;
      floor_id: string;
      state: string;
    }>(`
      select ca.id, ca.state, ca.title, sp.name as space_name, ca.site_id, ca.floor_id
        from corrective_actions ca
        join sites s on s.id = ca.site_id
        join spaces sp on sp.id = ca.space_id
        join floors f on f.id = ca.floor_id
        join users u on u.id = ca.assignee_id
       where s.name = 'Tamsin Bay General Hospital' and ca.state in ('to_fix', 'fixing')
         and ca.due_at < now() and f.plan_image_id is not null
         and u.email = 'facilities.general@example.org'
       order by ca.due_at limit 1`);
    const action = rows[0]!;
    expect(action).toBeDefined();
    // Arrange: its overdue notice has not gone out yet, as after downtime; the scheduler catches up.
    await db.query("delete from action_notices where action_id = $1", [action.id]);
    const mail = await receivedMail(
      "facilities.general@example.org",
      (message) =>
        message.subject === `Overdue: ${action.space_name}` && message.text.includes(action.id),
    );
    const link = new RegExp(`https?://\\S+/actions/${action.id}`).exec(mail.text)?.[0];
    expect(link).toBeTruthy();

    // The facilities lead opens the link on a phone and signs in on the way.
    const lead = await phonePage(browser);
    await lead.page.goto(link!);
    await lead.page.waitForURL(/\/sign-in/);
    await signIn(lead.page, "facilities.general@example.org", password, false);
    await lead.page.getByRole("heading", { level: 1, name: action.title }).waitFor();
    await lead.page.getByText("Overdue", { exact: true }).first().waitFor();
    await lead.page
      .getByRole("region", { name: new RegExp(`^Where ${action.space_name} is`) })
      .waitFor();

    const start = lead.page.getByRole("button", { name: "Start fixing" });
    if (action.state === "to_fix") {
      await start.click();
      await lead.page.getByLabel("Note for the auditor").waitFor();
    }
    await lead.page.getByLabel("Add a photo of the fix").setInputFiles({
      name: "fix.jpg",
      mimeType: "image/jpeg",
      buffer: await fixPhoto(),
    });
    await lead.page.getByText("The photo is added.").waitFor();
    await lead.page.getByText("There is a photo of this fix.", { exact: false }).waitFor();
    await lead.page
      .getByLabel("Note for the auditor")
      .fill("Dispensers moved to 1.3 m apart and refilled");
    await lead.page.getByRole("button", { name: "Ask for a check" }).click();
    await lead.page.getByText("An auditor of the site is asked to check the fix.").waitFor();
    expect(lead.problems).toEqual([]);

    // The auditor sees the pin on the floor plan, opens the action from it and confirms the fix.
    const auditor = await phonePage(browser);
    await signIn(auditor.page, "auditor@example.org", password);
    await auditor.page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    const floorUrl = `${baseUrl()}/sites/${action.site_id}/floors/${action.floor_id}`;
    await auditor.page.goto(floorUrl);
    const pin = auditor.page.locator(`[data-action-id="${action.id}"]`);
    await pin.waitFor();
    await pin.click();
    await auditor.page.waitForURL(new RegExp(`/actions/${action.id}$`));
    await auditor.page.getByRole("heading", { level: 1, name: action.title }).waitFor();
    await auditor.page
      .getByLabel("What you saw")
      .fill("Checked on the ward: spacing and stock right");
    await auditor.page.getByRole("button", { name: "Confirm the fix" }).click();
    await auditor.page.getByText("The fix is confirmed: this action is done.").waitFor();

    // Back on the floor plan, the map shows its pins but this one is gone.
    // A full page load: the floor's open actions come fresh from the server.
    await auditor.page.goto(floorUrl);
    await auditor.page.getByRole("region", { name: "Floor plan map" }).waitFor();
    await auditor.page.locator("img.leaflet-image-layer").waitFor();
    await auditor.page
      .getByText(
        /^(No unfinished actions on this floor\.|\d+ of \d+ on the plan\. Tap a pin to open its action\.)$/,
      )
      .waitFor();
    expect(await pin.count()).toBe(0);
    expect(auditor.problems).toEqual([]);

    const { rows: after } = await db.query<{ state: string; days_to_close: number }>(
      "select state, days_to_close from corrective_actions where id = $1",
      [action.id],
    );
    expect(after[0]).toMatchObject({ state: "done" });
    expect(after[0]!.days_to_close).toBeGreaterThan(30);
  });
});
