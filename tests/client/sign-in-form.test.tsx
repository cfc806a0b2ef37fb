import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { SignInForm } from "@/features/auth/components/sign-in-form";
import { createQueryClient } from "@/lib/query-client";

import { auditor, errorResponse, jsonResponse, stubApi } from "./support/api-stub";

afterEach(() => {
  vi.unstubAllGlobals();
});

function renderForm() {
  const onSuccess = vi.fn();
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <SignInForm onSuccess={onSuccess} />
    </QueryClientProvider>,
  );
  return { user, onSuccess };
}

async function fillAndSubmit(
  user: ReturnType<typeof userEvent.setup>,
  email: string,
  password: string,
) {
  await user.type(screen.getByLabelText("E-mail"), email);
  await user.type(screen.getByLabelText("Password"), password);
  await user.click(screen.getByRole("button", { name: "Sign in" }));
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("SignInForm", () => {
  it("when submitted empty, then each field shows its own error and nothing is sent", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const email = screen.getByLabelText("E-mail");
    const password = screen.getByLabelText("Password");
    expect(
      await screen.findByText("Enter an e-mail address such as name@example.org."),
    ).toBeTruthy();
    expect(email.getAttribute("aria-invalid")).toBe("true");
    expect(describedText(email)).toContain("Enter an e-mail address such as name@example.org.");
    expect(password.getAttribute("aria-invalid")).toBe("true");
    expect(describedText(password)).toContain("Required.");
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the server rejects a field, then its message appears beside that field", async () => {
    stubApi({
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
      "POST /api/auth/sign-in": () =>
        errorResponse(401, "invalid_credentials", "That e-mail and password do not match."),
    });
    const { user, onSuccess } = renderForm();

    await fillAndSubmit(user, "rowan.ellery@example.org", "not the password");

    const alert = await screen.findByRole("alert");
    expect(alert.textContent).toContain("That e-mail and password do not match.");
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it("when there were too many attempts, then the server's message is announced in an alert", async () => {
    stubApi({
      "POST /api/auth/sign-in": () =>
        errorResponse(429, "rate_limited", "Too many attempts. Try again in a few minutes."),
    });
    const { user } = renderForm();

    await fillAndSubmit(user, "rowan.ellery@example.org", "guess");

    expect((await screen.findByRole("alert")).textContent).toContain(
      "Too many attempts. Try again in a few minutes.",
    );
  });

  it("when the credentials are right, then the normalised e-mail is sent and the person is handed on", async () => {
    const { calls } = stubApi({ "POST /api/auth/sign-in": () => jsonResponse(auditor) });
    const { user, onSuccess } = renderForm();

    await fillAndSubmit(user, "  Rowan.Ellery@Example.org ", "correct horse");

    await vi.waitFor(() => expect(onSuccess).toHaveBeenCalled());
    expect(onSuccess.mock.calls[0]?.[0]).toEqual(auditor);
    expect(calls[0]?.body).toEqual({
      email: "rowan.ellery@example.org",
      password: "correct horse",
    });
  });
});
