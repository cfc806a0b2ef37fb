import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import type { AuditDetail } from "@shared/schemas/audits";

import { AmendAuditForm } from "@/features/walkthroughs/components/amend-audit-form";

import { errorResponse, jsonResponse, stubApi, type StubRequest } from "./support/api-stub";

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

afterEach(() => {
  vi.unstubAllGlobals();
});

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
    await userEvent.click(screen.getByText("Amend an answer"));
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
    await userEvent.click(screen.getByText("Amend an answer"));
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
    await userEvent.click(screen.getByText("Amend an answer"));
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
