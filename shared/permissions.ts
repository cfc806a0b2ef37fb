import type { Role, RoleGrant } from "./roles";

/**
 * Permissions are `action:entity:scope` strings. `site` scope is decided against the site the
 * resource belongs to; `network` scope needs a network-wide grant.
 * The server is the authority; the client uses the same check only to hide what a role cannot do.
 */
export const permissions = [
  "read:site:site",
  "create:site:network",
  "update:site:site",
  "read:change-log:site",
] as const;
export type Permission = (typeof permissions)[number];

export const rolePermissions: Record<Role, readonly Permission[]> = {
  administrator: [
    "read:site:site",
    "create:site:network",
    "update:site:site",
    "read:change-log:site",
  ],
  auditor: ["read:site:site"],
  facilities_lead: ["read:site:site"],
  committee_member: ["read:site:site", "read:change-log:site"],
};

export function scopeOf(permission: Permission): "site" | "network" {
  return permission.endsWith(":network") ? "network" : "site";
}

/**
 * Whether the grants allow `permission`. For site-scoped permissions pass the site the resource
 * belongs to; a network-wide grant covers every site. Network-scoped permissions need a
 * network-wide grant.
 */
export function can(
  grants: readonly RoleGrant[],
  permission: Permission,
  siteId?: string | null,
): boolean {
  const scope = scopeOf(permission);
  return grants.some((grant) => {
    if (!rolePermissions[grant.role].includes(permission)) return false;
    if (grant.siteId === null) return true;
    if (scope === "network") return false;
    return siteId != null && grant.siteId === siteId;
  });
}

/** Whether the grants give the person any role at the site (what "their site" means). */
export function hasAnyRoleAt(grants: readonly RoleGrant[], siteId: string): boolean {
  return grants.some((grant) => grant.siteId === null || grant.siteId === siteId);
}
