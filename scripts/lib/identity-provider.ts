import { generateKeyPairSync, randomBytes, randomUUID } from "node:crypto";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";

import { demoNetworkName, demoPeople } from "../../server/demo/people";
import Provider, { type Adapter, type AdapterPayload, type Configuration } from "oidc-provider";

/**
 * A local OpenID Connect provider for the demo and the tests, on 127.0.0.1 only. Its sign-in page
 * lists its people: pick one, no password. It is a demo provider and says so on every page; it is
 * never started in production (`npm start` and the test setups start it, never `server/index.ts`).
 */

export interface ProviderPerson {
  /** The provider's stable identifier for the person (the `sub` claim). */
  sub: string;
  email: string;
  name: string;
  /** What the provider says about the address; leave out to send no `email_verified` at all. */
  emailVerified?: boolean;
}

export interface ProviderClient {
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
}

export interface LocalIdentityProvider {
  readonly issuer: string;
  readonly port: number;
  /** Changes what the provider says about a person from now on (e-mail change, verification). */
  updatePerson: (sub: string, change: Partial<Omit<ProviderPerson, "sub">>) => void;
  addPerson: (person: ProviderPerson) => void;
  /** Stops listening (the provider is down); `start` listens again on the same port. */
  stop: () => Promise<void>;
  start: () => Promise<void>;
}

export interface LocalProviderOptions {
  /** What every page says the provider is. */
  title: string;
  people: ProviderPerson[];
  clients: ProviderClient[];
  port?: number;
}

/** In-memory storage for one provider instance (never shared between instances). */
function memoryAdapterFactory() {
  const store = new Map<string, { payload: AdapterPayload; expiresAt: number | null }>();
  const live = (key: string) => {
    const entry = store.get(key);
    if (!entry) return undefined;
    if (entry.expiresAt !== null && entry.expiresAt < Date.now()) {
      store.delete(key);
      return undefined;
    }
    return entry.payload;
  };
  return class MemoryAdapter implements Adapter {
    constructor(private readonly model: string) {}
    private key(id: string) {
      return `${this.model}:${id}`;
    }
    upsert(id: string, payload: AdapterPayload, expiresIn: number) {
      const expiresAt = expiresIn ? Date.now() + expiresIn * 1000 : null;
      store.set(this.key(id), { payload, expiresAt });
      if (payload.uid)
        store.set(`uid:${this.model}:${payload.uid}`, {
          payload: { id } as AdapterPayload,
          expiresAt,
        });
      if (payload.userCode)
        store.set(`code:${this.model}:${payload.userCode}`, {
          payload: { id } as AdapterPayload,
          expiresAt,
        });
      return Promise.resolve();
    }
    find(id: string) {
      return Promise.resolve(live(this.key(id)));
    }
    findByUid(uid: string) {
      const ref = live(`uid:${this.model}:${uid}`) as { id?: string } | undefined;
      return Promise.resolve(ref?.id ? live(this.key(ref.id)) : undefined);
    }
    findByUserCode(userCode: string) {
      const ref = live(`code:${this.model}:${userCode}`) as { id?: string } | undefined;
      return Promise.resolve(ref?.id ? live(this.key(ref.id)) : undefined);
    }
    consume(id: string) {
      const entry = live(this.key(id));
      if (entry) entry.consumed = Math.floor(Date.now() / 1000);
      return Promise.resolve();
    }
    destroy(id: string) {
      store.delete(this.key(id));
      return Promise.resolve();
    }
    revokeByGrantId(grantId: string) {
      for (const [key, entry] of store) {
        if (entry.payload.grantId === grantId) store.delete(key);
      }
      return Promise.resolve();
    }
  };
}

const escapeHtml = (value: string) => value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(title: string, heading: string, body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${escapeHtml(heading)} · ${escapeHtml(title)} (demo)</title>
<style>
body{font-family:system-ui,sans-serif;margin:0;padding:16px;background:#f4f1ea;color:#1d232a;max-width:480px;margin-inline:auto}
.demo{background:#fff3c4;border:1px solid #b08900;padding:8px 12px;border-radius:6px;font-size:14px}
h1{font-size:20px}ul{list-style:none;padding:0}li{margin:8px 0}
button{width:100%;text-align:left;padding:12px;font-size:16px;border:1px solid #7a8491;border-radius:6px;background:#fff;cursor:pointer}
button span{display:block;font-size:14px;color:#4a5561}
</style></head><body>
<p class="demo"><strong>Demo identity provider.</strong> This is not a real hospital sign-in: it exists so you can try single sign-on in Lintel's demo and tests. No passwords are asked.</p>
<p>${escapeHtml(title)}</p>
<h1>${escapeHtml(heading)}</h1>
${body}
</body></html>`;
}

async function readForm(req: IncomingMessage): Promise<URLSearchParams> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  return new URLSearchParams(Buffer.concat(chunks).toString("utf8"));
}

/** Starts a local provider on 127.0.0.1 (a free port unless one is given). */
export async function startLocalIdentityProvider(
  options: LocalProviderOptions,
): Promise<LocalIdentityProvider> {
  const people = new Map(options.people.map((person) => [person.sub, { ...person }]));
  let port = options.port ?? 0;

  // The issuer must be known before listening, so a free port is found first.
  const probe = createServer();
  await new Promise<void>((resolve, reject) => {
    probe.once("error", reject);
    probe.listen(port, "127.0.0.1", () => resolve());
  });
  port = (probe.address() as AddressInfo).port;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  const issuer = `http://127.0.0.1:${port}`;

  const { privateKey } = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const signingKey = {
    ...privateKey.export({ format: "jwk" }),
    kid: randomUUID(),
    alg: "RS256",
    use: "sig",
  };

  const configuration: Configuration = {
    adapter: memoryAdapterFactory(),
    clients: options.clients.map((client) => ({
      client_id: client.clientId,
      client_secret: client.clientSecret,
      redirect_uris: client.redirectUris,
      post_logout_redirect_uris: client.postLogoutRedirectUris,
      grant_types: ["authorization_code"],
      response_types: ["code"],
      token_endpoint_auth_method: "client_secret_post",
    })),
    jwks: { keys: [signingKey as never] },
    cookies: { keys: [randomBytes(32).toString("base64url")] },
    claims: {
      openid: ["sub"],
      email: ["email", "email_verified"],
      profile: ["name"],
    },
    // The ID token carries the scopes' claims, as most hospital providers send them.
    conformIdTokenClaims: false,
    pkce: { methods: ["S256"], required: () => true },
    clientBasedCORS: () => false,
    ttl: {
      AccessToken: 600,
      AuthorizationCode: 60,
      IdToken: 600,
      Interaction: 600,
      Session: 12 * 3600,
      Grant: 12 * 3600,
    },
    features: {
      devInteractions: { enabled: false },
      rpInitiatedLogout: {
        enabled: true,
        // No question asked: the person already chose to sign out in Lintel.
        logoutSource(ctx, form) {
          const confirm = form.replace(
            "</form>",
            '<input type="hidden" name="logout" value="yes"></form>',
          );
          ctx.body = page(
            options.title,
            "Signing you out",
            `${confirm}<button type="submit" form="op.logoutForm">Continue</button>
<script>document.getElementById("op.logoutForm").submit()</script>`,
          );
        },
        postLogoutSuccessSource(ctx) {
          ctx.body = page(options.title, "You are signed out of the demo provider", "");
        },
      },
    },
    interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
    findAccount(_ctx, sub) {
      const person = people.get(sub);
      if (!person) return undefined;
      return {
        accountId: sub,
        claims() {
          const current = people.get(sub) ?? person;
          return {
            sub,
            email: current.email,
            name: current.name,
            ...(current.emailVerified === undefined
              ? {}
              : { email_verified: current.emailVerified }),
          };
        },
      };
    },
    renderError(ctx, out) {
      // The error's code only: descriptions can carry request details back to the page.
      ctx.type = "html";
      ctx.body = page(
        options.title,
        "Something went wrong",
        `<p>The demo provider could not complete this request (${escapeHtml(String(out.error))}).</p>`,
      );
    },
  };

  const provider = new Provider(issuer, configuration);
  const callback = provider.callback();

  async function interaction(
    req: IncomingMessage,
    res: ServerResponse,
    uid: string,
    action: string,
  ) {
    const details = await provider.interactionDetails(req, res);
    if (details.uid !== uid) throw new Error("interaction mismatch");
    if (details.prompt.name === "consent") {
      // Lintel is the provider's own client: consent is implied.
      const grant = details.grantId
        ? await provider.Grant.find(details.grantId)
        : new provider.Grant({
            accountId: details.session!.accountId,
            clientId: String(details.params.client_id),
          });
      const missing = details.prompt.details as {
        missingOIDCScope?: string[];
        missingOIDCClaims?: string[];
      };
      if (missing.missingOIDCScope) grant!.addOIDCScope(missing.missingOIDCScope.join(" "));
      if (missing.missingOIDCClaims) grant!.addOIDCClaims(missing.missingOIDCClaims);
      const grantId = await grant!.save();
      await provider.interactionFinished(
        req,
        res,
        { consent: { grantId } },
        { mergeWithLastSubmission: true },
      );
      return;
    }
    if (req.method === "POST" && action === "login") {
      const form = await readForm(req);
      const sub = form.get("sub") ?? "";
      if (form.get("cancel") === "1") {
        await provider.interactionFinished(
          req,
          res,
          { error: "access_denied", error_description: "The person cancelled." },
          { mergeWithLastSubmission: false },
        );
        return;
      }
      if (!people.has(sub)) {
        res.writeHead(400, { "Content-Type": "text/html; charset=utf-8" });
        res.end(
          page(options.title, "Pick a person", "<p>That person is not on this demo provider.</p>"),
        );
        return;
      }
      await provider.interactionFinished(
        req,
        res,
        { login: { accountId: sub } },
        { mergeWithLastSubmission: false },
      );
      return;
    }
    const hint =
      typeof details.params.login_hint === "string" ? details.params.login_hint.toLowerCase() : "";
    const list = [...people.values()]
      .sort(
        (a, b) => Number(b.email.toLowerCase() === hint) - Number(a.email.toLowerCase() === hint),
      )
      .map(
        (person) =>
          `<li><button type="submit" name="sub" value="${escapeHtml(person.sub)}">${escapeHtml(person.name)}<span>${escapeHtml(person.email)}</span></button></li>`,
      )
      .join("");
    res.writeHead(200, { "Content-Type": "text/html; charset=utf-8", "Cache-Control": "no-store" });
    res.end(
      page(
        options.title,
        "Who is signing in?",
        `<form method="post" action="/interaction/${escapeHtml(uid)}/login"><ul>${list}</ul>
<button type="submit" name="cancel" value="1">Cancel and go back</button></form>`,
      ),
    );
  }

  const server = createServer((req, res) => {
    const match = /^\/interaction\/([\w-]+)(?:\/(login))?$/.exec(req.url?.split("?")[0] ?? "");
    if (match) {
      interaction(req, res, match[1]!, match[2] ?? "").catch(() => {
        if (!res.headersSent) res.writeHead(400, { "Content-Type": "text/html; charset=utf-8" });
        res.end(
          page(
            options.title,
            "Something went wrong",
            "<p>This sign-in has expired. Go back to Lintel and start again.</p>",
          ),
        );
      });
      return;
    }
    void callback(req, res);
  });

  let listening = false;
  const start = async () => {
    if (listening) return;
    await new Promise<void>((resolve, reject) => {
      server.once("error", reject);
      server.listen(port, "127.0.0.1", () => resolve());
    });
    listening = true;
  };
  await start();

  return {
    issuer,
    port,
    updatePerson(sub, change) {
      const person = people.get(sub);
      if (!person) throw new Error(`no person ${sub} at the local provider`);
      people.set(sub, { ...person, ...change });
    },
    addPerson(person) {
      people.set(person.sub, { ...person });
    },
    async stop() {
      if (!listening) return;
      listening = false;
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
    start,
  };
}

/** The demo network's provider: every demo person, one client for the Lintel at `publicUrl`. */
export async function startDemoIdentityProvider(options: {
  publicUrl: URL;
  port?: number;
}): Promise<LocalIdentityProvider & { clientId: string; clientSecret: string }> {
  // Loopback only, and known to anyone reading this file: it protects nothing but the demo.
  const clientId = "lintel-demo";
  const clientSecret = "lintel-demo-client-secret";
  const provider = await startLocalIdentityProvider({
    title: `${demoNetworkName} (demo identity provider)`,
    people: demoPeople.map((person) => ({
      sub: `demo-${person.email.split("@")[0]!.replace(/[^a-z0-9]+/g, "-")}`,
      email: person.email,
      name: person.name,
      emailVerified: true,
    })),
    clients: [
      {
        clientId,
        clientSecret,
        redirectUris: [new URL("/api/auth/provider/callback", options.publicUrl).toString()],
        postLogoutRedirectUris: [new URL("/sign-in", options.publicUrl).toString()],
      },
    ],
    port: options.port,
  });
  return Object.assign(provider, { clientId, clientSecret });
}
