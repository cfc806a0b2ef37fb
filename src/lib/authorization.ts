import {
  can as grantsAllow,
  canGrant as grantsMayGive,
  canSomewhere,
  type Permission,
  scopeOf,
} from "@shared/permissions";
import type { RoleGrant } from "@shared/roles";
import { createContext, createElement, type ReactNode, useContext, useMemo } from "react";

/**
 * What the signed-in person may do, for hiding controls they cannot use. The server still decides
 * every request; this only keeps the interface honest.
 */
export interface Authorization {
  grants: readonly RoleGrant[];
  /** Whether the person may do this at the given site (or network-wide, for network permissions). */
  can: (permission: Permission, siteId?: string | null) => boolean;
  /** Whether the person may do this at one site at least: used for navigation entries. */
  canAnywhere: (permission: Permission) => boolean;
  /** Whether the person may give or take away this role there. */
  canGrant: (target: RoleGrant) => boolean;
}

/** Site permissions count when held at any site; network permissions need a network-wide role. */
export function canAnywhere(grants: readonly RoleGrant[], permission: Permission): boolean {
  return scopeOf(permission) === "network"
    ? grantsAllow(grants, permission)
    : canSomewhere(grants, permission);
}

export function createAuthorization(grants: readonly RoleGrant[]): Authorization {
  return {
    grants,
    can: (permission, siteId) => grantsAllow(grants, permission, siteId),
    canAnywhere: (permission) => canAnywhere(grants, permission),
    canGrant: (target) => grantsMayGive(grants, target),
  };
}

const signedOut = createAuthorization([]);
const AuthorizationContext = createContext<Authorization>(signedOut);

export interface AuthorizationProviderProps {
  grants: readonly RoleGrant[];
  children?: ReactNode;
}

export function AuthorizationProvider({ grants, children }: AuthorizationProviderProps) {
  const value = useMemo(() => createAuthorization(grants), [grants]);
  return createElement(AuthorizationContext.Provider, { value }, children);
}

/** The signed-in person's authorization; outside a provider nobody may do anything. */
export function useAuthorization(): Authorization {
  return useContext(AuthorizationContext);
}
