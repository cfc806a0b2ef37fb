import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  administrator,
  auditor,
  errorResponse,
  jsonResponse,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { buildFloor } from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const sites = () => jsonResponse({ sites: [tamsinGeneral, orchardHill] });

function signedInAs(me: typeof administrator) {
  return {
    "GET /api/auth/me": () => jsonResponse(me),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    "GET /api/sites": sites,
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET /api/sites/${tamsinGeneral.id}/floors`]: () => jsonResponse({ floors: [buildFloor()] }),
    [`GET /api/sites/${tamsinGeneral.id}/schedule`]: () => jsonResponse({ entries: [] }),
  };
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("adding a site", () => {
  it("when a network administrator is home, then Add a site leads to the new-site form", async () => {
    stubApi(signedInAs(administrator));
    const { user, router } = renderApp("/");

    await user.click(await screen.findByRole("link", { name: "Add a site" }));

    expect(await screen.findByRole("heading", { level: 1, name: "Add a site" })).toBeTruthy();
    expect(router.state.location.pathname).toBe("/sites/new");
  });

  it("when an auditor is home, then there is no Add a site", async () => {
    stubApi(signedInAs(auditor));
    renderApp("/");

    await screen.findByRole("heading", { level: 1, name: "My sites" });
    expect(screen.queryByRole("link", { name: "Add a site" })).toBeNull();
  });

  it("when an auditor opens the new-site address, then it is not available", async () => {
    stubApi(signedInAs(auditor));
    renderApp("/sites/new");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
  });

  it("when the form is sent empty, then each field says what is missing and nothing is sent", async () => {
    const { calls } = stubApi(signedInAs(administrator));
    const { user } = renderApp("/sites/new");

    await user.click(await screen.findByRole("button", { name: "Add site" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Name"))).toContain("Required."),
    );
    expect(describedText(screen.getByLabelText("Latitude"))).toContain("Required.");
    expect(describedText(screen.getByLabelText("Time zone"))).toContain(
      "Use a time zone name such as Europe/Dublin or America/New_York.",
    );
    expect(calls.some((call) => call.method === "POST")).toBe(false);
  });

  it("when the form is filled in, then numbers go as numbers and the new site's page opens", async () => {
    const created = { ...tamsinGeneral, id: "5b7d9f11-2a3b-4c4d-8e5f-6a7b8c9d0e1f" };
    const { calls } = stubApi({
      ...signedInAs(administrator),
      "POST /api/sites": () => jsonResponse({ site: created }, 201),
      [`GET /api/sites/${created.id}`]: () => jsonResponse({ site: created }),
      [`GET /api/sites/${created.id}/floors`]: () => jsonResponse({ floors: [] }),
      [`GET /api/sites/${created.id}/schedule`]: () => jsonResponse({ entries: [] }),
    });
    const { user, router } = renderApp("/sites/new");

    const timeZone = await screen.findByLabelText("Time zone");
    const suggestions = document.getElementById(timeZone.getAttribute("list") ?? "");
    expect(suggestions?.querySelector('option[value="Europe/London"]')).not.toBeNull();

    await user.type(screen.getByLabelText("Name"), "Tamsin Bay General Hospital");
    await user.type(screen.getByLabelText("Address"), "1 Harbour Road, Tamsin Bay");
    await user.type(timeZone, "Europe/London");
    await user.type(screen.getByLabelText("Latitude"), "50,1234");
    await user.type(screen.getByLabelText("Longitude"), "-5.4321");
    await user.click(screen.getByRole("button", { name: "Add site" }));

    await vi.waitFor(() => expect(router.state.location.pathname).toBe(`/sites/${created.id}`));
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      name: "Tamsin Bay General Hospital",
      address: "1 Harbour Road, Tamsin Bay",
      timeZone: "Europe/London",
      latitude: 50.1234,
      longitude: -5.4321,
    });
  });
});

describe("editing a site", () => {
  it("when a field is changed with a reason, then only that field and the reason are sent", async () => {
    const renamed = { ...tamsinGeneral, name: "Tamsin Bay General" };
    const { calls } = stubApi({
      ...signedInAs(administrator),
      [`PATCH /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: renamed }),
    });
    const { user, router } = renderApp(`/sites/${tamsinGeneral.id}`);

    await user.click(await screen.findByRole("link", { name: "Edit site" }));
    await screen.findByRole("heading", { level: 1, name: "Edit site" });
    const name = screen.getByLabelText("Name");
    await user.clear(name);
    await user.type(name, "Tamsin Bay General");
    await user.type(screen.getByLabelText("Reason for the change"), "Shorter name on signs.");
    await user.click(screen.getByRole("button", { name: "Save changes" }));

    await vi.waitFor(() =>
      expect(router.state.location.pathname).toBe(`/sites/${tamsinGeneral.id}`),
    );
    expect(calls.find((call) => call.method === "PATCH")?.body).toEqual({
      name: "Tamsin Bay General",
      reason: "Shorter name on signs.",
    });
  });

  it("when nothing was changed, then it says so and sends nothing", async () => {
    const { calls } = stubApi(signedInAs(administrator));
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/edit`);

    await user.click(await screen.findByRole("button", { name: "Save changes" }));

    expect(
      await screen.findByText("Nothing has changed yet. Change a field, then save."),
    ).toBeTruthy();
    expect(calls.some((call) => call.method === "PATCH")).toBe(false);
  });

  it("when an auditor opens the site, then there is no Edit site and no Add a floor", async () => {
    stubApi(signedInAs(auditor));
    renderApp(`/sites/${tamsinGeneral.id}`);

    await screen.findByRole("link", { name: /Ward 4 East/ });
    expect(screen.queryByRole("link", { name: "Edit site" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Add floor" })).toBeNull();
  });
});

describe("floors on the site page", () => {
  it("when the site has floors, then each is listed as building, level and name with a link to its plan", async () => {
    stubApi(signedInAs(auditor));
    renderApp(`/sites/${tamsinGeneral.id}`);

    const floors = await screen.findByRole("region", { name: "Floors" });
    const link = await within(floors).findByRole("link", {
      name: "Main block · Level 4 · Ward 4 East",
    });
    expect(link.getAttribute("href")).toBe(`/sites/${tamsinGeneral.id}/floors/${buildFloor().id}`);
  });

  it("when an administrator adds a floor, then the level goes as a whole number and the form keeps the building", async () => {
    const added = buildFloor({
      id: "1f2e3d4c-5b6a-4789-8a0b-1c2d3e4f5a6b",
      level: -1,
      name: "Plant room",
    });
    const { calls } = stubApi({
      ...signedInAs(administrator),
      [`POST /api/sites/${tamsinGeneral.id}/floors`]: () => jsonResponse({ floor: added }, 201),
    });
    const { user } = renderApp(`/sites/${tamsinGeneral.id}`);

    await user.type(await screen.findByLabelText("Building"), "Main block");
    await user.type(screen.getByLabelText("Level"), "-1");
    await user.type(screen.getByLabelText("Name", { selector: "input[name=name]" }), "Plant room");
    await user.click(screen.getByRole("button", { name: "Add floor" }));

    expect(await screen.findByText("Plant room is added.")).toBeTruthy();
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      building: "Main block",
      level: -1,
      name: "Plant room",
    });
    expect((screen.getByLabelText("Building") as HTMLInputElement).value).toBe("Main block");
  });

  it("when the level is not a whole number, then the form says so", async () => {
    stubApi(signedInAs(administrator));
    const { user } = renderApp(`/sites/${tamsinGeneral.id}`);

    await user.type(await screen.findByLabelText("Building"), "Main block");
    await user.type(screen.getByLabelText("Level"), "2.5");
    await user.type(screen.getByLabelText("Name", { selector: "input[name=name]" }), "Mezzanine");
    await user.click(screen.getByRole("button", { name: "Add floor" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Level"))).toContain("A whole number."),
    );
  });

  it("when the floors cannot be loaded, then the site page still shows and offers a retry", async () => {
    stubApi({
      ...signedInAs(auditor),
      [`GET /api/sites/${tamsinGeneral.id}/floors`]: () =>
        errorResponse(500, "internal", "Something went wrong on our side."),
    });
    renderApp(`/sites/${tamsinGeneral.id}`);

    expect(
      await screen.findByText("We could not load the floors", {}, { timeout: 4000 }),
    ).toBeTruthy();
    expect(screen.getByRole("heading", { level: 1, name: tamsinGeneral.name })).toBeTruthy();
  });
});
