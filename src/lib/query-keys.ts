import type { ActionListQuery } from "@shared/schemas/actions";
import type { CommitteeQuery } from "@shared/schemas/committee";

/**
 * Every query key of the client, in one place. A key starts with the plural resource name, so a
 * prefix (`queryKeys.actions.all`, `queryKeys.actions.site(siteId)`) reaches every list under it.
 * Api files build their queries from here and a change made in one feature refreshes what another
 * feature shows through the same keys, never through a copy spelled out by hand.
 */
export const queryKeys = {
  sessions: {
    /** The key every sign-in, sign-out and session check reads or writes. */
    me: ["sessions", "me"] as const,
  },
  invitations: {
    detail: (token: string) => ["invitations", token] as const,
  },
  passwordResets: {
    detail: (token: string) => ["password-resets", token] as const,
  },
  sites: {
    list: ["sites", "list"] as const,
    retired: ["sites", "retired"] as const,
    detail: (siteId: string) => ["sites", "detail", siteId] as const,
  },
  floors: {
    /** Every floor detail loaded, whatever its id. */
    details: ["floors", "detail"] as const,
    detail: (floorId: string) => ["floors", "detail", floorId] as const,
    list: (siteId: string) => ["floors", "list", siteId] as const,
    retired: (siteId: string) => ["floors", "retired", siteId] as const,
    /** The floor a space is on, asked by the space's id (a QR code's start); kept as that floor. */
    ofSpace: (spaceId: string) => ["floors", "of-space", spaceId] as const,
  },
  audits: {
    detail: (auditId: string) => ["audits", "detail", auditId] as const,
    space: (spaceId: string) => ["audits", "list", "space", spaceId] as const,
  },
  schedules: {
    /** Every due list: the signed-in person's and each site's. */
    all: ["schedules"] as const,
    mine: ["schedules", "mine"] as const,
    site: (siteId: string) => ["schedules", "site", siteId] as const,
  },
  actions: {
    /** Every action detail loaded, whatever its id. */
    details: ["actions", "detail"] as const,
    detail: (actionId: string) => ["actions", "detail", actionId] as const,
    /** With filters, one list; without, every list of the site (the work list, floor pins, counts). */
    site: (siteId: string, filters?: Partial<ActionListQuery>) =>
      filters === undefined
        ? (["actions", "site", siteId] as const)
        : (["actions", "site", siteId, filters] as const),
    mine: ["actions", "mine"] as const,
    toCheck: ["actions", "to-check"] as const,
    assignees: (siteId: string) => ["actions", "assignees", siteId] as const,
    duePolicy: (siteId: string) => ["actions", "due-policy", siteId] as const,
  },
  pressureSettings: {
    site: (siteId: string) => ["pressure-settings", siteId] as const,
  },
  pressureUploadTokens: {
    site: (siteId: string) => ["pressure-upload-tokens", siteId] as const,
  },
  committee: {
    /** Every committee figure: trends and comparisons span sites, so all of them. */
    all: ["committee"] as const,
    site: (siteId: string, period: Omit<CommitteeQuery, "siteA" | "siteB">) =>
      ["committee", "site", siteId, period] as const,
    trends: (period: Omit<CommitteeQuery, "siteA" | "siteB">) =>
      ["committee", "trends", period] as const,
    comparison: (view: CommitteeQuery) => ["committee", "comparison", view] as const,
    observations: (period: { from: string; to: string }) =>
      ["committee", "observations", period] as const,
    pressure: (period: Omit<CommitteeQuery, "siteA" | "siteB">) =>
      ["committee", "pressure", period] as const,
  },
  checklists: {
    list: ["checklists", "list"] as const,
  },
  sequences: {
    list: ["sequences", "list"] as const,
  },
  pressureNow: {
    /** Every live pressure answer: each site's rooms now and each room's last day. */
    all: ["pressure-now"] as const,
    site: (siteId: string) => ["pressure-now", "site", siteId] as const,
    day: (spaceId: string) => ["pressure-now", "day", spaceId] as const,
  },
  observationSettings: {
    current: ["observation-settings", "current"] as const,
  },
  appConfigs: {
    current: ["app-configs", "current"] as const,
  },
  mailboxMessages: {
    list: ["mailbox-messages", "list"] as const,
  },
  undeliveredMails: {
    list: ["undelivered-mails", "list"] as const,
  },
  identityProviders: {
    /** The network's provider settings and the addresses to register at the provider. */
    current: ["identity-providers", "current"] as const,
  },
  roomPressures: {
    all: ["room-pressures"] as const,
    /** Every range of one room's pressure (the space page); an acknowledgement refreshes it. */
    space: (spaceId: string) => ["room-pressures", spaceId] as const,
    range: (spaceId: string, range: "24h" | "30d") => ["room-pressures", spaceId, range] as const,
  },
  people: {
    list: ["people", "list"] as const,
    detail: (userId: string) => ["people", "detail", userId] as const,
  },
} as const;
