import type { MeResponse, SignInBody } from "@shared/schemas/auth";

import { verifyPassword } from "../../auth/password";
import { AppError } from "../../lib/app-error";
import type { AppDeps } from "../../lib/context";
import { assertPasswordAllowed } from "../identity/identity.service";
import { findUserForSignIn, listGrants } from "./auth.repository";

const invalidCredentials = () =>
  new AppError(
    "invalid_credentials",
    401,
    "That e-mail and password do not match an active account.",
  );

/** Checks credentials under the sign-in limits; answers the same for unknown e-mail and wrong password. */
export async function signIn(
  deps: AppDeps,
  input: SignInBody,
  clientAddress: string,
): Promise<{ me: MeResponse; setCookie: string }> {
  await assertPasswordAllowed(deps, input.email, "email");
  await deps.signInLimiter.assertAllowed(input.email, clientAddress);

  const candidate = await findUserForSignIn(deps.db, input.email);
  const passwordOk = await verifyPassword(candidate?.passwordHash ?? null, input.password);
  if (!candidate || !passwordOk || candidate.deactivatedAt !== null) {
    await deps.signInLimiter.recordFailure(input.email, clientAddress);
    throw invalidCredentials();
  }
  await deps.signInLimiter.recordSuccess(input.email);

  const { setCookie } = await deps.sessions.create(candidate.id);
  const grants = await listGrants(deps.db, candidate.id);
  return {
    me: { user: { id: candidate.id, email: candidate.email, name: candidate.name }, roles: grants },
    setCookie,
  };
}

/** A person's role grants (a signed-in request reads its own with the session check). */
export function loadGrants(deps: Pick<AppDeps, "db">, userId: string) {
  return listGrants(deps.db, userId);
}
