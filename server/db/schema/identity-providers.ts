import { sql } from "drizzle-orm";
import {
  boolean,
  index,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { networks } from "./networks";
import { users } from "./users";

/**
 * The network's own identity provider (OpenID Connect): one per network at most. The client
 * secret is stored sealed (AES-256-GCM, `server/auth/secret-box.ts`), never in the clear.
 */
export const identityProviders = pgTable("identity_providers", {
  id: uuid("id").primaryKey().defaultRandom(),
  networkId: uuid("network_id")
    .notNull()
    .unique()
    .references(() => networks.id, { onDelete: "cascade" }),
  name: varchar("name", { length: 80 }).notNull(),
  issuerUrl: varchar("issuer_url", { length: 500 }).notNull(),
  clientId: varchar("client_id", { length: 200 }).notNull(),
  clientSecretSealed: text("client_secret_sealed").notNull(),
  /** Whether people of the covered domains may still sign in (and reset) with a password. */
  passwordAllowed: boolean("password_allowed").notNull().default(true),
  /** The administrator declared the provider only issues verified addresses. */
  assumeVerifiedEmail: boolean("assume_verified_email").notNull().default(false),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

/** The e-mail domains a provider covers; a domain belongs to one network at most. */
export const identityProviderDomains = pgTable(
  "identity_provider_domains",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    providerId: uuid("provider_id")
      .notNull()
      .references(() => identityProviders.id, { onDelete: "cascade" }),
    /** Stored lower-cased. */
    domain: varchar("domain", { length: 253 }).notNull(),
  },
  (table) => [
    uniqueIndex("identity_provider_domains_domain_unique").on(sql`lower(${table.domain})`),
    index("identity_provider_domains_provider_idx").on(table.providerId),
  ],
);

/** The provider's subject for a person: later sign-ins match on it, not on the e-mail. */
export const identityLinks = pgTable(
  "identity_links",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    providerId: uuid("provider_id")
      .notNull()
      .references(() => identityProviders.id, { onDelete: "cascade" }),
    subject: varchar("subject", { length: 255 }).notNull(),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex("identity_links_provider_subject_unique").on(table.providerId, table.subject),
    // One subject per person and provider: a second subject for the same account is refused.
    uniqueIndex("identity_links_provider_user_unique").on(table.providerId, table.userId),
  ],
);

/**
 * A sign-in begun at the provider and not yet come back: usable once, for a few minutes, and only
 * by the browser holding the cookie whose SHA-256 is `browser_key_hash`.
 */
export const signInAttempts = pgTable(
  "sign_in_attempts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    browserKeyHash: text("browser_key_hash").notNull(),
    state: text("state").notNull().unique(),
    nonce: text("nonce").notNull(),
    codeVerifier: text("code_verifier").notNull(),
    providerId: uuid("provider_id")
      .notNull()
      .references(() => identityProviders.id, { onDelete: "cascade" }),
    nextPath: text("next_path").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index("sign_in_attempts_created_idx").on(table.createdAt)],
);
