import type { RetiredPlaces, RetirementResult } from "@shared/schemas/retirement";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { buildActionDetail } from "./support/action-data";
import {
  administrator,
  auditor,
  errorResponse,
  jsonResponse,
  type StubRequest,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { buildDetail, isolationItems, isolationSpaceId } from "./support/audit-data";
import { buildFloorDetail, buildSpace, floorId } from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const floorUrl = `/sites/${tamsinGeneral.id}/floors/${floorId}`;
const siteUrl = `/sites/${tamsinGeneral.id}`;
const space = buildSpace();
const title = `${space.name} (No. ${space.number})`;

/** Lists nobody in these tests is about answer empty, so each page renders whole. */
function emptyLists({ method, path }: StubRequest) {
  if (method !== "GET") return undefined;
  if (path.endsWith("/actions")) return jsonResponse({ actions: [] });
  if (path.endsWith("/schedule")) return jsonResponse({ schedule: [] });
  if (path.endsWith("/floors")) return jsonResponse({ floors: [] });
  if (path === "/api/app-config") return jsonResponse({ demoMailbox: false });
  return undefined;
}

function result(overrides: Partial<RetirementResult>): RetirementResult {
  return {
    kind: "space",
    id: space.id,
    name: space.name,
    retiredAt: "2026-04-01T10:00:00.000Z",
    floors: 0,
    spaces: 1,
    actions: 0,
    ...overrides,
  };
}

describe("retiring and deleting a space on the floor page", () => {
  it("when an administrator retires a space, then the confirmation says in words what happens and the space is retired", async () => {
    const { calls } = stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(administrator),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
        [`GET /api/floors/${floorId}`]: () =>
          jsonResponse(
            buildFloorDetail({
              spaces: calls.some((call) => call.method === "POST") ? [] : [space],
              fixtures: [],
            }),
          ),
        [`POST /api/spaces/${space.id}/retire`]: () =>
          jsonResponse({ retirement: result({ actions: 2 }) }),
      },
      emptyLists,
    );
    const { user } = renderApp(floorUrl);

    await user.click(
      await screen.findByRole("button", { name: `Retire space ${title}` }, { timeout: 3000 }),
    );
    const confirm = screen.getByRole("group", { name: `Retire ${title}?` });
    expect(confirm.textContent).toContain(
      "leaves the plan, the due list, QR sheets and new audits",
    );
    expect(confirm.textContent).toContain("kept in its history");
    expect(confirm.textContent).toContain("“space retired”");
    expect(confirm.textContent).toContain("do not count as fixed");
    expect(confirm.textContent).toContain("can restore it");
    await user.click(within(confirm).getByRole("button", { name: "Retire space" }));

    await vi.waitFor(() =>
      expect(calls.filter((call) => call.method === "POST")).toEqual([
        { method: "POST", path: `/api/spaces/${space.id}/retire`, body: {} },
      ]),
    );
    await vi.waitFor(() =>
      expect(screen.queryByRole("button", { name: /^Retire space/ })).toBeNull(),
    );
  });

  it("when deleting a space is refused because it has history, then the reason is shown and Retire instead opens the retirement", async () => {
    stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(administrator),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
        [`GET /api/floors/${floorId}`]: () =>
          jsonResponse(buildFloorDetail({ spaces: [space], fixtures: [] })),
        [`DELETE /api/spaces/${space.id}`]: () =>
          errorResponse(
            409,
            "conflict",
            `${space.name} has history (3 audits), so it cannot be deleted. Retire it instead: it leaves the map and new audits, and its history is kept.`,
          ),
      },
      emptyLists,
    );
    const { user } = renderApp(floorUrl);

    await user.click(
      await screen.findByRole("button", { name: `Delete space ${title}` }, { timeout: 3000 }),
    );
    const confirm = screen.getByRole("group", { name: `Delete ${title}?` });
    expect(confirm.textContent).toContain("Only a space that was never audited");
    await user.click(within(confirm).getByRole("button", { name: "Delete space" }));

    expect((await screen.findByRole("alert")).textContent).toContain("has history (3 audits)");
    await user.click(screen.getByRole("button", { name: "Retire instead" }));
    expect(screen.getByRole("group", { name: `Retire ${title}?` })).toBeTruthy();
  });

  it("when an auditor opens the floor, then no retire or delete buttons are offered", async () => {
    stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(auditor),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
        [`GET /api/floors/${floorId}`]: () =>
          jsonResponse(buildFloorDetail({ spaces: [space], fixtures: [] })),
      },
      emptyLists,
    );
    renderApp(floorUrl);

    expect(
      await screen.findByRole("link", { name: "Audit history" }, { timeout: 3000 }),
    ).toBeTruthy();
    expect(screen.queryByRole("button", { name: /^Retire/ })).toBeNull();
    expect(screen.queryByRole("button", { name: /^Delete/ })).toBeNull();
  });
});

describe("retired floors and spaces on the site page", () => {
  const retired: RetiredPlaces = {
    floors: [
      {
        id: "7a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d",
        name: "Ward 2 West",
        building: "Main block",
        level: 2,
        retiredAt: "2026-03-30T08:00:00.000Z",
        retiredByName: "Morgan Adebayo",
      },
    ],
    spaces: [
      {
        id: space.id,
        name: "Doffing area 4",
        zoneType: "doffing_area",
        floorId,
        floorName: "Ward 4 East",
        retiredAt: "2026-03-31T08:00:00.000Z",
        retiredByName: "Morgan Adebayo",
        floorRetired: false,
      },
      {
        id: "8b2c3d4e-5f60-4b7c-9d8e-0f1a2b3c4d5e",
        name: "Anteroom 2",
        zoneType: "anteroom",
        floorId: "7a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d",
        floorName: "Ward 2 West",
        retiredAt: "2026-03-30T08:00:00.000Z",
        retiredByName: "Morgan Adebayo",
        floorRetired: true,
      },
    ],
  };

  it("when an administrator restores a retired space, then it is sent and what came back is said in words, even after the space leaves the list", async () => {
    const { calls } = stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(administrator),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
        // Once restored, the space leaves the list: the row that was tapped goes away.
        [`GET /api/sites/${tamsinGeneral.id}/retired`]: () =>
          jsonResponse(
            calls.some((call) => call.method === "POST")
              ? { ...retired, spaces: retired.spaces.filter((s) => s.id !== space.id) }
              : retired,
          ),
        [`POST /api/spaces/${space.id}/restore`]: () =>
          jsonResponse({
            retirement: result({ name: "Doffing area 4", retiredAt: null, actions: 1 }),
          }),
      },
      emptyLists,
    );
    const { user } = renderApp(siteUrl);

    const section = await screen.findByRole(
      "region",
      { name: "Retired floors and spaces" },
      { timeout: 3000 },
    );
    await within(section).findByRole("button", { name: "Restore floor Ward 2 West" });
    expect(within(section).getByRole("button", { name: "Restore floor Ward 2 West" })).toBeTruthy();
    // A space retired with its floor comes back with the floor, not on its own.
    expect(within(section).queryByRole("button", { name: "Restore space Anteroom 2" })).toBeNull();
    expect(within(section).getByText("Comes back with its floor")).toBeTruthy();
    expect(
      within(section)
        .getByRole("link", { name: "Audit history of Doffing area 4" })
        .getAttribute("href"),
    ).toBe(`/spaces/${space.id}/audits`);

    await user.click(within(section).getByRole("button", { name: "Restore space Doffing area 4" }));
    expect((await within(section).findByRole("status")).textContent).toBe(
      "Doffing area 4 is back. 1 corrective action made Done by the retirement is back in the work list.",
    );
    expect(calls.filter((call) => call.method === "POST")).toEqual([
      { method: "POST", path: `/api/spaces/${space.id}/restore`, body: {} },
    ]);
  });

  it("when an auditor opens the site, then the retired section is not shown or asked for", async () => {
    const { calls } = stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(auditor),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      },
      emptyLists,
    );
    renderApp(siteUrl);
    expect(await screen.findByRole("heading", { level: 1, name: tamsinGeneral.name })).toBeTruthy();
    expect(screen.queryByRole("region", { name: "Retired floors and spaces" })).toBeNull();
    expect(calls.some((call) => call.path.endsWith("/retired"))).toBe(false);
  });
});

describe("retiring a site", () => {
  it("when a network-wide administrator retires the site, then the confirmation explains it and the home page says what was retired", async () => {
    const { calls } = stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(administrator),
        [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
        [`GET /api/sites/${tamsinGeneral.id}/due-policy`]: () =>
          jsonResponse({
            policy: {
              critical: { amount: 24, unit: "hours" },
              major: { amount: 7, unit: "days" },
              minor: { amount: 30, unit: "days" },
            },
            isDefault: true,
          }),
        // The edit screen also shows the site's room-pressure alarm settings.
        [`GET /api/sites/${tamsinGeneral.id}/pressure-settings`]: () =>
          jsonResponse({
            graceSeconds: null,
            doorGraceSeconds: null,
            actionLimitMinutes: null,
            effective: { graceSeconds: 60, doorGraceSeconds: 300, actionLimitMinutes: 15 },
            recipients: "default",
            notified: [],
            people: [],
          }),
        [`POST /api/sites/${tamsinGeneral.id}/retire`]: () =>
          jsonResponse({
            retirement: result({
              kind: "site",
              id: tamsinGeneral.id,
              name: tamsinGeneral.name,
              floors: 2,
              spaces: 9,
            }),
          }),
        "GET /api/sites": () => jsonResponse({ sites: [] }),
        "GET /api/retired-sites": () =>
          jsonResponse({
            sites: [
              {
                id: tamsinGeneral.id,
                name: tamsinGeneral.name,
                retiredAt: "2026-04-01T10:00:00.000Z",
                retiredByName: "Morgan Adebayo",
              },
            ],
          }),
      },
      emptyLists,
    );
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/edit`);

    await user.click(await screen.findByRole("button", { name: "Retire site" }, { timeout: 3000 }));
    const confirm = screen.getByRole("group", { name: `Retire ${tamsinGeneral.name}?` });
    expect(confirm.textContent).toContain("leaves everyone's list of sites");
    expect(confirm.textContent).toContain("kept in history, exports and the committee's figures");
    await user.click(within(confirm).getByRole("button", { name: "Retire site" }));

    expect((await screen.findByRole("status", {}, { timeout: 3000 })).textContent).toBe(
      `${tamsinGeneral.name} is retired with 2 floors and 9 spaces.`,
    );
    const retiredSites = await screen.findByRole("region", { name: "Retired sites" });
    expect(
      within(retiredSites).getByRole("button", { name: `Restore site ${tamsinGeneral.name}` }),
    ).toBeTruthy();
    expect(calls.filter((call) => call.method === "POST")).toHaveLength(1);
  });
});

describe("a retired space's history and actions", () => {
  it("when the audit history of a retired space is opened, then it is labelled Retired and offers no new audit", async () => {
    const detail = buildDetail("4c5d6e7f-8091-4a2b-8c3d-4e5f60718293", isolationItems(), {
      spaceId: isolationSpaceId,
      spaceName: "Isolation room 1",
      zoneType: "isolation_room",
    });
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/spaces/${isolationSpaceId}/audits`]: () =>
        jsonResponse({
          audits: [
            {
              ...detail.audit,
              status: "submitted",
              submittedAt: "2026-03-02T09:40:00.000Z",
              verdict: "all_clear",
              score: 1,
              spaceRetiredAt: "2026-03-20T09:00:00.000Z",
            },
          ],
        }),
    });
    renderApp(`/spaces/${isolationSpaceId}/audits`);

    expect(await screen.findByRole("heading", { level: 1, name: "Isolation room 1" })).toBeTruthy();
    expect(screen.getByText("Retired")).toBeTruthy();
    expect(screen.getByText(/This space was retired on/)).toBeTruthy();
    expect(screen.queryByRole("link", { name: "Start audit" })).toBeNull();
    expect(within(screen.getByRole("list", { name: "Audits" })).getAllByRole("link")).toHaveLength(
      1,
    );
  });

  it("when an action was closed by its space's retirement, then the page says so in words and not as a fix", async () => {
    const detail = buildActionDetail({
      state: "done",
      closedAt: "2026-03-31T08:00:00.000Z",
      closeReason: "space_retired",
      spaceRetiredAt: "2026-03-31T08:00:00.000Z",
    });
    stubApi(
      {
        "GET /api/auth/me": () => jsonResponse(auditor),
        [`GET /api/actions/${detail.action.id}`]: () => jsonResponse(detail),
      },
      emptyLists,
    );
    renderApp(`/actions/${detail.action.id}`);

    expect(
      await screen.findByText("Space retired (not a fix)", {}, { timeout: 3000 }),
    ).toBeTruthy();
    expect(screen.queryByText("Days to close")).toBeNull();
    expect(screen.getByText(/Doffing area 4 was retired on/)).toBeTruthy();
  });
});
