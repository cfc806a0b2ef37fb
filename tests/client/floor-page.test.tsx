import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { administrator, auditor, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import {
  buildFixture,
  buildFloor,
  buildFloorDetail,
  buildSpace,
  floorId,
  suite4,
} from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const floorUrl = `/sites/${tamsinGeneral.id}/floors/${floorId}`;
const doffing = buildSpace();
const room = buildSpace({
  id: "b061df07-4253-4e6f-8078-91a2b3c4d546",
  zoneType: "isolation_room",
  name: "Room",
  number: "4",
  polygon: [
    [60, 60],
    [390, 60],
    [390, 390],
    [60, 390],
  ],
  floorAreaM2: 18.5,
});
const corridorBay = buildSpace({
  id: "c172e018-5364-4f70-9189-a2b3c4d5e657",
  zoneType: "doffing_area",
  name: "Corridor bay",
  number: null,
  suiteId: null,
  polygon: [
    [420, 420],
    [520, 420],
    [520, 520],
    [420, 520],
  ],
});
const stationA = buildFixture({ id: "d283f129-6475-4081-a29a-b3c4d5e6f768", x: 1000, y: 300 });
const stationB = buildFixture({ id: "e394023a-7586-4192-b3ab-c4d5e6f70879", x: 1000, y: 340 });
const chair = buildFixture({
  id: "f4a5134b-8697-42a3-84bc-d5e6f708198a",
  kind: "dirty_chair",
  x: 900,
  y: 200,
  label: "By the exit",
});

function stubFloor(me: typeof administrator, detail = buildFloorDetail()) {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(me),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET /api/floors/${floorId}`]: () => jsonResponse(detail),
  });
}

describe("a floor without a plan", () => {
  it("when an administrator opens it, then the upload control is offered under the floor's heading", async () => {
    stubFloor(administrator, buildFloorDetail({ floor: buildFloor({ plan: null }), spaces: [] }));
    renderApp(floorUrl);

    expect(await screen.findByRole("heading", { level: 1, name: "Ward 4 East" })).toBeTruthy();
    expect(screen.getByText("Main block · Level 4")).toBeTruthy();
    expect(screen.getByLabelText("Floor plan image")).toBeTruthy();
    expect(screen.getByRole("button", { name: "Upload plan" })).toBeTruthy();
    expect(screen.getByRole("complementary", { name: "Caution" })).toBeTruthy();
  });

  it("when an auditor opens it, then they are told the plan is not there yet and offered no upload", async () => {
    stubFloor(auditor, buildFloorDetail({ floor: buildFloor({ plan: null }), spaces: [] }));
    renderApp(floorUrl);

    expect(await screen.findByRole("heading", { name: "No floor plan yet" })).toBeTruthy();
    expect(screen.queryByLabelText("Floor plan image")).toBeNull();
  });
});

describe("a floor with a plan", () => {
  const detail = buildFloorDetail({
    spaces: [doffing, room, corridorBay],
    fixtures: [stationA, stationB, chair],
  });

  it("when two hand-rub stations are 1 m apart, then the spacing check names the distance and the rule", async () => {
    stubFloor(auditor, detail);
    renderApp(floorUrl);

    const check = await screen.findByRole("region", { name: "Spacing check" });
    expect(within(check).getByRole("status").textContent).toContain(
      "Hand-rub stations 1.00 m (3 ft 3.4 in) apart — at least 48 in (1.22 m) is required (NFPA 101, 2012, 18.3.2.6 / 19.3.2.6).",
    );
  });

  it("when an isolation room has no construction class, then the space list says it is judged as new or renovated until one is set", async () => {
    stubFloor(
      administrator,
      buildFloorDetail({
        spaces: [
          room,
          { ...room, id: corridorBay.id, name: "Room 2", constructionClass: "existing" },
        ],
        fixtures: [],
      }),
    );
    renderApp(floorUrl);

    expect(
      await screen.findByText(
        "No construction class set: judged as new or renovated, ≥ 12 air changes per hour, until an administrator sets it.",
      ),
    ).toBeTruthy();
    expect(
      screen.getByText("Air changes: ≥ 6 (existing rooms only; CDC: raise to 12 where feasible)"),
    ).toBeTruthy();
  });

  it("when the floor has no scale, then the spacing check says it waits for the scale", async () => {
    stubFloor(
      auditor,
      buildFloorDetail({
        floor: buildFloor({ metresPerUnit: null, scaleReference: null }),
        spaces: [doffing],
        fixtures: [stationA, stationB],
      }),
    );
    renderApp(floorUrl);

    const check = await screen.findByRole("region", { name: "Spacing check" });
    expect(check.textContent).toContain("cannot be checked until the scale of this floor is set");
  });

  it("when an auditor reads the list, then each space offers Start audit and its audit history", async () => {
    stubFloor(auditor, detail);
    renderApp(floorUrl);

    const list = await screen.findByRole("region", { name: "Spaces" });
    const starts = within(list).getAllByRole("link", { name: "Start audit" });
    expect(starts.map((link) => link.getAttribute("href")).sort()).toEqual(
      [doffing, room, corridorBay].map((space) => `/spaces/${space.id}/audit`).sort(),
    );
    expect(within(list).getAllByRole("link", { name: "Audit history" })).toHaveLength(3);
  });

  it("when an administrator reads the list, then there is no Start audit: auditors audit", async () => {
    stubFloor(administrator, detail);
    renderApp(floorUrl);

    const list = await screen.findByRole("region", { name: "Spaces" });
    expect(within(list).queryByRole("link", { name: "Start audit" })).toBeNull();
    expect(within(list).getAllByRole("link", { name: "Audit history" })).toHaveLength(3);
  });

  it("when the list is read, then spaces are grouped by suite with zone type, area and fixtures", async () => {
    stubFloor(auditor, detail);
    renderApp(floorUrl);

    const list = await screen.findByRole("region", { name: "Spaces" });
    const headings = within(list)
      .getAllByRole("heading", { level: 3 })
      .map((heading) => heading.textContent);
    expect(headings).toEqual([suite4.name, "Not in a suite"]);

    const roomButton = within(list).getByRole("button", { name: /^Room \(No\. 4\)/ });
    expect(roomButton.textContent).toContain("Isolation room · Floor area 18.50 m² (199.1 ft²)");
    const fixtures = within(list).getByRole("list", { name: "Fixtures in Doffing area (No. 4)" });
    expect(fixtures.textContent).toContain("Dirty chair — By the exit");
    expect(within(fixtures).getAllByText("Too close")).toHaveLength(2);
  });

  it("when doffing areas are filtered out, then they leave the list and the filter says how many are hidden", async () => {
    stubFloor(auditor, detail);
    const { user } = renderApp(floorUrl);

    await user.click(await screen.findByRole("checkbox", { name: "Doffing area" }));

    const list = screen.getByRole("region", { name: "Spaces" });
    expect(within(list).queryByRole("button", { name: /^Corridor bay/ })).toBeNull();
    expect(within(list).getByText("2 spaces are hidden by the zone type filters.")).toBeTruthy();
    expect(within(list).getByRole("button", { name: /^Room \(No\. 4\)/ })).toBeTruthy();
  });

  it("when a space is chosen in the list, then it is selected with its area in m² and ft², and fixtures can be placed in it", async () => {
    stubFloor(administrator, detail);
    const { user } = renderApp(floorUrl);

    expect(await screen.findByRole("button", { name: "Place a fixture" })).toHaveProperty(
      "disabled",
      true,
    );
    await user.click(screen.getByRole("button", { name: /^Corridor bay/ }));

    // 100 × 100 plan units at 0.025 m a unit.
    expect(screen.getByText(/Selected:/).textContent).toBe(
      "Selected: Corridor bay · About 6.25 m² (67.3 ft²) on the plan",
    );
    expect(screen.getByRole("button", { name: /^Corridor bay/ }).getAttribute("aria-pressed")).toBe(
      "true",
    );
    expect(screen.getByRole("button", { name: "Place a fixture" })).toHaveProperty(
      "disabled",
      false,
    );
  });

  it("when a space is deleted, then a confirm step comes first and the space leaves the list", async () => {
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(administrator),
      "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/floors/${floorId}`]: () =>
        jsonResponse(
          calls.some((call) => call.method === "DELETE")
            ? { ...detail, spaces: [doffing, room] }
            : detail,
        ),
      [`DELETE /api/spaces/${corridorBay.id}`]: () => new Response(null, { status: 204 }),
    });
    const { user } = renderApp(floorUrl);
    await user.click(
      await screen.findByRole("button", { name: "Delete space Corridor bay" }, { timeout: 3000 }),
    );
    const confirm = screen.getByRole("group", { name: "Delete Corridor bay?" });
    await user.click(within(confirm).getByRole("button", { name: "Delete space" }));

    await vi.waitFor(() =>
      expect(screen.queryByRole("button", { name: /^Corridor bay/ })).toBeNull(),
    );
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(1);
  });

  it("when an auditor opens the plan, then only the measuring tool is offered", async () => {
    stubFloor(auditor, detail);
    renderApp(floorUrl);

    const tools = await screen.findByRole("group", { name: "Plan tools" });
    expect(
      within(tools)
        .getAllByRole("button")
        .map((button) => button.textContent),
    ).toEqual(["Measure"]);
    expect(screen.queryByLabelText("Floor plan image")).toBeNull();
    expect(screen.getByText("Scale set: 0.025 m per plan unit")).toBeTruthy();
    expect(screen.getByTestId("plan-point-readout").textContent).toBe("Last point: none yet");
  });

  it("when the map has loaded, then it is labelled for assistive technology and shows the plan image", async () => {
    stubFloor(auditor, detail);
    renderApp(floorUrl);

    const map = await screen.findByRole("region", { name: "Floor plan map" });
    const image = map.querySelector("img.leaflet-image-layer");
    expect(image?.getAttribute("src")).toBe(
      `/api/images/${buildFloor().plan?.imageId}?variant=display`,
    );
    expect(
      map.querySelectorAll("[title^='Hand-rub station in Doffing area (No. 4)']"),
    ).toHaveLength(2);
    expect(map.querySelector(".leaflet-control-attribution")).toBeNull();
  });
});
