import { randomUUID } from "node:crypto";

import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { and, eq, isNull, sql } from "drizzle-orm";
import { Lucia, TimeSpan, type Adapter, type DatabaseSession, type DatabaseUser } from "lucia";

import type { RoleGrant } from "@shared/roles";
import { uuidSchema } from "@shared/schemas/common";

import type { Database } from "../db/client";
import { roleGrants, sessions, users } from "../db/schema/index";

// All session handling lives in this module, so the session library can be swapped in one place.

interface UserAttributes {
  email: string;
  displayName: string;
  networkId: string;
  deactivatedAt: Date | null;
  /** Read with the session, in the same query, so a removed grant counts on the next request. */
  grants: RoleGrant[];
}

/**
 * The session library's store, with the one read every signed-in request makes done in a single
 * round trip: the session, its person and the person's grants, joined in one prepared statement.
 * Nothing is cached between requests, so a deactivation, a removed grant or an ended session
 * counts on the very next request. Writes (new session, extension, sign-out) go through the
 * library's own Drizzle adapter.
 */
function sessionAdapter(db: Database, options: { providerHours?: number }): Adapter {
  const providerHours = options.providerHours ?? 12;
  const writes = new DrizzlePostgreSQLAdapter(db, sessions, users);
  // Sessions begun through an identity provider are never extended: the library asks to extend
  // any session past half its life, and the read just before says which ones not to.
  const notExtended = new Set<string>();
  const grants = sql<RoleGrant[]>`coalesce((
      select json_agg(json_build_object('role', ${roleGrants.role}, 'siteId', ${roleGrants.siteId})
                      order by ${roleGrants.role}, ${roleGrants.siteId})
        from ${roleGrants} where ${roleGrants.userId} = ${users.id}), '[]'::json)`;
  const sessionWithPerson = db
    .select({
      sessionId: sessions.id,
      expiresAt: sessions.expiresAt,
      userId: users.id,
      email: users.email,
      displayName: users.displayName,
      networkId: users.networkId,
      deactivatedAt: users.deactivatedAt,
      providerId: sessions.providerId,
      grants,
    })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(eq(sessions.id, sql.placeholder("sessionId")))
    .prepare("session_with_person_and_grants");

  return {
    async getSessionAndUser(sessionId): Promise<[DatabaseSession | null, DatabaseUser | null]> {
      const [row] = await sessionWithPerson.execute({ sessionId });
      if (!row) return [null, null];
      if (row.providerId !== null) notExtended.add(row.sessionId);
      return [
        {
          id: row.sessionId,
          userId: row.userId,
          expiresAt: row.expiresAt,
          attributes: { providerId: row.providerId },
        },
        {
          id: row.userId,
          attributes: {
            email: row.email,
            displayName: row.displayName,
            networkId: row.networkId,
            deactivatedAt: row.deactivatedAt,
            grants: row.grants,
          },
        },
      ];
    },
    getUserSessions: (userId) => writes.getUserSessions(userId),
    async setSession(session) {
      const providerId = (session.attributes as { providerId?: string | null }).providerId ?? null;
      const cap = new Date(Date.now() + providerHours * 60 * 60 * 1000);
      await db.insert(sessions).values({
        id: session.id,
        userId: session.userId,
        providerId,
        expiresAt: providerId !== null && cap < session.expiresAt ? cap : session.expiresAt,
      });
    },
    async updateSessionExpiration(sessionId, expiresAt) {
      if (notExtended.delete(sessionId)) return;
      // A provider's session read by a concurrent request: the guard keeps it unextended.
      await db
        .update(sessions)
        .set({ expiresAt })
        .where(and(eq(sessions.id, sessionId), isNull(sessions.providerId)));
    },
    deleteSession: (sessionId) => {
      notExtended.delete(sessionId);
      return writes.deleteSession(sessionId);
    },
    deleteUserSessions: (userId) => writes.deleteUserSessions(userId),
    deleteExpiredSessions: () => writes.deleteExpiredSessions(),
  };
}

function createLucia(db: Database, options: SessionOptions) {
  return new Lucia(sessionAdapter(db, options), {
    sessionExpiresIn: new TimeSpan(options.days, "d"),
    sessionCookie: {
      name: "lintel_session",
      attributes: { secure: options.secure, sameSite: "lax", path: "/" },
    },
    getSessionAttributes: (row) => ({ providerId: row.providerId }),
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.displayName,
      networkId: row.networkId,
      deactivatedAt: row.deactivatedAt,
      grants: row.grants,
    }),
  });
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: UserAttributes;
    DatabaseSessionAttributes: { providerId: string | null };
  }
}

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  networkId: string;
}

export interface SessionCheck {
  user: SessionUser | null;
  sessionId: string | null;
  /** The person's grants as of this request (empty when no one is signed in). */
  grants: RoleGrant[];
  /** A Set-Cookie value to send: a renewed cookie, or a blank one clearing a dead session. */
  setCookie: string | null;
}

export type SessionStore = ReturnType<typeof createSessionStore>;

interface SessionOptions {
  days: number;
  secure: boolean;
  /** Longest a session begun through an identity provider lasts (never extended); 12 unless given. */
  providerHours?: number;
}

export function createSessionStore(db: Database, options: SessionOptions) {
  const lucia = createLucia(db, options);

  return {
    cookieName: lucia.sessionCookieName,

    /**
     * Starts a session and returns the Set-Cookie value. Begun through an identity provider, it
     * lasts at most the provider hours and is never extended.
     */
    async create(
      userId: string,
      options: { providerId?: string } = {},
    ): Promise<{ sessionId: string; setCookie: string }> {
      const session = await lucia.createSession(
        userId,
        { providerId: options.providerId ?? null },
        { sessionId: randomUUID() },
      );
      return {
        sessionId: session.id,
        setCookie: lucia.createSessionCookie(session.id).serialize(),
      };
    },

    /**
     * Reads the cookie and, in one round trip, the session, the person and their grants; never
     * throws for a malformed or stale cookie. A session past half its life is extended (one more
     * write, then a renewed cookie); an expired one is deleted.
     */
    async check(cookieHeader: string | undefined): Promise<SessionCheck> {
      const none: SessionCheck = { user: null, sessionId: null, grants: [], setCookie: null };
      const sessionId = lucia.readSessionCookie(cookieHeader ?? "");
      if (!sessionId) return none;
      const blank = lucia.createBlankSessionCookie().serialize();
      if (!uuidSchema.safeParse(sessionId).success) return { ...none, setCookie: blank };

      const { session, user } = await lucia.validateSession(sessionId);
      if (!session) return { ...none, setCookie: blank };
      if (user.deactivatedAt !== null) {
        await lucia.invalidateUserSessions(user.id);
        return { ...none, setCookie: blank };
      }
      return {
        user: { id: user.id, email: user.email, name: user.name, networkId: user.networkId },
        sessionId: session.id,
        grants: user.grants,
        setCookie:
          session.fresh && session.providerId === null
            ? lucia.createSessionCookie(session.id).serialize()
            : null,
      };
    },

    async end(sessionId: string): Promise<string> {
      await lucia.invalidateSession(sessionId);
      return lucia.createBlankSessionCookie().serialize();
    },

    /** Signs the person out everywhere (deactivation, password change). */
    endAllFor(userId: string): Promise<void> {
      return lucia.invalidateUserSessions(userId);
    },
  };
}
