import type {
  IdentityProviderResponse,
  IdentityProviderSettings,
} from "@shared/schemas/identity-provider";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import {
  administrator,
  auditor,
  errorResponse,
  jsonResponse,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const redirectUri = "https://lintel.example/api/auth/provider/callback";
const postLogoutRedirectUri = "https://lintel.example/sign-in";

const stored: IdentityProviderSettings = {
  id: "7b1d2c3e-4f5a-4b6c-9d7e-8f9a0b1c2d3e",
  name: "Tamsin Bay Health",
  issuerUrl: "https://id.tamsinbay.example",
  clientId: "lintel",
  clientSecretStored: true,
  domains: ["tamsinbay.example", "orchardhill.example"],
  passwordAllowed: false,
  assumeVerifiedEmail: false,
  redirectUri,
  postLogoutRedirectUri,
  updatedAt: "2026-11-30T10:15:00.000Z",
};

function settingsReply(provider: IdentityProviderSettings | null): IdentityProviderResponse {
  return { provider, redirectUri, postLogoutRedirectUri };
}

function asAdministrator(provider: IdentityProviderSettings | null) {
  return {
    "GET /api/auth/me": () => jsonResponse(administrator),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral, orchardHill] }),
    "GET /api/admin/identity-provider": () => jsonResponse(settingsReply(provider)),
  };
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

describe("the sign-in settings page", () => {
  it("when no provider is set, then the addresses to register are shown, and a new provider is saved with its domains and secret", async () => {
    let saved: unknown;
    const { calls } = stubApi({
      ...asAdministrator(null),
      "PUT /api/admin/identity-provider": (request) => {
        saved = request.body;
        return jsonResponse({ provider: stored });
      },
    });
    const { user } = renderApp("/admin/sign-in");

    expect(
      await screen.findByRole("heading", { level: 2, name: "No identity provider yet" }),
    ).toBeTruthy();
    expect(screen.getByText(redirectUri)).toBeTruthy();
    expect(screen.getByText(postLogoutRedirectUri)).toBeTruthy();
    expect(screen.getByRole("button", { name: "Copy redirect uri" })).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Test the connection" })).toBeNull();

    await user.type(screen.getByLabelText("Name"), "Tamsin Bay Health");
    await user.type(screen.getByLabelText("Issuer URL"), "https://id.tamsinbay.example");
    await user.type(screen.getByLabelText("Client id"), "lintel");
    await user.type(screen.getByLabelText("Client secret"), "s3cret-from-the-provider");
    await user.type(
      screen.getByLabelText("E-mail domains"),
      "TamsinBay.example\norchardhill.example",
    );
    await user.click(screen.getByLabelText("Password sign-in allowed for these domains"));
    await user.click(screen.getByRole("button", { name: "Save provider" }));

    expect(await screen.findByText(/Saved\. People with an address at/)).toBeTruthy();
    expect(saved).toEqual({
      name: "Tamsin Bay Health",
      issuerUrl: "https://id.tamsinbay.example",
      clientId: "lintel",
      clientSecret: "s3cret-from-the-provider",
      domains: ["tamsinbay.example", "orchardhill.example"],
      passwordAllowed: false,
      assumeVerifiedEmail: false,
    });
    expect(calls.filter((call) => call.method === "PUT")).toHaveLength(1);
    // The page now shows the stored provider, with a fresh, empty secret box.
    expect(
      await screen.findByRole("heading", { level: 2, name: "Tamsin Bay Health" }),
    ).toBeTruthy();
    expect((screen.getByLabelText("Client secret") as HTMLInputElement).value).toBe("");
    expect(screen.getByRole("button", { name: "Test the connection" })).toBeTruthy();
  });

  it("when no provider is set and the form is sent empty, then each field says what is missing and nothing is sent", async () => {
    const { calls } = stubApi(asAdministrator(null));
    const { user } = renderApp("/admin/sign-in");

    await user.click(await screen.findByRole("button", { name: "Save provider" }));

    const secret = screen.getByLabelText("Client secret");
    await vi.waitFor(() => expect(secret.getAttribute("aria-invalid")).toBe("true"));
    expect(describedText(secret)).toContain("Enter the client secret");
    expect(describedText(screen.getByLabelText("E-mail domains"))).toContain(
      "List at least one e-mail domain.",
    );
    for (const label of ["Name", "Issuer URL", "Client id"])
      expect(screen.getByLabelText(label).getAttribute("aria-invalid"), label).toBe("true");
    expect(calls.some((call) => call.method === "PUT")).toBe(false);
  });

  it("when a domain is typed with its @, then the problem names that domain beside the field", async () => {
    stubApi(asAdministrator(stored));
    const { user } = renderApp("/admin/sign-in");

    const domains = await screen.findByLabelText("E-mail domains");
    await user.clear(domains);
    await user.type(domains, "tamsinbay.example\n@orchardhill.example");
    await user.click(screen.getByRole("button", { name: "Save changes" }));

    await vi.waitFor(() => expect(domains.getAttribute("aria-invalid")).toBe("true"));
    expect(describedText(domains)).toContain("“@orchardhill.example”");
    expect(describedText(domains)).toContain("without the @");
  });

  it("when a secret is stored and the box is left empty, then the secret is not sent, so it is kept", async () => {
    let saved: Record<string, unknown> | undefined;
    stubApi({
      ...asAdministrator(stored),
      "PUT /api/admin/identity-provider": (request) => {
        saved = request.body as Record<string, unknown>;
        return jsonResponse({ provider: { ...stored, name: "Tamsin Bay Health NHS" } });
      },
    });
    const { user } = renderApp("/admin/sign-in");

    const secret = await screen.findByLabelText("Client secret");
    expect(describedText(secret)).toContain("A secret is stored; leave empty to keep it.");
    expect((secret as HTMLInputElement).value).toBe("");
    await user.type(screen.getByLabelText("Name"), " NHS");
    await user.click(screen.getByRole("button", { name: "Save changes" }));

    await screen.findByText(/Saved\./);
    expect(saved).toBeDefined();
    expect(saved).not.toHaveProperty("clientSecret");
    expect(saved?.name).toBe("Tamsin Bay Health NHS");
  });

  it("when the server refuses fields with 422, then each message appears beside its own field", async () => {
    stubApi({
      ...asAdministrator(stored),
      "PUT /api/admin/identity-provider": () =>
        errorResponse(422, "validation_failed", "Check the highlighted fields.", {
          issuerUrl: "The issuer's address is a private network address.",
          "domains.1": "orchardhill.example is already covered by another network's provider.",
        }),
    });
    const { user } = renderApp("/admin/sign-in");

    await user.click(await screen.findByRole("button", { name: "Save changes" }));

    const issuer = screen.getByLabelText("Issuer URL");
    await vi.waitFor(() =>
      expect(describedText(issuer)).toContain("The issuer's address is a private network address."),
    );
    expect(describedText(screen.getByLabelText("E-mail domains"))).toContain(
      "orchardhill.example is already covered by another network's provider.",
    );
    expect(screen.queryByRole("alert")).toBeNull();
  });

  it("when the administrator declares that the provider only issues verified addresses, then a caution says it is logged, and the stored declaration is shown", async () => {
    stubApi(asAdministrator({ ...stored, assumeVerifiedEmail: true }));
    const { user } = renderApp("/admin/sign-in");

    expect(await screen.findByText("Addresses are taken as verified")).toBeTruthy();
    const box = screen.getByLabelText("This provider only issues verified e-mail addresses");
    expect((box as HTMLInputElement).checked).toBe(true);
    expect(screen.getByText(/recorded in the change log with your name/)).toBeTruthy();
    await user.click(box);
    expect(screen.queryByText(/recorded in the change log with your name/)).toBeNull();
  });

  it("when the connection is tested, then each step is reported in words with its outcome", async () => {
    stubApi({
      ...asAdministrator(stored),
      "POST /api/admin/identity-provider/test": () =>
        jsonResponse({
          ok: false,
          steps: [
            { step: "address", ok: true, words: "The issuer's address is public and uses https." },
            {
              step: "discovery",
              ok: false,
              words: "The provider did not answer within 5 seconds.",
            },
            { step: "client", ok: null, words: "Not tried: the step before it failed." },
          ],
        }),
    });
    const { user } = renderApp("/admin/sign-in");

    await user.click(await screen.findByRole("button", { name: "Test the connection" }));

    const section = within(screen.getByRole("region", { name: "Test the connection" }));
    const steps = await section.findAllByRole("listitem");
    const texts = steps.map((step) => step.textContent);
    expect(texts).toEqual([
      expect.stringMatching(/Passed.*The provider's address.*public and uses https/),
      expect.stringMatching(/Failed.*published settings.*did not answer within 5 seconds/),
      expect.stringMatching(/Not tried.*client id and secret.*step before it failed/),
    ]);
    expect(section.getByText(/does not work yet/)).toBeTruthy();
  });

  it("when the provider is removed, then nothing is sent until it is confirmed", async () => {
    let current: IdentityProviderSettings | null = stored;
    const { calls } = stubApi({
      ...asAdministrator(stored),
      "GET /api/admin/identity-provider": () => jsonResponse(settingsReply(current)),
      "DELETE /api/admin/identity-provider": () => {
        current = null;
        return new Response(null, { status: 204 });
      },
    });
    const { user } = renderApp("/admin/sign-in");

    await user.click(await screen.findByRole("button", { name: "Remove provider" }));
    const confirm = screen.getByRole("group", { name: "Remove Tamsin Bay Health?" });
    expect(calls.some((call) => call.method === "DELETE")).toBe(false);
    await user.click(within(confirm).getByRole("button", { name: "Remove provider" }));

    expect(
      await screen.findByText(/was removed\. Everyone signs in with a Lintel password/),
    ).toBeTruthy();
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(1);
    expect(
      screen.getByRole("heading", { level: 2, name: "No identity provider yet" }),
    ).toBeTruthy();
  });

  it("when an administrator of one site opens it, then it is not available and nothing is asked", async () => {
    const { calls } = stubApi({
      "GET /api/auth/me": () =>
        jsonResponse({
          ...administrator,
          roles: [{ role: "administrator", siteId: tamsinGeneral.id }],
        }),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
    });
    renderApp("/admin/sign-in");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
    expect(calls.some((call) => call.path.startsWith("/api/admin/identity-provider"))).toBe(false);
  });

  it("when an auditor opens it, then it is not available", async () => {
    stubApi({
      "GET /api/auth/me": () => jsonResponse(auditor),
      "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral] }),
    });
    renderApp("/admin/sign-in");

    expect(
      await screen.findByRole("heading", { level: 1, name: "This page is not available" }),
    ).toBeTruthy();
  });
});
