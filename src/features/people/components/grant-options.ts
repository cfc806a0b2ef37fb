import { networkWideRoles, type Role, roleLabels, roles } from "@shared/roles";
import type { GrantInput, PeopleListResponse, Person } from "@shared/schemas/people";

import type { SelectOption } from "@/components/ui/select-field";

/** The Site select's value for a network-wide grant (a select cannot hold null). */
export const networkWideValue = "network";

export const networkWideLabel = "All sites (network-wide)";

export type ManageableSite = PeopleListResponse["manageableSites"][number];

/** A role row as the form holds it: plain strings straight from the selects. */
export interface GrantDraft {
  role: string;
  siteId: string;
}

export const roleOptions: SelectOption[] = roles.map((role) => ({
  value: role,
  label: roleLabels[role],
}));

export function isRole(value: string): value is Role {
  return (roles as readonly string[]).includes(value);
}

/** Whether this role may be given across the whole network by this caller. */
export function offersNetworkWide(role: string, canGrantNetworkWide: boolean): boolean {
  return canGrantNetworkWide && isRole(role) && networkWideRoles.includes(role);
}

export function siteOptions(
  role: string,
  manageableSites: readonly ManageableSite[],
  canGrantNetworkWide: boolean,
): SelectOption[] {
  const sites = [...manageableSites]
    .sort((a, b) => a.name.localeCompare(b.name))
    .map((site) => ({ value: site.id, label: site.name }));
  return offersNetworkWide(role, canGrantNetworkWide)
    ? [{ value: networkWideValue, label: networkWideLabel }, ...sites]
    : sites;
}

/** A new role row: with a single site to choose from, it is chosen already. */
export function emptyGrantDraft(manageableSites: readonly ManageableSite[]): GrantDraft {
  return { role: "", siteId: manageableSites.length === 1 ? (manageableSites[0]?.id ?? "") : "" };
}

/**
 * Turns a row into what the contract expects. An empty role or site stays empty so the schema
 * refuses it; it never silently becomes a network-wide grant.
 */
export function grantFromDraft(draft: GrantDraft): Record<keyof GrantInput, unknown> {
  return {
    role: draft.role === "" ? undefined : draft.role,
    siteId: draft.siteId === networkWideValue ? null : draft.siteId,
  };
}

/** The schema's message for a missing id reads oddly beside a select; say what to do instead. */
export function siteErrorMessage(draft: GrantDraft | undefined, message: string | undefined) {
  if (!message) return undefined;
  return draft?.siteId === "" ? "Choose a site." : message;
}

export function grantSiteLabel(grant: Person["grants"][number]): string {
  return grant.siteId === null ? "all sites" : (grant.siteName ?? "a site no longer listed");
}

export function describeGrant(grant: Person["grants"][number]): string {
  return `${roleLabels[grant.role]} · ${grantSiteLabel(grant)}`;
}
