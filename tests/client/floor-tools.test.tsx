import { screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { administrator, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { buildFloorDetail, floorId } from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

// jsdom lays nothing out, so these tests tap with "Use the point at the map centre", the path
// for people without a pointer; the browser tests tap the map itself.
const floorUrl = `/sites/${tamsinGeneral.id}/floors/${floorId}`;

function stubFloor() {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(administrator),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET /api/floors/${floorId}`]: () => jsonResponse(buildFloorDetail()),
  });
}

async function openFloor() {
  stubFloor();
  const app = renderApp(floorUrl);
  await screen.findByRole("region", { name: "Floor plan map" }, { timeout: 3000 });
  return app;
}

const centre = () => screen.getByRole("button", { name: "Use the point at the map centre" });

describe("plan tools", () => {
  it("when corners are added and undone, then Finish shape is offered only from three corners", async () => {
    const { user } = await openFloor();

    await user.click(screen.getByRole("button", { name: "Draw a space" }));
    expect(screen.getByRole("button", { name: "Finish shape" })).toHaveProperty("disabled", true);
    expect(screen.getByRole("button", { name: "Undo corner" })).toHaveProperty("disabled", true);
    expect(screen.getByRole("button", { name: "Set scale" })).toHaveProperty("disabled", true);

    await user.click(centre());
    await user.click(centre());
    await user.click(centre());
    expect(
      screen.getByText("3 corners placed. Tap the next corner, or finish the shape."),
    ).toBeTruthy();
    expect(screen.getByRole("button", { name: "Finish shape" })).toHaveProperty("disabled", false);

    await user.click(screen.getByRole("button", { name: "Undo corner" }));
    expect(screen.getByText("2 corners placed. Tap the next corner.")).toBeTruthy();
    expect(screen.getByRole("button", { name: "Finish shape" })).toHaveProperty("disabled", true);

    await user.click(screen.getByRole("button", { name: "Cancel" }));
    expect(screen.queryByRole("button", { name: "Finish shape" })).toBeNull();
    expect(screen.getByRole("button", { name: "Set scale" })).toHaveProperty("disabled", false);
  });

  it("when a point is tapped, then the readout shows its plan coordinates", async () => {
    const { user } = await openFloor();

    await user.click(screen.getByRole("button", { name: "Draw a space" }));
    await user.click(centre());

    expect(screen.getByTestId("plan-point-readout").textContent).toMatch(
      /^Last point: x -?\d+, y -?\d+$/,
    );
  });

  it("when both scale points are the same spot, then the scale is refused before anything is sent", async () => {
    const { user } = await openFloor();
    const { calls } = stubFloor();

    await user.click(screen.getByRole("button", { name: "Set scale" }));
    expect(screen.getByText("Tap the first point")).toBeTruthy();
    await user.click(centre());
    expect(screen.getByText("Tap the second point")).toBeTruthy();
    await user.click(centre());
    await user.type(screen.getByLabelText("Real distance (metres)"), "5");
    await user.click(screen.getByRole("button", { name: "Save scale" }));

    expect(await screen.findByText("Choose two different points.")).toBeTruthy();
    expect(calls.some((call) => call.method === "PUT")).toBe(false);
  });
});
