import { parseEnv } from "./env";
import { startServer } from "./server";

// Entry for a deployment (or `npm run dev:server`): the database is given by DATABASE_URL.
async function main() {
  const env = parseEnv();
  const server = await startServer(env);
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping Lintel…`);
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    void server.close().then(() => process.exit(0));
  };
  process.on("SIGINT", () => stop("SIGINT"));
  process.on("SIGTERM", () => stop("SIGTERM"));
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
