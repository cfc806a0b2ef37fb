import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { can, canSomewhere } from "@shared/permissions";

import type { RouteDefinition } from "../../server/lib/routes";
import { apiRoutes } from "../../server/routes";
import { api, createTestApp, type TestApp } from "../helpers/app";
import { createIsolatedDatabase } from "../helpers/isolated-database";
import {
  bodyVariants,
  changedTables,
  fingerprint,
  paramVariants,
  prototypeKeys,
  refusedCharacters,
  unfingerprintedTables,
  uploadVariants,
  type Variant,
} from "../helpers/robustness";
import { callerNames, seedWorld, type CallerName, type World } from "../helpers/robustness-world";
import { examples, readParams, type ExampleRequest } from "./robustness.examples";

// The standing robustness walk: every route in the registry, as a caller its access admits, with
// real ids from one seeded network. Each write route gets a battery of malformed requests made
// from its valid example (robustness.examples.ts): every one must get a 4xx naming the field at
// fault and write no row; then the example itself must get a 2xx, which proves the battery reached
// the route's own validation. Read routes get malformed params and query: never a 5xx.

const routeKey = (route: RouteDefinition) => `${route.method.toUpperCase()} ${route.path}`;
const writes = apiRoutes.filter((route) => route.method !== "get");
const reads = apiRoutes.filter((route) => route.method === "get");

const tally = { routes: 0, requests: 0, "2xx": 0, "3xx": 0, "4xx": 0, "5xx": 0 };
const readTally = { routes: 0, requests: 0, "2xx": 0, "3xx": 0, "4xx": 0, "5xx": 0 };

function callerFor(route: RouteDefinition, world: World): CallerName | "nobody" {
  const access = route.access;
  if (access.kind === "public") return "nobody";
  const admitted = callerNames.find((name) => {
    const grants = world.callers[name].grants;
    if (access.kind === "signed-in") return true;
    if (access.kind === "network") return can(grants, access.permission);
    if (access.kind === "any-site") return canSomewhere(grants, access.permission);
    return can(grants, access.permission, world.siteA);
  });
  if (!admitted) throw new Error(`${routeKey(route)}: no caller of the world is admitted`);
  return admitted;
}

function urlOf(route: RouteDefinition, params: Record<string, string>, query?: string) {
  const filled = route.path.replace(/:(\w+)/g, (_, name: string) => {
    if (!(name in params)) throw new Error(`${routeKey(route)}: no value for :${name}`);
    return encode(params[name]!);
  });
  return `/api${filled}${query ? `?${query}` : ""}`;
}

/** Percent-encoding that also carries half a surrogate pair (as the bytes a careless client sends). */
function encode(value: string): string {
  return value
    .split(/([\ud800-\udfff])/)
    .map((part) => (/^[\ud800-\udfff]$/.test(part) ? "%ED%A0%80" : encodeURIComponent(part)))
    .join("");
}

const queryText = (query: [string, string][]) =>
  query.map(([key, value]) => `${encode(key)}=${encode(value)}`).join("&");

interface Outgoing {
  params: Record<string, string>;
  query?: string;
  raw?: string;
  contentType?: string;
  json?: unknown;
  upload?: Variant["upload"];
  noBody?: boolean;
  headers?: Record<string, string>;
}

describe("robustness: every route against malformed input", () => {
  let app: TestApp;
  let world: World;
  let mailboxDir = "";

  async function send(route: RouteDefinition, cookie: string | undefined, out: Outgoing) {
    const request = api(app.app, { cookie }).request(
      route.method,
      urlOf(route, out.params, out.query),
    );
    for (const [name, value] of Object.entries(out.headers ?? {})) request.set(name, value);
    if (out.upload) {
      for (const [name, value] of Object.entries(out.upload.fields ?? {}))
        request.field(name, value);
      if (out.upload.file.length > 0)
        request.attach(out.upload.field, out.upload.file, out.upload.name);
      else request.field("comment", "no file here");
    } else if (out.raw !== undefined) {
      request.set("Content-Type", out.contentType ?? "application/json").send(out.raw);
    } else if (out.json !== undefined && !out.noBody) {
      request.send(out.json as object);
    }
    const response = await request;
    return response;
  }

  function count(which: typeof tally, status: number) {
    which.requests += 1;
    const bucket = `${Math.floor(status / 100)}xx` as keyof typeof tally;
    if (bucket in which) which[bucket] += 1;
  }

  /** What is wrong with the answer to a variant, or null. */
  function judge(variant: Variant, status: number, body: unknown): string | null {
    if (status >= 500) return `${variant.label}: ${status} ${JSON.stringify(body).slice(0, 200)}`;
    if (variant.expect === "tolerated") return null;
    if (status < 400) return `${variant.label}: accepted with ${status}`;
    if (variant.field) {
      const fields = (body as { error?: { fields?: Record<string, string> } })?.error?.fields ?? {};
      const named = Object.keys(fields).some(
        (key) =>
          key === variant.field ||
          key.startsWith(`${variant.field}.`) ||
          // Without a field, its parent (or the whole body) is what falls short.
          (variant.missing && (key === "body" || variant.field!.startsWith(`${key}.`))),
      );
      if (!named)
        return `${variant.label}: ${status} does not name ${variant.field} (${JSON.stringify(body).slice(0, 200)})`;
    }
    return null;
  }

  beforeAll(async () => {
    mailboxDir = mkdtempSync(path.join(os.tmpdir(), "lintel-robust-mailbox-"));
    app = createTestApp({
      DATABASE_URL: await createIsolatedDatabase(),
      LINTEL_DEMO: "1",
      LINTEL_DEV_MAILBOX_DIR: mailboxDir,
    });
    world = await seedWorld(app);
  });

  afterAll(async () => {
    // The closing numbers of the walk, for the log of every run.
    console.log(
      `robustness walk — write routes: ${JSON.stringify(tally)}; read routes: ${JSON.stringify(readTally)}; tables not fingerprinted: ${JSON.stringify(unfingerprintedTables)}`,
    );
    await app?.database.close();
    rmSync(mailboxDir, { recursive: true, force: true });
  });

  it("when a write route is registered, then it has a valid example to build its battery from", () => {
    const missing = writes.map(routeKey).filter((key) => !(key in examples));
    expect(missing, "add these to tests/server/robustness.examples.ts").toEqual([]);
    const stale = Object.keys(examples).filter(
      (key) => !apiRoutes.some((r) => routeKey(r) === key),
    );
    expect(stale, "examples of routes that no longer exist").toEqual([]);
  });

  for (const route of writes) {
    const key = routeKey(route);
    it(`${key}: when malformed input is sent, then 4xx naming the field and no row written; the valid example then gets 2xx`, async () => {
      const example = examples[key];
      if (!example) return; // reported by the test above
      const caller = example.as ?? callerFor(route, world);
      // One session for the whole battery, made before the first fingerprint.
      const cookie = caller === "nobody" ? undefined : await world.fresh.cookie(caller);
      const control: ExampleRequest = await example.control(world);
      const params = control.params ?? {};
      const newIds = example.newIds ?? [];
      const variants: Variant[] = [...paramVariants(params, { newIds })];
      if (control.upload) variants.push(...uploadVariants(control.upload, control.uploadSchema));
      else if (route.input.body) {
        if (control.body === undefined) throw new Error(`${key}: the example needs a body`);
        variants.push(...bodyVariants(route.input.body, control.body as never, { newIds }));
      }
      const outgoing = (variant: Variant): Outgoing => ({
        params: variant.params ?? params,
        raw: variant.raw,
        contentType: variant.contentType,
        upload:
          variant.upload === undefined
            ? variant.raw
              ? undefined
              : control.upload
            : variant.upload,
        json: variant.raw === undefined && !variant.upload ? control.body : undefined,
        noBody: variant.noBody,
        headers: control.headers,
      });

      const problems: string[] = [];
      const before = await fingerprint(app.deps.db);
      for (const variant of variants.filter((v) => v.expect === "refused")) {
        const response = await send(route, cookie, outgoing(variant));
        count(tally, response.status);
        const problem = judge(variant, response.status, response.body);
        if (problem) problems.push(problem);
      }
      const written = changedTables(before, await fingerprint(app.deps.db));
      if (written.length)
        problems.push(`refused requests changed the tables ${written.join(", ")}`);

      const answer = await send(route, cookie, {
        params,
        json: control.upload ? undefined : control.body,
        upload: control.upload,
        headers: control.headers,
      });
      count(tally, answer.status);
      if (answer.status < 200 || answer.status >= 300)
        problems.push(
          `the valid example got ${answer.status} ${JSON.stringify(answer.body).slice(0, 300)}`,
        );

      // Maybe valid (emoji, right-to-left text, a missing optional field): after the control,
      // since they may well be stored; they must never break the server.
      for (const variant of variants.filter((v) => v.expect === "tolerated")) {
        const response = await send(route, cookie, outgoing(variant));
        count(tally, response.status);
        const problem = judge(variant, response.status, response.body);
        if (problem) problems.push(problem);
      }
      tally.routes += 1;
      expect(problems).toEqual([]);
    });
  }

  for (const route of reads) {
    const key = routeKey(route);
    it(`${key}: when params and query are malformed, then never 5xx`, async () => {
      const example = examples[key];
      const caller = example?.as ?? callerFor(route, world);
      const cookie = caller === "nobody" ? undefined : await world.fresh.cookie(caller);
      const control = example ? await example.control(world) : {};
      const byName = await readParams(world);
      const names = [...route.path.matchAll(/:(\w+)/g)].map((match) => match[1]!);
      const params =
        control.params ?? Object.fromEntries(names.map((name) => [name, byName[name]!]));
      const query = Object.entries(control.query ?? {});
      const validates = Boolean(route.input.query);

      const variants: Variant[] = paramVariants(params, { newIds: [] });
      const queryVariants: { label: string; query: [string, string][]; field?: string }[] = [];
      for (const extra of ["unexpectedField", ...prototypeKeys, "hasOwnProperty"])
        queryVariants.push({
          label: `query ${extra}`,
          query: [...query, [extra, "1"]],
          field: extra,
        });
      for (const [name, value] of query) {
        const others = query.filter(([other]) => other !== name);
        for (const [what, character] of Object.entries(refusedCharacters))
          queryVariants.push({
            label: `query ${name} with ${what}`,
            query: [...others, [name, `${value}${character}`]],
            field: name,
          });
        queryVariants.push({
          label: `query ${name} twice`,
          query: [...query, [name, value]],
          field: name,
        });
        queryVariants.push({
          label: `query ${name}[x]`,
          query: [...others, [`${name}[x]`, value]],
        });
        queryVariants.push({
          label: `query ${name} of 10000`,
          query: [...others, [name, value.padEnd(10_000, "a")]],
        });
        queryVariants.push({ label: `query ${name} empty`, query: [...others, [name, ""]] });
      }

      const problems: string[] = [];
      const baseline = await send(route, cookie, { params, query: queryText(query) });
      count(readTally, baseline.status);
      if (example?.redirectsToProblem) {
        // A browser navigation that answers with a redirect (the provider sign-in): whatever the
        // query, it is refused with a 4xx or sent to the problem page, never signed in, never 5xx.
        const judgeRedirect = (label: string, response: typeof baseline) => {
          if (response.status >= 400 && response.status < 500) return;
          const location = String(response.headers.location ?? "");
          if (response.status !== 302 || !location.startsWith("/sign-in/problem?"))
            problems.push(`${label}: ${response.status} ${location}`);
          if (/lintel_session=[^;]/.test(String(response.headers["set-cookie"] ?? "")))
            problems.push(`${label}: a session cookie`);
        };
        judgeRedirect("the plain request", baseline);
        for (const variant of queryVariants) {
          const response = await send(route, cookie, { params, query: queryText(variant.query) });
          count(readTally, response.status);
          judgeRedirect(variant.label, response);
        }
        readTally.routes += 1;
        expect(problems).toEqual([]);
        return;
      }
      if (example ? baseline.status >= 300 : baseline.status >= 500)
        problems.push(
          `the plain request got ${baseline.status} ${JSON.stringify(baseline.body).slice(0, 200)}`,
        );
      for (const variant of variants) {
        const response = await send(route, cookie, {
          params: variant.params!,
          query: queryText(query),
        });
        count(readTally, response.status);
        const problem = judge(variant, response.status, response.body);
        if (problem) problems.push(problem);
      }
      for (const variant of queryVariants) {
        const response = await send(route, cookie, { params, query: queryText(variant.query) });
        count(readTally, response.status);
        const problem = judge(
          {
            label: variant.label,
            expect: validates && variant.field ? "refused" : "tolerated",
            field: variant.field,
          },
          response.status,
          response.body,
        );
        if (problem) problems.push(problem);
      }
      readTally.routes += 1;
      expect(problems).toEqual([]);
    });
  }
});
