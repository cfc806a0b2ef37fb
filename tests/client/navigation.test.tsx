import type { RoleGrant } from "@shared/roles";
import { render, screen } from "@testing-library/react";
import { MemoryRouter } from "react-router-dom";
import { describe, expect, it } from "vitest";

import { Navigation, type NavigationItem } from "@/components/layouts/navigation";
import { AuthorizationProvider } from "@/lib/authorization";

const siteId = "0b6f2a9c-3d4e-4f5a-8b6c-7d8e9f0a1b2c";

const items: NavigationItem[] = [
  { label: "Sites", to: "/", icon: null, end: true, alsoActiveOn: ["/sites/:siteId"] },
  { label: "Account", to: "/account", icon: null },
  { label: "Add a site", to: "/admin/sites/new", icon: null, permission: "create:site:network" },
  { label: "Change log", to: "/change-log", icon: null, permission: "read:change-log:site" },
];

function renderNavigation(grants: RoleGrant[], url = "/") {
  render(
    <MemoryRouter initialEntries={[url]}>
      <AuthorizationProvider grants={grants}>
        <Navigation items={items} />
      </AuthorizationProvider>
    </MemoryRouter>,
  );
}

function linkNames(): string[] {
  return screen.getAllByRole("link").map((link) => link.textContent ?? "");
}

describe("Navigation", () => {
  it("when the person's roles cannot use an entry, then the entry is hidden", () => {
    renderNavigation([{ role: "auditor", siteId }]);

    expect(linkNames()).toEqual(["Sites", "Account"]);
    expect(screen.queryByRole("link", { name: "Add a site" })).toBeNull();
  });

  it("when a site role grants an entry's permission, then the entry is shown", () => {
    renderNavigation([{ role: "committee_member", siteId }]);

    expect(linkNames()).toEqual(["Sites", "Account", "Change log"]);
  });

  it("when the person is a network-wide administrator, then every entry is shown", () => {
    renderNavigation([{ role: "administrator", siteId: null }]);

    expect(linkNames()).toEqual(["Sites", "Account", "Add a site", "Change log"]);
  });

  it("when an entry matches the current page, then it is marked as the current page", () => {
    renderNavigation([{ role: "auditor", siteId }]);

    expect(screen.getByRole("link", { name: "Sites" }).getAttribute("aria-current")).toBe("page");
    expect(screen.getByRole("link", { name: "Account" }).getAttribute("aria-current")).toBeNull();
  });

  it("when a page belongs to an entry's section, then that entry is marked current", () => {
    renderNavigation([{ role: "auditor", siteId }], `/sites/${siteId}`);

    expect(screen.getByRole("link", { name: "Sites" }).getAttribute("aria-current")).toBe("page");
  });
});
