import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { observationsExportPath } from "@/features/committee/api/download-observations";

import { committeeMember } from "./support/action-data";
import {
  errorResponse,
  jsonResponse,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
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

const period = "from=2025-05&to=2026-04";

function stubCommittee(figures = buildObservationFigures()) {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(committeeMember),
    "GET /api/committee/comparison": () => jsonResponse(buildComparison()),
    "GET /api/committee/trends": () => jsonResponse(buildTrends()),
    "GET /api/committee/observations": () => jsonResponse(figures),
    [`GET /api/committee/sites/${tamsinGeneral.id}`]: () => jsonResponse(buildDrillDown()),
  });
}

function row(table: HTMLElement, name: RegExp): HTMLElement {
  return within(table).getByRole("row", { name });
}

describe("the committee's observation figures", () => {
  it("when the view opens, then the network's step breach rates show with their 95% intervals, the most error-prone first", async () => {
    const { fetchStub } = stubCommittee();
    renderApp(`/committee?${period}&zoneType=doffing_area`);

    const section = await screen.findByRole("region", { name: "Observed putting-on and removal" });
    expect(
      await within(section).findByRole("heading", { name: "All sites together: 40 observations" }),
    ).toBeTruthy();
    const ranked = within(section).getByRole("table", { name: "The five most error-prone steps" });
    // Wilson score interval, z = 1.96: 12 of 40 → 18.1% – 45.4%; 8 of 40 → 10.5% – 34.8%.
    const gloves = row(ranked, /Remove gloves/);
    expect(within(gloves).getByText("30.0%")).toBeTruthy();
    expect(within(gloves).getByText("18.1% – 45.4%")).toBeTruthy();
    expect(within(gloves).getByText("n = 40")).toBeTruthy();
    expect(within(row(ranked, /Remove gown/)).getByText("10.5% – 34.8%")).toBeTruthy();
    expect(within(gloves).getByText("Removing PPE, example 1 (gloves first)")).toBeTruthy();
    expect(
      within(section).getByRole("table", {
        name: "Breaches per step: Removing PPE, example 1 (gloves first)",
      }),
    ).toBeTruthy();
    expect(section.textContent).toContain(
      "They cover every donning zone, doffing area and anteroom, whatever zone type is chosen.",
    );
    // The figures cover months only: the zone type of the readiness view is not sent.
    const asked = fetchStub.mock.calls
      .map(([input]) => new URL(String(input), "http://localhost"))
      .filter((url) => url.pathname === "/api/committee/observations");
    expect(asked.map((url) => url.search)).toEqual(["?from=2025-05&to=2026-04"]);
  });

  it("when hand hygiene is read, then the share of observations with every moment has its interval and the moment-level rate stands beside it without one, saying why", async () => {
    stubCommittee();
    renderApp(`/committee?${period}`);

    const table = await screen.findByRole("table", { name: "Hand hygiene and coaching" });
    // 31 of 40 → 77.5%, 62.5% – 87.7%.
    const every = row(table, /every hand-hygiene moment performed/);
    expect(within(every).getByText("77.5%")).toBeTruthy();
    expect(within(every).getByText("62.5% – 87.7%")).toBeTruthy();
    const moments = row(table, /Moments performed, counted one by one/);
    expect(within(moments).getByText("91.7%")).toBeTruthy();
    expect(moments.textContent).toContain(
      "No interval: the moments of one observation are not independent.",
    );
    expect(moments.textContent).not.toMatch(/–/);
    // 9 of 12 coached staff clean next time: fewer than 30, so flagged.
    const coaching = row(table, /Coached staff whose next observation was clean/);
    expect(within(coaching).getByText("75.0%")).toBeTruthy();
    expect(within(coaching).getByText("n = 12, small sample")).toBeTruthy();
  });

  it("when a site observed too few staff members is chosen, then its figures are not shown and the page says why", async () => {
    const { user } = (stubCommittee(), renderApp(`/committee?${period}`));

    const section = await screen.findByRole("region", { name: "Observed putting-on and removal" });
    await user.selectOptions(
      await within(section).findByLabelText("Show the figures of"),
      orchardHill.name,
    );

    expect(
      within(section).getByRole("heading", { name: `${orchardHill.name}: 4 observations` }),
    ).toBeTruthy();
    expect(section.textContent).toContain("fewer than 5 staff members observed in this period");
    expect(within(section).queryByRole("table")).toBeNull();
    expect(section.textContent).not.toMatch(/\d+\.\d%/);
  });

  it("when one step or the coaching figure describes too few staff members, then that cell says why and shows no rate", async () => {
    const figures = buildObservationFigures();
    const withheld = { n: 0, successes: 0, rate: null, interval: null, smallSample: false };
    figures.network = {
      ...figures.network,
      steps: figures.network.steps.map((step, index) =>
        index === 2 ? { ...step, breached: withheld, suppressed: true } : step,
      ),
      cleanAfterCoaching: { ...withheld, suppressed: true },
    };
    stubCommittee(figures);
    renderApp(`/committee?${period}`);

    const steps = await screen.findByRole("table", {
      name: "Breaches per step: Removing PPE, example 1 (gloves first)",
    });
    const hidden = row(steps, /Perform hand hygiene before leaving/);
    expect(hidden.textContent).toContain("Not shown: fewer than 5 staff members observed");
    expect(hidden.textContent).not.toMatch(/%/);
    expect(within(row(steps, /Remove gloves/)).getByText("30.0%")).toBeTruthy();
    const coaching = row(
      screen.getByRole("table", { name: "Hand hygiene and coaching" }),
      /Coached staff whose next observation was clean/,
    );
    expect(coaching.textContent).toContain("Not shown: fewer than 5 staff members observed");
    expect(coaching.textContent).not.toMatch(/%/);
  });

  it("when a site's page opens, then it shows that site's observation figures only", async () => {
    stubCommittee();
    renderApp(`/committee/sites/${tamsinGeneral.id}?${period}`);

    const section = await screen.findByRole("region", { name: "Observed putting-on and removal" });
    expect(
      await within(section).findByRole("heading", {
        name: `${tamsinGeneral.name}: 40 observations`,
      }),
    ).toBeTruthy();
    expect(within(section).queryByLabelText("Show the figures of")).toBeNull();
    expect(section.textContent).not.toContain("All sites together");
  });

  it("when a site's page names a site the person may not read, then it says so and shows no observation figures beneath", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(committeeMember),
      "GET /api/committee/observations": () => jsonResponse(buildObservationFigures()),
      [`GET /api/committee/sites/${orchardHill.id}`]: () =>
        errorResponse(404, "not_found", "That was not found."),
    });
    renderApp(`/committee/sites/${orchardHill.id}?${period}`);

    await screen.findByText("We could not load the spaces");
    expect(screen.queryByRole("region", { name: "Observed putting-on and removal" })).toBeNull();
  });

  it("when the observation figures are downloaded, then the CSV is asked for the months on screen only", async () => {
    stubCommittee();
    renderApp(`/committee?${period}&zoneType=doffing_area`);

    expect(
      await screen.findByRole("button", { name: "Download the observation figures (CSV)" }),
    ).toBeTruthy();
    expect(
      observationsExportPath({ from: "2025-05", to: "2026-04", zoneType: "doffing_area" }),
    ).toBe("/api/committee/observations/export?from=2025-05&to=2026-04");
  });
});
