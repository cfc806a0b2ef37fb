import { randomUUID } from "node:crypto";

import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, TimeSpan } from "lucia";

import { uuidSchema } from "@shared/schemas/common";

import type { Database } from "../db/client";
import { sessions, users } from "../db/schema/index";

// All session handling lives in this module, so the session library can be swapped in one place.

interface UserAttributes {
  email: string;
  displayName: string;
  networkId: string;
  deactivatedAt: Date | null;
}

function createLucia(db: Database, options: { days: number; secure: boolean }) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(options.days, "d"),
    sessionCookie: {
      name: "lintel_session",
      attributes: { secure: options.secure, sameSite: "lax", path: "/" },
    },
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.displayName,
      networkId: row.networkId,
      deactivatedAt: row.deactivatedAt,
    }),
  });
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: UserAttributes;
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
  /** A Set-Cookie value to send: a renewed cookie, or a blank one clearing a dead session. */
  setCookie: string | null;
}

export type SessionStore = ReturnType<typeof createSessionStore>;

export function createSessionStore(db: Database, options: { days: number; secure: boolean }) {
  const lucia = createLucia(db, options);

  return {
    cookieName: lucia.sessionCookieName,

    /** Starts a session and returns the Set-Cookie value. */
    async create(userId: string): Promise<{ sessionId: string; setCookie: string }> {
      const session = await lucia.createSession(userId, {}, { sessionId: randomUUID() });
      return {
        sessionId: session.id,
        setCookie: lucia.createSessionCookie(session.id).serialize(),
      };
    },

    /** Reads the cookie; never throws for a malformed or stale cookie. */
    async check(cookieHeader: string | undefined): Promise<SessionCheck> {
      const none: SessionCheck = { user: null, sessionId: null, setCookie: null };
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
        setCookie: session.fresh ? lucia.createSessionCookie(session.id).serialize() : null,
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
