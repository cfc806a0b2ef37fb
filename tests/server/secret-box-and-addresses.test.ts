import { randomBytes } from "node:crypto";

import { describe, expect, it } from "vitest";

import { addressKind, refuseUnlessPublic } from "../../server/auth/public-address";
import { openSecret, sealSecret } from "../../server/auth/secret-box";
import { parseEnv } from "../../server/env";

describe("sealing secrets at rest", () => {
  const key = randomBytes(32);

  it("when a secret is sealed, then it opens with the same key and context, and the sealed form never shows it", () => {
    const sealed = sealSecret(key, "client-secret-123", "identity-provider:a");
    expect(sealed).not.toContain("client-secret-123");
    expect(openSecret(key, sealed, "identity-provider:a")).toBe("client-secret-123");
    // A fresh nonce each time: the same secret never seals to the same text.
    expect(sealSecret(key, "client-secret-123", "identity-provider:a")).not.toBe(sealed);
  });

  it("when the key, the context or a byte differs, then it does not open", () => {
    const sealed = sealSecret(key, "client-secret-123", "identity-provider:a");
    expect(() => openSecret(randomBytes(32), sealed, "identity-provider:a")).toThrow();
    expect(() => openSecret(key, sealed, "identity-provider:b")).toThrow();
    const parts = sealed.split(".");
    const body = Buffer.from(parts[3]!, "base64url");
    body[0] = body[0]! ^ 1;
    parts[3] = body.toString("base64url");
    expect(() => openSecret(key, parts.join("."), "identity-provider:a")).toThrow();
    expect(() => openSecret(key, "plain-text", "identity-provider:a")).toThrow();
  });

  it("when production starts without LINTEL_SECRET_KEY, then it refuses; a malformed key is refused anywhere", () => {
    const base = { DATABASE_URL: "postgres://x@127.0.0.1/x" };
    expect(() => parseEnv({ ...base, NODE_ENV: "production" })).toThrow(/LINTEL_SECRET_KEY/);
    expect(() => parseEnv({ ...base, LINTEL_SECRET_KEY: "short" })).toThrow(/LINTEL_SECRET_KEY/);
    const given = randomBytes(32).toString("base64");
    const env = parseEnv({ ...base, NODE_ENV: "production", LINTEL_SECRET_KEY: given });
    expect(env.secretKey.equals(Buffer.from(given, "base64"))).toBe(true);
    expect(parseEnv({ ...base, NODE_ENV: "test" }).secretKey).toHaveLength(32);
  });
});

describe("which issuer addresses Lintel may reach", () => {
  it("when an address is special-purpose, then it is not public", () => {
    for (const address of [
      "10.0.0.1",
      "172.16.5.4",
      "192.168.1.1",
      "169.254.169.254",
      "100.64.0.1",
      "0.0.0.0",
      "224.0.0.1",
      "255.255.255.255",
      "fd12::1",
      "fe80::1",
      "::",
      "::ffff:192.168.0.1",
      "2001:db8::1",
      "not an address",
    ])
      expect(addressKind(address), address).toBe("other");
    expect(addressKind("127.0.0.1")).toBe("loopback");
    expect(addressKind("::1")).toBe("loopback");
    expect(addressKind("::ffff:127.0.0.1")).toBe("loopback");
    expect(addressKind("93.184.215.14")).toBe("public");
    expect(addressKind("2606:4700::1111")).toBe("public");
  });

  it("when a host name resolves to any non-public address, then it is refused, even beside public ones", async () => {
    const resolveTo = (addresses: string[]) => ({
      allowLoopback: false,
      resolve: () => Promise.resolve(addresses),
    });
    expect(
      await refuseUnlessPublic("https://login.example.org", resolveTo(["93.184.215.14"])),
    ).toBeNull();
    expect(
      await refuseUnlessPublic(
        "https://login.example.org",
        resolveTo(["93.184.215.14", "10.0.0.7"]),
      ),
    ).toBe("not_public");
    expect(await refuseUnlessPublic("https://login.example.org", resolveTo(["fe80::1"]))).toBe(
      "not_public",
    );
    expect(await refuseUnlessPublic("https://login.example.org", resolveTo([]))).toBe("not_found");
    expect(
      await refuseUnlessPublic("https://login.example.org", {
        allowLoopback: false,
        resolve: () => Promise.reject(new Error("ENOTFOUND")),
      }),
    ).toBe("not_found");
  });

  it("when the issuer is on loopback, then only a non-production policy allows it, with http or https", async () => {
    expect(await refuseUnlessPublic("http://127.0.0.1:4000", { allowLoopback: true })).toBeNull();
    expect(await refuseUnlessPublic("http://[::1]:4000", { allowLoopback: true })).toBeNull();
    expect(await refuseUnlessPublic("http://127.0.0.1:4000", { allowLoopback: false })).toBe(
      "not_public",
    );
    const loopbackName = { allowLoopback: true, resolve: () => Promise.resolve(["127.0.0.1"]) };
    expect(await refuseUnlessPublic("http://localhost:4000", loopbackName)).toBeNull();
  });

  it("when a public issuer uses plain http or carries credentials, then it is refused", async () => {
    const pub = { allowLoopback: false, resolve: () => Promise.resolve(["93.184.215.14"]) };
    expect(await refuseUnlessPublic("http://login.example.org", pub)).toBe("not_https");
    expect(await refuseUnlessPublic("ftp://login.example.org", pub)).toBe("not_https");
    expect(await refuseUnlessPublic("https://a:b@login.example.org", pub)).toBe("credentials");
    expect(await refuseUnlessPublic("not a url", pub)).toBe("not_a_url");
  });
});
