import type { UndeliveredMail } from "@shared/schemas/mail";
import { screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { actionId, buildAction, facilitiesLead, siteAuditor } from "./support/action-data";
import { administrator, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const interrupted: UndeliveredMail = {
  id: "5b6c7d8e-9f0a-4b1c-8d2e-3f4a5b6c7d8e",
  topic: "action_assigned",
  recipient: "jonah.whitlock@example.org",
  recipientName: "Jonah Whitlock",
  subject: "Corrective action for you: Doffing area 4",
  status: "uncertain",
  attempts: 1,
  queuedAt: "2026-03-30T08:00:00.000Z",
  lastTriedAt: "2026-03-30T08:00:01.000Z",
  problem: "Sending was interrupted; it is not sent again automatically, to avoid a duplicate.",
};
const refused: UndeliveredMail = {
  ...interrupted,
  id: "6c7d8e9f-0a1b-4c2d-8e3f-4a5b6c7d8e9f",
  topic: "invitation",
  recipient: "nia.calloway@example.org",
  recipientName: "Nia Calloway",
  subject: "You have been invited to Lintel",
  status: "failed",
  attempts: 12,
};

function asAdministrator(mail: () => UndeliveredMail[]) {
  return {
    "GET /api/auth/me": () => jsonResponse(administrator),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
    "GET /api/mail/undelivered": () => jsonResponse({ mail: mail() }),
  };
}

describe("e-mail that may not have arrived", () => {
  it("when an administrator opens the list, then each e-mail says what it was, to whom, when and why, in words", async () => {
    stubApi(asAdministrator(() => [interrupted, refused]));
    renderApp("/admin/undelivered-mail");

    const list = await screen.findByRole("list", { name: "E-mail that may not have arrived" });
    const [first, second] = within(list).getAllByRole("listitem");
    expect(within(first!).getByText("Corrective action assigned")).toBeTruthy();
    expect(
      within(first!).getByRole("heading", { name: "Corrective action for you: Doffing area 4" }),
    ).toBeTruthy();
    expect(within(first!).getByText("Jonah Whitlock (jonah.whitlock@example.org)")).toBeTruthy();
    expect(within(first!).getByText("May not have arrived")).toBeTruthy();
    expect(within(first!).getByText(/stopped while sending/)).toBeTruthy();
    expect(within(first!).getAllByRole("time")[0]!.getAttribute("dateTime")).toBe(
      interrupted.queuedAt,
    );
    expect(within(second!).getByText("Invitation to Lintel")).toBeTruthy();
    expect(within(second!).getByText("Not sent")).toBeTruthy();
    // Invitations carry a one-time link: the page says a new one may be needed.
    expect(within(second!).getByText(/works once and for a limited time/)).toBeTruthy();
  });

  it("when Resend is pressed twice quickly, then one request goes out and the e-mail leaves the list", async () => {
    let current = [interrupted];
    let release: () => void = () => undefined;
    const { calls } = stubApi({
      ...asAdministrator(() => current),
      [`POST /api/mail/${interrupted.id}/resend`]: () =>
        new Promise((resolve) => {
          release = () => {
            current = [];
            resolve(jsonResponse({ id: interrupted.id, status: "pending", resent: true }));
          };
        }),
    });
    const { user } = renderApp("/admin/undelivered-mail");

    const button = await screen.findByRole("button", { name: "Resend" });
    await user.click(button);
    const busy = await screen.findByRole("button", { name: "Sending again…" });
    expect((busy as HTMLButtonElement).disabled).toBe(true);
    await user.click(busy);
    release();

    expect(await screen.findByRole("heading", { name: "No e-mail in doubt" })).toBeTruthy();
    expect(calls.filter((call) => call.method === "POST")).toEqual([
      { method: "POST", path: `/api/mail/${interrupted.id}/resend`, body: {} },
    ]);
  });

  it("when a network administrator's home page opens with e-mail in doubt, then a notice counts it and links to the list", async () => {
    stubApi(asAdministrator(() => [interrupted, refused]));
    renderApp("/");

    const link = await screen.findByRole("link", { name: "Review and resend" });
    expect(screen.getByText("2 e-mails may not have arrived")).toBeTruthy();
    expect(link.getAttribute("href")).toBe("/admin/undelivered-mail");
  });

  it("when a facilities lead opens the list's address, then it is not available and nothing is asked of the server", async () => {
    const { calls } = stubApi({
      "GET /api/auth/me": () => jsonResponse(facilitiesLead),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/my/actions": () => jsonResponse({ actions: [] }),
    });
    renderApp("/admin/undelivered-mail");

    await screen.findByRole("heading", { level: 1, name: /not available/i });
    expect(calls.some((call) => call.path.startsWith("/api/mail"))).toBe(false);
  });
});

describe("fixes to check on the auditor's home page", () => {
  it("when a fix waits for its check at the auditor's site, then their home page lists it with its severity and state in words", async () => {
    const waiting = buildAction({ state: "to_check" });
    stubApi({
      "GET /api/auth/me": () => jsonResponse(siteAuditor),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
      "GET /api/my/checks": () => jsonResponse({ actions: [waiting] }),
      "GET /api/my/due": () => jsonResponse({ spaces: [] }),
    });
    renderApp("/");

    const list = await screen.findByRole("list", { name: "Fixes to check" });
    const card = within(list).getByRole("link");
    expect(card.getAttribute("href")).toBe(`/actions/${actionId}`);
    expect(within(card).getByText("Critical")).toBeTruthy();
    expect(within(card).getByText("Fix to check")).toBeTruthy();
    expect(within(card).getByText(/fixed by Jonah Whitlock/)).toBeTruthy();
    await waitFor(() => expect(screen.queryByText(/could not be loaded/)).toBeNull());
  });
});
