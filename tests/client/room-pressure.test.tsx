import type { PressureSpaceResponse } from "@shared/schemas/pressure-space";
import { screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  administrator,
  auditor,
  errorResponse,
  jsonResponse,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const spaceId = "3e4f5a6b-7c8d-4e9f-8a0b-1c2d3e4f5a6b";
const alarmId = "4f5a6b7c-8d9e-4f0a-9b1c-2d3e4f5a6b7c";
const now = new Date("2026-12-03T14:20:00Z");
const hour = 3_600_000;

function room(overrides: Partial<PressureSpaceResponse> = {}): PressureSpaceResponse {
  const from = new Date(now.getTime() - 2 * hour);
  return {
    space: {
      id: spaceId,
      siteId: tamsinGeneral.id,
      name: "Isolation room 4",
      zoneType: "isolation_room",
      retired: false,
      takesMonitor: true,
      timeZone: "Europe/London",
    },
    monitor: {
      monitorId: "tamsin-4-iso",
      thresholdPa: -2.5,
      thresholdIsDefault: true,
      unit: "Pa",
      thresholdInUnit: -2.5,
      thresholdWords:
        "−2.5 Pa (−0.01 in. w.c.) or more negative to the corridor: Lintel's default.",
      mappedAt: "2026-11-01T09:00:00.000Z",
    },
    live: {
      state: "excursion",
      latest: {
        measuredAt: "2026-12-03T14:19:30.000Z",
        pressure: 1.2,
        unit: "Pa",
        pressurePa: 1.2,
        door: "open",
        meetsThreshold: false,
      },
      openAlarmId: alarmId,
    },
    range: "24h",
    from: from.toISOString(),
    to: now.toISOString(),
    bucket: "minute",
    series: [
      {
        at: "2026-12-03T13:00:00.000Z",
        readings: 12,
        meanPa: -6.1,
        minPa: -6.5,
        maxPa: -5.8,
        doorOpenReadings: 0,
      },
      {
        at: "2026-12-03T13:01:00.000Z",
        readings: 12,
        meanPa: -6.0,
        minPa: -6.3,
        maxPa: -5.7,
        doorOpenReadings: 0,
      },
      {
        at: "2026-12-03T14:10:00.000Z",
        readings: 12,
        meanPa: 0.9,
        minPa: 0.2,
        maxPa: 1.4,
        doorOpenReadings: 6,
      },
    ],
    table: [
      {
        from: "2026-12-03T12:00:00.000Z",
        to: "2026-12-03T13:00:00.000Z",
        readings: 0,
        meanPa: null,
        minPa: null,
        maxPa: null,
        excursionMinutes: 0,
      },
      {
        from: "2026-12-03T13:00:00.000Z",
        to: "2026-12-03T14:00:00.000Z",
        readings: 24,
        meanPa: -6.05,
        minPa: -6.5,
        maxPa: -5.7,
        excursionMinutes: 0,
      },
      {
        from: "2026-12-03T14:00:00.000Z",
        to: "2026-12-03T14:20:00.000Z",
        readings: 12,
        meanPa: 0.9,
        minPa: 0.2,
        maxPa: 1.4,
        excursionMinutes: 12,
      },
    ],
    alarms: [
      {
        id: alarmId,
        kind: "out_of_range",
        startedAt: "2026-12-03T14:08:00.000Z",
        endedAt: null,
        durationMinutes: 12,
        worst: { value: 1.4, unit: "Pa", pressurePa: 1.4, at: "2026-12-03T14:12:00.000Z" },
        critical: false,
        acknowledgement: {
          at: "2026-12-03T14:11:00.000Z",
          byName: "Dana Okafor",
          note: "Door propped for a bed move; closing it.",
        },
      },
    ],
    alarmCount: 1,
    ...overrides,
  };
}

/** The API stubbed, with the pressure reply chosen by the range the page asks for. */
function stubPressure(
  me: typeof auditor,
  replies: { "24h": () => Response; "30d"?: () => Response },
  extra: Parameters<typeof stubApi>[0] = {},
) {
  const ranges: string[] = [];
  let lastUrl = "";
  const stub = stubApi({
    "GET /api/auth/me": () => jsonResponse(me),
    [`GET /api/spaces/${spaceId}/audits`]: () => jsonResponse({ audits: [] }),
    [`GET /api/spaces/${spaceId}/pressure`]: () => {
      const range = new URL(lastUrl, "http://localhost").searchParams.get("range") ?? "24h";
      ranges.push(range);
      return (range === "30d" ? replies["30d"]! : replies["24h"])();
    },
    ...extra,
  });
  const inner = globalThis.fetch;
  vi.stubGlobal("fetch", (input: RequestInfo | URL, init?: RequestInit) => {
    lastUrl = String(input);
    return inner(input, init);
  });
  return { ranges, calls: stub.calls };
}

describe("the room's pressure on its space page", () => {
  it("when the room is in an excursion, then the value, the state in words, the hourly table and the acknowledged excursion show", async () => {
    stubPressure(auditor, { "24h": () => jsonResponse(room()) });
    renderApp(`/spaces/${spaceId}/audits`);

    const section = await screen.findByRole("region", { name: "Room pressure" });
    const live = within(section).getByTestId("pressure-live");
    expect(live.textContent).toContain("+1.2 Pa");
    expect(live.textContent).toContain("door open");
    const state = within(live).getByRole("status");
    expect(state.textContent).toContain("Excursion");
    expect(state.textContent).toContain("the alarm has been raised");

    const table = within(section).getByTestId("pressure-table");
    const rows = within(table).getAllByRole("row").slice(1);
    expect(rows).toHaveLength(3);
    // Newest first, in the site's time (London is UTC in December).
    expect(rows[0]!.textContent).toContain("14:00–14:20");
    expect(rows[0]!.textContent).toContain("+0.9");
    expect(rows[0]!.textContent).toContain("12 min");
    expect(rows[1]!.textContent).toContain("−6.5 to −5.7");
    expect(rows[2]!.textContent).toContain("No readings");

    const log = within(section).getByTestId("pressure-alarms");
    expect(log.textContent).toContain("Excursion from 3 Dec, 14:08");
    expect(log.textContent).toContain("still going on");
    expect(log.textContent).toContain("worst +1.4 Pa at 14:12");
    expect(log.textContent).toContain(
      "Acknowledged by Dana Okafor at 3 Dec, 14:11: “Door propped for a bed move; closing it.”",
    );
    // An auditor does not map monitors.
    expect(within(section).queryByText("Change or unmap the monitor")).toBeNull();
  });

  it("when 30 days is chosen, then the page asks for that range and the table has a row a day", async () => {
    const month = room({
      range: "30d",
      bucket: "hour",
      table: [
        {
          from: "2026-12-02T00:00:00.000Z",
          to: "2026-12-03T00:00:00.000Z",
          readings: 8640,
          meanPa: -6.2,
          minPa: -7.1,
          maxPa: -4.9,
          excursionMinutes: 0,
        },
        {
          from: "2026-12-03T00:00:00.000Z",
          to: "2026-12-03T14:20:00.000Z",
          readings: 5000,
          meanPa: -5.1,
          minPa: -7,
          maxPa: 1.4,
          excursionMinutes: 12,
        },
      ],
    });
    const { ranges } = stubPressure(auditor, {
      "24h": () => jsonResponse(room()),
      "30d": () => jsonResponse(month),
    });
    const { user } = renderApp(`/spaces/${spaceId}/audits`);
    const section = await screen.findByRole("region", { name: "Room pressure" });
    await user.click(within(section).getByRole("button", { name: "30 days" }));
    await waitFor(() => expect(ranges).toContain("30d"));
    await waitFor(() =>
      expect(within(section).getByTestId("pressure-table").textContent).toContain("Each day"),
    );
    const rows = within(within(section).getByTestId("pressure-table")).getAllByRole("row").slice(1);
    expect(rows.map((row) => row.querySelector("th")!.textContent)).toEqual(["3 Dec", "2 Dec"]);
    expect(
      within(section).getByRole("button", { name: "30 days" }).getAttribute("aria-pressed"),
    ).toBe("true");
  });

  it("when no monitor is mapped, then an auditor reads that in words and sees no form", async () => {
    stubPressure(auditor, {
      "24h": () =>
        jsonResponse(
          room({ monitor: null, live: null, series: [], table: [], alarms: [], alarmCount: 0 }),
        ),
    });
    renderApp(`/spaces/${spaceId}/audits`);
    const section = await screen.findByRole("region", { name: "Room pressure" });
    expect(section.textContent).toContain("No monitor is mapped to this room.");
    expect(within(section).queryByRole("textbox")).toBeNull();
  });

  it("when an administrator maps a monitor, then a threshold weaker than the CDC's is refused beside the field and an id mapped elsewhere shows the server's words beside the id", async () => {
    const { calls } = stubPressure(
      administrator,
      {
        "24h": () =>
          jsonResponse(
            room({ monitor: null, live: null, series: [], table: [], alarms: [], alarmCount: 0 }),
          ),
      },
      {
        [`PUT /api/spaces/${spaceId}/monitor`]: () =>
          errorResponse(409, "conflict", "That monitor is already mapped to Isolation room 2.", {
            monitorId:
              "That monitor is already mapped to Isolation room 2. Unmap it there first, or check the id.",
          }),
      },
    );
    const { user } = renderApp(`/spaces/${spaceId}/audits`);
    const section = await screen.findByRole("region", { name: "Room pressure" });
    await user.type(within(section).getByLabelText("Monitor id"), "tamsin-2-iso");
    await user.type(within(section).getByLabelText(/Threshold in Pa/), "-1");
    await user.click(within(section).getByRole("button", { name: "Map the monitor" }));
    const threshold = within(section).getByLabelText(/Threshold in Pa/);
    expect(threshold.getAttribute("aria-invalid")).toBe("true");
    expect(section.textContent).toContain("the CDC's minimum");
    expect(calls.filter((call) => call.method === "PUT")).toHaveLength(0);

    await user.clear(threshold);
    await user.click(within(section).getByRole("button", { name: "Map the monitor" }));
    await waitFor(() =>
      expect(within(section).getByLabelText("Monitor id").getAttribute("aria-invalid")).toBe(
        "true",
      ),
    );
    expect(section.textContent).toContain("already mapped to Isolation room 2");
    expect(calls.find((call) => call.method === "PUT")?.body).toEqual({
      monitorId: "tamsin-2-iso",
      thresholdPa: null,
    });
  });

  it("when an administrator unmaps the monitor, then nothing is sent until it is confirmed, and the step says the open alarm ends", async () => {
    const { calls } = stubPressure(
      administrator,
      { "24h": () => jsonResponse(room()) },
      { [`DELETE /api/spaces/${spaceId}/monitor`]: () => new Response(null, { status: 204 }) },
    );
    const { user } = renderApp(`/spaces/${spaceId}/audits`);
    const section = await screen.findByRole("region", { name: "Room pressure" });
    await user.click(within(section).getByText("Change or unmap the monitor"));
    await user.click(within(section).getByRole("button", { name: "Unmap the monitor" }));
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(0);
    expect(section.textContent).toContain("an alarm still open ends");

    await user.click(within(section).getByRole("button", { name: "Cancel" }));
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(0);
    await user.click(within(section).getByRole("button", { name: "Unmap the monitor" }));
    await user.click(within(section).getByRole("button", { name: "Unmap" }));
    await waitFor(() => expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(1));
  });

  it("when the space is not an isolation room and has no monitor, then there is no pressure section", async () => {
    stubPressure(auditor, {
      "24h": () =>
        jsonResponse(
          room({
            space: { ...room().space, zoneType: "doffing_area", takesMonitor: false },
            monitor: null,
            live: null,
            series: [],
            table: [],
            alarms: [],
            alarmCount: 0,
          }),
        ),
    });
    renderApp(`/spaces/${spaceId}/audits`);
    expect(await screen.findByText("No audits of this space yet.")).toBeTruthy();
    await waitFor(() => expect(screen.queryByText("Loading the room's pressure…")).toBeNull());
    expect(screen.queryByRole("region", { name: "Room pressure" })).toBeNull();
  });
});
