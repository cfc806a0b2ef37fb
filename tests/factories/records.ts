import { randomUUID } from "node:crypto";

import type { Role } from "@shared/roles";
import type { CreateSiteBody } from "@shared/schemas/site";

import { hashPassword } from "../../server/auth/password";
import type { Database } from "../../server/db/client";
import { networks, roleGrants, sites, users } from "../../server/db/schema/index";

const unique = () => randomUUID().slice(0, 8);

export function buildSite(overrides: Partial<CreateSiteBody> = {}): CreateSiteBody {
  return {
    name: `Test Site ${unique()}`,
    address: "2 Test Row, Sampletown",
    timeZone: "Europe/London",
    latitude: 50.7,
    longitude: -3.5,
    ...overrides,
  };
}

export async function insertNetwork(
  db: Database,
  name = `Network ${unique()}`,
): Promise<{ id: string }> {
  const [row] = await db.insert(networks).values({ name }).returning({ id: networks.id });
  return row!;
}

export async function insertSite(
  db: Database,
  networkId: string,
  overrides: Partial<CreateSiteBody> = {},
) {
  const [row] = await db
    .insert(sites)
    .values({ networkId, ...buildSite(overrides) })
    .returning();
  return row!;
}

export interface UserOverrides {
  email?: string;
  displayName?: string;
  /** Hashing costs ~60 ms: only sign-in tests should pass a password. */
  password?: string;
  deactivatedAt?: Date | null;
}

export async function insertUser(db: Database, networkId: string, overrides: UserOverrides = {}) {
  const { password, ...rest } = overrides;
  const [row] = await db
    .insert(users)
    .values({
      networkId,
      email: `person-${unique()}@example.org`,
      displayName: `Test Person ${unique()}`,
      passwordHash: password ? await hashPassword(password) : null,
      ...rest,
    })
    .returning();
  return row!;
}

export async function insertGrant(db: Database, userId: string, role: Role, siteId: string | null) {
  const [row] = await db.insert(roleGrants).values({ userId, role, siteId }).returning();
  return row!;
}
