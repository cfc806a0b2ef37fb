import { request, type Browser } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import type { ChecklistItem } from "@shared/schemas/checklists";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";
import { answerDoffingItem } from "../helpers/doffing-steps";
import { waitForKept } from "../helpers/kept";

const password = "lintel-demo-2026";
const shots = "/tmp/shots/i15-offline";

interface Published {
  id: string;
  version: number;
  title: string;
  items: ChecklistItem[];
}

/** Publishes the doffing checklist again, item for item, as an administrator: a new version. */
async function republishDoffingChecklist(): Promise<Published> {
  // Writes must come from Lintel's own origin, as the browser would send them.
  const admin = await request.newContext({
    baseURL: baseUrl(),
    extraHTTPHeaders: { Origin: new URL(baseUrl()).origin },
  });
  try {
    const signedIn = await admin.post("/api/auth/sign-in", {
      data: { email: "admin@example.org", password },
    });
    expect(signedIn.status()).toBe(200);
    const { checklists } = await (await admin.get("/api/checklists")).json();
    const current = checklists.find(
      (entry: { zoneType: string }) => entry.zoneType === "doffing_area",
    ).published as Published;
    const draft = await admin.put("/api/checklists/doffing_area/draft", {
      data: {
        title: current.title,
        items: current.items.map((item) => ({
          key: item.key,
          text: item.text,
          severity: item.severity,
          response: item.response,
          quantity: item.quantity,
          threshold: item.threshold,
          choices: item.choices,
          reference: item.reference,
          photoOnFail: item.photoOnFail,
        })),
      },
    });
    expect(draft.status(), await draft.text()).toBe(200);
    const published = await admin.post("/api/checklists/doffing_area/publish");
    expect(published.status(), await published.text()).toBe(200);
    return (await published.json()).published as Published;
  } finally {
    await admin.dispose();
  }
}

describe("an audit begun with no signal at all (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when the auditor signed in once and then has no signal, then they open the due list, start an audit of a space never opened, finish it with a failed item and a photo, and on reconnecting it arrives once with the checklist version it began with", async () => {
    const { page, problems } = await phonePage(browser);
    const context = page.context();
    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();

    const kept = await waitForKept(page);
    // The figure the README gives for the demo auditor.
    console.info(
      `kept for the demo auditor: ${kept.queries} lists, ${(kept.listBytes / 1024).toFixed(0)} KB; ` +
        `${kept.images} floor plans, ${(kept.imageBytes / 1024).toFixed(0)} KB`,
    );
    expect(kept.queries).toBeGreaterThan(5);
    expect(kept.images).toBeGreaterThan(0);

    const due = (await (await page.request.get(`${baseUrl()}/api/my/due`)).json()).entries as {
      spaceId: string;
      spaceName: string;
      zoneType: string;
      siteName: string;
    }[];
    // A doffing area other browser tests leave alone: the last one due.
    const space = due
      .filter(
        (entry) =>
          entry.zoneType === "doffing_area" &&
          !(entry.spaceName === "Doffing area 1" && entry.siteName.startsWith("Wexley")),
      )
      .at(-1)!;
    expect(space).toBeDefined();
    const { checklists } = await (await page.request.get(`${baseUrl()}/api/checklists`)).json();
    const before = checklists.find(
      (entry: { zoneType: string }) => entry.zoneType === "doffing_area",
    ).published as Published;

    // No signal from here on: the browser is offline and Lintel cannot be reached.
    await context.setOffline(true);
    await context.route("**/api/**", (route) => route.abort());
    // Meanwhile an administrator publishes the doffing checklist again.
    const republished = await republishDoffingChecklist();
    expect(republished.version).toBe(before.version + 1);

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
    await page.getByText(/No signal — shown from this phone, last updated from Lintel/).waitFor();
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: `${shots}/due-list-offline-auditor.png` });
    // A floor plan of the site opens too, from the copy the phone keeps.
    await page.goBack();
    await page
      .getByRole("region", { name: "Floors" })
      .getByRole("link")
      .filter({ hasNotText: "No plan yet" })
      .first()
      .click();
    const plan = page.locator("img.leaflet-image-layer");
    await expect
      .poll(async () =>
        plan.evaluate((img: HTMLImageElement) => img.src.startsWith("blob:") && img.naturalWidth),
      )
      .toBeGreaterThan(0);
    await page.screenshot({ path: `${shots}/floor-offline-auditor.png` });
    await page.goBack();
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
    await page.getByText(`checklist version ${before.version}`, { exact: false }).waitFor();
    const total = Number(
      /of (\d+)$/.exec((await page.getByText(/^Item 1 of \d+$/).textContent())!)![1],
    );
    expect(total).toBe(before.items.length);
    const auditId = new URL(page.url()).pathname.split("/").pop()!;
    await page.screenshot({ path: `${shots}/audit-started-offline-auditor.png` });

    const chairPhoto = await sharp({
      create: { width: 800, height: 600, channels: 3, background: "#5a7f22" },
    })
      .png()
      .toBuffer();
    for (let index = 1; index <= total; index += 1) {
      await page.getByText(`Item ${index} of ${total}`, { exact: true }).waitFor();
      await answerDoffingItem(page, {
        note: "The dirty chair is missing from the bay",
        photo: { name: "bay.png", buffer: chairPhoto },
      });
    }
    await page.getByRole("button", { name: "Submit audit" }).click();
    await page.getByRole("heading", { level: 2, name: "Hold until fixed" }).waitFor();
    await page.getByText("On this phone only").first().waitFor();
    await page.getByText(/^Offline — \d+ changes saved on this phone only/).waitFor();
    await page.screenshot({ path: `${shots}/audit-submitted-offline-auditor.png` });

    // The signal returns: everything goes by itself, once.
    await context.unroute("**/api/**");
    await context.setOffline(false);
    await page.getByText("All changes arrived in Lintel").waitFor({ timeout: 30_000 });
    await page.screenshot({ path: `${shots}/audit-arrived-auditor.png` });

    const detail = await (await page.request.get(`${baseUrl()}/api/audits/${auditId}`)).json();
    expect(detail.audit).toMatchObject({
      status: "submitted",
      verdict: "hold",
      checklistVersionId: before.id,
      checklistVersion: before.version,
    });
    expect(detail.items.map((item: { id: string }) => item.id)).toEqual(
      before.items.map((item) => item.id),
    );
    expect(detail.answers).toHaveLength(total);
    expect(detail.photos).toHaveLength(1);
    const history = await (
      await page.request.get(`${baseUrl()}/api/spaces/${space.spaceId}/audits`)
    ).json();
    expect(history.audits.filter((audit: { id: string }) => audit.id === auditId)).toHaveLength(1);
    expect(
      problems.filter((problem) => !/ERR_FAILED|ERR_INTERNET_DISCONNECTED/.test(problem)),
    ).toEqual([]);
    await context.close();
  });
});
