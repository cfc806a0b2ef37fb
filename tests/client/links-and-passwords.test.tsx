import { screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  auditor,
  errorResponse,
  jsonResponse,
  orchardHill,
  signedOutReply,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const token = "DjJKcYt4HLTOnHljWBBTJAIs2m_-Wr1_085kFTZGPyY";
const newcomer = {
  user: {
    id: "4fad6e30-7b8c-4d9e-8f01-2b3c4d5e6f70",
    email: "priya.nair@example.org",
    name: "Priya Nair",
  },
  roles: [{ role: "auditor" as const, siteId: tamsinGeneral.id }],
};
const sites = () => jsonResponse({ sites: [tamsinGeneral, orchardHill] });
const goodPassword = "kettle on the third floor landing";

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("welcome page", () => {
  const invitation = {
    [`GET /api/invitations/${token}`]: () =>
      jsonResponse({
        email: "priya.nair@example.org",
        name: "Priya Nair",
        expiresAt: "2099-01-08T09:00:00.000Z",
      }),
  };

  it("when the two passwords differ, then the repeat field says so and nothing is sent", async () => {
    const { calls } = stubApi(invitation);
    const { user } = renderApp(`/welcome/${token}`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "Welcome, Priya Nair" }),
    ).toBeTruthy();
    expect(screen.getByText("priya.nair@example.org")).toBeTruthy();
    const password = screen.getByLabelText("New password");
    expect(describedText(password)).toContain(
      "At least 12 characters. Long phrases are good; common passwords are refused.",
    );
    await user.type(password, goodPassword);
    await user.type(screen.getByLabelText("Repeat password"), `${goodPassword}!`);
    await user.click(screen.getByRole("button", { name: "Set password and sign in" }));

    const repeat = screen.getByLabelText("Repeat password");
    await vi.waitFor(() => expect(repeat.getAttribute("aria-invalid")).toBe("true"));
    expect(describedText(repeat)).toContain("The two passwords are not the same.");
    expect(calls.some((call) => call.method === "POST")).toBe(false);
  });

  it("when the server refuses a common password, then its message appears beside the password", async () => {
    stubApi({
      ...invitation,
      [`POST /api/invitations/${token}/accept`]: () =>
        errorResponse(400, "validation_failed", "Check the highlighted fields.", {
          password: "This password is too common. Try a longer phrase.",
        }),
    });
    const { user } = renderApp(`/welcome/${token}`);

    await user.type(await screen.findByLabelText("New password"), "password1234");
    await user.type(screen.getByLabelText("Repeat password"), "password1234");
    await user.click(screen.getByRole("button", { name: "Set password and sign in" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("New password"))).toContain("too common"),
    );
  });

  it("when the password is accepted, then the newcomer is signed in and lands on their sites", async () => {
    const { calls } = stubApi({
      ...invitation,
      [`POST /api/invitations/${token}/accept`]: () => jsonResponse(newcomer),
      "GET /api/sites": sites,
    });
    const { router, user } = renderApp(`/welcome/${token}`);

    await user.type(await screen.findByLabelText("New password"), goodPassword);
    await user.type(screen.getByLabelText("Repeat password"), goodPassword);
    await user.click(screen.getByRole("button", { name: "Set password and sign in" }));

    expect(await screen.findByRole("heading", { level: 1, name: "My sites" })).toBeTruthy();
    expect(screen.getByText(/Hello Priya/)).toBeTruthy();
    expect(router.state.location.pathname).toBe("/");
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({ password: goodPassword });
    // Signed in by the reply itself: the session is not asked for again, nor the spent link.
    expect(calls.some((call) => call.path === "/api/auth/me")).toBe(false);
    expect(calls.filter((call) => call.path === `/api/invitations/${token}`)).toHaveLength(1);
  });

  it("when the link was used or replaced, then the server's message and a way to sign in are shown", async () => {
    stubApi({
      [`GET /api/invitations/${token}`]: () =>
        errorResponse(410, "link_invalid", "This invitation has been replaced by a newer one."),
    });
    renderApp(`/welcome/${token}`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "This link no longer works" }),
    ).toBeTruthy();
    expect(screen.getByText("This invitation has been replaced by a newer one.")).toBeTruthy();
    expect(screen.getByRole("link", { name: "Go to sign in" }).getAttribute("href")).toBe(
      "/sign-in",
    );
  });
});

describe("forgotten and reset passwords", () => {
  it("when the address may sign in with a password, then the sign-in page offers a way to reset a forgotten one", async () => {
    stubApi({
      "GET /api/auth/me": signedOutReply,
      "POST /api/auth/sign-in/method": () => jsonResponse({ password: true, provider: null }),
    });
    const { user } = renderApp("/sign-in");

    await user.type(await screen.findByLabelText("E-mail"), "priya.nair@example.org");
    expect(screen.queryByRole("link", { name: "Forgot your password?" })).toBeNull();
    await user.click(screen.getByRole("button", { name: "Continue" }));

    expect(
      (await screen.findByRole("link", { name: "Forgot your password?" })).getAttribute("href"),
    ).toBe("/forgot-password");
  });

  it("when the address signs in only through its provider, then no password or reset is offered", async () => {
    stubApi({
      "GET /api/auth/me": signedOutReply,
      "POST /api/auth/sign-in/method": () =>
        jsonResponse({
          password: false,
          provider: { name: "Tamsin Bay Health", startUrl: "/api/auth/provider/start?network=x" },
        }),
    });
    const { user } = renderApp("/sign-in");

    await user.type(await screen.findByLabelText("E-mail"), "priya.nair@tamsinbay.example");
    await user.click(screen.getByRole("button", { name: "Continue" }));

    expect(
      await screen.findByRole("link", { name: "Sign in with Tamsin Bay Health" }),
    ).toBeTruthy();
    expect(screen.queryByLabelText("Password")).toBeNull();
    expect(screen.queryByRole("link", { name: "Forgot your password?" })).toBeNull();
  });

  it("when a reset link is asked for, then the server's answer is shown", async () => {
    const message = "If that address has an account, a reset link is on its way.";
    const { calls } = stubApi({
      "POST /api/auth/password-reset": () => jsonResponse({ message }, 202),
    });
    const { user } = renderApp("/forgot-password");

    expect(
      await screen.findByRole("heading", { level: 1, name: "Reset your password" }),
    ).toBeTruthy();
    await user.type(screen.getByLabelText("E-mail"), " Priya.Nair@example.org");
    await user.click(screen.getByRole("button", { name: "Send reset link" }));

    expect(await screen.findByText(message)).toBeTruthy();
    expect(calls[0]?.body).toEqual({ email: "priya.nair@example.org" });
  });

  it("when a new password is chosen from a reset link, then the person is signed in", async () => {
    stubApi({
      [`GET /api/auth/password-reset/${token}`]: () =>
        jsonResponse({ email: "priya.nair@example.org", expiresAt: "2099-01-01T10:00:00.000Z" }),
      [`POST /api/auth/password-reset/${token}`]: () => jsonResponse(newcomer),
      "GET /api/sites": sites,
    });
    const { user } = renderApp(`/reset-password/${token}`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "Choose a new password" }),
    ).toBeTruthy();
    await user.type(screen.getByLabelText("New password"), goodPassword);
    await user.type(screen.getByLabelText("Repeat password"), goodPassword);
    await user.click(screen.getByRole("button", { name: "Change password and sign in" }));

    expect(await screen.findByRole("heading", { level: 1, name: "My sites" })).toBeTruthy();
  });

  it("when a reset link has expired, then the page offers a new one", async () => {
    stubApi({
      [`GET /api/auth/password-reset/${token}`]: () =>
        errorResponse(410, "link_invalid", "This reset link has expired."),
    });
    renderApp(`/reset-password/${token}`);

    expect(await screen.findByText("This reset link has expired.")).toBeTruthy();
    expect(
      screen.getByRole("link", { name: "Ask for a new reset link" }).getAttribute("href"),
    ).toBe("/forgot-password");
  });
});

describe("account", () => {
  const signedIn = {
    "GET /api/auth/me": () => jsonResponse(auditor),
    "GET /api/sites": sites,
  };

  it("when the name is changed, then it is saved and shown", async () => {
    const { calls } = stubApi({
      ...signedIn,
      "PATCH /api/auth/me": () =>
        jsonResponse({ ...auditor, user: { ...auditor.user, name: "Rowan Ellery-Shaw" } }),
    });
    const { user } = renderApp("/account");

    const name = await screen.findByLabelText("Name");
    await user.clear(name);
    await user.type(name, "  Rowan Ellery-Shaw ");
    await user.click(screen.getByRole("button", { name: "Save name" }));

    expect(await screen.findByText("Your name is saved.")).toBeTruthy();
    expect(calls.find((call) => call.method === "PATCH")?.body).toEqual({
      name: "Rowan Ellery-Shaw",
    });
  });

  it("when the current password is wrong, then the server's message appears beside it", async () => {
    stubApi({
      ...signedIn,
      "POST /api/auth/me/password": () =>
        errorResponse(400, "validation_failed", "Check the highlighted fields.", {
          currentPassword: "That is not your current password.",
        }),
    });
    const { user } = renderApp("/account");

    await user.type(await screen.findByLabelText("Current password"), "not it at all");
    await user.type(screen.getByLabelText("New password"), goodPassword);
    await user.type(screen.getByLabelText("Repeat new password"), goodPassword);
    await user.click(screen.getByRole("button", { name: "Change password" }));

    await vi.waitFor(() =>
      expect(describedText(screen.getByLabelText("Current password"))).toContain(
        "That is not your current password.",
      ),
    );
  });

  it("when too many current passwords were wrong, then the form says so, how long to wait, and that nothing changed", async () => {
    stubApi({
      ...signedIn,
      "POST /api/auth/me/password": () =>
        errorResponse(
          429,
          "rate_limited",
          "Too many wrong passwords. For your safety, try again in 15 minute(s).",
        ),
    });
    const { user } = renderApp("/account");

    await user.type(await screen.findByLabelText("Current password"), "correct horse battery");
    await user.type(screen.getByLabelText("New password"), goodPassword);
    await user.type(screen.getByLabelText("Repeat new password"), goodPassword);
    await user.click(screen.getByRole("button", { name: "Change password" }));

    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toContain("Password change paused");
    expect(alert.textContent).toContain("Too many wrong passwords");
    expect(alert.textContent).toContain("try again in 15 minute(s)");
    expect(alert.textContent).toContain("Your password has not changed.");
  });

  it("when the password is changed, then the page says other devices were signed out", async () => {
    const { calls } = stubApi({
      ...signedIn,
      "POST /api/auth/me/password": () => new Response(null, { status: 204 }),
    });
    const { user } = renderApp("/account");

    await user.type(await screen.findByLabelText("Current password"), "correct horse battery");
    await user.type(screen.getByLabelText("New password"), goodPassword);
    await user.type(screen.getByLabelText("Repeat new password"), goodPassword);
    await user.click(screen.getByRole("button", { name: "Change password" }));

    expect((await screen.findByText(/have been signed out/)).textContent).toContain(
      "other phones or computers",
    );
    expect(calls.find((call) => call.path === "/api/auth/me/password")?.body).toEqual({
      currentPassword: "correct horse battery",
      newPassword: goodPassword,
    });
  });
});
