import type { Browser, Locator, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { distanceMetres, formatLength } from "@shared/calc/plan-geometry";

import { baseUrl, launchBrowser, phonePage, signIn } from "../helpers/browser";

const planWidth = 1200;
const planHeight = 800;

/** A simple plan drawn for the test: outer walls and a corridor. */
function testPlan(): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${planWidth}" height="${planHeight}">
    <rect width="100%" height="100%" fill="#f7f5f0"/>
    <rect x="20" y="20" width="${planWidth - 40}" height="${planHeight - 40}" fill="none" stroke="#333" stroke-width="8"/>
    <rect x="20" y="360" width="${planWidth - 40}" height="80" fill="#e5e0d5"/>
  </svg>`;
  return sharp(Buffer.from(svg)).png().toBuffer();
}

/** Taps the screen point over plan point (x, y) and returns the plan point the app recorded. */
async function tapPlan(
  page: Page,
  map: Locator,
  x: number,
  y: number,
): Promise<{ x: number; y: number }> {
  // Runs in the page; the test's own types have no DOM.
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
  const readout = page.getByTestId("plan-point-readout");
  await expect
    .poll(async () => (await readout.textContent()) ?? "")
    .toMatch(/Last point: x \d+, y \d+/);
  const [, px, py] = /x (\d+), y (\d+)/.exec((await readout.textContent())!)!;
  return { x: Number(px), y: Number(py) };
}

describe("drawing on a floor plan on a phone (390×844)", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it("when an administrator uploads a plan, draws a doffing area and places hand-rub stations 1 m apart, then the spacing flag shows", async () => {
    const { page, problems } = await phonePage(browser);
    await signIn(page, "admin@example.org", "lintel-demo-2026");
    await page.getByRole("heading", { level: 1, name: "My sites" }).waitFor();

    // A new floor at Wexley.
    await page
      .getByRole("list", { name: "Sites" })
      .getByRole("link", { name: /Wexley Rehabilitation Centre/ })
      .first()
      .click();
    await page.getByLabel("Building").fill("Garden wing");
    await page.getByLabel("Level").fill("1");
    await page.getByLabel("Name", { exact: true }).fill("Temporary ward");
    await page.getByRole("button", { name: "Add floor" }).click();
    await page.getByRole("link", { name: /Temporary ward/ }).click();
    await page.getByRole("heading", { level: 1, name: "Temporary ward" }).waitFor();

    await page
      .getByLabel("Floor plan image")
      .setInputFiles({ name: "garden-wing.png", mimeType: "image/png", buffer: await testPlan() });
    await page.getByRole("button", { name: "Upload plan" }).click();
    const map = page.getByLabel("Floor plan map");
    await map.locator("img.leaflet-image-layer").waitFor();

    // Scale: two points along the corridor, 25 m apart.
    await page.getByRole("button", { name: "Set scale" }).click();
    const a = await tapPlan(page, map, 100, 400);
    await page.getByText("Tap the second point").waitFor();
    const b = await tapPlan(page, map, 1100, 400);
    await page.getByLabel("Real distance (metres)").fill("25");
    await page.getByRole("button", { name: "Save scale" }).click();
    await page.getByText(/^Scale set: /).waitFor();
    const scale = 25 / Math.hypot(b.x - a.x, b.y - a.y);

    // A doffing area in the upper right.
    await page.getByRole("button", { name: "Draw a space" }).click();
    for (const [x, y] of [
      [700, 80],
      [1100, 80],
      [1100, 340],
      [700, 340],
    ] as const) {
      await tapPlan(page, map, x, y);
    }
    await page.getByRole("button", { name: "Finish shape" }).click();
    await page.getByLabel("Zone type").selectOption({ label: "Doffing area" });
    await page.getByLabel("Name", { exact: true }).fill("Doffing bay G1");
    await page.getByRole("button", { name: "Save space" }).click();
    await page.getByText(/Doffing bay G1.* is saved and selected/).waitFor();

    // A dirty chair and two hand-rub stations 40 units (1 m) apart.
    await page.getByRole("button", { name: "Place a fixture" }).click();
    await page.getByLabel("Fixture type").selectOption({ label: "Dirty chair" });
    await tapPlan(page, map, 800, 150);
    await page.getByText(/Dirty chair placed in/).waitFor();
    await page.getByLabel("Fixture type").selectOption({ label: "Hand-rub station" });
    const first = await tapPlan(page, map, 1000, 200);
    await page
      .getByText(/Hand-rub station placed in/)
      .first()
      .waitFor();
    const second = await tapPlan(page, map, 1000, 240);
    await expect
      .poll(async () => page.getByText(/Hand-rub station placed in/).count())
      .toBeGreaterThan(0);
    await page.getByRole("button", { name: "Done" }).click();

    const expected = formatLength(distanceMetres(first, second, scale));
    const panel = page.getByRole("region", { name: "Spacing check" });
    await panel.getByText(`Hand-rub stations ${expected} apart`).waitFor();
    expect(await panel.textContent()).toContain(
      "at least 48 in (1.22 m) is required (NFPA 101, 2012, 18.3.2.6 / 19.3.2.6)",
    );
    expect(distanceMetres(first, second, scale)).toBeGreaterThan(0.8);
    expect(distanceMetres(first, second, scale)).toBeLessThan(1.2);

    // What the map shows is what the server stored.
    const floorId = new URL(page.url()).pathname.split("/").pop();
    const detail = await (await page.request.get(`${baseUrl()}/api/floors/${floorId}`)).json();
    expect(detail.spaces).toEqual([
      expect.objectContaining({ zoneType: "doffing_area", name: "Doffing bay G1" }),
    ]);
    expect(detail.fixtures.map((f: { kind: string }) => f.kind).sort()).toEqual([
      "dirty_chair",
      "hand_rub_station",
      "hand_rub_station",
    ]);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
