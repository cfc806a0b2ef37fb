import { describe, expect, it } from "vitest";

import { can, hasAnyRoleAt } from "@shared/permissions";

const siteA = "00000000-0000-4000-8000-00000000000a";
const siteB = "00000000-0000-4000-8000-00000000000b";

describe("can", () => {
  it("when a role is granted at one site, then it applies at that site only", () => {
    const grants = [{ role: "administrator" as const, siteId: siteA }];
    expect(can(grants, "update:site:site", siteA)).toBe(true);
    expect(can(grants, "update:site:site", siteB)).toBe(false);
  });

  it("when a role is granted network-wide, then it applies at every site and to network actions", () => {
    const grants = [{ role: "administrator" as const, siteId: null }];
    expect(can(grants, "update:site:site", siteB)).toBe(true);
    expect(can(grants, "create:site:network")).toBe(true);
  });

  it("when an administrator holds only site grants, then network actions are refused", () => {
    expect(can([{ role: "administrator", siteId: siteA }], "create:site:network")).toBe(false);
  });

  it("when a committee member reads anywhere, then reads pass and changes are refused", () => {
    const grants = [{ role: "committee_member" as const, siteId: null }];
    expect(can(grants, "read:site:site", siteA)).toBe(true);
    expect(can(grants, "update:site:site", siteA)).toBe(false);
    expect(can(grants, "create:site:network")).toBe(false);
  });

  it("when a person has no grants, then nothing is allowed", () => {
    expect(can([], "read:site:site", siteA)).toBe(false);
  });

  it("when grants mix sites, then 'their site' means any role there", () => {
    const grants = [
      { role: "auditor" as const, siteId: siteA },
      { role: "facilities_lead" as const, siteId: siteB },
    ];
    expect(hasAnyRoleAt(grants, siteA)).toBe(true);
    expect(hasAnyRoleAt(grants, siteB)).toBe(true);
    expect(hasAnyRoleAt([{ role: "auditor", siteId: siteA }], siteB)).toBe(false);
  });
});
