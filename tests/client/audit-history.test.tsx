import { inchesOfWaterToPascals } from "@shared/calc/ventilation";
import { airflowNotConfirmedReason } from "@shared/calc/verdict";
import { cautionText } from "@shared/cautions";
import type { Audit } from "@shared/schemas/audits";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { administrator, auditor, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { buildDetail, isolationItems, isolationSpaceId } from "./support/audit-data";
import { buildFloor } from "./support/floor-data";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const auditId = "4c5d6e7f-8091-4a2b-8c3d-4e5f60718293";
const imageId = "5d6e7f80-91a2-4b3c-9d4e-5f6071829304";

function submittedDetail() {
  const items = isolationItems();
  const detail = buildDetail(auditId, items, {
    spaceId: isolationSpaceId,
    spaceName: "Isolation room 1",
    zoneType: "isolation_room",
    room: { volumeM3: 45, constructionClass: "existing", minimumAirChanges: 6 },
  });
  detail.audit = {
    ...detail.audit,
    status: "submitted",
    submittedAt: "2026-03-02T09:40:00.000Z",
    verdict: "not_ready",
    score: 0.5,
  };
  detail.answers = [
    {
      id: "6e7f8091-a2b3-4c4d-8e5f-607182930415",
      itemId: items[0]!.id,
      outcome: "fail",
      // Stored in Pa; the auditor read −0.008 inches of water.
      value: inchesOfWaterToPascals(-0.008),
      unit: "inH2O",
      count: null,
      choice: null,
      note: "Monitor alarm silenced by the ward.",
    },
    {
      id: "7f8091a2-b3c4-4d5e-9f60-718293041526",
      itemId: items[1]!.id,
      outcome: "pass",
      value: 169.9010796,
      unit: "cfm",
      count: null,
      choice: null,
      note: null,
    },
    {
      id: "8091a2b3-c4d5-4e6f-8071-829304152637",
      itemId: items[2]!.id,
      outcome: "pass",
      value: 13.6,
      unit: "ach",
      count: null,
      choice: null,
      note: null,
    },
  ];
  detail.photos = [{ id: "91a2b3c4-d5e6-4f70-8182-930415263748", itemId: items[0]!.id, imageId }];
  return detail;
}

describe("a space's audit history", () => {
  it("when the history opens, then each audit shows its date, auditor, verdict in words and score", async () => {
    const detail = submittedDetail();
    const older: Audit = {
      ...detail.audit,
      id: "a1b2c3d4-e5f6-4a7b-8c9d-0e1f2a3b4c5d",
      submittedAt: "2026-02-02T09:40:00.000Z",
      verdict: "ready",
      score: 1,
      auditorName: "Priya Nair",
    };
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/spaces/${isolationSpaceId}/audits`]: () =>
        jsonResponse({ audits: [detail.audit, older] }),
    });
    renderApp(`/spaces/${isolationSpaceId}/audits`);

    expect(await screen.findByRole("heading", { level: 1, name: "Isolation room 1" })).toBeTruthy();
    const rows = within(screen.getByRole("list", { name: "Audits" })).getAllByRole("link");
    expect(rows).toHaveLength(2);
    expect(rows[0]!.textContent).toContain("Rowan Ellery");
    expect(rows[0]!.textContent).toContain("Hold until fixed");
    expect(rows[0]!.textContent).toContain("50%");
    expect(rows[1]!.textContent).toContain("All clear");
    expect(rows[1]!.textContent).toContain("100%");
    expect(rows[0]!.getAttribute("href")).toBe(`/audits/${auditId}`);
    expect(screen.getByRole("link", { name: "Start audit" })).toBeTruthy();
  });

  it("when the history opens, then the standing caution says the verdicts are Lintel's own rules on top of the cited sources", async () => {
    const detail = submittedDetail();
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/spaces/${isolationSpaceId}/audits`]: () =>
        jsonResponse({ audits: [detail.audit] }),
    });
    renderApp(`/spaces/${isolationSpaceId}/audits`);

    expect(await screen.findByRole("list", { name: "Audits" })).toBeTruthy();
    const caution = screen.getByRole("complementary", { name: "Caution" });
    expect(caution.textContent).toBe(cautionText);
    expect(caution.textContent).toContain("Lintel's own rules on top of the cited sources");
    expect(caution.textContent).toContain("not a certification");
  });

  it("when a submitted audit is opened, then it is read-only with readings in the unit entered, notes and photo thumbnails", async () => {
    const detail = submittedDetail();
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/audits/${auditId}`]: () => jsonResponse(detail),
    });
    renderApp(`/audits/${auditId}`);

    expect(await screen.findByRole("heading", { level: 1, name: "Isolation room 1" })).toBeTruthy();
    expect(screen.getByRole("heading", { level: 2, name: "Hold until fixed" })).toBeTruthy();
    const answers = screen.getByRole("list", { name: "All answers" });
    expect(within(answers).getByText("\u22120.008 in. w.c.")).toBeTruthy();
    expect(within(answers).getByText("100 cfm")).toBeTruthy();
    expect(within(answers).getByText("13.6 ACH")).toBeTruthy();
    expect(within(answers).getByText("Note: Monitor alarm silenced by the ward.")).toBeTruthy();
    const thumbnail = within(answers).getByRole("img", { name: /Photo 1 of: Pressure/ });
    expect(thumbnail.getAttribute("src")).toBe(`/api/images/${imageId}?variant=thumb`);
    expect(screen.queryByRole("button", { name: "Pass" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Submit audit" })).toBeNull();
  });
});

describe("why an audit's verdict is what it is", () => {
  it("when a submitted audit has reasons, then its page lists them in words with the rules version", async () => {
    const detail = submittedDetail();
    detail.audit = {
      ...detail.audit,
      rulesVersion: 2,
      verdictReasons: [`Critical item failed: ${detail.items[0]!.text}`, airflowNotConfirmedReason],
    };
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/audits/${auditId}`]: () => jsonResponse(detail),
    });
    renderApp(`/audits/${auditId}`);

    expect(await screen.findByRole("heading", { level: 2, name: "Hold until fixed" })).toBeTruthy();
    const why = screen.getByRole("list", { name: "Why" });
    expect(
      within(why)
        .getAllByRole("listitem")
        .map((li) => li.textContent),
    ).toEqual([`Critical item failed: ${detail.items[0]!.text}`, airflowNotConfirmedReason]);
    expect(screen.getByText("Decided by Lintel's readiness rules, version 2.")).toBeTruthy();
  });

  it("when a verdict was decided before reasons were kept, then the page says so and lists none", async () => {
    const detail = submittedDetail();
    detail.audit = { ...detail.audit, rulesVersion: 1, verdictReasons: null };
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      [`GET /api/audits/${auditId}`]: () => jsonResponse(detail),
    });
    renderApp(`/audits/${auditId}`);

    expect(await screen.findByRole("heading", { level: 2, name: "Hold until fixed" })).toBeTruthy();
    expect(screen.queryByRole("list", { name: "Why" })).toBeNull();
    expect(screen.getByText("Decided by Lintel's readiness rules, version 1.")).toBeTruthy();
  });
});

describe("the QR sheet", () => {
  it("when an administrator opens it, then every space has a code for its audit address, its name, zone type and floor", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(administrator),
      "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/schedule`]: () =>
        jsonResponse({
          entries: [
            {
              spaceId: isolationSpaceId,
              spaceName: "Isolation room 1",
              zoneType: "isolation_room",
              floorId: buildFloor().id,
              floorName: "Ward 4 East",
              cadenceDays: 7,
              lastAuditAt: null,
              dueAt: "2026-03-01T00:00:00.000Z",
              state: "overdue",
              verdict: null,
              lastAuditorName: null,
            },
          ],
        }),
    });
    renderApp(`/sites/${tamsinGeneral.id}/qr-sheet`);

    const code = await screen.findByRole("img", { name: "QR code to audit Isolation room 1" });
    expect(code.getAttribute("src")).toMatch(/^data:image\/svg\+xml/);
    const card = code.closest("li")!;
    expect(card.textContent).toContain("Isolation room · Ward 4 East");
    expect(card.textContent).toContain(
      `${window.location.origin}/spaces/${isolationSpaceId}/audit`,
    );
    expect(screen.getByRole("button", { name: "Print" })).toBeTruthy();
  });

  it("when an auditor opens it, then it is not available", async () => {
    stubApi({ "GET /api/auth/me": () => jsonResponse(auditor) });
    renderApp(`/sites/${tamsinGeneral.id}/qr-sheet`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
  });
});

describe("audit intervals", () => {
  it("when a site administrator changes a space's interval, then the number of days is sent and the list is asked for again", async () => {
    let scheduleRequests = 0;
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(administrator),
      "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/schedule`]: () => {
        scheduleRequests += 1;
        return jsonResponse({
          entries: [
            {
              spaceId: isolationSpaceId,
              spaceName: "Isolation room 1",
              zoneType: "isolation_room",
              floorId: buildFloor().id,
              floorName: "Ward 4 East",
              cadenceDays: 7,
              lastAuditAt: "2026-02-20T10:00:00.000Z",
              dueAt: "2026-02-27T10:00:00.000Z",
              state: "overdue",
              verdict: "ready",
              lastAuditorName: "Rowan Ellery",
            },
          ],
        });
      },
      [`PATCH /api/spaces/${isolationSpaceId}/cadence`]: () => jsonResponse({ cadenceDays: 3 }),
    });
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/due`);

    const entry = await screen.findByRole("listitem", { name: "Isolation room 1" });
    // Administrators set the schedule; auditors start the audits.
    expect(within(entry).queryByRole("link", { name: "Start audit" })).toBeNull();
    await user.click(within(entry).getByRole("button", { name: "Change interval" }));
    const days = within(entry).getByLabelText("Audit every (days)");
    await user.clear(days);
    await user.type(days, "3");
    await user.click(within(entry).getByRole("button", { name: "Save interval" }));

    await vi.waitFor(() => expect(scheduleRequests).toBe(2));
    expect(calls.find((call) => call.method === "PATCH")?.body).toEqual({ cadenceDays: 3 });
  });
});
