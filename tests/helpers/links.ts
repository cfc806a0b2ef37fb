import type { TokenPurpose } from "../../server/modules/accounts/accounts.repository";
import { issueLink } from "../../server/modules/accounts/accounts.service";
import { testApp, type TestApp } from "./app";

/** A real one-time link for the person, made the way the app makes them; returns its token. */
export async function issueTestLink(
  userId: string,
  purpose: TokenPurpose,
  app: TestApp = testApp(),
): Promise<string> {
  const { link } = await app.deps.db.transaction((tx) =>
    issueLink(tx, app.deps, { userId, purpose, createdBy: null }),
  );
  return new URL(link).pathname.split("/").pop()!;
}
