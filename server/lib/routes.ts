import type { Request, RequestHandler, Response, Router } from "express";
import type { Logger } from "pino";
import type { z } from "zod";

import { can, canSomewhere, hasAnyRoleAt, scopeOf, type Permission } from "@shared/permissions";
import type { RoleGrant } from "@shared/roles";

import type { ResetLimiter, SignInLimiter } from "../auth/sign-in-limiter";
import type { SessionStore, SessionUser } from "../auth/sessions";
import type { Database } from "../db/client";
import type { Env } from "../env";
import type { Storage } from "./storage";
import { parseInput } from "../middleware/validate";
import { forbidden, notFound, unauthenticated } from "./app-error";

export interface AppDeps {
  db: Database;
  env: Env;
  logger: Logger;
  sessions: SessionStore;
  signInLimiter: SignInLimiter;
  resetLimiter: ResetLimiter;
  storage: Storage;
  /** Whether the site exists and belongs to the network (every site-scoped route asks this). */
  siteInNetwork: (siteId: string, networkId: string) => Promise<boolean>;
  /** Loads a person's role grants; one query per request. */
  loadGrants: (userId: string) => Promise<RoleGrant[]>;
  /** Tells the e-mail worker that new mail is waiting (after the transaction commits). */
  notifyOutbox: () => void;
  /**
   * The folder of the local mail catcher when the process that started it runs this app
   * (`npm start`, the browser tests); null otherwise, and always null from `server/index.ts`.
   */
  mailCatcherDir: string | null;
}

export interface SignedIn {
  user: SessionUser;
  sessionId: string;
  grants: RoleGrant[];
}

/**
 * Who may call a route. Site-scoped routes name how to find the site the resource belongs to
 * (null when the resource does not exist); the mount code checks that site is in the caller's
 * network, decides, then runs the handler.
 */
export type Access =
  | { kind: "public" }
  | { kind: "signed-in" }
  | { kind: "network"; permission: Permission }
  /** The permission at one site at least; the service narrows to those sites. */
  | { kind: "any-site"; permission: Permission }
  | {
      kind: "site";
      permission: Permission;
      /** `req` serves resources the request itself creates (its body says where). */
      siteOf: (
        params: Record<string, string>,
        deps: AppDeps,
        user: SessionUser,
        req: Request,
      ) => Promise<string | null>;
    };

export interface RouteContext<P, Q, B> {
  req: Request;
  res: Response;
  deps: AppDeps;
  params: P;
  query: Q;
  body: B;
  /** Present on every route but public ones. */
  auth: SignedIn | null;
  /** The site the resource belongs to, on site-scoped routes. */
  siteId: string | null;
  requestId: string;
}

export interface RouteDefinition {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** Express path under /api, e.g. `/sites/:siteId`. */
  path: string;
  access: Access;
  /** One line for the route list in docs and test names. */
  summary: string;
  // The registry holds routes of every input type; defineRoute keeps each handler typed.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  handle: (ctx: RouteContext<any, any, any>) => Promise<unknown> | unknown;
  input: { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };
  /** A route that exists only in some installations; unmounted, it answers like any unknown route. */
  mountedWhen?: (deps: AppDeps) => boolean;
}

/** Declares a route with typed input; the registry is the list of these. */
export function defineRoute<
  P extends z.ZodType = z.ZodType<Record<string, never>>,
  Q extends z.ZodType = z.ZodType<Record<string, never>>,
  B extends z.ZodType = z.ZodType<undefined>,
>(route: {
  method: RouteDefinition["method"];
  path: string;
  access: Access;
  summary: string;
  params?: P;
  query?: Q;
  body?: B;
  mountedWhen?: (deps: AppDeps) => boolean;
  handle: (ctx: RouteContext<z.output<P>, z.output<Q>, z.output<B>>) => Promise<unknown> | unknown;
}): RouteDefinition {
  if (route.access.kind === "network" && scopeOf(route.access.permission) !== "network") {
    throw new Error(
      `${route.method} ${route.path}: ${route.access.permission} is not network-scoped`,
    );
  }
  return {
    method: route.method,
    path: route.path,
    access: route.access,
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
      if (route.access.kind !== "public" && auth === null) throw unauthenticated();

      const params = route.input.params ? parseInput(route.input.params, req.params, "params") : {};
      let siteId: string | null = null;
      if (route.access.kind === "network") {
        if (!can(auth!.grants, route.access.permission)) throw forbidden();
      } else if (route.access.kind === "any-site") {
        if (!canSomewhere(auth!.grants, route.access.permission)) throw forbidden();
      } else if (route.access.kind === "site") {
        siteId = await route.access.siteOf(params as Record<string, string>, deps, auth!.user, req);
        if (siteId !== null && !(await deps.siteInNetwork(siteId, auth!.user.networkId)))
          siteId = null;
        // What is not theirs to see does not exist for them.
        if (siteId === null || !hasAnyRoleAt(auth!.grants, siteId)) throw notFound();
        if (!can(auth!.grants, route.access.permission, siteId)) throw forbidden();
      }
      const query = route.input.query ? parseInput(route.input.query, req.query, "query") : {};
      const body = route.input.body ? parseInput(route.input.body, req.body, "body") : undefined;

      await route.handle({
        req,
        res,
        deps,
        params,
        query,
        body,
        auth,
        siteId,
        requestId: String(req.id),
      });
    };
    router[route.method](route.path, handler);
  }
}
