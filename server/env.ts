import { existsSync } from "node:fs";

import { z } from "zod";

/** The only reader of process.env. Parsed once at start-up; invalid settings stop the process. */
const positiveInt = (fallback: number) => z.coerce.number().int().positive().default(fallback);

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
  DATABASE_URL: z.url({ message: "DATABASE_URL must be a postgres:// URL" }),
  HOST: z.string().min(1).default("127.0.0.1"),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  /** The address people open; links in e-mails and the same-origin check use it. */
  LINTEL_PUBLIC_URL: z.url().optional(),
  LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
  /** Session lifetime; a session used in its second half is extended (sliding renewal). */
  LINTEL_SESSION_DAYS: positiveInt(14),
  /** Failed sign-ins allowed per account, and per client address, within the window. */
  LINTEL_LOGIN_LIMIT_ACCOUNT: positiveInt(10),
  LINTEL_LOGIN_LIMIT_ADDRESS: positiveInt(50),
  LINTEL_LOGIN_WINDOW_MINUTES: positiveInt(15),
  /** Express "trust proxy" value: set it when a load balancer sits in front (e.g. `1`). */
  LINTEL_TRUST_PROXY: z.string().optional(),
  /** `1` loads the demo network (people, sites, history) into the database on start. */
  LINTEL_DEMO: z.enum(["0", "1"]).default("0"),
  /** SMTP server for every e-mail Lintel sends. */
  SMTP_HOST: z.string().min(1).default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  /** `true` for implicit TLS (usually port 465); otherwise STARTTLS is used when offered. */
  SMTP_SECURE: z.enum(["true", "false"]).default("false"),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  LINTEL_MAIL_FROM: z.string().min(3).default("Lintel <lintel@example.org>"),
  /** How often the outbox worker looks for due e-mail, and the first retry delay (doubling). */
  LINTEL_OUTBOX_POLL_MS: positiveInt(1000),
  LINTEL_OUTBOX_RETRY_MS: positiveInt(5000),
  LINTEL_OUTBOX_MAX_ATTEMPTS: positiveInt(12),
  /** A send not finished within this time is treated as interrupted (process died). */
  LINTEL_OUTBOX_LEASE_MS: positiveInt(120_000),
  /** `0` keeps this process from sending e-mail (another process does it). */
  LINTEL_OUTBOX_WORKER: z.enum(["0", "1"]).default("1"),
  /** How often the server looks for actions due soon or overdue (`0` in LINTEL_ACTION_NOTICES
   *  leaves it to another process). */
  LINTEL_ACTION_NOTICE_MS: positiveInt(60_000),
  LINTEL_ACTION_NOTICES: z.enum(["0", "1"]).default("1"),
  LINTEL_INVITATION_DAYS: positiveInt(7),
  LINTEL_PASSWORD_RESET_MINUTES: positiveInt(60),
  /** Object storage for images: any S3-compatible store. Without an endpoint, AWS S3 itself.
   *  The default keys are the ones the local store accepts. */
  S3_ENDPOINT: z.url().optional(),
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("lintel"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  /** Path-style addressing (bucket in the path), which most S3-compatible stores need. */
  S3_FORCE_PATH_STYLE: z.enum(["true", "false"]).default("true"),
  /**
   * Key that seals identity-provider client secrets at rest (AES-256-GCM): 32 random bytes in
   * base64 (`openssl rand -base64 32`). Required in production; elsewhere a fixed development key.
   */
  LINTEL_SECRET_KEY: z
    .string()
    .refine((value) => Buffer.from(value, "base64").length === 32, {
      message: "LINTEL_SECRET_KEY must be 32 random bytes in base64 (openssl rand -base64 32)",
    })
    .optional(),
  /** Longest a session begun through an identity provider lasts; it is never extended. */
  LINTEL_OIDC_SESSION_HOURS: positiveInt(12),
  /**
   * Live room pressure: the MQTT broker monitors publish to (mqtt://, mqtts://, ws://, wss://).
   * Without it Lintel takes readings only by HTTP upload (`npm start` runs a local broker instead).
   */
  LINTEL_MQTT_URL: z
    .url({
      message: "LINTEL_MQTT_URL must be a broker address such as mqtts://broker.example.org:8883",
    })
    .refine((value) => /^(mqtts?|wss?):\/\//.test(value), {
      message: "LINTEL_MQTT_URL must start with mqtt://, mqtts://, ws:// or wss://",
    })
    .optional(),
  LINTEL_MQTT_USERNAME: z.string().min(1).optional(),
  LINTEL_MQTT_PASSWORD: z.string().min(1).optional(),
  /** Topic prefix monitors publish under: `<prefix>/<monitor id>`. */
  LINTEL_MQTT_TOPIC_PREFIX: z
    .string()
    .regex(/^[^+#/](?:[^+#]*[^+#/])?$/, {
      message:
        "LINTEL_MQTT_TOPIC_PREFIX has no wildcards and no leading or trailing slash, e.g. lintel/pressure",
    })
    .default("lintel/pressure"),
  /** A PEM file of the certificate authority that signed the broker's certificate (mqtts, wss). */
  LINTEL_MQTT_CA_FILE: z.string().min(1).optional(),
  /** `false` accepts a broker certificate that does not verify: only for a test broker. */
  LINTEL_MQTT_REJECT_UNAUTHORIZED: z.enum(["true", "false"]).default("true"),
  /** The client id Lintel connects with; one per installation, kept so QoS 1 sessions resume. */
  LINTEL_MQTT_CLIENT_ID: z.string().min(1).max(64).default("lintel-ingest"),
  /** `0` keeps this process from ever taking the ingest lock (another process ingests). */
  LINTEL_PRESSURE_INGEST: z.enum(["0", "1"]).default("1"),
  /** `0`: this process runs no room-pressure alarm rounds (another process does). */
  LINTEL_PRESSURE_ALARMS: z.enum(["0", "1"]).default("1"),
  /** Raw readings are kept this many days (dropped a month at a time); roll-ups are kept. */
  LINTEL_PRESSURE_RAW_DAYS: positiveInt(90),
  /** Folder holding the built client; empty means API only. */
  LINTEL_CLIENT_DIR: z.string().optional(),
});

// The AWS SDK warns on every start that later releases will need Node 22; Lintel pins a release
// that runs on Node 20, so the warning is noise here.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= "true";

export type Env = z.infer<typeof envSchema> & { publicUrl: URL; secretKey: Buffer };

/** Used only outside production when LINTEL_SECRET_KEY is not set (demo and tests). */
const developmentSecretKey = Buffer.alloc(32, "lintel-development-key-not-secret");

/** Every variable the settings parser reads (the README's configuration table names each). */
export const settingNames = Object.keys(envSchema.shape);

export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((issue) => `  ${issue.path.join(".")}: ${issue.message}`);
    throw new Error(`Lintel cannot start: invalid configuration\n${lines.join("\n")}`);
  }
  const env = result.data;
  const fallbackHost = env.HOST === "0.0.0.0" || env.HOST === "::" ? "127.0.0.1" : env.HOST;
  const publicUrl = new URL(env.LINTEL_PUBLIC_URL ?? `http://${fallbackHost}:${env.PORT}`);
  if (!env.LINTEL_SECRET_KEY && env.NODE_ENV === "production") {
    throw new Error(
      "Lintel cannot start: invalid configuration\n  LINTEL_SECRET_KEY: required in production (openssl rand -base64 32)",
    );
  }
  if (env.LINTEL_MQTT_CA_FILE && !existsSync(env.LINTEL_MQTT_CA_FILE)) {
    throw new Error(
      `Lintel cannot start: invalid configuration\n  LINTEL_MQTT_CA_FILE: no file at ${env.LINTEL_MQTT_CA_FILE}`,
    );
  }
  if (env.LINTEL_MQTT_PASSWORD && !env.LINTEL_MQTT_USERNAME) {
    throw new Error(
      "Lintel cannot start: invalid configuration\n  LINTEL_MQTT_USERNAME: required with LINTEL_MQTT_PASSWORD",
    );
  }
  const secretKey = env.LINTEL_SECRET_KEY
    ? Buffer.from(env.LINTEL_SECRET_KEY, "base64")
    : developmentSecretKey;
  return { ...env, publicUrl, secretKey };
}
