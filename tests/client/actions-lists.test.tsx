import { screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  administrator,
  errorResponse,
  jsonResponse,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { buildAction, facilitiesLead, siteAuditor } from "./support/action-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const overdueCritical = buildAction({
  id: "b2000000-0000-4000-8000-000000000001",
  title: "Hand rub reachable from every removal step",
  severity: "critical",
  overdue: true,
  dueAt: "2026-03-29T08:00:00.000Z",
});
const majorInProgress = buildAction({
  id: "b2000000-0000-4000-8000-000000000002",
  title: "Hands-free lidded bin",
  severity: "major",
  state: "fixing",
  dueAt: "2026-04-06T08:00:00.000Z",
  assignee: { id: "c3000000-0000-4000-8000-000000000001", name: "Alder Quinn" },
});
const minorClosed = buildAction({
  id: "b2000000-0000-4000-8000-000000000003",
  title: "Removal order displayed",
  severity: "minor",
  state: "done",
  closedAt: "2026-04-02T08:00:00.000Z",
  daysToClose: 3,
  dueAt: "2026-04-29T08:00:00.000Z",
});

// The list's route and its table code load on first use; on a loaded two-core machine that can
// take longer than the default wait, which is not what these tests are about.
const findActionsTable = () =>
  screen.findByRole("table", { name: "Corrective actions" }, { timeout: 15_000 });

describe("my actions on the home page", () => {
  it("when a facilities lead opens the home page, then their actions are cards in the server's order, each opening its action", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(facilitiesLead),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/my/actions": () => jsonResponse({ actions: [overdueCritical, majorInProgress] }),
    });
    renderApp("/");

    const list = await screen.findByRole("list", { name: "My corrective actions" });
    const cards = within(list).getAllByRole("listitem");
    expect(cards.map((card) => card.getAttribute("aria-label"))).toEqual([
      overdueCritical.title,
      majorInProgress.title,
    ]);
    expect(within(cards[0]!).getByText("Overdue")).toBeTruthy();
    expect(cards[0]!.textContent).toContain(
      "Doffing area 4 · Ward 4 East · Tamsin Bay General Hospital",
    );
    expect(cards[0]!.textContent).toContain("Sun 29 Mar 2026, 09:00 BST");
    expect(within(cards[1]!).queryByText("Overdue")).toBeNull();
    expect(within(cards[1]!).getByText("Being fixed")).toBeTruthy();
    expect(within(cards[0]!).getByRole("link").getAttribute("href")).toBe(
      `/actions/${overdueCritical.id}`,
    );
  });

  it("when an auditor opens the home page, then no action cards are asked for", async () => {
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(siteAuditor),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/my/due": () => jsonResponse({ entries: [] }),
    });
    renderApp("/");

    await screen.findByRole("heading", { level: 1, name: "My sites" });
    expect(screen.queryByRole("heading", { name: "My corrective actions" })).toBeNull();
    expect(calls.some((call) => call.path === "/api/my/actions")).toBe(false);
  });
});

describe("the Fixes page", () => {
  it("when a facilities lead opens Fixes from the menu, then the page is titled Corrective actions and lists their fixes", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(facilitiesLead),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/my/actions": () => jsonResponse({ actions: [overdueCritical, majorInProgress] }),
    });
    const { user } = renderApp("/");

    const menu = await screen.findByRole("navigation", { name: "Main" });
    await user.click(within(menu).getByRole("link", { name: "Fixes" }));

    expect(
      await screen.findByRole("heading", { level: 1, name: "Corrective actions" }),
    ).toBeTruthy();
    const list = await screen.findByRole("list", { name: "My corrective actions" });
    expect(within(list).getAllByRole("listitem")).toHaveLength(2);
  });
});

function stubList() {
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(siteAuditor),
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET /api/sites/${tamsinGeneral.id}/actions`]: () =>
      jsonResponse({ actions: [overdueCritical, majorInProgress, minorClosed] }),
  });
}

function itemNames(): string[] {
  const table = screen.getByRole("table", { name: "Corrective actions" });
  return within(table)
    .getAllByRole("row")
    .slice(1)
    .map((row) => row.querySelector('[data-column="item"]')?.textContent ?? "");
}

describe("the site's action list", () => {
  const listUrl = `/sites/${tamsinGeneral.id}/actions`;
  const exportLink = () => screen.getByRole("link", { name: "Download CSV" }).getAttribute("href");

  it("when it opens, then the unfinished actions show in the server's order and the CSV link asks for the unfinished ones", async () => {
    stubList();
    renderApp(listUrl);

    await findActionsTable();
    expect(itemNames()).toEqual([overdueCritical.title, majorInProgress.title]);
    // One word for an action's state on every screen.
    expect(screen.getByRole("columnheader", { name: /^State/ })).toBeTruthy();
    expect(screen.queryByRole("columnheader", { name: /^Status/ })).toBeNull();
    expect(exportLink()).toBe(`/api/sites/${tamsinGeneral.id}/actions/export?state=unfinished`);
  });

  it("when a column heading is pressed, then the rows sort by it, and again the other way", async () => {
    stubList();
    const { user } = renderApp(`${listUrl}?state=all`);

    await findActionsTable();
    await user.click(screen.getByRole("button", { name: "Item" }));
    expect(itemNames()).toEqual([overdueCritical.title, majorInProgress.title, minorClosed.title]);
    await user.click(screen.getByRole("button", { name: "Item" }));
    expect(itemNames()).toEqual([minorClosed.title, majorInProgress.title, overdueCritical.title]);
    expect(
      screen.getByRole("columnheader", { name: /Item/ }).getAttribute("aria-sort"),
    ).toBeTruthy();

    await user.click(screen.getByRole("button", { name: "Severity" }));
    expect(itemNames()[0]).toBe(overdueCritical.title);
  });

  it("when filters are chosen, then the rows narrow and the CSV link carries the same filters", async () => {
    stubList();
    const { user, router } = renderApp(listUrl);

    await findActionsTable();
    await user.selectOptions(screen.getByRole("combobox", { name: "State" }), "all");
    // The filters live in the page address, which the router updates after its loader.
    await waitFor(() => expect(itemNames()).toHaveLength(3));

    await user.selectOptions(screen.getByRole("combobox", { name: "Severity" }), "minor");
    await waitFor(() => expect(itemNames()).toEqual([minorClosed.title]));
    expect(exportLink()).toBe(
      `/api/sites/${tamsinGeneral.id}/actions/export?state=all&severity=minor`,
    );

    await user.selectOptions(screen.getByRole("combobox", { name: "Severity" }), "");
    await user.click(screen.getByRole("checkbox", { name: "Overdue only" }));
    await waitFor(() => expect(itemNames()).toEqual([overdueCritical.title]));
    expect(exportLink()).toBe(
      `/api/sites/${tamsinGeneral.id}/actions/export?state=all&overdue=true`,
    );
    expect(router.state.location.search).toBe("?state=all&overdue=true");
    // Eight interactions, each waiting on the router's loader: on a loaded two-core machine this
    // took longer than the 5 s default while behaving correctly.
  }, 15_000);

  it("when the site page opens, then it counts the open and overdue actions and links to the list", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(siteAuditor),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/actions`]: () =>
        jsonResponse({ actions: [overdueCritical, majorInProgress] }),
    });
    renderApp(`/sites/${tamsinGeneral.id}`);

    expect((await screen.findByTestId("open-actions-count")).textContent).toBe("2");
    expect(screen.getByTestId("overdue-actions-count").textContent).toBe("1");
    expect(
      screen.getByRole("link", { name: "See all corrective actions" }).getAttribute("href"),
    ).toBe(listUrl);
  });
});

describe("due times on the edit-site page", () => {
  it("when an administrator saves a slip, then the server's message shows beside that field and the typed values stay", async () => {
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(administrator),
      "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/due-policy`]: () =>
        jsonResponse({
          policy: {
            critical: { amount: 24, unit: "hours" },
            major: { amount: 7, unit: "days" },
            minor: { amount: 30, unit: "days" },
          },
          isDefault: true,
        }),
      [`PUT /api/sites/${tamsinGeneral.id}/due-policy`]: () =>
        errorResponse(400, "validation_failed", "Check the due times.", {
          "critical.amount": "Between 1 and 2160 hours.",
        }),
    });
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/edit`);

    const amount = await screen.findByLabelText("Critical: due after");
    expect(screen.getByText(/are common practice rather than a published rule/)).toBeTruthy();
    await user.clear(amount);
    await user.type(amount, "9999");
    await user.click(screen.getByRole("button", { name: "Save due times" }));

    expect(await screen.findByText("Between 1 and 2160 hours.")).toBeTruthy();
    expect(amount.getAttribute("aria-invalid")).toBe("true");
    expect((amount as HTMLInputElement).value).toBe("9999");
    await waitFor(() =>
      expect(calls.find((call) => call.method === "PUT")?.body).toEqual({
        critical: { amount: 9999, unit: "hours" },
        major: { amount: 7, unit: "days" },
        minor: { amount: 30, unit: "days" },
      }),
    );
  });
});
