import { spawn } from "node:child_process";
import { createHash } from "node:crypto";
import {
  chmodSync,
  closeSync,
  existsSync,
  mkdirSync,
  openSync,
  readdirSync,
  readFileSync,
  rmSync,
} from "node:fs";
import os from "node:os";
import path from "node:path";

import { aptInstall, isRoot, portInUse, run } from "./process";

const debianRoot = "/usr/lib/postgresql";

function findBinDir(): string | null {
  if (!existsSync(debianRoot)) return null;
  const versions = readdirSync(debianRoot)
    .filter((name) => existsSync(path.join(debianRoot, name, "bin", "initdb")))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] ? path.join(debianRoot, versions[0], "bin") : null;
}

/** PostgreSQL's server binaries from Debian's package, installing the package when allowed. */
export async function ensurePostgresBinaries(): Promise<string> {
  const found = findBinDir();
  if (found) return found;
  await aptInstall(["postgresql"], "PostgreSQL (Debian package postgresql)");
  const installed = findBinDir();
  if (!installed)
    throw new Error(`PostgreSQL was installed but no initdb was found under ${debianRoot}.`);
  return installed;
}

/** As root, PostgreSQL refuses to run: each command runs as the `postgres` system user. */
function pg(binDir: string, tool: string, args: string[]): string {
  const binary = path.join(binDir, tool);
  if (isRoot) return run("runuser", ["-u", "postgres", "--", binary, ...args], { cwd: "/" });
  return run(binary, args);
}

/** Whether the `postgres` user can reach and write `dir` (a 0700 home in the path stops it). */
function postgresUserCanUse(dir: string): boolean {
  if (!isRoot) return true;
  try {
    run("runuser", ["-u", "postgres", "--", "test", "-x", dir]);
    return true;
  } catch {
    return false;
  }
}

/** Whether a process lives (a zombie — ended, not yet reaped by its parent — does not). */
function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== "EPERM") return false;
  }
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    return stat.slice(stat.lastIndexOf(")") + 2, stat.lastIndexOf(")") + 3) !== "Z";
  } catch {
    return true;
  }
}

export interface ClusterOptions {
  /** Folder for data, socket and log. */
  folder: string;
  port: number;
  /** Throwaway clusters trade durability for speed. */
  throwaway?: boolean;
}

export interface Cluster {
  folder: string;
  port: number;
  binDir: string;
  urlFor: (database: string) => string;
  /** Whether a postmaster runs on this folder (a killed one that is not yet reaped does not count). */
  isRunning: () => boolean;
  /** The running postmaster's process id, or null. */
  postmasterPid: () => number | null;
  /** Starts PostgreSQL unless it runs, and resolves once it accepts connections. */
  start: () => Promise<void>;
  /** Creates the database unless it exists, optionally as a copy of `template`. */
  createDatabase: (name: string, template?: string) => void;
  stop: () => void;
  /** Stops and deletes the folder (throwaway clusters only). */
  destroy: () => void;
}

/**
 * Picks the cluster folder: the wanted one, or — when running as root and the `postgres` user
 * cannot enter it — a stable folder under the system temp directory.
 */
export function chooseClusterFolder(wanted: string): { folder: string; moved: boolean } {
  mkdirSync(wanted, { recursive: true });
  if (postgresUserCanUse(wanted)) return { folder: wanted, moved: false };
  const tag = createHash("sha256").update(wanted).digest("hex").slice(0, 12);
  const folder = path.join(os.tmpdir(), `lintel-postgres-${tag}`);
  mkdirSync(folder, { recursive: true });
  return { folder, moved: true };
}

export async function prepareCluster(options: ClusterOptions): Promise<Cluster> {
  const binDir = await ensurePostgresBinaries();
  const { folder, port } = options;
  const dataDir = path.join(folder, "data");
  const socketDir = path.join(folder, "run");
  const logFile = path.join(folder, "server.log");
  mkdirSync(socketDir, { recursive: true });
  if (isRoot) {
    run("chown", ["-R", "postgres:postgres", folder]);
  }

  if (!existsSync(path.join(dataDir, "PG_VERSION"))) {
    pg(binDir, "initdb", [
      "-D",
      dataDir,
      "-U",
      "postgres",
      "--auth=trust",
      "--encoding=UTF8",
      "--locale=C.UTF-8",
    ]);
  }
  if (isRoot) chmodSync(folder, 0o755);

  const pidFile = path.join(dataDir, "postmaster.pid");
  /** postmaster.pid: line 1 the process id, line 8 "starting", "ready" or "stopping". */
  const readPidFile = (): { pid: number; status: string } | null => {
    try {
      const lines = readFileSync(pidFile, "utf8").split("\n");
      const pid = Number(lines[0]);
      return Number.isInteger(pid) && pid > 0 ? { pid, status: (lines[7] ?? "").trim() } : null;
    } catch {
      return null;
    }
  };
  const postmasterPid = () => {
    const entry = readPidFile();
    return entry && processAlive(entry.pid) ? entry.pid : null;
  };
  const isRunning = () => postmasterPid() !== null;

  const settings = [
    "-p",
    String(port),
    "-c",
    "listen_addresses=127.0.0.1",
    "-k",
    socketDir,
    ...(options.throwaway
      ? ["-c", "fsync=off", "-c", "synchronous_commit=off", "-c", "full_page_writes=off"]
      : []),
  ];

  const cluster: Cluster = {
    folder,
    port,
    binDir,
    urlFor: (database) => `postgres://postgres@127.0.0.1:${port}/${database}`,
    isRunning,
    postmasterPid,
    async start() {
      if (isRunning()) return;
      if (await portInUse(port)) {
        throw new Error(
          `Port ${port} on 127.0.0.1 is taken by another program. Stop it, or choose another port with LINTEL_PG_PORT.`,
        );
      }
      // PostgreSQL runs in the foreground as a child of this process (not daemonised by pg_ctl),
      // so that when it ends it is reaped here — a killed postmaster left as a zombie would
      // otherwise keep its lock file "in use" and stop it from starting again.
      const log = openSync(logFile, "a");
      const postgres = path.join(binDir, "postgres");
      const args = ["-D", dataDir, ...settings];
      const child = isRoot
        ? spawn("runuser", ["-u", "postgres", "--", postgres, ...args], {
            cwd: "/",
            detached: true,
            stdio: ["ignore", log, log],
          })
        : spawn(postgres, args, { detached: true, stdio: ["ignore", log, log] });
      closeSync(log);
      child.unref();
      let exited: string | null = null;
      child.once("exit", (code, signal) => {
        exited = signal ? `signal ${signal}` : `exit ${code}`;
      });
      child.once("error", (error) => {
        exited = error.message;
      });
      const deadline = Date.now() + 60_000;
      for (;;) {
        const entry = readPidFile();
        if (entry?.status === "ready" && processAlive(entry.pid)) return;
        if (exited !== null || Date.now() > deadline) {
          const tail = readFileSync(logFile, "utf8").trim().split("\n").slice(-5).join("\n");
          throw new Error(
            `PostgreSQL did not start (${exited ?? "not ready within 60 s"}). From ${logFile}:\n${tail}`,
          );
        }
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
    },
    createDatabase(name, template) {
      const exists = pg(binDir, "psql", [
        "-h",
        "127.0.0.1",
        "-p",
        String(port),
        "-U",
        "postgres",
        "-d",
        "postgres",
        "-tAc",
        `select 1 from pg_database where datname = '${name.replace(/'/g, "''")}'`,
      ]).trim();
      if (exists !== "1") {
        const from = template ? ["-T", template] : [];
        pg(binDir, "createdb", [
          "-h",
          "127.0.0.1",
          "-p",
          String(port),
          "-U",
          "postgres",
          ...from,
          name,
        ]);
      }
    },
    stop() {
      if (!isRunning()) return;
      pg(binDir, "pg_ctl", ["-D", dataDir, "-m", "fast", "-w", "-t", "60", "stop"]);
    },
    destroy() {
      try {
        cluster.stop();
      } finally {
        rmSync(folder, { recursive: true, force: true });
      }
    },
  };
  return cluster;
}
