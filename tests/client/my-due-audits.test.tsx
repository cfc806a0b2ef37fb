import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { render, screen, within } from "@testing-library/react";
import { MemoryRouter } from "react-router-dom";
import { afterEach, describe, expect, it, vi } from "vitest";

import { MyDueAudits } from "@/features/walkthroughs/components/my-due-audits";

import { jsonResponse, stubApi } from "./support/api-stub";

const entry = (name: string, state: "overdue" | "due_soon", dueInDays: number) => ({
  spaceId: crypto.randomUUID(),
  spaceName: name,
  zoneType: "doffing_area",
  floorId: crypto.randomUUID(),
  floorName: "Ground floor",
  cadenceDays: 30,
  lastAuditAt: new Date(Date.now() - 40 * 86_400_000).toISOString(),
  dueAt: new Date(Date.now() + dueInDays * 86_400_000).toISOString(),
  state,
  verdict: "gaps_to_fix",
  lastAuditorName: "Rafael Dunmore",
  siteId: crypto.randomUUID(),
  siteName: "Wexley Rehabilitation Centre",
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe("what is due for the auditor", () => {
  it("when spaces are overdue at the auditor's sites, then each is listed with its site and a link to start the audit", async () => {
    const overdue = entry("Doffing area 1", "overdue", -5);
    stubApi({
      "GET /api/my/due": () =>
        jsonResponse({ entries: [overdue, entry("Donning zone 2", "due_soon", 1)] }),
    });
    render(
      <QueryClientProvider
        client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}
      >
        <MemoryRouter>
          <MyDueAudits startHref={(spaceId) => `/spaces/${spaceId}/audit`} />
        </MemoryRouter>
      </QueryClientProvider>,
    );
    const item = await screen.findByRole("listitem", { name: "Doffing area 1" });
    expect(within(item).getByText(/Wexley Rehabilitation Centre/)).toBeTruthy();
    expect(within(item).getByText("Overdue by 5 days")).toBeTruthy();
    expect(within(item).getByRole("link", { name: "Start audit" }).getAttribute("href")).toBe(
      `/spaces/${overdue.spaceId}/audit`,
    );
    expect(screen.getAllByRole("listitem")).toHaveLength(2);
  });

  it("when nothing is due, then the card says so", async () => {
    stubApi({ "GET /api/my/due": () => jsonResponse({ entries: [] }) });
    render(
      <QueryClientProvider
        client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}
      >
        <MemoryRouter>
          <MyDueAudits startHref={(spaceId) => `/spaces/${spaceId}/audit`} />
        </MemoryRouter>
      </QueryClientProvider>,
    );
    expect(await screen.findByText("Nothing is due at your sites right now.")).toBeTruthy();
  });
});
