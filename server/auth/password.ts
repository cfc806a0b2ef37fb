import { hash, verify } from "@node-rs/argon2";

// argon2id with the OWASP-recommended minimum (m=19 MiB, t=2, p=1). `algorithm: 2` is Argon2id;
// the package exposes the enum only as a TypeScript const enum.
const options = { algorithm: 2, memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, options);
}

// Verifying against a fixed hash when the account is unknown keeps the answer time the same,
// so the response time does not tell whether an e-mail address has an account.
let decoyHash: Promise<string> | undefined;

export async function verifyPassword(
  storedHash: string | null,
  password: string,
): Promise<boolean> {
  if (storedHash === null) {
    decoyHash ??= hashPassword("lintel-decoy-password");
    await verify(await decoyHash, password).catch(() => false);
    return false;
  }
  return verify(storedHash, password).catch(() => false);
}
