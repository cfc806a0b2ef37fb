import type { UploadToken } from "@shared/schemas/pressure-uploads";
import { screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";

import { administrator, jsonResponse, stubApi, tamsinGeneral } from "./support/api-stub";
import { renderApp } from "./support/render-app";

afterEach(() => {
  vi.unstubAllGlobals();
});

const tokensPath = `/api/sites/${tamsinGeneral.id}/pressure-upload-tokens`;
const gateway: UploadToken = {
  id: "5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d",
  name: "Building 2 gateway",
  createdAt: "2026-11-02T09:30:00Z",
  createdByName: "Morgan Adebayo",
  lastUsedAt: "2026-12-03T10:14:00Z",
  revokedAt: null,
};
const oldScript: UploadToken = {
  ...gateway,
  id: "6b2c3d4e-5f6a-4b7c-9d8e-0f1a2b3c4d5e",
  name: "Old export script",
  lastUsedAt: null,
  revokedAt: "2026-11-20T16:00:00Z",
};
const secret = "lintel_pu_Qm9vbXRva2VuLXNob3duLW9uY2UtYW5kLW5ldmVyLWFnYWlu";

function stubTokens() {
  let tokens = [gateway, oldScript];
  return stubApi({
    "GET /api/auth/me": () => jsonResponse(administrator),
    "GET /api/app-config": () => jsonResponse({ demoMailbox: false }),
    [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
    [`GET ${tokensPath}`]: () => jsonResponse({ tokens }),
    [`POST ${tokensPath}`]: (request) => {
      const made = {
        ...gateway,
        id: "7c3d4e5f-6a7b-4c8d-8e9f-1a2b3c4d5e6f",
        name: (request.body as { name: string }).name,
        lastUsedAt: null,
      };
      tokens = [made, ...tokens];
      return jsonResponse({ token: made, secret }, 201);
    },
    [`DELETE ${tokensPath}/${gateway.id}`]: () => {
      const revoked = { ...gateway, revokedAt: "2026-12-03T11:00:00Z" };
      tokens = [revoked, oldScript];
      return jsonResponse(revoked);
    },
  });
}

describe("pressure upload tokens on the site's admin screen", () => {
  it("when an administrator opens it, then each token shows its name, state in words and last use, and only tokens in use can be revoked", async () => {
    stubTokens();
    renderApp(`/sites/${tamsinGeneral.id}/edit`);

    // The first screen of the run loads its route module cold.
    const list = await screen.findByRole("list", { name: "Upload tokens" }, { timeout: 10_000 });
    const rows = within(list).getAllByRole("listitem");
    expect(rows).toHaveLength(2);
    expect(rows[0]!.textContent).toContain("Building 2 gateway");
    expect(rows[0]!.textContent).toContain("In use");
    expect(
      within(rows[0]!).getByRole("button", { name: "Revoke Building 2 gateway" }),
    ).toBeTruthy();
    expect(rows[1]!.textContent).toContain("Revoked");
    expect(rows[1]!.textContent).toContain("Never used");
    expect(within(rows[1]!).queryByRole("button")).toBeNull();
  });

  it("when a token is made, then it is shown once with a copy button and words saying it will not be shown again", async () => {
    const { calls } = stubTokens();
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/edit`);

    await user.type(await screen.findByLabelText("Name of the new token"), "Ward 4 BMS export");
    await user.click(screen.getByRole("button", { name: "Create token" }));

    expect(await screen.findByText(secret)).toBeTruthy();
    expect(screen.getByText(/it is not shown again/)).toBeTruthy();
    expect(screen.getByRole("button", { name: "Copy token" })).toBeTruthy();
    expect(calls.find((call) => call.method === "POST")?.body).toEqual({
      name: "Ward 4 BMS export",
    });
    const list = await screen.findByRole("list", { name: "Upload tokens" });
    expect(
      await within(list).findByRole("button", { name: "Revoke Ward 4 BMS export" }),
    ).toBeTruthy();

    await user.click(screen.getByRole("button", { name: "Done" }));
    expect(screen.queryByText(secret)).toBeNull();
  });

  it("when Revoke is chosen, then nothing is sent until it is confirmed, and the token then lists as revoked", async () => {
    const { calls } = stubTokens();
    const { user } = renderApp(`/sites/${tamsinGeneral.id}/edit`);

    await user.click(await screen.findByRole("button", { name: "Revoke Building 2 gateway" }));
    expect(screen.getByText(/Uploads with this token are refused from now on/)).toBeTruthy();
    expect(calls.some((call) => call.method === "DELETE")).toBe(false);
    await user.click(screen.getByRole("button", { name: "Revoke token" }));

    const list = screen.getByRole("list", { name: "Upload tokens" });
    await vi.waitFor(() =>
      expect(within(list).queryByRole("button", { name: "Revoke Building 2 gateway" })).toBeNull(),
    );
    expect(within(list).queryByText("In use")).toBeNull();
    expect(within(list).getAllByRole("listitem")[0]!.textContent).toContain("Revoked");
    expect(calls.filter((call) => call.method === "DELETE")).toHaveLength(1);
  });
});
