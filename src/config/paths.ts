function withSearch(path: string, search?: URLSearchParams | string): string {
  const query = search ? String(search).replace(/^\?/, "") : "";
  return query ? `${path}?${query}` : path;
}

/** Route paths and the builders that make links to them; nothing else spells a URL. */
export const paths = {
  home: {
    path: "/",
    getHref: () => "/",
  },
  signIn: {
    path: "/sign-in",
    getHref: (next?: string | null) => {
      const safe = next ? safeNextPath(next) : null;
      return safe && safe !== "/" ? `/sign-in?next=${encodeURIComponent(safe)}` : "/sign-in";
    },
  },
  signInProblem: {
    path: "/sign-in/problem",
    getHref: () => "/sign-in/problem",
  },
  newSite: {
    path: "/sites/new",
    getHref: () => "/sites/new",
  },
  site: {
    path: "/sites/:siteId",
    getHref: (siteId: string) => `/sites/${encodeURIComponent(siteId)}`,
  },
  editSite: {
    path: "/sites/:siteId/edit",
    getHref: (siteId: string) => `/sites/${encodeURIComponent(siteId)}/edit`,
  },
  floor: {
    path: "/sites/:siteId/floors/:floorId",
    getHref: (siteId: string, floorId: string) =>
      `/sites/${encodeURIComponent(siteId)}/floors/${encodeURIComponent(floorId)}`,
  },
  siteDue: {
    path: "/sites/:siteId/due",
    getHref: (siteId: string) => `/sites/${encodeURIComponent(siteId)}/due`,
  },
  qrSheet: {
    path: "/sites/:siteId/qr-sheet",
    getHref: (siteId: string) => `/sites/${encodeURIComponent(siteId)}/qr-sheet`,
  },
  startAudit: {
    path: "/spaces/:spaceId/audit",
    getHref: (spaceId: string) => `/spaces/${encodeURIComponent(spaceId)}/audit`,
  },
  startObservation: {
    path: "/spaces/:spaceId/observe",
    getHref: (spaceId: string) => `/spaces/${encodeURIComponent(spaceId)}/observe`,
  },
  observation: {
    path: "/observations/:observationId",
    getHref: (observationId: string) => `/observations/${encodeURIComponent(observationId)}`,
  },
  spaceAudits: {
    path: "/spaces/:spaceId/audits",
    getHref: (spaceId: string) => `/spaces/${encodeURIComponent(spaceId)}/audits`,
  },
  audit: {
    path: "/audits/:auditId",
    getHref: (auditId: string) => `/audits/${encodeURIComponent(auditId)}`,
  },
  siteActions: {
    path: "/sites/:siteId/actions",
    getHref: (siteId: string, search?: URLSearchParams | string) => {
      const query = search ? String(search) : "";
      return `/sites/${encodeURIComponent(siteId)}/actions${query ? `?${query}` : ""}`;
    },
  },
  myActions: {
    path: "/actions",
    getHref: () => "/actions",
  },
  action: {
    path: "/actions/:actionId",
    getHref: (actionId: string) => `/actions/${encodeURIComponent(actionId)}`,
  },
  committee: {
    path: "/committee",
    getHref: (search?: URLSearchParams | string) => withSearch("/committee", search),
  },
  committeeSite: {
    path: "/committee/sites/:siteId",
    getHref: (siteId: string, search?: URLSearchParams | string) =>
      withSearch(`/committee/sites/${encodeURIComponent(siteId)}`, search),
  },
  admin: {
    path: "/admin",
    getHref: () => "/admin",
  },
  sequences: {
    path: "/admin/sequences",
    getHref: () => "/admin/sequences",
  },
  checklists: {
    path: "/admin/checklists",
    getHref: () => "/admin/checklists",
  },
  account: {
    path: "/account",
    getHref: () => "/account",
  },
  people: {
    path: "/admin/people",
    getHref: () => "/admin/people",
  },
  invitePerson: {
    path: "/admin/people/invite",
    getHref: () => "/admin/people/invite",
  },
  person: {
    path: "/admin/people/:userId",
    getHref: (userId: string) => `/admin/people/${encodeURIComponent(userId)}`,
  },
  mailbox: {
    path: "/admin/mail",
    getHref: () => "/admin/mail",
  },
  undeliveredMail: {
    path: "/admin/undelivered-mail",
    getHref: () => "/admin/undelivered-mail",
  },
  signInSettings: {
    path: "/admin/sign-in",
    getHref: () => "/admin/sign-in",
  },
  welcome: {
    path: "/welcome/:token",
    getHref: (token: string) => `/welcome/${encodeURIComponent(token)}`,
  },
  forgotPassword: {
    path: "/forgot-password",
    getHref: () => "/forgot-password",
  },
  resetPassword: {
    path: "/reset-password/:token",
    getHref: (token: string) => `/reset-password/${encodeURIComponent(token)}`,
  },
} as const;

const probeOrigin = "https://lintel.invalid";

/** C0 controls, space, DEL and the Unicode spaces a browser may strip or fold away in a URL. */
const unsafeCharacter =
  // eslint-disable-next-line no-control-regex -- matching control characters is the point
  /[\u0000-\u0020\u007f-\u00a0\u1680\u180e\u2000-\u200f\u2028\u2029\u202f\u205f\u3000\ufeff\\]/;

/** Whether a browser, reading `value` against this app's page, would leave this app's origin. */
function leavesOrigin(value: string): boolean {
  if (!value.startsWith("/") || value.startsWith("//") || unsafeCharacter.test(value)) return true;
  let decoded: string;
  try {
    decoded = decodeURIComponent(value);
  } catch {
    return true;
  }
  // `/%2F%2Fhost` or `/%5Chost` is harmless to a browser but not to every router or proxy after it.
  return decoded.startsWith("//") || unsafeCharacter.test(decoded);
}

/**
 * Where to go after signing in: only a path inside this app, never anything a browser would
 * resolve to another origin (`//host`, `/\host`, `https:`, `/.//host` once dot segments are
 * removed, encoded slashes, stripped whitespace …) and never back to the sign-in page. Anything
 * else → home. The answer is checked after normalising, and must normalise to itself.
 */
export function safeNextPath(next: string | null | undefined): string {
  if (typeof next !== "string" || next.length > 2048 || leavesOrigin(next)) return paths.home.path;
  let url: URL;
  try {
    url = new URL(next, probeOrigin);
  } catch {
    return paths.home.path;
  }
  if (url.origin !== probeOrigin) return paths.home.path;
  const normalised = `${url.pathname}${url.search}${url.hash}`;
  if (leavesOrigin(normalised)) return paths.home.path;
  const again = new URL(normalised, probeOrigin);
  if (
    again.origin !== probeOrigin ||
    `${again.pathname}${again.search}${again.hash}` !== normalised
  )
    return paths.home.path;
  const page = url.pathname.replace(/\/+$/, "").toLowerCase();
  if (page === paths.signIn.path) return paths.home.path;
  return normalised;
}
