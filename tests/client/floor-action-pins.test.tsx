import { screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { buildAction, siteAuditor } from "./support/action-data";
import { jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { buildFloorDetail, buildSpace, floorId } from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const floorUrl = `/sites/${tamsinGeneral.id}/floors/${floorId}`;
const critical = buildAction({
  id: "a1000000-0000-4000-8000-000000000001",
  title: "Dirty chair present and labelled",
  severity: "critical",
  overdue: true,
});
const major = buildAction({
  id: "a1000000-0000-4000-8000-000000000002",
  title: "Hands-free lidded bin",
  severity: "major",
  state: "to_check",
});
// Same spot as the critical one: both must stay tappable.
const minor = buildAction({
  id: "a1000000-0000-4000-8000-000000000003",
  title: "Removal order displayed",
  severity: "minor",
  position: critical.position,
});

function stubFloorWithActions() {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(siteAuditor),
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET /api/floors/${floorId}`]: () =>
      jsonResponse(buildFloorDetail({ spaces: [buildSpace()] })),
    [`GET /api/sites/${tamsinGeneral.id}/actions`]: () =>
      jsonResponse({ actions: [critical, major, minor] }),
    [`GET /api/actions/${critical.id}`]: () =>
      jsonResponse({ error: { code: "not_found", message: "Gone." } }, 404),
  });
}

async function pinElements(): Promise<HTMLElement[]> {
  const map = await screen.findByRole("region", { name: "Floor plan map" }, { timeout: 3000 });
  await waitFor(() => expect(map.querySelectorAll("[data-action-id]").length).toBe(3));
  return [...map.querySelectorAll<HTMLElement>("[data-action-id]")];
}

describe("unfinished actions on the floor plan", () => {
  it("when the floor has unfinished actions, then each is a pin with its severity symbol, marks and title", async () => {
    const { calls } = stubFloorWithActions();
    renderApp(floorUrl);

    const pins = await pinElements();
    const byId = new Map(pins.map((pin) => [pin.dataset.actionId, pin]));
    expect(byId.get(critical.id)?.dataset.severity).toBe("critical");
    expect(byId.get(critical.id)?.classList.contains("is-overdue")).toBe(true);
    expect(byId.get(critical.id)?.querySelector(".lintel-action-pin-clock")).not.toBeNull();
    expect(byId.get(major.id)?.dataset.severity).toBe("major");
    expect(
      byId.get(major.id)?.querySelector('.lintel-action-pin-check[data-mark="to_check"]'),
    ).not.toBeNull();
    expect(byId.get(minor.id)?.dataset.severity).toBe("minor");

    const marker = byId.get(critical.id)!.closest(".leaflet-marker-icon")!;
    expect(marker.getAttribute("title")).toBe(
      "Critical, overdue: Dirty chair present and labelled — Doffing area 4",
    );
    expect(byId.get(major.id)!.closest(".leaflet-marker-icon")!.getAttribute("title")).toBe(
      "Major, fix to check: Hands-free lidded bin — Doffing area 4",
    );
    const asked = calls.find((call) => call.path === `/api/sites/${tamsinGeneral.id}/actions`);
    expect(asked).toBeTruthy();
    expect(screen.getByRole("heading", { name: "Corrective actions not done yet" })).toBeTruthy();
  });

  it("when two actions share a spot, then their pins are drawn apart", async () => {
    stubFloorWithActions();
    renderApp(floorUrl);

    const pins = await pinElements();
    const icon = (id: string) =>
      pins
        .find((pin) => pin.dataset.actionId === id)!
        .closest<HTMLElement>(".leaflet-marker-icon")!;
    const a = icon(critical.id).style;
    const b = icon(minor.id).style;
    expect(`${a.marginLeft},${a.marginTop}`).not.toBe(`${b.marginLeft},${b.marginTop}`);
  });

  it("when the filter keeps only overdue actions, then only their pins stay", async () => {
    stubFloorWithActions();
    const { user } = renderApp(floorUrl);

    await pinElements();
    await user.click(screen.getByRole("checkbox", { name: "Overdue actions only" }));

    const map = screen.getByRole("region", { name: "Floor plan map" });
    await waitFor(() =>
      expect(
        [...map.querySelectorAll<HTMLElement>("[data-action-id]")].map(
          (pin) => pin.dataset.actionId,
        ),
      ).toEqual([critical.id]),
    );
  });

  it("when minor actions are hidden, then their pins leave the map", async () => {
    stubFloorWithActions();
    const { user } = renderApp(floorUrl);

    await pinElements();
    await user.click(screen.getByRole("checkbox", { name: "Minor actions" }));

    const map = screen.getByRole("region", { name: "Floor plan map" });
    await waitFor(() => expect(map.querySelectorAll("[data-action-id]").length).toBe(2));
    expect(map.querySelector(`[data-action-id="${minor.id}"]`)).toBeNull();
  });

  it("when a pin is clicked, then its action page opens", async () => {
    stubFloorWithActions();
    const { router, user } = renderApp(floorUrl);

    const pins = await pinElements();
    const pin = pins.find((element) => element.dataset.actionId === critical.id)!;
    await user.click(pin.closest<HTMLElement>(".leaflet-marker-icon")!);

    await waitFor(() => expect(router.state.location.pathname).toBe(`/actions/${critical.id}`));
  });
});
