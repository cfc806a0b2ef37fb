import { parseEnv, type Env } from "../../server/env";

export const testOrigin = "http://lintel.test";

/** Configuration for an in-process test app; tests override what they examine. */
export function testEnv(overrides: Record<string, string> = {}): Env {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: the API project's global setup provides it.");
  return parseEnv({
    NODE_ENV: "test",
    DATABASE_URL: url,
    LOG_LEVEL: "silent",
    LINTEL_PUBLIC_URL: testOrigin,
    // Each test speaks from its own client address (X-Forwarded-For), as behind a load balancer.
    LINTEL_TRUST_PROXY: "true",
    LINTEL_LOGIN_LIMIT_ADDRESS: "1000",
    S3_ENDPOINT: process.env.S3_ENDPOINT ?? "",
    S3_BUCKET: "lintel-test",
    ...overrides,
  });
}
