import { describe, expect, expectTypeOf, it } from "vitest";

import { siteParamsSchema } from "@shared/schemas/site";

import {
  atSite,
  defineRoute,
  siteThrough,
  type RequestActor,
  type SignedIn,
} from "../../server/lib/routes";

// The handler's context follows from the route's access. The type checks here are checked by
// `tsc -p tsconfig.json` (which includes this folder): a nullable `auth` on a signed-in route, or
// an `actor` on a public one, fails the typecheck.

describe("route typing", () => {
  it("when a route needs a signed-in person, then its handler's auth and actor are not nullable", () => {
    const seen: unknown[] = [];
    defineRoute({
      method: "get",
      path: "/typing/signed-in",
      summary: "typing",
      access: { kind: "signed-in" },
      handle({ auth, actor }) {
        expectTypeOf(auth).toEqualTypeOf<SignedIn>();
        expectTypeOf(actor).toEqualTypeOf<RequestActor>();
        expectTypeOf(actor.userId).toEqualTypeOf<string>();
        seen.push(auth.user.id);
      },
    });
    defineRoute({
      method: "get",
      path: "/typing/network",
      summary: "typing",
      access: { kind: "network", permission: "create:site:network" },
      handle({ auth }) {
        expectTypeOf(auth).toEqualTypeOf<SignedIn>();
      },
    });
    defineRoute({
      method: "get",
      path: "/typing/any-site",
      summary: "typing",
      access: { kind: "any-site", permission: "read:site:site" },
      handle({ auth }) {
        expectTypeOf(auth).toEqualTypeOf<SignedIn>();
      },
    });
    const route = defineRoute({
      method: "get",
      path: "/typing/sites/:siteId",
      summary: "typing",
      access: atSite("read:site:site"),
      params: siteParamsSchema,
      handle({ auth, siteId, params }) {
        expectTypeOf(auth).toEqualTypeOf<SignedIn>();
        expectTypeOf(siteId).toEqualTypeOf<string>();
        expectTypeOf(params.siteId).toEqualTypeOf<string>();
      },
    });
    expect(route.access).toMatchObject({ kind: "site", param: "siteId" });
    expect(seen).toEqual([]);
  });

  it("when a route is public, then its handler's auth may be null and it has no actor", () => {
    const route = defineRoute({
      method: "get",
      path: "/typing/public",
      summary: "typing",
      access: { kind: "public" },
      handle(ctx) {
        expectTypeOf(ctx.auth).toEqualTypeOf<SignedIn | null>();
        // @ts-expect-error -- nobody need be signed in, so there is no actor to log
        void ctx.actor;
        // @ts-expect-error -- and no site
        void ctx.siteId;
      },
    });
    expect(route.access.kind).toBe("public");
  });

  it("when a site-scoped route's path does not name the parameter its site is found through, then declaring it fails", () => {
    expect(() =>
      defineRoute({
        method: "get",
        path: "/typing/floors/:floorId",
        summary: "typing",
        access: atSite("read:site:site"),
        handle: () => undefined,
      }),
    ).toThrow("get /typing/floors/:floorId: the path names no :siteId");
    const viaSpace = siteThrough("spaceId", async () => null);
    expect(() =>
      defineRoute({
        method: "post",
        path: "/typing/spaces/:spaceIdentifier",
        summary: "typing",
        access: viaSpace("update:site:site"),
        handle: () => undefined,
      }),
    ).toThrow("the path names no :spaceId");
  });
});
