import type { Logger } from "pino";

import { createSessionStore } from "./auth/sessions";
import { createResetLimiter, createSignInLimiter } from "./auth/sign-in-limiter";
import type { DatabaseHandle } from "./db/client";
import type { Env } from "./env";
import type { AppDeps } from "./lib/routes";
import type { Storage } from "./lib/storage";
import { createProviderClient } from "./modules/identity/identity.oidc";
import { siteIdIfExists } from "./modules/sites/sites.service";

/** Wires the app's collaborators from configuration and a database handle. */
export function buildDeps(
  env: Env,
  database: DatabaseHandle,
  logger: Logger,
  storage: Storage,
  notifyOutbox: () => void = () => undefined,
  options: { mailCatcherDir?: string | null } = {},
): AppDeps {
  return {
    db: database.db,
    env,
    logger,
    sessions: createSessionStore(database.db, {
      days: env.LINTEL_SESSION_DAYS,
      secure: env.publicUrl.protocol === "https:",
      providerHours: env.LINTEL_OIDC_SESSION_HOURS,
    }),
    identityProviders: createProviderClient({ allowLoopback: env.NODE_ENV !== "production" }),
    signInLimiter: createSignInLimiter(database.pool, {
      perAccount: env.LINTEL_LOGIN_LIMIT_ACCOUNT,
      perAddress: env.LINTEL_LOGIN_LIMIT_ADDRESS,
      windowMinutes: env.LINTEL_LOGIN_WINDOW_MINUTES,
    }),
    resetLimiter: createResetLimiter(database.pool, {
      perAccount: 5,
      perAddress: 30,
      windowMinutes: 60,
    }),
    storage,
    siteInNetwork: async (siteId, networkId) =>
      (await siteIdIfExists(database.db, networkId, siteId)) !== null,
    notifyOutbox,
    mailCatcherDir: options.mailCatcherDir ?? null,
  };
}
