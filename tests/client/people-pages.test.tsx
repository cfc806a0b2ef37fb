import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  administrator,
  auditor,
  buildPerson,
  errorResponse,
  jsonResponse,
  manageableSites,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const priya = buildPerson();
const peopleReply = () =>
  jsonResponse({ people: [priya], manageableSites, canGrantNetworkWide: true });

function signedInAsAdministrator({ demoMailbox = true } = {}) {
  return {
    "GET /api/auth/me": () => jsonResponse(administrator),
    "GET /api/app-config": () => jsonResponse({ demoMailbox }),
    "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral, orchardHill] }),
    "GET /api/people": peopleReply,
  };
}

const signedInAsAuditor = {
  "GET /api/auth/me": () => jsonResponse(auditor),
  "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral, orchardHill] }),
};

function navigationLinks(): string[] {
  return within(screen.getByRole("navigation", { name: "Main" }))
    .getAllByRole("link")
    .map((link) => link.textContent ?? "");
}

describe("who sees people and the mailbox", () => {
  it("when an auditor is signed in, then navigation shows neither People nor Demo e-mails", async () => {
    const { calls } = stubApi(signedInAsAuditor);
    renderApp("/");

    await screen.findByRole("heading", { level: 1, name: "My sites" });
    // This auditor is also a facilities lead at another site, so their own actions are listed.
    expect(navigationLinks()).toEqual(["Sites", "Fixes", "Account"]);
    expect(calls.some((call) => call.path === "/api/app-config")).toBe(false);
  });

  it("when a network administrator is signed in where the local mail catcher runs, then Admin (on phones) and People and Demo e-mails (in the side rail) are shown, and the Admin page lists them", async () => {
    stubApi(signedInAsAdministrator());
    const { user } = renderApp("/");

    await screen.findByRole("heading", { level: 1, name: "My sites" });
    // Admin shows only in the phone's bar, the pages behind it only in the side rail (by CSS).
    await vi.waitFor(() =>
      expect(navigationLinks()).toEqual([
        "Sites",
        "Committee",
        "Admin",
        "People",
        "Checklists",
        "Observation steps",
        "Demo e-mails",
        "Account",
      ]),
    );
    expect(screen.getByRole("link", { name: "People" }).getAttribute("href")).toBe("/admin/people");

    await user.click(screen.getByRole("link", { name: "Admin" }));
    await screen.findByRole("heading", { level: 1, name: "Admin" });
    const main = within(screen.getByRole("main"));
    await vi.waitFor(() =>
      expect(main.getAllByRole("link").map((link) => link.textContent)).toEqual([
        expect.stringMatching(/^People/),
        expect.stringMatching(/^Checklists/),
        expect.stringMatching(/^Observation steps/),
        expect.stringMatching(/^Sign-in/),
        expect.stringMatching(/^Undelivered mail/),
        expect.stringMatching(/^Demo e-mails/),
      ]),
    );
  });

  it("when the local mail catcher does not run, then the administrator sees People but no Demo e-mails", async () => {
    stubApi(signedInAsAdministrator({ demoMailbox: false }));
    renderApp("/");

    await screen.findByRole("heading", { level: 1, name: "My sites" });
    await vi.waitFor(() =>
      expect(navigationLinks()).toEqual([
        "Sites",
        "Committee",
        "Admin",
        "People",
        "Checklists",
        "Observation steps",
        "Account",
      ]),
    );
  });

  it("when an auditor opens the people page directly, then it is not available and nothing is asked of the server", async () => {
    const { calls } = stubApi(signedInAsAuditor);
    renderApp("/admin/people");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
    expect(calls.some((call) => call.path.startsWith("/api/people"))).toBe(false);
  });

  it("when the local mail catcher does not run and the mailbox is opened directly, then it is not available", async () => {
    const { calls } = stubApi(signedInAsAdministrator({ demoMailbox: false }));
    renderApp("/admin/mail");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
    expect(calls.some((call) => call.path === "/api/dev/mailbox")).toBe(false);
  });
});

describe("people page", () => {
  it("when an administrator opens it, then the people are listed with a way to invite someone", async () => {
    stubApi(signedInAsAdministrator());
    renderApp("/admin/people");

    expect(await screen.findByRole("heading", { level: 1, name: "People" })).toBeTruthy();
    const table = await screen.findByRole("table", { name: "People" });
    expect(within(table).getByRole("link", { name: priya.name })).toBeTruthy();
    expect(screen.getByRole("link", { name: "Invite someone" }).getAttribute("href")).toBe(
      "/admin/people/invite",
    );
  });

  it("when an invitation is sent, then the person's page opens saying so", async () => {
    const invited = buildPerson({
      status: "invited",
      invitationExpiresAt: "2099-01-08T09:00:00.000Z",
    });
    const { calls } = stubApi({
      ...signedInAsAdministrator(),
      "POST /api/people/invitations": () => jsonResponse({ person: invited }, 201),
      [`GET /api/people/${invited.id}`]: () => jsonResponse({ person: invited }),
    });
    const { router, user } = renderApp("/admin/people/invite");

    expect(await screen.findByRole("heading", { level: 1, name: "Invite someone" })).toBeTruthy();
    await user.type(await screen.findByLabelText("Name"), "Priya Nair");
    await user.type(screen.getByLabelText("E-mail"), "priya.nair@example.org");
    await user.selectOptions(screen.getByLabelText("Role"), "Auditor");
    await user.selectOptions(screen.getByLabelText("Site"), tamsinGeneral.name);
    await user.click(screen.getByRole("button", { name: "Send invitation" }));

    expect(await screen.findByText("Invitation sent to priya.nair@example.org.")).toBeTruthy();
    expect(router.state.location.pathname).toBe(`/admin/people/${invited.id}`);
    expect(screen.getByRole("heading", { level: 1, name: "Priya Nair" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "Send a new invitation" })).toBeTruthy();
    expect(screen.getByText(/works until/).textContent).toContain("2099");
    expect(calls.filter((call) => call.method === "POST")).toHaveLength(1);
  });
});

describe("person page", () => {
  it("when a role is removed and the removal confirmed, then it is taken away", async () => {
    let current = priya;
    const { calls } = stubApi({
      ...signedInAsAdministrator(),
      [`GET /api/people/${priya.id}`]: () => jsonResponse({ person: current }),
      [`DELETE /api/people/${priya.id}/grants/${priya.grants[0]!.id}`]: () => {
        current = { ...priya, grants: [] };
        return jsonResponse({ person: current });
      },
    });
    const { user } = renderApp(`/admin/people/${priya.id}`);

    await user.click(
      await screen.findByRole("button", { name: `Remove Auditor · ${tamsinGeneral.name}` }),
    );
    const confirm = screen.getByRole("group", { name: /^Remove Auditor/ });
    expect(document.activeElement).toBe(confirm);
    expect(calls.some((call) => call.method === "DELETE")).toBe(false);

    await user.click(within(confirm).getByRole("button", { name: "Yes, remove" }));

    expect(await screen.findByText("Priya Nair holds no roles at the moment.")).toBeTruthy();
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(1);
  });

  it("when someone is deactivated with a reason, then the reason is sent and Reactivate is offered", async () => {
    const deactivated = {
      ...priya,
      status: "deactivated" as const,
      deactivatedAt: "2026-03-02T08:15:00.000Z",
    };
    let current = priya;
    const { calls } = stubApi({
      ...signedInAsAdministrator(),
      [`GET /api/people/${priya.id}`]: () => jsonResponse({ person: current }),
      [`POST /api/people/${priya.id}/deactivate`]: () => {
        current = deactivated;
        return jsonResponse({ person: current });
      },
    });
    const { user } = renderApp(`/admin/people/${priya.id}`);

    await user.click(await screen.findByRole("button", { name: "Deactivate" }));
    const confirm = screen.getByRole("group", { name: "Deactivate Priya Nair?" });
    expect(confirm.textContent).toContain("signs Priya Nair out on every device");
    await user.type(within(confirm).getByLabelText("Reason (optional)"), "Left the trust");
    await user.click(within(confirm).getByRole("button", { name: "Deactivate and sign out" }));

    expect(await screen.findByRole("button", { name: "Reactivate" })).toBeTruthy();
    expect(screen.getByText("Priya Nair is deactivated and signed out everywhere.")).toBeTruthy();
    expect(calls.find((call) => call.path.endsWith("/deactivate"))?.body).toEqual({
      reason: "Left the trust",
    });
  });

  it("when a role is given that the person already holds, then the server's answer is shown", async () => {
    stubApi({
      ...signedInAsAdministrator(),
      [`GET /api/people/${priya.id}`]: () => jsonResponse({ person: priya }),
      [`POST /api/people/${priya.id}/grants`]: () =>
        errorResponse(409, "conflict", "Priya Nair already holds this role there."),
    });
    const { user } = renderApp(`/admin/people/${priya.id}`);

    const form = (await screen.findByRole("heading", { name: "Give a role" })).closest("form")!;
    await user.selectOptions(within(form).getByLabelText("Role"), "Auditor");
    await user.selectOptions(within(form).getByLabelText("Site"), tamsinGeneral.name);
    await user.click(within(form).getByRole("button", { name: "Give role" }));

    expect((await screen.findByRole("alert")).textContent).toContain(
      "Priya Nair already holds this role there.",
    );
  });
});

describe("mailbox", () => {
  it("when messages have arrived, then each shows who it is for and opens to a clickable link", async () => {
    const link = "http://localhost:5173/welcome/DjJKcYt4HLTOnHljWBBTJAIs2m_-Wr1_085kFTZGPyY";
    stubApi({
      ...signedInAsAdministrator(),
      "GET /api/dev/mailbox": () =>
        jsonResponse({
          messages: [
            {
              id: "m-1",
              to: ["priya.nair@example.org"],
              from: "Lintel <no-reply@lintel.invalid>",
              subject: "You are invited to Lintel",
              text: `Hello Priya,\n\nSet your password here: ${link}.\n`,
              html: null,
              receivedAt: "2026-03-02T08:15:00.000Z",
            },
          ],
        }),
    });
    const { user } = renderApp("/admin/mail");

    expect(await screen.findByRole("heading", { level: 1, name: "Demo e-mails" })).toBeTruthy();
    // A visible note, not only a tooltip: real deployments send real mail instead.
    expect(screen.getByText(/A real deployment sends real e-mail/)).toBeTruthy();
    const toggle = await screen.findByRole("button", { name: /You are invited to Lintel/ });
    expect(toggle.textContent).toContain("To: priya.nair@example.org");
    expect(toggle.getAttribute("aria-expanded")).toBe("false");

    await user.click(toggle);

    expect(toggle.getAttribute("aria-expanded")).toBe("true");
    expect(screen.getByRole("link", { name: link }).getAttribute("href")).toBe(link);
  });
});
