import type { Logger } from "pino";

import type { RoleGrant } from "@shared/roles";

import type { ResetLimiter, SignInLimiter } from "../auth/sign-in-limiter";
import type { SessionStore, SessionUser } from "../auth/sessions";
import type { Database } from "../db/client";
import type { Env } from "../env";
import type { Actor } from "./change-log";
import type { ProviderClient } from "../modules/identity/identity.oidc";
import type { Storage } from "./storage";

// What services are given: the app's dependencies, who is asking and who acts. No HTTP types
// here, so a service can be called from a route, a job or a test alike.

export interface AppDeps {
  db: Database;
  env: Env;
  logger: Logger;
  sessions: SessionStore;
  signInLimiter: SignInLimiter;
  resetLimiter: ResetLimiter;
  storage: Storage;
  /** Talks to the networks' identity providers (OpenID Connect); public addresses only. */
  identityProviders: ProviderClient;
  /** Whether the site exists and belongs to the network (every site-scoped route asks this). */
  siteInNetwork: (siteId: string, networkId: string) => Promise<boolean>;
  /** Tells the e-mail worker that new mail is waiting (after the transaction commits). */
  notifyOutbox: () => void;
  /**
   * The folder of the local mail catcher when the process that started it runs this app
   * (`npm start`, the browser tests); null otherwise, and always null from `server/index.ts`.
   */
  mailCatcherDir: string | null;
}

export interface SignedIn {
  user: SessionUser;
  sessionId: string;
  grants: RoleGrant[];
}

/** Who changes something, for the change log: the signed-in person and this request. */
export interface RequestActor extends Actor {
  userId: string;
  requestId: string;
}
