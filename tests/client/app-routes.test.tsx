import { screen, within } from "@testing-library/react";
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

const signedInAsAuditor = {
  "GET /api/auth/me": () => jsonResponse(auditor),
  "GET /api/sites": () => jsonResponse({ sites: [tamsinGeneral, orchardHill] }),
};

const passwordOnly = { password: true, provider: null };

function currentUrl(router: ReturnType<typeof renderApp>["router"]): string {
  const { pathname, search } = router.state.location;
  return `${pathname}${search}`;
}

describe("signing in", () => {
  it("when a signed-out visitor opens a protected page, then they are sent to sign in with the page kept in next", async () => {
    stubApi({ "GET /api/auth/me": signedOutReply });
    const { router } = renderApp("/account");

    expect(
      await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" }),
    ).toBeTruthy();
    expect(currentUrl(router)).toBe("/sign-in?next=%2Faccount");
  });

  it("when sign-in succeeds, then the person lands on the page in next", async () => {
    stubApi({
      ...signedInAsAuditor,
      "GET /api/auth/me": signedOutReply,
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
      "POST /api/auth/sign-in": () => jsonResponse(auditor),
    });
    const { router, user } = renderApp("/sign-in?next=%2Faccount");

    await user.type(await screen.findByLabelText("E-mail"), "rowan.ellery@example.org");
    await user.click(screen.getByRole("button", { name: "Continue" }));
    await user.type(await screen.findByLabelText("Password"), "correct horse");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("heading", { level: 1, name: "Account" })).toBeTruthy();
    expect(currentUrl(router)).toBe("/account");
  });

  it("when next points to another site, then sign-in goes home instead", async () => {
    stubApi({
      ...signedInAsAuditor,
      "GET /api/auth/me": signedOutReply,
      "POST /api/auth/sign-in/method": () => jsonResponse(passwordOnly),
      "POST /api/auth/sign-in": () => jsonResponse(auditor),
    });
    const { router, user } = renderApp("/sign-in?next=%2F%2Felsewhere.example%2Fphish");

    await user.type(await screen.findByLabelText("E-mail"), "rowan.ellery@example.org");
    await user.click(screen.getByRole("button", { name: "Continue" }));
    await user.type(await screen.findByLabelText("Password"), "correct horse");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("heading", { level: 1, name: "My sites" })).toBeTruthy();
    expect(currentUrl(router)).toBe("/");
  });

  it("when someone signed in opens the sign-in page, then they go straight home", async () => {
    stubApi(signedInAsAuditor);
    const { router } = renderApp("/sign-in");

    expect(await screen.findByRole("heading", { level: 1, name: "My sites" })).toBeTruthy();
    expect(currentUrl(router)).toBe("/");
  });
});

describe("my sites", () => {
  it("when the person holds roles at sites, then each site shows as a card with address and time zone", async () => {
    stubApi(signedInAsAuditor);
    renderApp("/");

    const list = await screen.findByRole("list", { name: "Sites" });
    const cards = within(list).getAllByRole("listitem");
    expect(cards).toHaveLength(2);
    expect(
      within(cards[0]!).getByRole("link", { name: tamsinGeneral.name }).getAttribute("href"),
    ).toBe(`/sites/${tamsinGeneral.id}`);
    expect(cards[0]!.textContent).toContain(tamsinGeneral.address);
    expect(cards[0]!.textContent).toContain("Europe/London");
  });

  it("when the person has no sites, then the page says so and who can help", async () => {
    stubApi({ ...signedInAsAuditor, "GET /api/sites": () => jsonResponse({ sites: [] }) });
    renderApp("/");

    expect(await screen.findByRole("heading", { name: "You have no sites yet" })).toBeTruthy();
    expect(screen.getByText(/Ask your administrator/)).toBeTruthy();
  });

  it("when the session has ended on the server, then the next request sends the person to sign in", async () => {
    stubApi({
      ...signedInAsAuditor,
      "GET /api/sites": () => errorResponse(401, "unauthenticated", "Please sign in to continue."),
    });
    const { router } = renderApp("/");

    expect(
      await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" }),
    ).toBeTruthy();
    expect(currentUrl(router)).toBe("/sign-in");
  });
});

describe("site overview", () => {
  it("when the site is one of the person's, then its details and its corrective actions are shown", async () => {
    stubApi({
      ...signedInAsAuditor,
      [`GET /api/sites/${tamsinGeneral.id}`]: () => jsonResponse({ site: tamsinGeneral }),
      [`GET /api/sites/${tamsinGeneral.id}/actions`]: () => jsonResponse({ actions: [] }),
    });
    renderApp(`/sites/${tamsinGeneral.id}`);

    expect(await screen.findByRole("heading", { level: 1, name: tamsinGeneral.name })).toBeTruthy();
    expect(screen.getByText(tamsinGeneral.address)).toBeTruthy();
    expect(screen.getByText("Your role here: Auditor")).toBeTruthy();
    expect(screen.getByRole("heading", { name: "Corrective actions" })).toBeTruthy();
    expect(
      screen.getByRole("link", { name: "See all corrective actions" }).getAttribute("href"),
    ).toBe(`/sites/${tamsinGeneral.id}/actions`);
    expect(screen.getByRole("complementary", { name: "Caution" }).textContent).toContain(
      "it does not replace it",
    );
  });

  it("when the site is not the person's, then a friendly not-available page is shown", async () => {
    const otherId = "9e8d7c6b-5a4f-4e3d-8c2b-1a0f9e8d7c6b";
    stubApi({
      ...signedInAsAuditor,
      [`GET /api/sites/${otherId}`]: () => errorResponse(404, "not_found", "Site not found."),
    });
    renderApp(`/sites/${otherId}`);

    expect(
      await screen.findByRole("heading", { level: 1, name: "This site is not available" }),
    ).toBeTruthy();
  });
});

describe("account", () => {
  it("when the account page opens, then it lists the person's roles with site names", async () => {
    stubApi(signedInAsAuditor);
    renderApp("/account");

    expect(await screen.findByText("Tamsin Bay General Hospital")).toBeTruthy();
    expect(screen.getByText(auditor.user.email)).toBeTruthy();
    expect(screen.getByText("Auditor")).toBeTruthy();
    expect(screen.getByText("Facilities lead")).toBeTruthy();
    expect(screen.getByText("Orchard Hill Community Hospital")).toBeTruthy();
  });

  it("when the person signs out, then they land on the sign-in page", async () => {
    const { calls } = stubApi({
      ...signedInAsAuditor,
      "POST /api/auth/sign-out": () => new Response(null, { status: 204 }),
    });
    const { router, user } = renderApp("/account");

    await user.click(await screen.findByRole("button", { name: "Sign out" }));

    expect(
      await screen.findByRole("heading", { level: 1, name: "Sign in to Lintel" }),
    ).toBeTruthy();
    expect(currentUrl(router)).toBe("/sign-in");
    expect(calls.some((call) => call.method === "POST" && call.path === "/api/auth/sign-out")).toBe(
      true,
    );
  });
});

describe("unknown addresses", () => {
  it("when the address matches no page, then the not-found page offers a way home", async () => {
    stubApi({});
    renderApp("/no/such/page");

    expect(await screen.findByRole("heading", { level: 1, name: "Page not found" })).toBeTruthy();
    expect(screen.getByRole("link", { name: "Go to my sites" }).getAttribute("href")).toBe("/");
  });
});
