import "fake-indexeddb/auto";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { cleanup, render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import type { ActionSummary } from "@shared/schemas/actions";
import type { MeResponse } from "@shared/schemas/auth";
import type { AuditDetail } from "@shared/schemas/audits";
import { IDBFactory } from "fake-indexeddb";

import { AmendAuditForm } from "@/features/walkthroughs/components/amend-audit-form";
import { closeAuditDevice } from "@/features/walkthroughs/lib/audit-device";

import { buildAction } from "./support/action-data";
import {
  administrator,
  errorResponse,
  jsonResponse,
  stubApi,
  type StubRequest,
  tamsinGeneral,
} from "./support/api-stub";
import { renderApp } from "./support/render-app";

const itemId = crypto.randomUUID();
const detail: AuditDetail = {
  audit: {
    id: crypto.randomUUID(),
    siteId: crypto.randomUUID(),
    spaceId: crypto.randomUUID(),
    spaceName: "Doffing area 1",
    zoneType: "doffing_area",
    spaceRetiredAt: null,
    checklistVersionId: crypto.randomUUID(),
    checklistVersion: 1,
    auditorId: crypto.randomUUID(),
    auditorName: "Rafael Dunmore",
    status: "submitted",
    startedAt: new Date().toISOString(),
    submittedAt: new Date().toISOString(),
    verdict: "gaps_to_fix",
    score: 0.9,
  },
  items: [
    {
      id: itemId,
      key: "doff.order-poster",
      position: 0,
      text: "Removal order displayed at eye level",
      severity: "minor",
      response: "check",
      quantity: null,
      threshold: null,
      choices: null,
      reference: null,
      photoOnFail: true,
    },
  ],
  answers: [],
  photos: [],
  room: null,
};

afterEach(async () => {
  cleanup();
  globalThis.indexedDB = new IDBFactory();
  await closeAuditDevice();
  vi.unstubAllGlobals();
});

/** Opens the panel; the form's code loads then, so its fields appear a moment later. */
async function openForm() {
  expect(screen.queryByLabelText("Reason for the amendment")).toBeNull();
  await userEvent.click(screen.getByText("Amend an answer"));
  await screen.findByRole("button", { name: "Record amendment" });
}

function renderForm() {
  render(
    <QueryClientProvider
      client={
        new QueryClient({
          defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
        })
      }
    >
      <AmendAuditForm detail={detail} />
    </QueryClientProvider>,
  );
}

describe("amending a submitted audit", () => {
  it("when no reason is given, then the form asks for one and sends nothing", async () => {
    const requests: StubRequest[] = [];
    stubApi({}, (request) => {
      requests.push(request);
      return undefined;
    });
    renderForm();
    await openForm();
    await userEvent.click(screen.getByRole("button", { name: "Record amendment" }));
    expect(await screen.findByText("Say why, in a few words.")).toBeTruthy();
    expect(requests).toEqual([]);
  });

  it("when the amendment is recorded, then the reason and corrected answer are sent and a confirmation shows", async () => {
    let sent: unknown;
    stubApi({
      [`POST /api/audits/${detail.audit.id}/amendments`]: (request) => {
        sent = request.body;
        return jsonResponse({
          ...detail,
          audit: { ...detail.audit, verdict: "all_clear", score: 1 },
        });
      },
    });
    renderForm();
    await openForm();
    await userEvent.selectOptions(screen.getByLabelText("Corrected answer"), "pass");
    await userEvent.type(
      screen.getByLabelText("Reason for the amendment"),
      "The poster was behind the door",
    );
    await userEvent.click(screen.getByRole("button", { name: "Record amendment" }));
    expect(await screen.findByText(/Amended "Removal order displayed at eye level"/)).toBeTruthy();
    expect(sent).toEqual({
      itemId,
      outcome: "pass",
      note: null,
      reason: "The poster was behind the door",
    });
  });

  it("when the server refuses, then its message is shown beside the field it names", async () => {
    stubApi({
      [`POST /api/audits/${detail.audit.id}/amendments`]: () =>
        errorResponse(400, "validation_failed", "Needs a note.", {
          note: "Not applicable on a critical item needs a note saying why.",
        }),
    });
    renderForm();
    await openForm();
    await userEvent.type(
      screen.getByLabelText("Reason for the amendment"),
      "Room was closed that day",
    );
    await userEvent.click(screen.getByRole("button", { name: "Record amendment" }));
    expect(
      await screen.findByText("Not applicable on a critical item needs a note saying why."),
    ).toBeTruthy();
  });
});

describe("what an amendment refreshes elsewhere", () => {
  // Routes load their code on first use; a loaded two-core machine can take a while.
  const wait = { timeout: 15_000 };
  // An administrator of the network who also leads facilities at the site: the amendment's new
  // action lands on their own list.
  const leadAdministrator: MeResponse = {
    ...administrator,
    roles: [
      { role: "administrator", siteId: null },
      { role: "facilities_lead", siteId: tamsinGeneral.id },
    ],
  };
  const submitted: AuditDetail = {
    ...detail,
    audit: { ...detail.audit, siteId: tamsinGeneral.id, verdict: "all_clear", score: 1 },
    answers: [
      {
        id: crypto.randomUUID(),
        itemId,
        outcome: "pass",
        value: null,
        unit: null,
        count: null,
        choice: null,
        note: null,
      },
    ],
  };
  const opened = buildAction({
    id: crypto.randomUUID(),
    title: detail.items[0]!.text,
    spaceId: submitted.audit.spaceId,
    spaceName: submitted.audit.spaceName,
    severity: "minor",
    assignee: { id: leadAdministrator.user.id, name: leadAdministrator.user.name },
  });

  it("when an amendment turns an item to fail, then the site's action list and the home page's lists are fetched again and show the new action", async () => {
    // What the server holds: no action until the amendment records the failed item.
    let actions: ActionSummary[] = [];
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(leadAdministrator),
      "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/retired-sites": () => jsonResponse({ sites: [] }),
      "GET /api/mail/undelivered": () => jsonResponse({ mail: [] }),
      "GET /api/my/actions": () => jsonResponse({ actions }),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/actions`]: () => jsonResponse({ actions }),
      [`GET /api/audits/${submitted.audit.id}`]: () => jsonResponse(submitted),
      [`POST /api/audits/${submitted.audit.id}/amendments`]: () => {
        actions = [opened];
        return jsonResponse({
          ...submitted,
          audit: { ...submitted.audit, verdict: "gaps_to_fix", score: 0 },
          answers: [{ ...submitted.answers[0]!, outcome: "fail" }],
        });
      },
    });
    const { router, user } = renderApp("/");
    expect(await screen.findByText(/no corrective actions/i, {}, wait)).toBeTruthy();
    await router.navigate(`/sites/${tamsinGeneral.id}/actions`);
    expect(await screen.findByText(/no corrective actions/i, {}, wait)).toBeTruthy();

    await router.navigate(`/audits/${submitted.audit.id}`);
    await user.click(await screen.findByText("Amend an answer", {}, wait));
    await user.selectOptions(screen.getByLabelText("Corrected answer"), "fail");
    await user.type(screen.getByLabelText("Reason for the amendment"), "The poster had fallen");
    await user.click(screen.getByRole("button", { name: "Record amendment" }));
    expect(await screen.findByText(/Amended "Removal order displayed at eye level"/)).toBeTruthy();

    const listsBefore = calls.filter((call) => call.path.endsWith("/actions")).length;
    await router.navigate(`/sites/${tamsinGeneral.id}/actions`);
    const cell = await screen.findByText(opened.title, {}, wait);
    expect(screen.getByRole("table", { name: "Corrective actions" }).contains(cell)).toBe(true);
    await router.navigate("/");
    const mine = await screen.findByRole("list", { name: "My corrective actions" }, wait);
    expect(within(mine).getByRole("listitem", { name: opened.title })).toBeTruthy();
    expect(calls.filter((call) => call.path.endsWith("/actions")).length).toBe(listsBefore + 2);
  }, 60_000);
});
