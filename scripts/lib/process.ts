import { spawn, spawnSync, type SpawnSyncOptions } from "node:child_process";
import net from "node:net";

export const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

/** Runs a command to completion; throws with its output when it fails. */
export function run(command: string, args: string[], options: SpawnSyncOptions = {}): string {
  const result = spawnSync(command, args, { encoding: "utf8", ...options });
  if (result.error) throw result.error;
  if (result.status !== 0) {
    const output = `${String(result.stdout ?? "")}${String(result.stderr ?? "")}`.trim();
    throw new Error(`${command} ${args.join(" ")} failed (exit ${result.status}):\n${output}`);
  }
  return String(result.stdout ?? "");
}

/** Runs a command with its output shown to the person (long installs). */
export function runVisible(command: string, args: string[]): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, {
      stdio: "inherit",
      env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
    });
    child.on("error", reject);
    child.on("exit", (code) =>
      code === 0
        ? resolve()
        : reject(new Error(`${command} ${args.join(" ")} exited with ${code}`)),
    );
  });
}

/** A TCP port on 127.0.0.1 that nothing listens on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      const port = typeof address === "object" && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

export function portInUse(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host: "127.0.0.1" });
    socket.once("connect", () => {
      socket.destroy();
      resolve(true);
    });
    socket.once("error", () => resolve(false));
  });
}

let aptUpdated = false;

/** Installs Debian packages when running as root; otherwise explains what to run. */
export async function aptInstall(packages: string[], why: string): Promise<void> {
  if (!isRoot) {
    throw new Error(
      `${why} is not installed. Install it once with:\n\n  sudo apt-get install -y ${packages.join(" ")}\n\nthen run the command again.`,
    );
  }
  console.log(`Installing ${packages.join(", ")} from Debian's packages (${why})…`);
  if (!aptUpdated) {
    await runVisible("apt-get", ["update", "-q"]);
    aptUpdated = true;
  }
  await runVisible("apt-get", ["install", "-y", "-q", "--no-install-recommends", ...packages]);
}
