import type { Request, RequestHandler, Response, Router } from "express";
import type { z } from "zod";

import { can, canSomewhere, hasAnyRoleAt, scopeOf, type Permission } from "@shared/permissions";

import type { Database } from "../db/client";
import { parseInput } from "../middleware/validate";
import { forbidden, notFound, unauthenticated } from "./app-error";
import type { AppDeps, RequestActor, SignedIn } from "./context";

export type { AppDeps, RequestActor, SignedIn } from "./context";

/**
 * Finds the site a resource belongs to (null when it does not exist) from the parsed path
 * parameters; a resource the request itself creates says in the body, as sent, where it goes.
 */
type SiteOf = (
  params: Record<string, string>,
  deps: AppDeps,
  rawBody: unknown,
) => Promise<string | null>;

export interface PublicAccess {
  kind: "public";
}
export interface SignedInAccess {
  kind: "signed-in";
}
export interface NetworkAccess {
  kind: "network";
  permission: Permission;
}
/** The permission at one site at least; the service narrows to those sites. */
export interface AnySiteAccess {
  kind: "any-site";
  permission: Permission;
}
export interface SiteAccess {
  kind: "site";
  permission: Permission;
  /** The path parameter `siteOf` reads; the route's path must name it. */
  param: string;
  siteOf: SiteOf;
}

/**
 * Who may call a route. Site-scoped routes name how to find the site the resource belongs to
 * (`atSite`, `siteThrough`); the mount code checks that site is in the caller's network, decides,
 * then runs the handler.
 */
export type Access = PublicAccess | SignedInAccess | NetworkAccess | AnySiteAccess | SiteAccess;

interface BaseContext<P, Q, B> {
  req: Request;
  res: Response;
  deps: AppDeps;
  params: P;
  query: Q;
  body: B;
  requestId: string;
}

/** A public route: whoever asks, signed in or not. */
export interface PublicContext<P, Q, B> extends BaseContext<P, Q, B> {
  auth: SignedIn | null;
}

/** Every route but public ones: the person is known (401 before the handler otherwise). */
export interface SignedInContext<P, Q, B> extends BaseContext<P, Q, B> {
  auth: SignedIn;
  actor: RequestActor;
}

/** A site-scoped route: the site is known, in the person's network, and theirs to act at. */
export interface SiteContext<P, Q, B> extends SignedInContext<P, Q, B> {
  siteId: string;
}

/** The handler's context follows from the route's access (a union of accesses gives the union). */
export type RouteContext<A extends Access, P, Q, B> = A extends PublicAccess
  ? PublicContext<P, Q, B>
  : A extends SiteAccess
    ? SiteContext<P, Q, B>
    : SignedInContext<P, Q, B>;

export interface RouteDefinition {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** Express path under /api, e.g. `/sites/:siteId`. */
  path: string;
  access: Access;
  /** One line for the route list in docs and test names. */
  summary: string;
  // The registry holds routes of every input type; defineRoute keeps each handler typed (method
  // syntax: a handler typed for its own access kind fits the registry's union of them).
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  handle(ctx: RouteContext<Access, any, any, any>): Promise<unknown> | unknown;
  input: { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };
  /** A route that exists only in some installations; unmounted, it answers like any unknown route. */
  mountedWhen?: (deps: AppDeps) => boolean;
}

/** Site-scoped access to the site named in the path's `:siteId`. */
export function atSite(permission: Permission): SiteAccess {
  return siteThrough("siteId", async (_db, siteId) => siteId)(permission);
}

/**
 * Site-scoped access through the resource named by the path parameter `param`: `resolve` returns
 * the site that resource belongs to, or null when it does not exist.
 */
export function siteThrough(
  param: string,
  resolve: (db: Database, id: string, rawBody: unknown) => Promise<string | null>,
): (permission: Permission) => SiteAccess {
  return (permission) => ({
    kind: "site",
    permission,
    param,
    siteOf: async (params, deps, rawBody) => {
      const id = params[param];
      return id === undefined ? null : resolve(deps.db, id, rawBody);
    },
  });
}

/** Declares a route with typed input; the registry is the list of these. */
export function defineRoute<
  const A extends Access,
  P extends z.ZodType = z.ZodType<Record<string, never>>,
  Q extends z.ZodType = z.ZodType<Record<string, never>>,
  B extends z.ZodType = z.ZodType<undefined>,
>(route: {
  method: RouteDefinition["method"];
  path: string;
  access: A;
  summary: string;
  params?: P;
  query?: Q;
  body?: B;
  mountedWhen?: (deps: AppDeps) => boolean;
  handle: (
    ctx: RouteContext<A, z.output<P>, z.output<Q>, z.output<B>>,
  ) => Promise<unknown> | unknown;
}): RouteDefinition {
  const access: Access = route.access;
  if (access.kind === "network" && scopeOf(access.permission) !== "network") {
    throw new Error(`${route.method} ${route.path}: ${access.permission} is not network-scoped`);
  }
  if (access.kind === "site") {
    const names = route.path.split("/").filter((part) => part.startsWith(":"));
    if (!names.includes(`:${access.param}`))
      throw new Error(`${route.method} ${route.path}: the path names no :${access.param}`);
  }
  return {
    method: route.method,
    path: route.path,
    access,
    summary: route.summary,
    handle: route.handle,
    input: { params: route.params, query: route.query, body: route.body },
    mountedWhen: route.mountedWhen,
  };
}

/** Mounts every route with the same sequence: who → params → scope → permission → query/body. */
export function mountRoutes(
  router: Router,
  routes: readonly RouteDefinition[],
  deps: AppDeps,
): void {
  for (const route of routes) {
    if (route.mountedWhen && !route.mountedWhen(deps)) continue;
    const handler: RequestHandler = async (req, res) => {
      const auth = (res.locals.auth as SignedIn | null | undefined) ?? null;
      const requestId = String(req.id);
      const access = route.access;
      if (access.kind === "public") {
        const params = parseParams(route, req);
        const { query, body } = parseQueryAndBody(route, req);
        await route.handle({ req, res, deps, params, query, body, requestId, auth });
        return;
      }
      if (auth === null) throw unauthenticated();

      const params = parseParams(route, req);
      let siteId: string | null = null;
      if (access.kind === "network") {
        if (!can(auth.grants, access.permission)) throw forbidden();
      } else if (access.kind === "any-site") {
        if (!canSomewhere(auth.grants, access.permission)) throw forbidden();
      } else if (access.kind === "site") {
        siteId = await access.siteOf(params as Record<string, string>, deps, req.body as unknown);
        if (siteId !== null && !(await deps.siteInNetwork(siteId, auth.user.networkId)))
          siteId = null;
        // What is not theirs to see does not exist for them.
        if (siteId === null || !hasAnyRoleAt(auth.grants, siteId)) throw notFound();
        if (!can(auth.grants, access.permission, siteId)) throw forbidden();
      }
      const { query, body } = parseQueryAndBody(route, req);
      const actor: RequestActor = { userId: auth.user.id, requestId };
      const signedIn = { req, res, deps, params, query, body, requestId, auth, actor };
      // Site-scoped routes (and only they) reach here with their site decided.
      await route.handle(siteId === null ? signedIn : { ...signedIn, siteId });
    };
    router[route.method](route.path, handler);
  }
}

const parseParams = (route: RouteDefinition, req: Request) =>
  route.input.params ? parseInput(route.input.params, req.params, "params") : {};

const parseQueryAndBody = (route: RouteDefinition, req: Request) => ({
  query: route.input.query ? parseInput(route.input.query, req.query, "query") : {},
  body: route.input.body ? parseInput(route.input.body, req.body, "body") : undefined,
});
