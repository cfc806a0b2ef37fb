import { providerProblemReasons } from "@shared/schemas/identity-provider";
import { cleanup, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { holdSignedOutNotice } from "@/app/signed-out-notice";
import { providerProblemTexts } from "@/features/auth/lib/provider-problems";
import { leaveAppFor } from "@/lib/leave-app";

import { auditor, jsonResponse, signedOutReply, stubApi, tamsinGeneral } from "./support/api-stub";
import { renderApp } from "./support/render-app";

// Handing the tab to the provider cannot happen in this document: note where it would go.
vi.mock("@/lib/leave-app", () => ({ leaveAppFor: vi.fn() }));

afterEach(() => {
  vi.unstubAllGlobals();
  vi.mocked(leaveAppFor).mockClear();
  sessionStorage.clear();
  localStorage.clear();
});

const requestId = "6f1c2d3e-4a5b-4c6d-8e7f-9a0b1c2d3e4f";

describe("the page a provider sign-in ends on without a session", () => {
  it("when the person is unknown to the network, then the page says to ask the administrator for an invitation and shows the request id", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    renderApp(`/sign-in/problem?reason=unknown&request=${requestId}`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "Lintel does not know you yet" }),
    ).toBeTruthy();
    expect(screen.getByText(/ask your administrator to invite you/i)).toBeTruthy();
    expect(screen.getByText("Reference for your help desk")).toBeTruthy();
    expect(screen.getByTestId("request-id").textContent).toBe(requestId);
    expect(screen.getByRole("link", { name: "Back to sign in" }).getAttribute("href")).toBe(
      "/sign-in",
    );
  });

  it("when each reason of the contract is given, then each has its own heading and words", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    const headings = new Set<string>();
    for (const reason of providerProblemReasons) {
      renderApp(`/sign-in/problem?reason=${reason}&request=${requestId}`);
      const heading = await screen.findByRole("heading", { level: 1 });
      expect(heading.textContent).toBe(providerProblemTexts[reason].title);
      expect(screen.getByText(providerProblemTexts[reason].explanation)).toBeTruthy();
      headings.add(heading.textContent);
      cleanup();
    }
    expect(headings.size).toBe(providerProblemReasons.length);
  });

  it("when the address carries an unknown reason and a request id not shaped like one, then neither is shown", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    const planted = "<b>Call 0800 000 000 to unlock your account</b>";
    renderApp(
      `/sign-in/problem?reason=${encodeURIComponent(planted)}&request=${encodeURIComponent(planted)}`,
    );

    expect(
      await screen.findByRole("heading", { level: 1, name: "Signing in did not finish" }),
    ).toBeTruthy();
    expect(document.body.textContent).not.toContain("0800");
    expect(screen.queryByText("Reference for your help desk")).toBeNull();
  });

  it("when the reason names a property every object has, then the general words are shown", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    renderApp("/sign-in/problem?reason=constructor&request=short");

    expect(
      await screen.findByRole("heading", { level: 1, name: "Signing in did not finish" }),
    ).toBeTruthy();
    expect(screen.queryByText("Reference for your help desk")).toBeNull();
  });
});

describe("signing out of a session begun through the provider", () => {
  const signedIn = {
    "GET /api/auth/me": () => jsonResponse(auditor),
    "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
  };

  it("when the server offers the provider's sign-out page, then the browser goes there once Lintel's session has ended", async () => {
    const providerSignOutUrl =
      "http://127.0.0.1:4455/session/end?client_id=lintel&post_logout_redirect_uri=x";
    const { calls } = stubApi({
      ...signedIn,
      "POST /api/auth/sign-out": () => jsonResponse({ providerSignOutUrl }),
    });
    const { user, queryClient } = renderApp("/account");

    await user.click(await screen.findByRole("button", { name: "Sign out" }));

    await vi.waitFor(() => expect(leaveAppFor).toHaveBeenCalledWith(providerSignOutUrl));
    expect(calls.some((call) => call.method === "POST" && call.path === "/api/auth/sign-out")).toBe(
      true,
    );
    expect(queryClient.getQueryData(["sessions", "me"])).toBeNull();
  });

  it("when the server answers 204, then the person lands on sign-in and nothing leaves the app", async () => {
    stubApi({ ...signedIn, "POST /api/auth/sign-out": () => new Response(null, { status: 204 }) });
    const { user } = renderApp("/account");

    await user.click(await screen.findByRole("button", { name: "Sign out" }));

    expect(
      await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" }),
    ).toBeTruthy();
    expect(leaveAppFor).not.toHaveBeenCalled();
  });

  it("when the offered address is not a web address, then it is not followed and the person lands on sign-in", async () => {
    stubApi({
      ...signedIn,
      "POST /api/auth/sign-out": () => jsonResponse({ providerSignOutUrl: "javascript:alert(1)" }),
    });
    const { user } = renderApp("/account");

    await user.click(await screen.findByRole("button", { name: "Sign out" }));

    expect(
      await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" }),
    ).toBeTruthy();
    expect(leaveAppFor).not.toHaveBeenCalled();
  });

  it("when the provider sends the browser back to sign-in, then the notice held for it is shown once", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    holdSignedOutNotice({ signedOut: { kept: true, reachedLintel: true } });
    renderApp("/sign-in");

    const notice = (await screen.findByText("Signed out on this phone")).closest("[role=status]");
    expect(notice?.textContent).toContain("Your unsent work stays on this phone");
    cleanup();

    renderApp("/sign-in");
    await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" });
    expect(screen.queryByText("Signed out on this phone")).toBeNull();
  });
});
