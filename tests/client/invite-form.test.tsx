import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen, within } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";

import { InviteForm } from "@/features/people/components/invite-form";
import { createQueryClient } from "@/lib/query-client";

import {
  buildPerson,
  errorResponse,
  jsonResponse,
  manageableSites,
  orchardHill,
  stubApi,
  tamsinGeneral,
} from "./support/api-stub";

afterEach(() => {
  vi.unstubAllGlobals();
});

function renderForm({ canGrantNetworkWide = true } = {}) {
  const onInvited = vi.fn();
  const user = userEvent.setup();
  render(
    <QueryClientProvider client={createQueryClient()}>
      <InviteForm
        manageableSites={manageableSites}
        canGrantNetworkWide={canGrantNetworkWide}
        onInvited={onInvited}
      />
    </QueryClientProvider>,
  );
  return { user, onInvited };
}

function describedText(input: HTMLElement): string {
  return (input.getAttribute("aria-describedby") ?? "")
    .split(" ")
    .map((id) => document.getElementById(id)?.textContent ?? "")
    .join(" ");
}

function roleRow(index: number) {
  return within(screen.getByRole("group", { name: `Role ${index + 1}` }));
}

function optionLabels(select: HTMLElement): string[] {
  return within(select)
    .getAllByRole("option")
    .map((option) => option.textContent ?? "");
}

async function fillValidInvitation(user: ReturnType<typeof userEvent.setup>) {
  await user.type(screen.getByLabelText("Name"), "Priya Nair");
  await user.type(screen.getByLabelText("E-mail"), "  Priya.Nair@Example.org ");
  await user.selectOptions(roleRow(0).getByLabelText("Role"), "Auditor");
  await user.selectOptions(roleRow(0).getByLabelText("Site"), tamsinGeneral.name);
}

describe("InviteForm", () => {
  it("when submitted empty, then each field says what is missing beside it and nothing is sent", async () => {
    const { fetchStub } = stubApi({});
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Send invitation" }));

    expect(
      await screen.findByText("Enter an e-mail address such as name@example.org."),
    ).toBeTruthy();
    expect(describedText(screen.getByLabelText("Name"))).toContain("Required.");
    expect(screen.getByLabelText("E-mail").getAttribute("aria-invalid")).toBe("true");
    expect(describedText(roleRow(0).getByLabelText("Role"))).toContain("Choose a role.");
    expect(describedText(roleRow(0).getByLabelText("Site"))).toContain("Choose a site.");
    expect(fetchStub).not.toHaveBeenCalled();
  });

  it("when the address already has an account, then the server's message appears beside the e-mail", async () => {
    stubApi({
      "POST /api/people/invitations": () =>
        errorResponse(409, "conflict", "Someone already uses this address.", {
          email: "This address already has an active account.",
        }),
    });
    const { user, onInvited } = renderForm();

    await fillValidInvitation(user);
    await user.click(screen.getByRole("button", { name: "Send invitation" }));

    const email = screen.getByLabelText("E-mail");
    await vi.waitFor(() =>
      expect(describedText(email)).toContain("This address already has an active account."),
    );
    expect(email.getAttribute("aria-invalid")).toBe("true");
    expect(document.activeElement).toBe(email);
    expect(screen.queryByRole("alert")).toBeNull();
    expect(onInvited).not.toHaveBeenCalled();
  });

  it("when the server refuses a role at a site, then its message appears beside that row's site", async () => {
    stubApi({
      "POST /api/people/invitations": () =>
        errorResponse(403, "forbidden", "You may not give that role.", {
          "grants.1.siteId": "You do not manage people at this site.",
        }),
    });
    const { user } = renderForm();

    await fillValidInvitation(user);
    await user.click(screen.getByRole("button", { name: "Add another role" }));
    await user.selectOptions(roleRow(1).getByLabelText("Role"), "Facilities lead");
    await user.selectOptions(roleRow(1).getByLabelText("Site"), orchardHill.name);
    await user.click(screen.getByRole("button", { name: "Send invitation" }));

    await vi.waitFor(() =>
      expect(describedText(roleRow(1).getByLabelText("Site"))).toContain(
        "You do not manage people at this site.",
      ),
    );
    expect(describedText(roleRow(0).getByLabelText("Site"))).not.toContain("You do not manage");
  });

  it("when the role can span the network, then All sites is offered, and only then", async () => {
    const { user } = renderForm();

    const site = roleRow(0).getByLabelText("Site");
    await user.selectOptions(roleRow(0).getByLabelText("Role"), "Auditor");
    expect(optionLabels(site)).not.toContain("All sites (network-wide)");

    await user.selectOptions(roleRow(0).getByLabelText("Role"), "Administrator");
    expect(optionLabels(site)).toContain("All sites (network-wide)");
  });

  it("when the inviter manages single sites only, then All sites is never offered", async () => {
    const { user } = renderForm({ canGrantNetworkWide: false });

    await user.selectOptions(roleRow(0).getByLabelText("Role"), "Administrator");

    expect(optionLabels(roleRow(0).getByLabelText("Site"))).not.toContain(
      "All sites (network-wide)",
    );
  });

  it("when the form is valid, then the contract's body is sent and the new person handed on", async () => {
    const person = buildPerson({ status: "invited" });
    const { calls } = stubApi({
      "POST /api/people/invitations": () => jsonResponse({ person }, 201),
    });
    const { user, onInvited } = renderForm();

    await fillValidInvitation(user);
    await user.click(screen.getByRole("button", { name: "Add another role" }));
    await user.selectOptions(roleRow(1).getByLabelText("Role"), "Committee member");
    await user.selectOptions(roleRow(1).getByLabelText("Site"), "All sites (network-wide)");
    await user.click(screen.getByRole("button", { name: "Send invitation" }));

    await vi.waitFor(() => expect(onInvited).toHaveBeenCalledWith(person));
    expect(calls[0]?.body).toEqual({
      name: "Priya Nair",
      email: "priya.nair@example.org",
      grants: [
        { role: "auditor", siteId: tamsinGeneral.id },
        { role: "committee_member", siteId: null },
      ],
    });
  });

  it("when the second role row is removed, then one row is left and it cannot be removed", async () => {
    const { user } = renderForm();

    await user.click(screen.getByRole("button", { name: "Add another role" }));
    expect(screen.getAllByRole("group", { name: /^Role \d$/ })).toHaveLength(2);

    await user.click(screen.getByRole("button", { name: "Remove role 2" }));
    expect(screen.getAllByRole("group", { name: /^Role \d$/ })).toHaveLength(1);
    expect(screen.queryByRole("button", { name: /^Remove/ })).toBeNull();
  });
});
