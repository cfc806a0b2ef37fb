import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { MemoryRouter } from "react-router-dom";
import { afterEach, describe, expect, it, vi } from "vitest";

import { SignInForm } from "@/features/auth/components/sign-in-form";
import { providerStartHref } from "@/features/auth/lib/provider-start";
import { createQueryClient } from "@/lib/query-client";
import { leaveAppFor } from "@/lib/leave-app";
import { setSignOutPending, signOutPending } from "@/lib/phone-person";

import { auditor, errorResponse, jsonResponse, stubApi } from "./support/api-stub";

// Handing the tab to the provider cannot happen in this document: note where it would go.
vi.mock("@/lib/leave-app", () => ({ leaveAppFor: vi.fn() }));

afterEach(() => {
  vi.unstubAllGlobals();
  vi.mocked(leaveAppFor).mockClear();
  localStorage.clear();
});

const passwordOnly = { password: true, provider: null };
const startUrl = "/api/auth/provider/start?network=2f0c1a52-8a61-4d1e-9a0e-6f3b8b1b7c11";
const providerOnly = { password: false, provider: { name: "Tamsin Bay Health", startUrl } };
const both = { password: true, provider: { name: "Tamsin Bay Health", startUrl } };

function renderForm(next = "/") {
  const onSuccess = vi.fn();
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <SignInForm next={next} forgotPasswordHref="/forgot-password" onSuccess={onSuccess} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  return { user, onSuccess };
}

async function continueWith(user: ReturnType<typeof userEvent.setup>, email: string) {
  await user.type(screen.getByLabelText("E-mail"), email);
  await user.click(screen.getByRole("button", { name: "Continue" }));
}

async function fillAndSubmit(
  user: ReturnType<typeof userEvent.setup>,
  email: string,
  password: string,
) {
  await continueWith(user, email);
  await user.type(await screen.findByLabelText("Password"), password);
  await user.click(screen.getByRole("button", { name: "Sign in" }));
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("SignInForm: the address first", () => {
  it("when the page opens, then it asks for the e-mail address only, and lists no provider", () => {
    stubApi({});
    renderForm();

    expect(screen.getByLabelText("E-mail")).toBeTruthy();
    expect(screen.queryByLabelText("Password")).toBeNull();
    expect(screen.queryByRole("link", { name: /Sign in with/ })).toBeNull();
    expect(screen.queryByRole("link", { name: "Forgot your password?" })).toBeNull();
  });

  it("when Continue is pressed with no address, then the field shows its error and nothing is sent", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Continue" }));

    const email = screen.getByLabelText("E-mail");
    expect(
      await screen.findByText("Enter an e-mail address such as name@example.org."),
    ).toBeTruthy();
    expect(email.getAttribute("aria-invalid")).toBe("true");
    expect(describedText(email)).toContain("Enter an e-mail address such as name@example.org.");
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the address may use a password, then the normalised address is asked about and the password field takes focus", async () => {
    const { calls } = stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
    });
    const { user } = renderForm();

    await continueWith(user, "  Rowan.Ellery@Example.org ");

    const password = await screen.findByLabelText("Password");
    await vi.waitFor(() => expect(document.activeElement).toBe(password));
    expect(calls[0]).toMatchObject({
      method: "POST",
      path: "/api/auth/sign-in/method",
      body: { email: "rowan.ellery@example.org" },
    });
    expect(screen.queryByRole("link", { name: /Sign in with/ })).toBeNull();
    expect(screen.getByRole("link", { name: "Forgot your password?" })).toBeTruthy();
  });

  it("when the address's network signs in only through its provider, then only the provider's link is offered, carrying the page to come back to", async () => {
    stubApi({ "POST /api/auth/sign-in/method": () => jsonResponse(providerOnly) });
    const { user } = renderForm("/committee?from=2026-01-01");

    await continueWith(user, "committee@example.org");

    const link = await screen.findByRole("link", { name: "Sign in with Tamsin Bay Health" });
    const href = new URL(link.getAttribute("href")!, "https://lintel.example");
    expect(href.pathname).toBe("/api/auth/provider/start");
    expect(href.searchParams.get("network")).toBe("2f0c1a52-8a61-4d1e-9a0e-6f3b8b1b7c11");
    expect(href.searchParams.get("next")).toBe("/committee?from=2026-01-01");
    await vi.waitFor(() => expect(document.activeElement).toBe(link));
    expect(screen.queryByLabelText("Password")).toBeNull();
    expect(screen.queryByRole("button", { name: "Sign in" })).toBeNull();
    expect(screen.queryByRole("link", { name: "Forgot your password?" })).toBeNull();
  });

  it("when both are allowed, then the provider's link and the password field are offered, and the link adds no next for home", async () => {
    stubApi({ "POST /api/auth/sign-in/method": () => jsonResponse(both) });
    const { user } = renderForm("/");

    await continueWith(user, "committee@example.org");

    const link = await screen.findByRole("link", { name: "Sign in with Tamsin Bay Health" });
    expect(link.getAttribute("href")).toBe(startUrl);
    // The organisation's sign-in takes focus: no keyboard opens over it.
    await vi.waitFor(() => expect(document.activeElement).toBe(link));
    expect(screen.getByLabelText("Password")).toBeTruthy();
    expect(screen.getByRole("button", { name: "Sign in" })).toBeTruthy();
    expect(screen.getByRole("link", { name: "Forgot your password?" })).toBeTruthy();
  });

  it("when the address is changed after Continue, then the choices go and the new address is asked about", async () => {
    const { calls } = stubApi({
      "POST /api/auth/sign-in/method": (request) =>
        jsonResponse(
          (request.body as { email: string }).email.endsWith("@example.org") ? both : passwordOnly,
        ),
    });
    const { user } = renderForm();

    await continueWith(user, "committee@example.org");
    await screen.findByRole("link", { name: "Sign in with Tamsin Bay Health" });

    await user.clear(screen.getByLabelText("E-mail"));
    expect(screen.queryByRole("link", { name: /Sign in with/ })).toBeNull();
    expect(screen.queryByLabelText("Password")).toBeNull();
    await continueWith(user, "someone@elsewhere.example");

    expect(await screen.findByLabelText("Password")).toBeTruthy();
    expect(screen.queryByRole("link", { name: /Sign in with/ })).toBeNull();
    expect(calls.map((call) => (call.body as { email: string }).email)).toEqual([
      "committee@example.org",
      "someone@elsewhere.example",
    ]);
  });

  it("when asking how to sign in is refused, then the server's message is announced", async () => {
    stubApi({
      "POST /api/auth/sign-in/method": () =>
        errorResponse(429, "rate_limited", "Too many attempts. Try again in a few minutes."),
    });
    const { user } = renderForm();

    await continueWith(user, "rowan.ellery@example.org");

    expect((await screen.findByRole("alert")).textContent).toContain(
      "Too many attempts. Try again in a few minutes.",
    );
    expect(screen.queryByLabelText("Password")).toBeNull();
  });

  it("when someone signed out here with no signal, then following the provider's link ends that session first", async () => {
    const { calls } = stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(providerOnly),
      "POST /api/auth/sign-out": () => new Response(null, { status: 204 }),
    });
    const { user } = renderForm();
    await continueWith(user, "committee@example.org");
    const link = await screen.findByRole("link", { name: "Sign in with Tamsin Bay Health" });
    // Pending again after the method was asked: the link itself settles it before leaving.
    setSignOutPending(true);
    calls.length = 0;

    await user.click(link);

    await vi.waitFor(() => expect(leaveAppFor).toHaveBeenCalledWith(startUrl));
    expect(calls.map((call) => `${call.method} ${call.path}`)).toEqual(["POST /api/auth/sign-out"]);
    expect(signOutPending()).toBe(false);
  });
});

describe("SignInForm: the password", () => {
  it("when the password is left empty, then its field shows its error and no sign-in is sent", async () => {
    const { calls } = stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
    });
    const { user } = renderForm();

    await continueWith(user, "rowan.ellery@example.org");
    await screen.findByLabelText("Password");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const password = screen.getByLabelText("Password");
    await vi.waitFor(() => expect(password.getAttribute("aria-invalid")).toBe("true"));
    expect(describedText(password)).toContain("Required.");
    expect(calls.some((call) => call.path === "/api/auth/sign-in")).toBe(false);
  });

  it("when the server rejects a field, then its message appears beside that field", async () => {
    stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
      "POST /api/auth/sign-in": () =>
        errorResponse(400, "validation_failed", "Check the highlighted fields.", {
          email: "This address cannot sign in here.",
        }),
    });
    const { user, onSuccess } = renderForm();

    await fillAndSubmit(user, "rowan.ellery@example.org", "a long passphrase");

    expect(await screen.findByText("This address cannot sign in here.")).toBeTruthy();
    expect(describedText(screen.getByLabelText("E-mail"))).toContain(
      "This address cannot sign in here.",
    );
    expect(screen.queryByRole("alert")).toBeNull();
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it("when the credentials are wrong, then the server's message is announced in an alert", async () => {
    stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
      "POST /api/auth/sign-in": () =>
        errorResponse(401, "invalid_credentials", "That e-mail and password do not match."),
    });
    const { user, onSuccess } = renderForm();

    await fillAndSubmit(user, "rowan.ellery@example.org", "not the password");

    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toContain("That e-mail and password do not match.");
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it("when the credentials are right, then the normalised e-mail is sent and the person is handed on", async () => {
    const { calls } = stubApi({
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
      "POST /api/auth/sign-in": () => jsonResponse(auditor),
    });
    const { user, onSuccess } = renderForm();

    await fillAndSubmit(user, "  Rowan.Ellery@Example.org ", "correct horse");

    await vi.waitFor(() => expect(onSuccess).toHaveBeenCalled());
    expect(onSuccess.mock.calls[0]?.[0]).toEqual(auditor);
    expect(calls.find((call) => call.path === "/api/auth/sign-in")?.body).toEqual({
      email: "rowan.ellery@example.org",
      password: "correct horse",
    });
  });
});

describe("providerStartHref", () => {
  const origin = "https://lintel.example";

  it("when the start address is a path of this app, then next is added unless it is home", () => {
    expect(providerStartHref("/api/auth/provider/start?network=a", "/", origin)).toBe(
      "/api/auth/provider/start?network=a",
    );
    expect(providerStartHref("/api/auth/provider/start?network=a", "/actions/1", origin)).toBe(
      "/api/auth/provider/start?network=a&next=%2Factions%2F1",
    );
  });

  it("when the start address would leave this app, then no link is made", () => {
    for (const startUrl of [
      "https://elsewhere.example/start",
      "//elsewhere.example/start",
      "/\\elsewhere.example/start",
      "javascript:alert(1)",
      "api/auth/provider/start",
    ]) {
      expect(providerStartHref(startUrl, "/", origin), startUrl).toBeNull();
    }
  });
});
