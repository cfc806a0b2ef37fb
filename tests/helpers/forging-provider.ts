import { createSign, generateKeyPairSync, randomBytes, randomUUID } from "node:crypto";
import { createServer } from "node:http";
import type { AddressInfo } from "node:net";

/**
 * A provider that answers the token request with an ID token made to order: honest, or wrong in
 * exactly one way (signed with a key it never published, for another audience, expired, without a
 * verified address). It publishes its own keys and skips any sign-in page: its authorization
 * endpoint sends the browser straight back with a code.
 */
export type Forgery =
  | "honest"
  | "foreign-signature"
  | "wrong-audience"
  | "wrong-issuer"
  | "expired"
  | "wrong-nonce"
  | "unverified";

export interface ForgingProvider {
  issuer: string;
  clientId: string;
  clientSecret: string;
  forgery: Forgery;
  person: { sub: string; email: string };
  stop: () => Promise<void>;
}

const b64 = (value: object) => Buffer.from(JSON.stringify(value)).toString("base64url");

function signJwt(
  header: object,
  payload: object,
  privateKey: ReturnType<typeof generateKeyPairSync>["privateKey"],
) {
  const input = `${b64(header)}.${b64(payload)}`;
  const signature = createSign("RSA-SHA256").update(input).sign(privateKey).toString("base64url");
  return `${input}.${signature}`;
}

export async function startForgingProvider(): Promise<ForgingProvider> {
  const published = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const foreign = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const kid = randomUUID();
  const codes = new Map<string, { nonce: string; clientId: string }>();

  const state: ForgingProvider = {
    issuer: "",
    clientId: `forged-${randomUUID().slice(0, 8)}`,
    clientSecret: randomUUID(),
    forgery: "honest",
    person: { sub: "", email: "" },
    stop: () => Promise.resolve(),
  };

  const server = createServer((req, res) => {
    const url = new URL(req.url ?? "/", state.issuer);
    const json = (status: number, body: object) => {
      res.writeHead(status, { "Content-Type": "application/json", "Cache-Control": "no-store" });
      res.end(JSON.stringify(body));
    };
    if (url.pathname === "/.well-known/openid-configuration") {
      json(200, {
        issuer: state.issuer,
        authorization_endpoint: `${state.issuer}/authorize`,
        token_endpoint: `${state.issuer}/token`,
        jwks_uri: `${state.issuer}/jwks`,
        response_types_supported: ["code"],
        subject_types_supported: ["public"],
        id_token_signing_alg_values_supported: ["RS256"],
        code_challenge_methods_supported: ["S256"],
        token_endpoint_auth_methods_supported: ["client_secret_post"],
      });
      return;
    }
    if (url.pathname === "/jwks") {
      json(200, {
        keys: [{ ...published.publicKey.export({ format: "jwk" }), kid, alg: "RS256", use: "sig" }],
      });
      return;
    }
    if (url.pathname === "/authorize") {
      const code = randomBytes(16).toString("base64url");
      codes.set(code, {
        nonce: url.searchParams.get("nonce") ?? "",
        clientId: url.searchParams.get("client_id") ?? "",
      });
      const back = new URL(url.searchParams.get("redirect_uri")!);
      back.searchParams.set("code", code);
      back.searchParams.set("state", url.searchParams.get("state") ?? "");
      res.writeHead(302, { Location: back.toString() });
      res.end();
      return;
    }
    if (url.pathname === "/token" && req.method === "POST") {
      const chunks: Buffer[] = [];
      req.on("data", (chunk: Buffer) => chunks.push(chunk));
      req.on("end", () => {
        const form = new URLSearchParams(Buffer.concat(chunks).toString("utf8"));
        const grant = codes.get(form.get("code") ?? "");
        codes.delete(form.get("code") ?? "");
        if (!grant) return json(400, { error: "invalid_grant" });
        const now = Math.floor(Date.now() / 1000);
        const forgery = state.forgery;
        const claims = {
          iss: forgery === "wrong-issuer" ? "https://someone-else.example" : state.issuer,
          aud: forgery === "wrong-audience" ? "another-client" : grant.clientId,
          sub: state.person.sub,
          email: state.person.email,
          email_verified: forgery !== "unverified",
          nonce: forgery === "wrong-nonce" ? "not-the-nonce" : grant.nonce,
          iat: forgery === "expired" ? now - 7200 : now,
          exp: forgery === "expired" ? now - 3600 : now + 300,
        };
        const key = forgery === "foreign-signature" ? foreign.privateKey : published.privateKey;
        json(200, {
          access_token: randomBytes(16).toString("base64url"),
          token_type: "Bearer",
          expires_in: 300,
          id_token: signJwt({ alg: "RS256", typ: "JWT", kid }, claims, key),
        });
      });
      return;
    }
    json(404, { error: "not_found" });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  state.issuer = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  state.stop = () =>
    new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
  return state;
}
