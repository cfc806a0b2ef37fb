import { spawn, type ChildProcess } from "node:child_process";
import { randomUUID } from "node:crypto";
import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";

import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { startMailCatcher, type MailCatcher } from "../../scripts/lib/mail-catcher";
import { prepareCluster, type Cluster } from "../../scripts/lib/postgres";
import { freePort } from "../../scripts/lib/process";
import { createSessionStore } from "../../server/auth/sessions";
import { connectDatabase, migrateDatabase } from "../../server/db/client";
import { outbox, sites } from "../../server/db/schema/index";
import { enqueueMail } from "../../server/outbox/outbox.repository";
import { apiRoutes } from "../../server/routes";
import { buildSite, insertGrant, insertNetwork, insertUser } from "../factories/records";

const root = path.resolve(import.meta.dirname, "../..");
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function until<T>(
  what: string,
  probe: () => Promise<T | null> | T | null,
  timeoutMs = 10_000,
) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== null && value !== false) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting: ${what}`);
    await sleep(25);
  }
}

interface Outcome {
  kind: "read" | "write";
  startedAt: number;
  endedAt: number;
  /** 0: the connection was refused (no server); -1: no answer within the wait (hung). */
  status: number;
  retryAfter: string | null;
  code?: string;
  message?: string;
}

/**
 * The server as deployed — `server/index.ts` in a process of its own, with its e-mail worker and
 * notice scheduler — on a PostgreSQL cluster of this test's own, so the test can kill the
 * postmaster and see whether the server process outlives it.
 */
describe("when PostgreSQL goes away", () => {
  let cluster: Cluster;
  let catcher: MailCatcher;
  let server: ChildProcess;
  let output = "";
  let base = "";
  let cookie = "";
  let networkId = "";
  let url = "";

  const alive = () => server.exitCode === null && server.signalCode === null;
  const exitReport = () =>
    `the server process ended (exit ${server.exitCode}, signal ${server.signalCode}); its last output:\n${output.slice(-1500)}`;

  async function call(kind: Outcome["kind"]): Promise<Outcome> {
    const startedAt = Date.now();
    const init: RequestInit =
      kind === "read"
        ? { headers: { Cookie: cookie } }
        : {
            method: "POST",
            headers: { Cookie: cookie, Origin: base, "Content-Type": "application/json" },
            body: JSON.stringify(buildSite()),
          };
    try {
      const response = await fetch(`${base}/api/sites`, {
        ...init,
        signal: AbortSignal.timeout(8_000),
      });
      const body = (await response.json().catch(() => ({}))) as {
        error?: { code: string; message: string };
      };
      return {
        kind,
        startedAt,
        endedAt: Date.now(),
        status: response.status,
        retryAfter: response.headers.get("retry-after"),
        code: body.error?.code,
        message: body.error?.message,
      };
    } catch (error) {
      const hung = error instanceof Error && error.name === "TimeoutError";
      return { kind, startedAt, endedAt: Date.now(), status: hung ? -1 : 0, retryAfter: null };
    }
  }

  /** Keeps requests going from `workers` callers until stopped: reads, and every third a write. */
  function load(workers: number) {
    const outcomes: Outcome[] = [];
    let running = true;
    const loops = Array.from({ length: workers }, async (_, worker) => {
      for (let n = 0; running; n += 1) {
        outcomes.push(await call((n + worker) % 3 === 2 ? "write" : "read"));
        await sleep(15);
      }
    });
    return {
      outcomes,
      stop: async () => {
        running = false;
        await Promise.all(loops);
      },
    };
  }

  /** pg_ctl's crash: SIGKILL to the postmaster, as the out-of-memory killer would. */
  async function killPostgres(): Promise<number> {
    const pid = cluster.postmasterPid();
    if (pid === null) throw new Error("PostgreSQL is not running");
    process.kill(pid, "SIGKILL");
    await until("the postmaster ends", () => !cluster.isRunning());
    return Date.now();
  }

  /** Starts the cluster again (its killed backends may take a moment to let go). */
  async function restartPostgres(): Promise<{ began: number; ready: number }> {
    const began = Date.now();
    await until(
      "PostgreSQL starts again",
      () =>
        cluster.start().then(
          () => true,
          () => null,
        ),
      10_000,
    );
    return { began, ready: Date.now() };
  }

  beforeAll(async () => {
    const folder = mkdtempSync(path.join(os.tmpdir(), "lintel-outage-"));
    // Durable settings (not the throwaway ones): a write answered 201 must survive the crash.
    cluster = await prepareCluster({ folder, port: await freePort() });
    await cluster.start();
    cluster.createDatabase("lintel");
    url = cluster.urlFor("lintel");
    await migrateDatabase(url);

    const seed = connectDatabase(url, { max: 2 });
    try {
      networkId = (await insertNetwork(seed.db)).id;
      const admin = await insertUser(seed.db, networkId);
      await insertGrant(seed.db, admin.id, "administrator", null);
      const { setCookie } = await createSessionStore(seed.db, { days: 1, secure: false }).create(
        admin.id,
      );
      cookie = setCookie.split(";")[0]!;
    } finally {
      await seed.close();
    }

    catcher = await startMailCatcher();
    const port = await freePort();
    base = `http://127.0.0.1:${port}`;
    server = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
      cwd: root,
      env: {
        PATH: process.env.PATH,
        NODE_ENV: "production",
        LINTEL_SECRET_KEY: Buffer.alloc(32, 7).toString("base64"),
        DATABASE_URL: url,
        HOST: "127.0.0.1",
        PORT: String(port),
        LINTEL_PUBLIC_URL: base,
        LOG_LEVEL: "info",
        S3_ENDPOINT: process.env.S3_ENDPOINT,
        S3_BUCKET: "lintel-test",
        SMTP_HOST: "127.0.0.1",
        SMTP_PORT: String(catcher.port),
        LINTEL_OUTBOX_POLL_MS: "200",
        LINTEL_ACTION_NOTICE_MS: "300",
      },
      stdio: ["ignore", "pipe", "pipe"],
    });
    server.stdout!.on("data", (chunk: Buffer) => (output += chunk.toString()));
    server.stderr!.on("data", (chunk: Buffer) => (output += chunk.toString()));
    await until(
      "the server answers",
      () => {
        if (!alive()) throw new Error(exitReport());
        return fetch(`${base}/api/health`).then(
          (r) => r.status === 200 || null,
          () => null,
        );
      },
      20_000,
    );
  }, 40_000);

  afterAll(async () => {
    if (server && alive()) {
      server.kill("SIGTERM");
      await until("the server stops", () => !alive()).catch(() => server.kill("SIGKILL"));
    }
    await catcher?.stop();
    cluster?.destroy();
  });

  it("when the postmaster is killed under load and while idle, then the server lives, answers 503 with Retry-After, and recovers by itself", async () => {
    const traffic = load(4);
    await until(
      "requests succeed",
      () => traffic.outcomes.filter((o) => o.status < 300).length >= 12 || null,
    );

    // Under load.
    const killedAt = await killPostgres();
    await sleep(2_000);
    expect(alive(), exitReport()).toBe(true);
    const restart = await restartPostgres();
    const recovered = await until(
      "reads succeed again",
      () =>
        traffic.outcomes.find(
          (o) => o.kind === "read" && o.startedAt >= restart.began && o.status === 200,
        ) ?? null,
    );
    await sleep(300);
    await traffic.stop();
    expect(alive(), exitReport()).toBe(true);

    const { outcomes } = traffic;
    const duringOutage = outcomes.filter(
      (o) => o.startedAt > killedAt && o.endedAt < restart.began,
    );
    const unavailable = outcomes.filter((o) => o.status === 503);
    const failed = outcomes.filter((o) => o.status >= 300 || o.status <= 0);
    // Every failure is the honest 503: none refused, none hung, no 500.
    expect(failed.map((o) => o.status).filter((s) => s !== 503)).toEqual([]);
    expect(duringOutage.length).toBeGreaterThan(20);
    expect(duringOutage.filter((o) => o.status !== 503)).toEqual([]);
    expect(duringOutage.some((o) => o.kind === "write")).toBe(true);
    for (const answer of unavailable) {
      expect(answer.retryAfter).toBe("5");
      expect(answer.code).toBe("unavailable");
      expect(answer.message).toMatch(/cannot reach its database/);
    }
    const slowest503 = Math.max(...unavailable.map((o) => o.endedAt - o.startedAt));
    expect(slowest503).toBeLessThan(1_000);

    // A write after recovery is stored, and the e-mail worker, which lived through it, still sends.
    const written = await call("write");
    expect(written.status).toBe(201);
    const check = connectDatabase(url, { max: 1 });
    try {
      const mailId = await enqueueMail(
        check.db,
        {
          topic: "outage-check",
          to: "after-outage@example.org",
          subject: "Sent after PostgreSQL came back",
          text: "The e-mail worker carries on.",
          html: null,
        },
        null,
      );
      await until(
        "the e-mail worker sends",
        async () => {
          const [mail] = await check.db.select().from(outbox).where(eq(outbox.id, mailId));
          return mail!.status === "sent" || null;
        },
        5_000,
      );
      expect(catcher.messages.map((m) => m.to)).toContainEqual(["after-outage@example.org"]);
      const stored = await check.db
        .select({ id: sites.id })
        .from(sites)
        .where(and(eq(sites.networkId, networkId)));
      expect(stored.length).toBe(outcomes.filter((o) => o.status === 201).length + 1);
    } finally {
      await check.close();
    }

    // While idle: only pooled connections, no request in flight.
    await sleep(300);
    const idleKilledAt = await killPostgres();
    await sleep(700);
    expect(alive(), exitReport()).toBe(true);
    const idleAnswer = await call("read");
    expect(idleAnswer).toMatchObject({ status: 503, retryAfter: "5", code: "unavailable" });
    // Every route of the registry, as the signed-in administrator: the session check that runs
    // before any route meets the lost database first, and says 503. Without a session, a public
    // route answers 503 too, refuses the empty body (4xx), or needs no database (the app's
    // settings); never another 5xx.
    const routeAnswers: string[] = [];
    for (const route of apiRoutes) {
      const target = `${base}/api${route.path.replace(/:[A-Za-z]+/g, randomUUID())}`;
      for (const signedIn of route.access.kind === "public" ? [true, false] : [true]) {
        const response = await fetch(target, {
          method: route.method.toUpperCase(),
          headers: {
            ...(signedIn ? { Cookie: cookie } : {}),
            Origin: base,
            ...(route.method === "get" ? {} : { "Content-Type": "application/json" }),
          },
          body: route.method === "get" ? undefined : "{}",
          signal: AbortSignal.timeout(8_000),
        });
        const ok = signedIn
          ? response.status === 503 && response.headers.get("retry-after") === "5"
          : response.status < 500 ||
            (response.status === 503 && response.headers.get("retry-after") === "5");
        if (!ok)
          routeAnswers.push(
            `${route.method} ${route.path} (${signedIn ? "signed in" : "no session"}): ${response.status}`,
          );
      }
    }
    expect(routeAnswers).toEqual([]);
    const health = await fetch(`${base}/api/health`);
    expect(health.status).toBe(503);
    expect(health.headers.get("retry-after")).toBe("5");
    const idleRestart = await restartPostgres();
    const idleRecovered = await until("reads succeed again", async () => {
      const outcome = await call("read");
      return outcome.status === 200 ? outcome : null;
    });
    expect(alive(), exitReport()).toBe(true);
    expect(output).toMatch(/PostgreSQL connection lost/);
    expect(output).toMatch(/PostgreSQL is reachable again/);
    // Logged once an outage, as warnings; no request or background round failed unexplained.
    expect(output).not.toMatch(/unhandled error|outbox round failed|action notice round failed/);
    expect(output).toMatch(/e-mail waits in the outbox until it is back/);

    console.info(
      JSON.stringify({
        requests: outcomes.length,
        ok: outcomes.filter((o) => o.status < 300).length,
        answered503: unavailable.length,
        duringOutage: duringOutage.length,
        slowest503Ms: slowest503,
        outageMs: restart.began - killedAt,
        postgresStartMs: restart.ready - restart.began,
        firstOkAfterRestartBeganMs: recovered.endedAt - restart.began,
        routesChecked: apiRoutes.length,
        idleOutageMs: idleRestart.began - idleKilledAt,
        idlePostgresStartMs: idleRestart.ready - idleRestart.began,
        idleFirstOkAfterRestartBeganMs: idleRecovered.endedAt - idleRestart.began,
      }),
    );
  }, 30_000);
});
