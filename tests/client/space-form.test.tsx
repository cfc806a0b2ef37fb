import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { SpaceForm } from "@/features/floor-plans/components/space-form";
import { createQueryClient } from "@/lib/query-client";

import { errorResponse, jsonResponse, stubApi } from "./support/api-stub";
import { buildSpace, floorId, suite4 } from "./support/floor-data";

afterEach(() => {
  vi.unstubAllGlobals();
});

const polygon: [number, number][] = [
  [820, 70],
  [1130, 70],
  [1130, 380],
  [820, 380],
];

function renderForm() {
  const onSaved = vi.fn();
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <SpaceForm
        floorId={floorId}
        suites={[suite4]}
        polygon={polygon}
        planAreaM2={60.06}
        onSaved={onSaved}
        onKeepDrawing={vi.fn()}
        onCancel={vi.fn()}
      />
    </QueryClientProvider>,
  );
  return { user, onSaved };
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("SpaceForm", () => {
  it("when saved without a zone type or name, then both are asked for and nothing is sent", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Zone type"))).toContain("Choose a zone type."),
    );
    expect(describedText(screen.getByLabelText("Name"))).toContain("Required.");
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the suite field shows, then a hint says what a suite is", () => {
    stubApi({});
    renderForm();

    expect(describedText(screen.getByLabelText("Suite"))).toContain(
      "A suite groups the spaces that serve one isolation patient",
    );
  });

  it("when a new suite is chosen without a name, then the suite name is asked for", async () => {
    stubApi({});
    const { user } = renderForm();

    await user.selectOptions(screen.getByLabelText("Suite"), "New suite…");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Suite name"))).toContain(
        "Give the new suite a name.",
      ),
    );
  });

  it("when a doffing area is saved in a new suite, then the suite is made first and the space joins it", async () => {
    const newSuite = { id: "c3d4e5f6-a7b8-4c9d-8e0f-1a2b3c4d5e6f", floorId, name: "Suite 5" };
    const saved = buildSpace({ suiteId: newSuite.id });
    const { calls } = stubApi({
      [`POST /api/floors/${floorId}/suites`]: () => jsonResponse({ suite: newSuite }, 201),
      [`POST /api/floors/${floorId}/spaces`]: () => jsonResponse({ space: saved }, 201),
    });
    const { user, onSaved } = renderForm();

    expect(screen.queryByLabelText("Construction class")).toBeNull();
    await user.selectOptions(screen.getByLabelText("Zone type"), "Doffing area");
    await user.type(screen.getByLabelText("Name"), "Doffing area");
    await user.type(screen.getByLabelText("Number"), "5");
    await user.selectOptions(screen.getByLabelText("Suite"), "New suite…");
    await user.type(screen.getByLabelText("Suite name"), "Suite 5");
    await user.type(screen.getByLabelText("Floor area (m²)"), "6,5");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalledWith(saved));
    expect(calls.map((call) => call.path)).toEqual([
      `/api/floors/${floorId}/suites`,
      `/api/floors/${floorId}/spaces`,
    ]);
    expect(calls[0]?.body).toEqual({ name: "Suite 5" });
    expect(calls[1]?.body).toEqual({
      zoneType: "doffing_area",
      name: "Doffing area",
      number: "5",
      polygon,
      suiteId: newSuite.id,
      constructionClass: null,
      volumeM3: null,
      floorAreaM2: 6.5,
      ceilingHeightM: null,
    });
  });

  it("when an isolation room is saved in an existing suite, then its construction class goes with it", async () => {
    const { calls } = stubApi({
      [`POST /api/floors/${floorId}/spaces`]: () =>
        jsonResponse({ space: buildSpace({ zoneType: "isolation_room" }) }, 201),
    });
    const { user, onSaved } = renderForm();

    await user.selectOptions(screen.getByLabelText("Zone type"), "Isolation room");
    await user.type(screen.getByLabelText("Name"), "Room");
    await user.selectOptions(screen.getByLabelText("Suite"), suite4.name);
    await user.selectOptions(screen.getByLabelText("Construction class"), "New or renovated");
    await user.type(screen.getByLabelText("Volume (m³)"), "42");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(calls[0]?.body).toMatchObject({
      zoneType: "isolation_room",
      suiteId: suite4.id,
      constructionClass: "new_or_renovated",
      volumeM3: 42,
      number: null,
    });
  });

  it("when an isolation room is saved without a construction class, then the class is asked for and nothing is sent; choosing one shows its minimum", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.selectOptions(screen.getByLabelText("Zone type"), "Isolation room");
    await user.type(screen.getByLabelText("Name"), "Room");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Construction class"))).toContain(
        "Choose a construction class: it decides the air-change minimum.",
      ),
    );
    expect(fetchStub).not.toHaveBeenCalled();

    await user.selectOptions(screen.getByLabelText("Construction class"), "Existing");
    expect(describedText(screen.getByLabelText("Construction class"))).toContain(
      "Air changes per hour: ≥ 6 (existing rooms only; CDC: raise to 12 where feasible).",
    );
  });

  it("when a measurement is not a number, then it says so beside the field", async () => {
    stubApi({});
    const { user } = renderForm();

    await user.type(screen.getByLabelText("Ceiling height (m)"), "tall");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Ceiling height (m)"))).toContain(
        "Must be a number.",
      ),
    );
  });

  it("when the server refuses the name, then its message appears beside the name", async () => {
    stubApi({
      [`POST /api/floors/${floorId}/spaces`]: () =>
        errorResponse(400, "validation_failed", "Check the highlighted fields.", {
          name: "Another space on this floor has this name.",
        }),
    });
    const { user, onSaved } = renderForm();

    await user.selectOptions(screen.getByLabelText("Zone type"), "Donning zone");
    await user.type(screen.getByLabelText("Name"), "Donning zone");
    await user.click(screen.getByRole("button", { name: "Save space" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Name"))).toContain(
        "Another space on this floor has this name.",
      ),
    );
    expect(onSaved).not.toHaveBeenCalled();
  });

  it("when the plan knows the outline's area, then the floor area field shows it as a hint", () => {
    renderForm();
    expect(describedText(screen.getByLabelText("Floor area (m²)"))).toContain(
      "From the plan: 60.06 m² (646.5 ft²).",
    );
  });
});
