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

/**
 * Where to go after signing in: only a path inside this app, never another origin
 * (`//host`, `/\host`, `https:` …) and never back to the sign-in page. Anything else → home.
 */
export function safeNextPath(next: string | null | undefined): string {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.includes("\\")) {
    return paths.home.path;
  }
  let url: URL;
  try {
    url = new URL(next, probeOrigin);
  } catch {
    return paths.home.path;
  }
  if (url.origin !== probeOrigin || url.pathname === paths.signIn.path) return paths.home.path;
  return `${url.pathname}${url.search}${url.hash}`;
}
