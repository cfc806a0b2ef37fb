import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import type { CommitteePressureResponse } from "@shared/schemas/committee-pressure";

import { committeeMember } from "./support/action-data";
import { jsonResponse, orchardHill, stubApi, tamsinGeneral } from "./support/api-stub";
import {
  buildComparison,
  buildDrillDown,
  buildObservationFigures,
  buildTrends,
} from "./support/committee-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const period = "from=2026-02&to=2026-03";

// Exact 95% limits for 3 events (0.6187, 8.7673) over 250 minutes: × 240 → 148.5 and 2,104.1.
function figures(): CommitteePressureResponse {
  const room = (spaceId: string, spaceName: string, hours: number, out: number, n: number) => ({
    spaceId,
    spaceName,
    monitoredHours: hours,
    hoursOutOfRange: out,
    excursions: n,
  });
  const one = "5a1d6f0e-1b2c-4d3e-8f4a-5b6c7d8e9f01";
  const two = "5a1d6f0e-1b2c-4d3e-8f4a-5b6c7d8e9f02";
  return {
    from: "2026-02",
    to: "2026-03",
    zoneType: null,
    confidence: 0.95,
    per: 1000,
    sites: [
      { siteId: orchardHill.id, siteName: orchardHill.name, monitors: 0, months: [] },
      {
        siteId: tamsinGeneral.id,
        siteName: tamsinGeneral.name,
        monitors: 2,
        months: [
          {
            month: "2026-02",
            excursions: 3,
            monitoredHours: 250 / 60,
            hoursOutOfRange: 2.05,
            rate: { rate: 720, lower: 0.6186721228956014 * 240, upper: 8.767273069742323 * 240 },
            rooms: [
              room(one, "Isolation room 4", 2.5, 1.5, 2),
              room(two, "Isolation room 5", 50 / 60, 0.55, 1),
            ],
          },
          {
            month: "2026-03",
            excursions: 0,
            monitoredHours: 0,
            hoursOutOfRange: 0,
            rate: null,
            rooms: [room(one, "Isolation room 4", 0, 0, 0), room(two, "Isolation room 5", 0, 0, 0)],
          },
        ],
      },
    ],
  };
}

function stubCommittee() {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(committeeMember),
    "GET /api/committee/comparison": () => jsonResponse(buildComparison()),
    "GET /api/committee/trends": () => jsonResponse(buildTrends()),
    "GET /api/committee/observations": () => jsonResponse(buildObservationFigures()),
    "GET /api/committee/pressure": () => jsonResponse(figures()),
    [`GET /api/committee/sites/${tamsinGeneral.id}`]: () => jsonResponse(buildDrillDown()),
  });
}

describe("the committee's room-pressure figures", () => {
  it("when the view opens, then each site's months show the rate per 1,000 monitored hours with its interval in words, and a site without monitors says so", async () => {
    const { user } = (stubCommittee(), renderApp(`/committee?${period}`));

    const section = await screen.findByRole("region", { name: "Room pressure" }, { timeout: 5000 });
    expect(section.textContent).toContain("the grace time counts");
    expect(
      within(section).getByRole("heading", { name: `${orchardHill.name}: no monitors` }),
    ).toBeTruthy();
    const months = within(section).getByRole("table", { name: "Excursions month by month" });
    const february = within(months).getByRole("row", { name: /Feb 2026/ });
    expect(february.textContent).toContain("720.0 (148.5 to 2,104.1)");
    expect(february.textContent).toContain("3 in 4.2 h");
    const march = within(months).getByRole("row", { name: /Mar 2026/ });
    expect(within(march).getByText("Not monitored")).toBeTruthy();

    // The rooms open on the period's last month; choosing February shows its hours.
    expect(
      within(section).getByRole("table", { name: "Hours out of range by room, March 2026" }),
    ).toBeTruthy();
    await user.selectOptions(within(section).getByLabelText("Rooms in the month of"), "2026-02");
    const rooms = within(section).getByRole("table", {
      name: "Hours out of range by room, February 2026",
    });
    const four = within(rooms).getByRole("row", { name: /Isolation room 4/ });
    expect(within(four).getByText("1.5")).toBeTruthy();
    expect(within(four).getByText("2.5")).toBeTruthy();
  });

  it("when a site's committee page opens, then only that site's figures show, without its name repeated", async () => {
    stubCommittee();
    renderApp(`/committee/sites/${tamsinGeneral.id}?${period}`);

    const section = await screen.findByRole("region", { name: "Room pressure" }, { timeout: 5000 });
    expect(within(section).getByRole("table", { name: "Excursions month by month" })).toBeTruthy();
    expect(section.textContent).not.toContain(orchardHill.name);
    expect(within(section).queryByRole("heading", { level: 3 })).toBeNull();
  });
});
