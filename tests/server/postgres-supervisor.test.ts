import { mkdtempSync } from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { prepareCluster, type Cluster } from "../../scripts/lib/postgres";
import { superviseCluster } from "../../scripts/lib/postgres-supervisor";
import { freePort } from "../../scripts/lib/process";

async function until(what: string, condition: () => boolean, timeoutMs = 10_000) {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting: ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
}

async function answers(cluster: Cluster): Promise<boolean> {
  const client = new pg.Client({ connectionString: cluster.urlFor("postgres") });
  try {
    await client.connect();
    await client.query("select 1");
    return true;
  } finally {
    await client.end().catch(() => undefined);
  }
}

/** Kills the postmaster as the kernel's out-of-memory killer or a careless `kill -9` would. */
async function killPostmaster(cluster: Cluster): Promise<number> {
  const pid = cluster.postmasterPid();
  if (pid === null) throw new Error("PostgreSQL is not running");
  process.kill(pid, "SIGKILL");
  await until("the postmaster ends", () => !cluster.isRunning());
  return pid;
}

/** Holds the port so PostgreSQL cannot start on it. */
async function occupy(port: number): Promise<net.Server> {
  for (;;) {
    const server = net.createServer();
    const taken = await new Promise<boolean>((resolve) => {
      server.once("error", () => resolve(false));
      server.listen(port, "127.0.0.1", () => resolve(true));
    });
    if (taken) return server;
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}

describe("npm start's PostgreSQL supervisor", () => {
  let cluster: Cluster;
  beforeAll(async () => {
    const folder = mkdtempSync(path.join(os.tmpdir(), "lintel-supervised-"));
    cluster = await prepareCluster({ folder, port: await freePort(), throwaway: true });
    await cluster.start();
  });
  afterAll(() => cluster?.destroy());

  it("when the postmaster is killed, then it is started again by itself and a line says so", async () => {
    const lines: string[] = [];
    const supervisor = superviseCluster({
      cluster,
      log: (line) => lines.push(line),
      checkEveryMs: 100,
    });
    try {
      const killedAt = Date.now();
      const killed = await killPostmaster(cluster);
      await until("PostgreSQL runs again", () => lines.some((l) => /running again/.test(l)));
      const downMs = Date.now() - killedAt;

      expect(cluster.postmasterPid()).not.toBe(killed);
      expect(await answers(cluster)).toBe(true);
      expect(lines[0]).toMatch(
        new RegExp(
          `PostgreSQL on port ${cluster.port} has stopped unexpectedly; starting it again`,
        ),
      );
      expect(supervisor.attempts()).toBeGreaterThanOrEqual(1);
      expect(downMs).toBeLessThan(5_000);
    } finally {
      await supervisor.stop();
    }
  });

  it("when PostgreSQL cannot start again, then attempts back off, stay within the limit per window, and it starts once it can", async () => {
    const lines: string[] = [];
    const supervisor = superviseCluster({
      cluster,
      log: (line) => lines.push(line),
      checkEveryMs: 50,
      backoffMs: [50],
      maxAttempts: 3,
      windowMs: 1_500,
    });
    let blocker: net.Server | null = null;
    try {
      const killedAt = Date.now();
      const killed = cluster.postmasterPid()!;
      process.kill(killed, "SIGKILL");
      blocker = await occupy(cluster.port);
      await until("the limit is reached", () => lines.some((l) => /did not stay up/.test(l)));

      expect(Date.now() - killedAt).toBeLessThan(1_500);
      expect(supervisor.attempts()).toBe(3);
      expect(
        lines.filter((l) => /did not start: Port \d+ on 127\.0\.0\.1 is taken/.test(l)),
      ).toHaveLength(3);
      expect(lines.some((l) => /3 start attempts within 2 s\); next attempt in \d s/.test(l))).toBe(
        true,
      );
      expect(cluster.isRunning()).toBe(false);

      await new Promise<void>((resolve) => blocker!.close(() => resolve()));
      blocker = null;
      await until("PostgreSQL runs again", () => lines.some((l) => /running again/.test(l)));
      expect(supervisor.attempts()).toBe(4);
      expect(await answers(cluster)).toBe(true);
    } finally {
      blocker?.close();
      await supervisor.stop();
    }
  });
});
