import { mkdirSync } from "node:fs";
import path from "node:path";

import type { Browser, Locator, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { baseUrl, launchBrowser, phonePage, signIn, openSiteDueList } from "../helpers/browser";

const password = "lintel-demo-2026";
const planWidth = 1200;
const planHeight = 800;

/**
 * Screenshots of the phone's screen, scrolled to `near`, for review when LINTEL_SHOTS_DIR is set;
 * the test asserts without them.
 */
async function shot(page: Page, name: string, near: Locator) {
  const dir = process.env.LINTEL_SHOTS_DIR;
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  await near.evaluate((element) =>
    (element as unknown as { scrollIntoView: (options: object) => void }).scrollIntoView({
      block: "center",
    }),
  );
  await page.screenshot({ path: path.join(dir, `${name}.png`) });
}

async function expectFitsPhone(page: Page) {
  // Runs in the page; the test's own types have no DOM.
  const width = await page.evaluate(
    () =>
      (globalThis as unknown as { document: { documentElement: { scrollWidth: number } } }).document
        .documentElement.scrollWidth,
  );
  expect(width).toBeLessThanOrEqual(390);
}

async function tapPlan(page: Page, map: Locator, x: number, y: number) {
  await map.evaluate((element) =>
    (element as unknown as { scrollIntoView: (options: object) => void }).scrollIntoView({
      block: "center",
    }),
  );
  const box = (await map.locator("img.leaflet-image-layer").boundingBox())!;
  await page.mouse.click(
    box.x + (x / planWidth) * box.width,
    box.y + (y / planHeight) * box.height,
  );
}

/** Steps forward through the checklist until the item whose heading matches `heading`. */
async function nextUntil(page: Page, heading: RegExp) {
  for (let step = 0; step < 30; step += 1) {
    await page.getByRole("button", { name: "Next", exact: true }).click();
    const text = (await page.getByRole("heading", { level: 2 }).first().textContent()) ?? "";
    if (heading.test(text)) return;
  }
  throw new Error(`no item matching ${heading}`);
}

describe("isolation-room air on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when an auditor enters +3 Pa for an isolation room, then the sign is shown and a warning says air flows out; Negative makes it pass, and −0.010 in. w.c. passes as entered", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "auditor@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await openSiteDueList(page, /Orchard Hill Community Hospital/);
    await page
      .getByRole("listitem", { name: "Isolation room 11", exact: true })
      .getByRole("link", { name: "Start audit" })
      .click();
    await page.getByRole("heading", { level: 1, name: "Isolation room 11" }).waitFor();
    await page.getByRole("heading", { level: 2, name: /^Pressure differential/ }).waitFor();

    await page.getByLabel("Reading").fill("3");
    await page.getByText("Positive reading: air flows out of the room").waitFor();
    expect(await page.getByRole("button", { name: /Positive/ }).getAttribute("aria-pressed")).toBe(
      "true",
    );
    await page.getByText(/^Fails: limit/).waitFor();
    await expectFitsPhone(page);
    await shot(page, "reading-step-positive-warning", page.getByText("Direction of the reading"));

    await page.getByRole("button", { name: /Negative/ }).click();
    expect(await page.getByLabel("Reading").inputValue()).toBe("-3");
    await page.getByText(/^Passes: limit/).waitFor();
    expect(await page.getByText("Positive reading: air flows out of the room").count()).toBe(0);
    await shot(page, "reading-step-negative", page.getByText("Direction of the reading"));

    // The CDC's own figure in inches of water passes as entered (CDC 2005 TB guidelines:
    // 0.01 in. w.c.), though it is 2.49 Pa, a hair under the 2.5 Pa it also states.
    await page.getByLabel("Unit").selectOption("inH2O");
    await page.getByLabel("Reading").fill("-0.010");
    await page.getByText(/^Passes: limit/).waitFor();
    expect(await page.getByText("Positive reading: air flows out of the room").count()).toBe(0);
    await shot(page, "reading-step-inches-pass", page.getByText("Direction of the reading"));

    // Airflow for 12 air changes in this room, then a typed 8: more than 10 % apart.
    const auditId = new URL(page.url()).pathname.split("/").pop();
    const { room } = await (await page.request.get(`${baseUrl()}/api/audits/${auditId}`)).json();
    await nextUntil(page, /^Exhaust airflow/);
    await page.getByLabel("Unit").selectOption("m3/h");
    await page.getByLabel("Reading").fill(String(room.volumeM3 * 12));
    await nextUntil(page, /^Air changes/);
    await page.getByLabel("Reading").fill("8");
    await page.getByText("Typed 8 ACH · worked out from airflow ÷ volume 12 ACH").waitFor();
    await page.getByText("Which air-change figure is right?").waitFor();
    await page.getByText(/^Cannot pass until confirmed|^Fails: limit/).waitFor();
    await expectFitsPhone(page);
    await shot(page, "reading-step-air-changes-disagree", page.getByText(/^Typed 8 ACH/));
    await page.getByRole("button", { name: "The typed 8 ACH is right" }).click();
    expect(await page.getByLabel("Note").inputValue()).toBe(
      "Air changes confirmed: the typed 8 ACH is right; airflow ÷ volume gives 12 ACH.",
    );
    await shot(
      page,
      "reading-step-air-changes-confirmed",
      page.getByRole("region", { name: "Ventilation figures" }),
    );
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("when an administrator draws an isolation room without a construction class, then the class is asked for; once chosen, the list shows its minimum", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "admin@example.org", password);
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();
    await page
      .getByRole("list", { name: "Sites" })
      .getByRole("link", { name: /Orchard Hill Community Hospital/ })
      .first()
      .click();
    await page.getByLabel("Building").fill("Garden wing");
    await page.getByLabel("Level").fill("2");
    await page.getByLabel("Name", { exact: true }).fill("Isolation ward");
    await page.getByRole("button", { name: "Add floor" }).click();
    await page.getByRole("link", { name: /Isolation ward/ }).click();
    await page.getByRole("heading", { level: 1, name: "Isolation ward" }).waitFor();
    const plan = await sharp({
      create: { width: planWidth, height: planHeight, channels: 3, background: "#f7f5f0" },
    })
      .png()
      .toBuffer();
    await page
      .getByLabel("Floor plan image")
      .setInputFiles({ name: "ward.png", mimeType: "image/png", buffer: plan });
    await page.getByRole("button", { name: "Upload plan" }).click();
    const map = page.getByLabel("Floor plan map");
    await map.locator("img.leaflet-image-layer").waitFor();

    await page.getByRole("button", { name: "Draw a space" }).click();
    for (const [x, y] of [
      [100, 100],
      [500, 100],
      [500, 400],
      [100, 400],
    ] as const) {
      await tapPlan(page, map, x, y);
    }
    await page.getByRole("button", { name: "Finish shape" }).click();
    await page.getByLabel("Zone type").selectOption({ label: "Isolation room" });
    await page.getByLabel("Name", { exact: true }).fill("Isolation room G1");
    await page.getByRole("button", { name: "Save space" }).click();
    await page
      .getByText("Choose a construction class: it decides the air-change minimum.")
      .waitFor();
    await expectFitsPhone(page);
    await shot(page, "space-form-class-required", page.getByLabel("Construction class"));

    await page.getByLabel("Construction class").selectOption({ label: "Existing" });
    await page
      .getByText(
        "Air changes per hour: ≥ 6 (existing rooms only; CDC: raise to 12 where feasible).",
      )
      .waitFor();
    await shot(page, "space-form-class-chosen", page.getByLabel("Construction class"));
    await page.getByRole("button", { name: "Save space" }).click();
    await page.getByText(/Isolation room G1.* is saved and selected/).waitFor();
    await page
      .getByText("Air changes: ≥ 6 (existing rooms only; CDC: raise to 12 where feasible)")
      .waitFor();
    await shot(
      page,
      "space-list-minimum",
      page.getByText("Air changes: ≥ 6 (existing rooms only; CDC: raise to 12 where feasible)"),
    );

    const floorId = new URL(page.url()).pathname.split("/").pop();
    const detail = await (await page.request.get(`${baseUrl()}/api/floors/${floorId}`)).json();
    expect(detail.spaces).toEqual([
      expect.objectContaining({ zoneType: "isolation_room", constructionClass: "existing" }),
    ]);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
