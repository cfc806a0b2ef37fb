import { and, eq, like, ne } from "drizzle-orm";

import { sealSecret } from "../auth/secret-box";
import type { Database, Tx } from "../db/client";
import { identityProviderDomains, identityProviders, networks } from "../db/schema/index";
import type { Env } from "../env";
import { recordChange } from "../lib/change-log";
import { demoNetworkName } from "./people";
import type { DemoIdentityProvider } from "./run-demo-steps";

const loopbackIssuer = "http://127.0.0.1:%";

/**
 * The demo network signs in through its local provider too, with password sign-in still allowed
 * so the demo password keeps working for every demo person.
 */
export async function createDemoIdentityProvider(
  tx: Tx,
  env: Env,
  networkId: string,
  local: DemoIdentityProvider,
): Promise<void> {
  const [row] = await tx
    .insert(identityProviders)
    .values({
      networkId,
      name: demoNetworkName,
      issuerUrl: local.issuer,
      clientId: local.clientId,
      clientSecretSealed: sealSecret(
        env.secretKey,
        local.clientSecret,
        `identity-provider:${networkId}`,
      ),
      passwordAllowed: true,
      assumeVerifiedEmail: false,
    })
    .onConflictDoNothing()
    .returning({ id: identityProviders.id });
  if (!row) return;
  await tx.insert(identityProviderDomains).values({ providerId: row.id, domain: "example.org" });
  await recordChange(
    tx,
    { userId: null, requestId: "demo-data" },
    {
      action: "identity_provider.created",
      entity: "identity_provider",
      entityId: row.id,
      siteId: null,
      after: { name: demoNetworkName, issuerUrl: local.issuer, domains: ["example.org"] },
      reason: "The demo's local identity provider; password sign-in stays allowed.",
    },
  );
}

/** Whether any network points at a provider other than a local one (then no demo provider runs). */
export async function realIssuerConfigured(db: Database): Promise<boolean> {
  const rows = await db.select({ issuerUrl: identityProviders.issuerUrl }).from(identityProviders);
  return rows.some((row) => !row.issuerUrl.startsWith("http://127.0.0.1:"));
}

/** The local provider may listen on another port than last time: the demo network follows it. */
export async function followDemoIssuer(db: Database, local: DemoIdentityProvider): Promise<void> {
  const [network] = await db
    .select({ id: networks.id })
    .from(networks)
    .where(eq(networks.name, demoNetworkName));
  if (!network) return;
  await db
    .update(identityProviders)
    .set({ issuerUrl: local.issuer, updatedAt: new Date() })
    .where(
      and(
        eq(identityProviders.networkId, network.id),
        eq(identityProviders.clientId, local.clientId),
        like(identityProviders.issuerUrl, loopbackIssuer),
        ne(identityProviders.issuerUrl, local.issuer),
      ),
    );
}
