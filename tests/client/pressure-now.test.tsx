import type { PressureNowResponse, PressureRoomNow } from "@shared/schemas/pressure-site";
import { onlineManager, QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import type { ReactNode } from "react";
import { MemoryRouter } from "react-router-dom";
import { afterEach, describe, expect, it, vi } from "vitest";

import { Pressure24hPanel } from "@/features/pressure-now/components/pressure-24h-panel";
import { PressureAlarmCards } from "@/features/pressure-now/components/pressure-alarm-cards";
import { liveStateOf } from "@/features/pressure-now/components/room-live-state";
import { pressurePins } from "@/features/pressure-now/lib/pressure-pins";
import { DueList, DueSection } from "@/features/walkthroughs/components/due-list";

import { jsonResponse, stubApi } from "./support/api-stub";

const siteId = crypto.randomUUID();
const floorId = crypto.randomUUID();
const asOf = "2026-12-03T10:06:00.000Z";

function room(overrides: Partial<PressureRoomNow>): PressureRoomNow {
  return {
    spaceId: crypto.randomUUID(),
    spaceName: "Room 2.14",
    zoneType: "isolation_room",
    floorId,
    floorName: "Ground floor",
    monitorId: "wexley-214",
    thresholdPa: -2.5,
    state: "in_range",
    latest: {
      measuredAt: asOf,
      pressure: -3.2,
      unit: "Pa",
      pressurePa: -3.2,
      door: "closed",
    },
    alarm: null,
    ...overrides,
  };
}

const openAlarm = {
  id: crypto.randomUUID(),
  kind: "out_of_range" as const,
  since: "2026-12-03T10:00:00.000Z",
  alarmAt: "2026-12-03T10:01:00.000Z",
  worstValue: 1.2,
  worstUnit: "Pa" as const,
  worstPa: 1.2,
  critical: false,
  acknowledgedAt: null,
  acknowledgedByName: null,
  acknowledgementNote: null,
};

function site(rooms: PressureRoomNow[]): PressureNowResponse {
  return { siteId, siteName: "Wexley", asOf, rooms };
}

function wrap(children: ReactNode) {
  return render(
    <QueryClientProvider
      client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}
    >
      <MemoryRouter>{children}</MemoryRouter>
    </QueryClientProvider>,
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
  onlineManager.setOnline(true);
});

describe("the alarm card on home", () => {
  it("when a room at the person's site is in excursion, then the card says where, for how long and the worst value, and acknowledging asks for a note before it sends", async () => {
    const drifting = room({ state: "excursion", alarm: openAlarm });
    let acknowledged = false;
    const { calls } = stubApi({
      [`GET /api/sites/${siteId}/pressure-now`]: () =>
        jsonResponse(
          site([
            room({ spaceName: "Room 1.02" }),
            acknowledged
              ? {
                  ...drifting,
                  alarm: {
                    ...openAlarm,
                    acknowledgedAt: "2026-12-03T10:07:00.000Z",
                    acknowledgedByName: "Dana Okafor",
                    acknowledgementNote: "Door propped open; closed it",
                  },
                }
              : drifting,
          ]),
        ),
      [`POST /api/pressure-alarms/${openAlarm.id}/acknowledge`]: () => {
        acknowledged = true;
        return jsonResponse({ alarm: { ...openAlarm, acknowledgedAt: asOf } });
      },
    });
    wrap(
      <PressureAlarmCards
        siteIds={[siteId]}
        canAcknowledge={() => true}
        spaceHref={(id) => `/spaces/${id}/audits`}
      />,
    );
    const card = await screen.findByRole("listitem", { name: "Room 2.14, Wexley" });
    expect(within(card).getByText("Not negative for 6 min, worst +1.2 Pa")).toBeTruthy();
    expect(within(card).getByText("Not negative now")).toBeTruthy();
    expect(screen.getAllByRole("listitem")).toHaveLength(1);
    expect(within(card).getByRole("link", { name: "Open the room" }).getAttribute("href")).toBe(
      `/spaces/${drifting.spaceId}/audits`,
    );

    fireEvent.click(within(card).getByRole("button", { name: "Acknowledge" }));
    const sheet = screen.getByRole("dialog", { name: "Acknowledge the alarm" });
    fireEvent.click(within(sheet).getByRole("button", { name: "Acknowledge" }));
    expect(within(sheet).getByText(/a note is required/)).toBeTruthy();
    expect(calls.filter((call) => call.method === "POST")).toHaveLength(0);

    fireEvent.change(within(sheet).getByLabelText(/Note/), {
      target: { value: "  Door propped open; closed it " },
    });
    fireEvent.click(within(sheet).getByRole("button", { name: "Acknowledge" }));
    await waitFor(() => expect(screen.queryByRole("dialog")).toBeNull());
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      note: "Door propped open; closed it",
    });
    expect(
      await screen.findByText(/Acknowledged by Dana Okafor, .*“Door propped open; closed it”/),
    ).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Acknowledge" })).toBeNull();
  });

  it("when every room is fine, then home shows no alarm card at all", async () => {
    const { calls } = stubApi({
      [`GET /api/sites/${siteId}/pressure-now`]: () => jsonResponse(site([room({})])),
    });
    wrap(<PressureAlarmCards siteIds={[siteId]} canAcknowledge={() => true} spaceHref={String} />);
    await waitFor(() => expect(calls).toHaveLength(1));
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(screen.queryByRole("heading", { name: /Room pressure alarms/ })).toBeNull();
  });
});

describe("the room's pin on the map", () => {
  it("when one room is in excursion and one silent, then each gets a pin at its centre with its words, and a room in range gets none", () => {
    const square = [
      [0, 0],
      [100, 0],
      [100, 50],
      [0, 50],
    ] as [number, number][];
    const hot = room({ state: "excursion", alarm: openAlarm });
    const silent = room({ state: "no_readings", spaceName: "Room 2.15" });
    const fine = room({ state: "in_range", spaceName: "Room 2.16" });
    const pins = pressurePins(
      [hot, silent, fine],
      [hot, silent, fine].map((r) => ({ id: r.spaceId, polygon: square })),
    );
    expect(pins.map((pin) => pin.title)).toEqual([
      "Room 2.14: not negative",
      "Room 2.15: no readings",
    ]);
    expect(pins[0]!.position).toEqual({ x: 50, y: 25 });
    expect(pins[0]!.html).toContain(">Not negative</span>");
    expect(pins[1]!.html).toContain(">No readings</span>");
  });
});

describe("the due list", () => {
  it("when a room last audited as ready is in excursion now, then its entry says so first and keeps the last verdict as the last audit's", () => {
    const hot = room({ state: "excursion", alarm: openAlarm });
    wrap(
      <DueList
        siteId={siteId}
        label="Due"
        canStart={false}
        startHref={String}
        historyHref={String}
        liveState={liveStateOf(site([hot]))}
        entries={[
          {
            spaceId: hot.spaceId,
            spaceName: "Room 2.14",
            zoneType: "isolation_room",
            floorId,
            floorName: "Ground floor",
            cadenceDays: 7,
            lastAuditAt: asOf,
            dueAt: "2026-12-09T10:00:00.000Z",
            state: "ok",
            verdict: "all_clear",
            lastAuditorName: "Rafael Dunmore",
          },
        ]}
      />,
    );
    const item = screen.getByRole("listitem", { name: "Room 2.14" });
    expect(within(item).getByText("Not negative now")).toBeTruthy();
    expect(within(item).getByText("Not negative for 6 min, worst +1.2 Pa")).toBeTruthy();
    expect(within(item).getByText(/Last audit:/)).toBeTruthy();
  });
});

describe("the site page's short due list", () => {
  it("when a room whose audit is up to date is not negative now, then it comes first, ahead of the overdue spaces, with its state in words", async () => {
    const hot = room({ state: "excursion", alarm: openAlarm });
    const entry = (spaceId: string, spaceName: string, state: "ok" | "overdue") => ({
      spaceId,
      spaceName,
      zoneType: "isolation_room" as const,
      floorId,
      floorName: "Ground floor",
      cadenceDays: 7,
      lastAuditAt: asOf,
      dueAt: state === "ok" ? "2026-12-09T10:00:00.000Z" : "2026-11-30T10:00:00.000Z",
      state,
      verdict: "all_clear" as const,
      lastAuditorName: "Rafael Dunmore",
    });
    stubApi({
      [`GET /api/sites/${siteId}/schedule`]: () =>
        jsonResponse({
          entries: [
            entry(crypto.randomUUID(), "Room 2.01", "overdue"),
            entry(crypto.randomUUID(), "Room 2.02", "overdue"),
            entry(hot.spaceId, "Room 2.14", "ok"),
          ],
        }),
    });
    wrap(
      <DueSection
        siteId={siteId}
        canStart={false}
        allHref="/all"
        startHref={String}
        historyHref={String}
        liveState={liveStateOf(site([hot]))}
        limit={2}
      />,
    );
    const list = await screen.findByRole("list", { name: "Spaces due for audit" });
    const items = within(list).getAllByRole("listitem");
    expect(items.map((item) => item.getAttribute("aria-labelledby") && item.textContent)).toEqual([
      expect.stringContaining("Room 2.14"),
      expect.stringContaining("Room 2.01"),
    ]);
    expect(within(items[0]!).getByText("Not negative now")).toBeTruthy();
    // The count above the list is still of what is due for audit.
    expect(screen.getByText("2 overdue · 2 due")).toBeTruthy();
  });
});

describe("the last 24 hours beside the pressure item", () => {
  it("when the phone is offline, then the panel says so in words and asks nothing", async () => {
    onlineManager.setOnline(false);
    const { calls } = stubApi({});
    const spaceId = crypto.randomUUID();
    wrap(<Pressure24hPanel spaceId={spaceId} />);
    expect(
      await screen.findByText(/Offline: the monitor's last 24 hours cannot be shown/),
    ).toBeTruthy();
    expect(calls).toHaveLength(0);
  });

  it("when the room's monitor has readings, then the lowest, mean, highest and time out of range are in words", async () => {
    const spaceId = crypto.randomUUID();
    stubApi({
      [`GET /api/spaces/${spaceId}/pressure-24h`]: () =>
        jsonResponse({
          spaceId,
          monitorId: "wexley-214",
          thresholdPa: -2.5,
          from: "2026-12-02T10:00:00.000Z",
          to: asOf,
          points: [
            { at: "2026-12-03T09:00:00.000Z", meanPa: -3.5, minPa: -4, maxPa: -3 },
            { at: "2026-12-03T09:01:00.000Z", meanPa: 0.5, minPa: -1, maxPa: 1.2 },
          ],
          summary: { minPa: -4, meanPa: -1.5, maxPa: 1.2, minutes: 2, minutesOutOfRange: 1 },
        }),
    });
    wrap(<Pressure24hPanel spaceId={spaceId} />);
    expect(
      await screen.findByText(
        "Last 24 hours: lowest −4.0 Pa, mean −1.5 Pa, highest +1.2 Pa; 1 min with a reading out of range (threshold −2.5 Pa, 2 min monitored).",
      ),
    ).toBeTruthy();
  });
});
