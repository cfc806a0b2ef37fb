import { render, screen, within } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { MemoryRouter } from "react-router-dom";
import { describe, expect, it } from "vitest";

import { PeopleTable } from "@/features/people/components/people-table";

import { buildPerson, manageableSites, orchardHill, tamsinGeneral } from "./support/api-stub";

const people = [
  buildPerson(),
  buildPerson({
    id: "6b1c8a52-9d0e-4f1a-8b23-4d5e6f708192",
    name: "Tomasz Wieczorek",
    email: "t.wieczorek@example.org",
    status: "invited",
    invitationExpiresAt: "2026-12-01T12:00:00.000Z",
    grants: [
      {
        id: "7c2d9b63-0e1f-4a2b-9c34-5e6f708192a3",
        role: "facilities_lead",
        siteId: orchardHill.id,
        siteName: orchardHill.name,
      },
    ],
  }),
  buildPerson({
    id: "8d3e0c74-1f2a-4b3c-8d45-6f708192a3b4",
    name: "Aoife Brennan",
    email: "aoife.brennan@example.org",
    status: "deactivated",
    deactivatedAt: "2026-02-03T10:00:00.000Z",
    grants: [
      {
        id: "9e4f1d85-2a3b-4c4d-9e56-708192a3b4c5",
        role: "committee_member",
        siteId: null,
        siteName: null,
      },
    ],
  }),
];

function renderTable() {
  const user = userEvent.setup();
  render(
    <MemoryRouter>
      <PeopleTable people={people} manageableSites={manageableSites} />
    </MemoryRouter>,
  );
  return { user };
}

function shownNames(): string[] {
  const table = screen.queryByRole("table", { name: "People" });
  if (!table) return [];
  return within(table)
    .getAllByRole("row")
    .slice(1)
    .map((row) => within(row).getByRole("link").textContent ?? "");
}

describe("PeopleTable", () => {
  it("when it opens, then everyone is listed by name with e-mail, roles and status", () => {
    renderTable();

    expect(shownNames()).toEqual(["Aoife Brennan", "Priya Nair", "Tomasz Wieczorek"]);
    const priya = screen.getByRole("link", { name: "Priya Nair" });
    expect(priya.getAttribute("href")).toBe(`/admin/people/${people[0]!.id}`);
    const row = priya.closest("tr")!;
    expect(row.textContent).toContain("priya.nair@example.org");
    expect(row.textContent).toContain(`Auditor · ${tamsinGeneral.name}`);
    expect(row.textContent).toContain("Active");
    expect(
      screen.getByRole("link", { name: "Aoife Brennan" }).closest("tr")!.textContent,
    ).toContain("Committee member · all sites");
  });

  it("when search text is typed, then only people whose name or e-mail contains it remain", async () => {
    const { user } = renderTable();

    await user.type(screen.getByLabelText("Search people"), "WIECZ");
    expect(shownNames()).toEqual(["Tomasz Wieczorek"]);

    await user.clear(screen.getByLabelText("Search people"));
    await user.type(screen.getByLabelText("Search people"), "aoife.brennan@");
    expect(shownNames()).toEqual(["Aoife Brennan"]);
    expect(screen.getByText("Showing 1 of 3 people")).toBeTruthy();
  });

  it("when a status is chosen, then only people with that status remain", async () => {
    const { user } = renderTable();

    await user.selectOptions(screen.getByLabelText("Status"), "Invited");

    expect(shownNames()).toEqual(["Tomasz Wieczorek"]);
  });

  it("when a site is chosen, then people with a role there or across all sites remain", async () => {
    const { user } = renderTable();

    await user.selectOptions(screen.getByLabelText("Site"), orchardHill.name);

    expect(shownNames()).toEqual(["Aoife Brennan", "Tomasz Wieczorek"]);
  });

  it("when a role and a site are chosen, then one role must match both", async () => {
    const { user } = renderTable();

    await user.selectOptions(screen.getByLabelText("Role"), "Auditor");
    expect(shownNames()).toEqual(["Priya Nair"]);

    await user.selectOptions(screen.getByLabelText("Site"), orchardHill.name);
    expect(shownNames()).toEqual([]);
    expect(screen.getByText("No one matches these filters.")).toBeTruthy();

    await user.click(screen.getByRole("button", { name: "Clear filters" }));
    expect(shownNames()).toHaveLength(3);
  });
});
