import type { Role } from "@shared/roles";

/** The demo network's people (invented). Every one signs in with the demo password. */
export const demoPassword = "lintel-demo-2026";

export type DemoSiteKey = "general" | "orchard" | "wexley";

export interface DemoPerson {
  email: string;
  name: string;
  /** null site: network-wide. */
  grants: { role: Role; site: DemoSiteKey | null }[];
}

export const demoPeople: DemoPerson[] = [
  {
    email: "admin@example.org",
    name: "Imogen Hale",
    grants: [{ role: "administrator", site: null }],
  },
  {
    email: "auditor@example.org",
    name: "Rafael Dunmore",
    grants: [
      { role: "auditor", site: "general" },
      { role: "auditor", site: "orchard" },
      { role: "auditor", site: "wexley" },
    ],
  },
  {
    email: "auditor2@example.org",
    name: "Aisling Brack",
    grants: [{ role: "auditor", site: "orchard" }],
  },
  {
    email: "facilities.general@example.org",
    name: "Tobias Fenwright",
    grants: [{ role: "facilities_lead", site: "general" }],
  },
  {
    email: "facilities.orchard@example.org",
    name: "Maren Oakes",
    grants: [{ role: "facilities_lead", site: "orchard" }],
  },
  {
    email: "facilities.wexley@example.org",
    name: "Desmond Ure",
    grants: [{ role: "facilities_lead", site: "wexley" }],
  },
  {
    email: "committee@example.org",
    name: "Helena Stroud",
    grants: [{ role: "committee_member", site: null }],
  },
  {
    email: "committee2@example.org",
    name: "Kwame Ashby",
    grants: [{ role: "committee_member", site: null }],
  },
];

export const demoNetworkName = "Tamsin Bay Health";

export const demoSites: Record<
  DemoSiteKey,
  { name: string; address: string; timeZone: string; latitude: number; longitude: number }
> = {
  general: {
    name: "Tamsin Bay General Hospital",
    address: "1 Harbour Rise, Tamsin Bay",
    timeZone: "Europe/London",
    latitude: 50.7312,
    longitude: -3.5224,
  },
  orchard: {
    name: "Orchard Hill Community Hospital",
    address: "27 Cider Press Lane, Orchard Hill",
    timeZone: "Europe/London",
    latitude: 50.8127,
    longitude: -3.3809,
  },
  wexley: {
    name: "Wexley Rehabilitation Centre",
    address: "Millbrook Way, Wexley",
    timeZone: "Europe/London",
    latitude: 50.6645,
    longitude: -3.6951,
  },
};
