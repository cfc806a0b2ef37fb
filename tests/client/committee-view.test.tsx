import { act, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { committeeMember } from "./support/action-data";
import {
  administrator,
  auditor,
  errorResponse,
  jsonResponse,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import {
  buildComparison,
  buildDrillDown,
  buildTrends,
  doffingSpace,
  wexleyRehab,
  buildObservationFigures,
} from "./support/committee-data";
import { renderApp } from "./support/render-app";

// jsdom has no ResizeObserver, so the charts keep their initial size and draw at it.
// Restored one by one: the console.error spy of the shared setup must outlive this file's spies.
const spies: { mockRestore: () => void }[] = [];
afterEach(() => {
  vi.unstubAllGlobals();
  for (const spy of spies.splice(0)) spy.mockRestore();
});

const period = "from=2025-05&to=2026-04";
const pair = `siteA=${tamsinGeneral.id}&siteB=${orchardHill.id}`;

function stubCommittee(
  replies: Parameters<typeof stubApi>[0] = {},
  comparison = buildComparison(),
) {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(committeeMember),
    "GET /api/committee/comparison": () => jsonResponse(comparison),
    "GET /api/committee/trends": () => jsonResponse(buildTrends()),
    "GET /api/committee/observations": () => jsonResponse(buildObservationFigures()),
    ...replies,
  });
}

/** The URLs the page asked for on one endpoint, query strings included. */
function requested(fetchStub: ReturnType<typeof stubApi>["fetchStub"], path: string): URL[] {
  return fetchStub.mock.calls
    .map(([input]) => new URL(String(input), "http://localhost"))
    .filter((url) => url.pathname === path);
}

function siteRow(name: string): HTMLElement {
  const table = screen.getByRole("table", { name: "Readiness by site" });
  return within(table).getByRole("row", { name: new RegExp(name) });
}

describe("the committee comparison", () => {
  it("when the view opens, then each site shows its readiness with its 95% interval and a small sample is flagged, not ranked", async () => {
    stubCommittee();
    renderApp(`/committee?${period}&${pair}`);

    expect(await screen.findByRole("heading", { level: 1, name: "Committee view" })).toBeTruthy();
    await screen.findByRole("table", { name: "Readiness by site" });

    const tamsin = siteRow(tamsinGeneral.name);
    expect(within(tamsin).getByText("70.0%")).toBeTruthy();
    expect(within(tamsin).getByText("61.3% – 77.5%")).toBeTruthy();
    expect(within(tamsin).getAllByRole("cell")[0]!.textContent).toBe("1");

    const orchard = siteRow(orchardHill.name);
    expect(within(orchard).getByText("62.5%")).toBeTruthy();
    expect(within(orchard).getByText("50.3% – 73.3%")).toBeTruthy();

    const wexley = siteRow(wexleyRehab.name);
    expect(within(wexley).getByText("Small sample — not ranked")).toBeTruthy();
    expect(within(wexley).getByText("19.3% – 68.0%")).toBeTruthy();

    expect(screen.getByText(/fewer than 30 audits in the period are flagged/)).toBeTruthy();
    const chart = screen.getByRole("img", { name: /Chart of readiness by site/ });
    await waitFor(() => expect(chart.querySelectorAll(".recharts-errorBar").length).toBe(3));
    expect(screen.getAllByRole("complementary", { name: "Caution" }).length).toBeGreaterThan(0);
  });

  it("when the address names no sites, then the first two with audits are compared and put in the address", async () => {
    const empty = buildComparison();
    empty.sites = [
      { ...empty.sites[2]!, readiness: { ...empty.sites[2]!.readiness, n: 0, rate: null } },
      empty.sites[0]!,
      empty.sites[1]!,
    ];
    const { fetchStub } = stubCommittee({}, empty);
    const { router } = renderApp(`/committee?${period}`);

    await waitFor(() =>
      expect(router.state.location.search).toBe(
        `?${period}&siteA=${orchardHill.id}&siteB=${tamsinGeneral.id}`,
      ),
    );
    await waitFor(() =>
      expect(
        requested(fetchStub, "/api/committee/comparison").some(
          (url) => url.searchParams.get("siteA") === orchardHill.id,
        ),
      ).toBe(true),
    );
  });

  it("when the pair's interval includes zero, then the difference is read as possibly chance", async () => {
    stubCommittee(
      {},
      buildComparison({
        difference: {
          siteA: tamsinGeneral.id,
          siteB: orchardHill.id,
          difference: 0.075,
          interval: { lower: -0.0654, upper: 0.2113 },
          excludesZero: false,
        },
      }),
    );
    renderApp(`/committee?${period}&${pair}`);

    const panel = await screen.findByRole("region", { name: "Difference between two sites" });
    await waitFor(() => expect(panel.textContent).toContain("+7.5 percentage points"));
    expect(panel.textContent).toContain(`${tamsinGeneral.name} minus ${orchardHill.name}`);
    expect(panel.textContent).toContain("95% interval of the difference: −6.5 to +21.1 points.");
    expect(
      within(panel).getByText("The interval includes zero: the difference may be chance."),
    ).toBeTruthy();
  });

  it("when the pair's interval leaves out zero, then the difference is read as unlikely to be chance", async () => {
    stubCommittee(
      {},
      buildComparison({
        difference: {
          siteA: tamsinGeneral.id,
          siteB: orchardHill.id,
          difference: 0.2,
          interval: { lower: 0.05, upper: 0.33 },
          excludesZero: true,
        },
      }),
    );
    renderApp(`/committee?${period}&${pair}`);

    const panel = await screen.findByRole("region", { name: "Difference between two sites" });
    expect(
      await within(panel).findByText(
        "The interval leaves out zero: the difference is unlikely to be chance.",
      ),
    ).toBeTruthy();
    expect(panel.textContent).toContain(
      `${tamsinGeneral.name} was ready more often than ${orchardHill.name}`,
    );
  });
});

describe("the committee trends", () => {
  it("when a month falls outside its limits, then its table row says so and it is named in words", async () => {
    stubCommittee();
    renderApp(`/committee?${period}&${pair}`);

    const table = await screen.findByRole("table", {
      name: `Monthly readiness at ${tamsinGeneral.name}`,
    });
    const rows = within(table).getAllByRole("row").slice(1);
    expect(rows.map((row) => row.lastElementChild?.textContent)).toEqual([
      "Within",
      "Outside: below the lower limit",
      "Within",
    ]);
    const list = screen.getByRole("list", {
      name: `Months outside the limits at ${tamsinGeneral.name}`,
    });
    expect(
      within(list)
        .getAllByRole("listitem")
        .map((item) => item.textContent),
    ).toEqual(["March 2026: 30.0% all clear (12 of 40 audits), below the lower limit of 48.0%."]);
    expect(
      screen.queryByRole("list", { name: `Months outside the limits at ${orchardHill.name}` }),
    ).toBeNull();
    expect(
      screen.getByRole("img", { name: new RegExp(`Control chart .* ${tamsinGeneral.name}`) }),
    ).toBeTruthy();

    const open = screen.getByRole("table", { name: "Actions not done yet, by days since raised" });
    expect(
      within(open).getByRole("row", { name: new RegExp(tamsinGeneral.name) }).textContent,
    ).toContain("4321" + "10");
    const closes = screen.getByRole("table", { name: "Median days to close" });
    expect(within(closes).getByText("1.5 days")).toBeTruthy();
  });
});

describe("the committee filters", () => {
  it("when the zone type and the start month change, then the address and the requests follow", async () => {
    const { fetchStub } = stubCommittee();
    const { router, user } = renderApp(`/committee?${period}&${pair}`);

    await screen.findByRole("table", { name: "Readiness by site" });
    await user.selectOptions(screen.getByRole("combobox", { name: "Zone type" }), "doffing_area");
    await waitFor(() =>
      expect(router.state.location.search).toBe(
        `?from=2025-05&to=2026-04&zoneType=doffing_area&${pair}`,
      ),
    );
    // The page shows the new address a moment after the router has it.
    await waitFor(() =>
      expect((screen.getByRole("combobox", { name: "Zone type" }) as HTMLSelectElement).value).toBe(
        "doffing_area",
      ),
    );
    fireEvent.change(screen.getByLabelText("From"), { target: { value: "2025-11" } });
    await waitFor(() =>
      expect(router.state.location.search).toBe(
        `?from=2025-11&to=2026-04&zoneType=doffing_area&${pair}`,
      ),
    );

    await waitFor(() => {
      const last = requested(fetchStub, "/api/committee/comparison").at(-1)!;
      expect(last.search).toBe(`?from=2025-11&to=2026-04&zoneType=doffing_area&${pair}`);
    });
    const trends = requested(fetchStub, "/api/committee/trends").at(-1)!;
    expect(trends.search).toBe("?from=2025-11&to=2026-04&zoneType=doffing_area");
  });

  it("when the end comes before the start, then the field says so and nothing is asked", async () => {
    const { fetchStub } = stubCommittee();
    renderApp("/committee?from=2026-04&to=2026-01");

    expect(await screen.findByText("End on or after the start.")).toBeTruthy();
    expect(screen.getByLabelText("To").getAttribute("aria-invalid")).toBe("true");
    expect(requested(fetchStub, "/api/committee/comparison")).toEqual([]);
  });

  it("when a site reader without a network-wide role signs in, then no Committee entry is offered", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral, orchardHill] }),
      "GET /api/my/due": () => jsonResponse({ entries: [] }),
      "GET /api/my/actions": () => jsonResponse({ actions: [] }),
    });
    renderApp("/");

    const navigation = await screen.findByRole("navigation", { name: "Main" });
    await screen.findByRole("heading", { level: 1, name: "My sites" });
    expect(within(navigation).queryByRole("link", { name: "Committee" })).toBeNull();
  });
});

describe("the committee drill-down", () => {
  it("when a site's name is followed, then its spaces show with links to their audits, their floor and the site's actions", async () => {
    stubCommittee({
      [`GET /api/committee/sites/${tamsinGeneral.id}`]: () => jsonResponse(buildDrillDown()),
    });
    const { router, user } = renderApp(`/committee?${period}&zoneType=doffing_area&${pair}`);

    expect(
      within(await screen.findByRole("navigation", { name: "Main" }))
        .getByRole("link", { name: "Committee" })
        .getAttribute("aria-current"),
    ).toBe("page");
    await screen.findByRole("table", { name: "Readiness by site" });
    await user.click(screen.getByRole("link", { name: tamsinGeneral.name }));

    expect(await screen.findByRole("heading", { level: 1, name: tamsinGeneral.name })).toBeTruthy();
    expect(`${router.state.location.pathname}${router.state.location.search}`).toBe(
      `/committee/sites/${tamsinGeneral.id}?${period}&zoneType=doffing_area`,
    );
    const table = await screen.findByRole("table", { name: "Spaces" });
    const row = within(table).getByRole("row", { name: /Doffing area 4/ });
    expect(within(row).getByText("75.0%")).toBeTruthy();
    expect(within(row).getByText("46.8% – 91.1%")).toBeTruthy();
    expect(within(row).getByText("Gaps to fix")).toBeTruthy();
    expect(
      within(row)
        .getByRole("link", { name: "Audit history of Doffing area 4" })
        .getAttribute("href"),
    ).toBe(`/spaces/${doffingSpace.spaceId}/audits`);
    expect(
      within(row)
        .getByRole("link", { name: "Ward 4 East floor plan, for Doffing area 4" })
        .getAttribute("href"),
    ).toBe(`/sites/${tamsinGeneral.id}/floors/${doffingSpace.floorId}`);
    expect(
      screen
        .getByRole("link", { name: `Corrective actions at ${tamsinGeneral.name}` })
        .getAttribute("href"),
    ).toBe(`/sites/${tamsinGeneral.id}/actions`);
    expect(
      screen.getByRole("link", { name: "Back to the committee view" }).getAttribute("href"),
    ).toBe(`/committee?${period}&zoneType=doffing_area`);
  });
});

/** A reply whose body the test feeds chunk by chunk. */
function streamedReply(headers: Record<string, string>) {
  let feed!: ReadableStreamDefaultController<Uint8Array>;
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      feed = controller;
    },
  });
  return {
    response: new Response(body, { status: 200, headers }),
    push: (text: string) => feed.enqueue(new TextEncoder().encode(text)),
    end: () => feed.close(),
  };
}

function catchSaves() {
  const saved: { name: string; href: string }[] = [];
  const blobs: Blob[] = [];
  spies.push(
    vi.spyOn(URL, "createObjectURL").mockImplementation((blob) => {
      blobs.push(blob as Blob);
      return `blob:lintel/${blobs.length}`;
    }),
    vi.spyOn(URL, "revokeObjectURL").mockImplementation(() => {}),
    vi.spyOn(HTMLAnchorElement.prototype, "click").mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push({ name: this.download, href: this.getAttribute("href") ?? "" });
    }),
  );
  return { saved, blobs };
}

describe("the committee downloads", () => {
  it("when the report downloads with a known size, then a progress bar shows the percentage and the file is saved under the server's name", async () => {
    const reply = streamedReply({
      "Content-Type": "application/pdf",
      "Content-Length": "200",
      "Content-Disposition": 'attachment; filename="committee-report-2025-05-to-2026-04.pdf"',
    });
    const { fetchStub } = stubCommittee({ "GET /api/committee/report": () => reply.response });
    const { saved, blobs } = catchSaves();
    const { user } = renderApp(`/committee?${period}&${pair}`);

    await user.click(
      await screen.findByRole("button", { name: "Download the monthly report (PDF)" }),
    );
    reply.push("%PDF-".padEnd(100, "x"));
    const bar = await screen.findByRole("progressbar", {
      name: "Downloading the monthly report (PDF)",
    });
    await waitFor(() => expect(bar.getAttribute("aria-valuenow")).toBe("50"));
    expect(bar.getAttribute("aria-valuetext")).toBe("50% (100 bytes of 200 bytes)");

    reply.push("y".repeat(100));
    reply.end();
    expect(
      await screen.findByText("Saved committee-report-2025-05-to-2026-04.pdf (200 bytes)."),
    ).toBeTruthy();
    expect(screen.queryByRole("progressbar")).toBeNull();
    expect(saved).toEqual([
      { name: "committee-report-2025-05-to-2026-04.pdf", href: "blob:lintel/1" },
    ]);
    expect(blobs[0]!.size).toBe(200);
    expect(requested(fetchStub, "/api/committee/report")[0]!.search).toBe(`?${period}&${pair}`);
  });

  it("when the audits stream without a size, then the rows received are counted and the saved file says how many", async () => {
    const reply = streamedReply({
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": 'attachment; filename="audits-2025-05-to-2026-04.csv"',
    });
    stubCommittee({ "GET /api/committee/audits/export": () => reply.response });
    const { saved } = catchSaves();
    const { user } = renderApp(`/committee?${period}&${pair}`);

    await user.click(await screen.findByRole("button", { name: "Download the audits (CSV)" }));
    reply.push("audit id,site\na1,Tamsin\na2,Tamsin\n");
    const bar = await screen.findByRole("progressbar", {
      name: "Downloading the audits (CSV)",
    });
    await waitFor(() =>
      expect(bar.getAttribute("aria-valuetext")).toBe("34 bytes received, 2 rows"),
    );
    expect(bar.hasAttribute("aria-valuenow")).toBe(false);

    reply.push("a3,Orchard\n");
    reply.end();
    expect(
      await screen.findByText("Saved audits-2025-05-to-2026-04.csv (45 bytes, 3 rows)."),
    ).toBeTruthy();
    expect(saved.map((file) => file.name)).toEqual(["audits-2025-05-to-2026-04.csv"]);
  });

  it("when the server refuses a download, then its message is shown and nothing is saved", async () => {
    stubCommittee({
      "GET /api/committee/comparison/export": () =>
        errorResponse(400, "validation_failed", "At most 36 months at a time.", {
          to: "At most 36 months at a time.",
        }),
    });
    const { saved } = catchSaves();
    const { user } = renderApp(`/committee?${period}&${pair}`);

    await user.click(await screen.findByRole("button", { name: "Download the comparison (CSV)" }));
    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toContain("Could not download the comparison (CSV)");
    expect(alert.textContent).toContain("At most 36 months at a time.");
    expect(saved).toEqual([]);
  });
});

describe("leaving the committee view while it loads", () => {
  it("when the person moves to another page before the comparison arrives, then the comparison's default pair does not pull them back", async () => {
    let sendComparison: () => void = () => {};
    const comparisonSent = new Promise<void>((resolve) => (sendComparison = resolve));
    let sendConfig: () => void = () => {};
    const configSent = new Promise<void>((resolve) => (sendConfig = resolve));
    const { fetchStub } = stubApi({
      "GET /api/auth/me": () => jsonResponse(administrator),
      "GET /api/committee/comparison": async () => {
        await comparisonSent;
        return jsonResponse(buildComparison());
      },
      "GET /api/committee/trends": () => jsonResponse(buildTrends()),
      "GET /api/app-config": async () => {
        await configSent;
        return jsonResponse({ demoMailbox: false });
      },
    });
    const { router } = renderApp(`/committee?${period}`);
    await screen.findByRole("heading", { level: 1, name: "Committee view" });
    await waitFor(() => expect(requested(fetchStub, "/api/committee/comparison")).toHaveLength(1));

    // The next page waits for its settings; meanwhile the comparison arrives.
    void router.navigate("/admin/mail");
    await waitFor(() => expect(router.state.navigation.state).toBe("loading"));
    // The page has drawn the move under way (as a phone would have, long before a slow reply).
    await act(async () => {});
    sendComparison();
    await screen.findByRole("table", { name: "Readiness by site" });
    sendConfig();

    await waitFor(() => expect(router.state.navigation.state).toBe("idle"));
    expect(router.state.location.pathname).toBe("/admin/mail");
    await waitFor(() =>
      expect(screen.queryByRole("heading", { level: 1, name: "Committee view" })).toBeNull(),
    );
  });
});
