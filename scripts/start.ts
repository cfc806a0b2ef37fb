import path from "node:path";

import { demoNetworkName, demoPassword, demoPeople, demoSites } from "../server/demo/people";
import { roleLabels } from "../shared/roles";
import { parseEnv } from "../server/env";
import { startServer, type RunningServer } from "../server/server";
import { buildClient, projectRoot } from "./lib/client-build";
import { startDemoIdentityProvider } from "./lib/identity-provider";
import { startMailCatcher, type MailCatcher } from "./lib/mail-catcher";
import { startS3Fake, type S3Fake } from "./lib/s3-fake";
import { startMqttBroker, type MqttBroker } from "./lib/mqtt-broker";
import {
  demoMonitors,
  startPressureSimulator,
  type PressureSimulator,
} from "./lib/pressure-simulator";
import { chooseClusterFolder, prepareCluster, type Cluster } from "./lib/postgres";
import { superviseCluster, type Supervisor } from "./lib/postgres-supervisor";

/**
 * `npm start`: a private PostgreSQL under .data/ (unless DATABASE_URL is given), migrations,
 * demo data, the built client, and one Express process serving app and API. The private PostgreSQL
 * is watched and started again if it stops.
 */
async function main() {
  let cluster: Cluster | null = null;
  let supervisor: Supervisor | null = null;
  let server: RunningServer | null = null;
  let mailCatcher: MailCatcher | null = null;
  let s3: S3Fake | null = null;
  let mqttBroker: MqttBroker | null = null;
  let simulator: PressureSimulator | null = null;
  let mailCatcherDir: string | undefined;
  let stopping = false;

  const stop = async (reason: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${reason}: stopping Lintel…`);
    try {
      await simulator?.stop();
      await server?.close();
      await mqttBroker?.stop();
      await mailCatcher?.stop();
      await s3?.stop();
    } finally {
      await supervisor?.stop();
      if (cluster) {
        cluster.stop();
        console.log("PostgreSQL stopped.");
      }
    }
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));

  try {
    if (!process.env.DATABASE_URL) {
      const port = Number(process.env.LINTEL_PG_PORT ?? 54329);
      const { folder, moved } = chooseClusterFolder(path.join(projectRoot, ".data", "postgres"));
      if (moved) {
        console.log(
          `The postgres user cannot enter ${projectRoot}; the database lives in ${folder} instead.`,
        );
      }
      cluster = await prepareCluster({ folder, port });
      await cluster.start();
      cluster.createDatabase("lintel");
      process.env.DATABASE_URL = cluster.urlFor("lintel");
      process.env.LINTEL_DEMO ??= "1";
      console.log(`PostgreSQL is running on 127.0.0.1:${port} (data in ${folder}).`);
      supervisor = superviseCluster({
        cluster,
        log: (line) => console.log(`${new Date().toISOString()} ${line}`),
      });
    }

    if (!process.env.SMTP_HOST) {
      // No real SMTP server configured: catch every e-mail locally so nothing leaves the machine.
      const dir = path.join(projectRoot, ".data", "mail");
      mailCatcher = await startMailCatcher({ dir });
      process.env.SMTP_HOST = "127.0.0.1";
      process.env.SMTP_PORT = String(mailCatcher.port);
      mailCatcherDir = dir;
      console.log(`Local mail catcher on 127.0.0.1:${mailCatcher.port} (messages in ${dir}).`);
    }

    if (!process.env.S3_ENDPOINT && !process.env.S3_BUCKET) {
      // No object store configured: a local S3-compatible store keeps images under .data/s3.
      const dir = path.join(projectRoot, ".data", "s3");
      s3 = await startS3Fake({ dir, port: Number(process.env.LINTEL_S3_PORT ?? 54330) });
      process.env.S3_ENDPOINT = s3.endpoint;
      console.log(`Local S3-compatible store on ${s3.endpoint} (objects in ${dir}).`);
    }

    if (!process.env.LINTEL_MQTT_URL) {
      // No real broker configured: a local one, which the demo's simulated monitors publish to.
      mqttBroker = await startMqttBroker();
      process.env.LINTEL_MQTT_URL = mqttBroker.url;
      console.log(`Local MQTT broker on ${mqttBroker.url} (room-pressure readings).`);
    }

    const clientDir = path.join(projectRoot, "dist", "client");
    console.log("Building the app…");
    // The client build sets NODE_ENV=production in this process; the server keeps what was given.
    const nodeEnv = process.env.NODE_ENV;
    await buildClient(clientDir);
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
    process.env.LINTEL_CLIENT_DIR ??= clientDir;

    const env = parseEnv();
    server = await startServer(env, {
      mailCatcherDir,
      // A local identity provider for the demo network (never in production; see server.ts).
      demoIdentityProvider: (publicUrl) =>
        startDemoIdentityProvider({
          publicUrl,
          port: Number(process.env.LINTEL_OIDC_DEMO_PORT ?? 54331),
        }),
    });
    if (mqttBroker && env.LINTEL_DEMO === "1") {
      const monitors = await demoMonitors(env.DATABASE_URL);
      simulator = await startPressureSimulator({ brokerUrl: mqttBroker.url, monitors });
      console.log(
        `Simulated room-pressure monitors: ${monitors.length}, a reading every 5 s each (never with a real broker).`,
      );
    }
    console.log(`\nLintel is ready: ${server.url}`);
    if (env.HOST === "0.0.0.0") console.log("Listening on every network interface (HOST=0.0.0.0).");
    if (env.LINTEL_DEMO === "1") {
      console.log(`\nDemo sign-ins (password for all: ${demoPassword}):`);
      for (const person of demoPeople) {
        const role = roleLabels[person.grants[0]!.role].toLowerCase();
        const where = person.grants.map((grant) =>
          grant.site ? demoSites[grant.site].name : "network-wide",
        );
        console.log(`  ${person.email.padEnd(32)} ${role}: ${where.join(", ")}`);
      }
    }
    if (server.demoIssuer) {
      console.log(
        `\nDemo identity provider (not a real one) on ${server.demoIssuer}: enter a demo address on the sign-in page and choose "Sign in with ${demoNetworkName}".`,
      );
    }
    console.log("\nPress Ctrl-C to stop.");
  } catch (error) {
    console.error(`\n${error instanceof Error ? error.message : String(error)}`);
    await simulator?.stop().catch(() => undefined);
    await server?.close().catch(() => undefined);
    await mqttBroker?.stop();
    await mailCatcher?.stop();
    await s3?.stop();
    await supervisor?.stop();
    cluster?.stop();
    process.exit(1);
  }
}

void main();
