import type { MeResponse } from "@shared/schemas/auth";
import type { Person } from "@shared/schemas/people";
import type { Site } from "@shared/schemas/site";
import { vi } from "vitest";

export interface StubRequest {
  method: string;
  path: string;
  body: unknown;
}

type Reply = (request: StubRequest) => Response | Promise<Response>;

export function jsonResponse(body: unknown, status = 200): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { "Content-Type": "application/json" },
  });
}

export function errorResponse(
  status: number,
  code: string,
  message: string,
  fields?: Record<string, string>,
): Response {
  return jsonResponse({ error: { code, message, ...(fields ? { fields } : {}) } }, status);
}

export const signedOutReply: Reply = () =>
  errorResponse(401, "unauthenticated", "Please sign in to continue.");

/**
 * Replaces `fetch` with replies keyed by "METHOD /path"; `fallback` answers paths made at run time
 * (ids a device makes) and returns undefined for the rest. A request nobody expected fails the
 * test loudly rather than hanging.
 */
export function stubApi(
  replies: Record<string, Reply>,
  fallback?: (request: StubRequest) => Response | Promise<Response> | undefined,
) {
  const calls: StubRequest[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), "http://localhost");
    const method = (init?.method ?? "GET").toUpperCase();
    const body: unknown =
      typeof init?.body === "string"
        ? JSON.parse(init.body)
        : init?.body instanceof FormData
          ? init.body
          : undefined;
    const request = { method, path: url.pathname, body };
    calls.push(request);
    const reply = replies[`${method} ${url.pathname}`];
    if (reply) return reply(request);
    const fallen = fallback?.(request);
    if (!fallen) throw new Error(`Unexpected request in test: ${method} ${url.pathname}`);
    return fallen;
  });
  vi.stubGlobal("fetch", fetchStub);
  return { calls, fetchStub };
}

export const tamsinGeneral: Site = {
  id: "0b6f2a9c-3d4e-4f5a-8b6c-7d8e9f0a1b2c",
  name: "Tamsin Bay General Hospital",
  address: "1 Harbour Road, Tamsin Bay",
  timeZone: "Europe/London",
  latitude: 50.1234,
  longitude: -5.4321,
};

export const orchardHill: Site = {
  id: "1c7a3b0d-4e5f-4a6b-9c7d-8e9f0a1b2c3d",
  name: "Orchard Hill Community Hospital",
  address: "22 Orchard Lane, Orchard Hill",
  timeZone: "Europe/London",
  latitude: 50.2345,
  longitude: -5.3456,
};

export const auditor: MeResponse = {
  user: {
    id: "2d8b4c1e-5f6a-4b7c-8d9e-0f1a2b3c4d5e",
    email: "rowan.ellery@example.org",
    name: "Rowan Ellery",
  },
  roles: [
    { role: "auditor", siteId: tamsinGeneral.id },
    { role: "facilities_lead", siteId: orchardHill.id },
  ],
};

export const administrator: MeResponse = {
  user: {
    id: "3e9c5d2f-6a7b-4c8d-9e0f-1a2b3c4d5e6f",
    email: "morgan.adebayo@example.org",
    name: "Morgan Adebayo",
  },
  roles: [{ role: "administrator", siteId: null }],
};

/** A person as the people endpoints return them; override what the test is about. */
export function buildPerson(overrides: Partial<Person> = {}): Person {
  return {
    id: "4fad6e30-7b8c-4d9e-8f01-2b3c4d5e6f70",
    email: "priya.nair@example.org",
    name: "Priya Nair",
    status: "active",
    grants: [
      {
        id: "5a0b7f41-8c9d-4e0f-9a12-3c4d5e6f7081",
        role: "auditor",
        siteId: tamsinGeneral.id,
        siteName: tamsinGeneral.name,
      },
    ],
    createdAt: "2026-01-12T09:30:00.000Z",
    deactivatedAt: null,
    invitationExpiresAt: null,
    ...overrides,
  };
}

export const manageableSites = [
  { id: tamsinGeneral.id, name: tamsinGeneral.name },
  { id: orchardHill.id, name: orchardHill.name },
];
