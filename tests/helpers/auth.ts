import type { Role } from "@shared/roles";

import { insertGrant, insertUser, type UserOverrides } from "../factories/records";
import { testApp, type TestApp } from "./app";

export interface SignedInPerson {
  user: Awaited<ReturnType<typeof insertUser>>;
  /** The Cookie header value carrying a real session. */
  cookie: string;
}

/**
 * A person with the given grants and a real session made directly through the session store —
 * no password hashing, no sign-in request.
 */
export async function signInAs(
  networkId: string,
  grants: { role: Role; siteId: string | null }[],
  options: { user?: UserOverrides; app?: TestApp } = {},
): Promise<SignedInPerson> {
  const { deps } = options.app ?? testApp();
  const user = await insertUser(deps.db, networkId, options.user);
  for (const grant of grants) await insertGrant(deps.db, user.id, grant.role, grant.siteId);
  const cookie = await sessionCookieFor(user.id, options.app);
  return { user, cookie };
}

export async function sessionCookieFor(userId: string, app?: TestApp): Promise<string> {
  const { deps } = app ?? testApp();
  const { setCookie } = await deps.sessions.create(userId);
  return setCookie.split(";")[0]!;
}
