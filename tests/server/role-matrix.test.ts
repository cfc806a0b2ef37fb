import { beforeAll, describe, expect, it } from "vitest";

import type { Role } from "@shared/roles";

import { apiRoutes } from "../../server/routes";
import { buildSite, insertNetwork, insertSite, insertUser } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { sessionCookieFor, signInAs } from "../helpers/auth";

// The designed access for every route, stated here independently of the server's own tables.
// Callers hold roles at site A (the site every sample resource belongs to), at site B (another
// site of the same network), or network-wide.
type Caller =
  | "administrator (network)"
  | "administrator @A"
  | "auditor @A"
  | "facilities lead @A"
  | "committee member (network)"
  | "committee member @A"
  | "auditor @B"
  | "administrator @B"
  | "facilities lead @B";

const callerGrants: Record<Caller, { role: Role; site: "A" | "B" | null }[]> = {
  "administrator (network)": [{ role: "administrator", site: null }],
  "administrator @A": [{ role: "administrator", site: "A" }],
  "auditor @A": [{ role: "auditor", site: "A" }],
  "facilities lead @A": [{ role: "facilities_lead", site: "A" }],
  "committee member (network)": [{ role: "committee_member", site: null }],
  "committee member @A": [{ role: "committee_member", site: "A" }],
  "auditor @B": [{ role: "auditor", site: "B" }],
  "administrator @B": [{ role: "administrator", site: "B" }],
  "facilities lead @B": [{ role: "facilities_lead", site: "B" }],
};
const everyone = Object.keys(callerGrants) as Caller[];
const atA: Caller[] = [
  "administrator (network)",
  "administrator @A",
  "auditor @A",
  "facilities lead @A",
  "committee member (network)",
  "committee member @A",
];

interface World {
  siteA: string;
  signInEmail: string;
}

interface Sample {
  url: (world: World) => string;
  body?: (world: World) => object;
  ok: number;
  /** Callers who get `ok`; other signed-in callers get 403, or 404 on a site they hold no role at. */
  allowed: Caller[];
}

const samples: Record<string, Sample> = {
  "GET /health": { url: () => "/api/health", ok: 200, allowed: everyone },
  "POST /auth/sign-in": {
    url: () => "/api/auth/sign-in",
    body: (world) => ({ email: world.signInEmail, password: "matrix-password-1" }),
    ok: 200,
    allowed: everyone,
  },
  "POST /auth/sign-out": { url: () => "/api/auth/sign-out", ok: 204, allowed: everyone },
  "GET /auth/me": { url: () => "/api/auth/me", ok: 200, allowed: everyone },
  "GET /sites": { url: () => "/api/sites", ok: 200, allowed: everyone },
  "POST /sites": {
    url: () => "/api/sites",
    body: () => buildSite(),
    ok: 201,
    allowed: ["administrator (network)"],
  },
  "GET /sites/:siteId": { url: (w) => `/api/sites/${w.siteA}`, ok: 200, allowed: atA },
  "PATCH /sites/:siteId": {
    url: (w) => `/api/sites/${w.siteA}`,
    body: () => ({ address: `${Math.random()} Matrix Road` }),
    ok: 200,
    allowed: ["administrator (network)", "administrator @A"],
  },
};

const routeKey = (route: (typeof apiRoutes)[number]) =>
  `${route.method.toUpperCase()} ${route.path}`;

describe("role matrix: every registered route, as every role, another site's member and signed out", () => {
  const world = {} as World;
  const userIds = {} as Record<Caller, string>;
  let siteBId = "";

  beforeAll(async () => {
    const { db } = testApp().deps;
    const network = await insertNetwork(db);
    world.siteA = (await insertSite(db, network.id)).id;
    siteBId = (await insertSite(db, network.id)).id;
    const signInUser = await insertUser(db, network.id, { password: "matrix-password-1" });
    world.signInEmail = signInUser.email;
    for (const caller of everyone) {
      const grants = callerGrants[caller].map((g) => ({
        role: g.role,
        siteId: g.site === null ? null : g.site === "A" ? world.siteA : siteBId,
      }));
      userIds[caller] = (await signInAs(network.id, grants)).user.id;
    }
  });

  it("when a route is registered, then the matrix has a designed answer for it", () => {
    const registered = apiRoutes.map(routeKey).sort();
    expect(Object.keys(samples).sort()).toEqual(registered);
  });

  for (const route of apiRoutes) {
    const key = routeKey(route);
    describe(key, () => {
      const sample = samples[key];
      if (!sample) return;
      const call = (cookie?: string) => {
        const request = api(undefined, { cookie }).request(route.method, sample.url(world));
        return sample.body ? request.send(sample.body(world)) : request;
      };

      it(`when signed out, then ${route.access.kind === "public" ? sample.ok : 401}`, async () => {
        const response = await call();
        expect(response.status).toBe(route.access.kind === "public" ? sample.ok : 401);
      });

      for (const caller of everyone) {
        const allowed = sample.allowed.includes(caller);
        const hasRoleAtA = atA.includes(caller);
        const expected = allowed
          ? sample.ok
          : route.access.kind === "site" && !hasRoleAtA
            ? 404
            : 403;
        it(`when called by ${caller}, then ${expected}`, async () => {
          const response = await call(await sessionCookieFor(userIds[caller]));
          expect(response.status, JSON.stringify(response.body)).toBe(expected);
          if (expected >= 400) expect(response.body.error.code).toBeTypeOf("string");
        });
      }
    });
  }
});
