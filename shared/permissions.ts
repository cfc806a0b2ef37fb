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
  "manage:people:site",
  "read:dev-mailbox:network",
  /** E-mail that may not have arrived: list it and send it again. */
  "resend:mail:network",
  "upload:image:site",
  "conduct:audit:site",
  "manage:checklists:network",
  /** Facilities leads: start fixing, add photos of the fix, ask for a check. */
  "work:action:site",
  /** Auditors: confirm a fix, send it back, reopen a done action. */
  "verify:action:site",
  /** Who owns an action: administrators, and facilities leads handing over to a colleague. */
  "assign:action:site",
  /** The network's identity provider (single sign-on) settings. */
  "manage:identity-provider:network",
  /** Someone at the site has seen a room-pressure alarm and says what was done. */
  "acknowledge:pressure-alarm:site",
] as const;
export type Permission = (typeof permissions)[number];

export const rolePermissions: Record<Role, readonly Permission[]> = {
  administrator: [
    "read:site:site",
    "create:site:network",
    "update:site:site",
    "read:change-log:site",
    "manage:people:site",
    "read:dev-mailbox:network",
    "resend:mail:network",
    "upload:image:site",
    "manage:checklists:network",
    "assign:action:site",
    "manage:identity-provider:network",
    "acknowledge:pressure-alarm:site",
  ],
  auditor: [
    "read:site:site",
    "upload:image:site",
    "conduct:audit:site",
    "verify:action:site",
    "acknowledge:pressure-alarm:site",
  ],
  facilities_lead: [
    "read:site:site",
    "upload:image:site",
    "work:action:site",
    "assign:action:site",
    "acknowledge:pressure-alarm:site",
  ],
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

/** Whether the person holds the permission at one site at least (or network-wide). */
export function canSomewhere(grants: readonly RoleGrant[], permission: Permission): boolean {
  return grants.some((grant) => rolePermissions[grant.role].includes(permission));
}

/**
 * Whether a person with `grants` may give (or take away) `target`: nobody grants above their own.
 * A network-wide administrator may grant any role anywhere; an administrator of a site may grant
 * any role at that site only; network-wide grants need a network-wide administrator.
 */
export function canGrant(grants: readonly RoleGrant[], target: RoleGrant): boolean {
  if (target.siteId === null) {
    return grants.some(
      (grant) =>
        grant.siteId === null && rolePermissions[grant.role].includes("manage:people:site"),
    );
  }
  return can(grants, "manage:people:site", target.siteId);
}

/** Whether the grants give the person any role at the site (what "their site" means). */
export function hasAnyRoleAt(grants: readonly RoleGrant[], siteId: string): boolean {
  return grants.some((grant) => grant.siteId === null || grant.siteId === siteId);
}
