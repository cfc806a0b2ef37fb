export const roles = ["administrator", "auditor", "facilities_lead", "committee_member"] as const;
export type Role = (typeof roles)[number];

/** Roles that may be granted network-wide (siteId null); the others are always per site. */
export const networkWideRoles: readonly Role[] = ["administrator", "committee_member"];

export const roleLabels: Record<Role, string> = {
  administrator: "Administrator",
  auditor: "Auditor",
  facilities_lead: "Facilities lead",
  committee_member: "Committee member",
};

export interface RoleGrant {
  role: Role;
  /** null: the grant covers every site of the network. */
  siteId: string | null;
}
