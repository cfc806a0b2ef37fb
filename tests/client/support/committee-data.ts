import { wilsonInterval } from "@shared/calc/statistics";
import type {
  ComparisonResponse,
  Proportion,
  SiteDrillDown,
  TrendsResponse,
} from "@shared/schemas/committee";
import type { ObservationCommitteeResponse } from "@shared/schemas/observations";
import type { Site } from "@shared/schemas/site";

import { orchardHill, tamsinGeneral } from "./api-stub";

export const wexleyRehab: Site = {
  id: "3e8d5c2f-6a7b-4c8d-9e0f-1a2b3c4d5e70",
  name: "Wexley Rehabilitation Centre",
  address: "5 Mill Street, Wexley",
  timeZone: "Europe/London",
  latitude: 50.3456,
  longitude: -5.2567,
};

export function proportionOf(successes: number, n: number): Proportion {
  return {
    n,
    successes,
    rate: n === 0 ? null : successes / n,
    interval: n === 0 ? null : wilsonInterval(successes, n),
    smallSample: n < 30,
  };
}

function siteRow(
  site: Site,
  ready: number,
  audits: number,
  rank: number | null,
): ComparisonResponse["sites"][number] {
  const rest = audits - ready;
  return {
    siteId: site.id,
    siteName: site.name,
    readiness: proportionOf(ready, audits),
    verdicts: {
      all_clear: ready,
      gaps_to_fix: Math.ceil(rest / 2),
      hold: Math.floor(rest / 2),
    },
    categories: [
      { category: "ppe_supply", ...proportionOf(Math.round(audits * 0.9), audits) },
      { category: "hand_hygiene", ...proportionOf(Math.round(audits * 0.8), audits) },
    ],
    rank,
  };
}

/**
 * Tamsin Bay General 84 of 120 ready (70.0%, 61.3% – 77.5%), Orchard Hill 40 of 64 (62.5%,
 * 50.3% – 73.3%), Wexley 5 of 12 (41.7%, 19.3% – 68.0%): too few audits to rank.
 */
export function buildComparison(overrides: Partial<ComparisonResponse> = {}): ComparisonResponse {
  return {
    networkName: "Tamsin Bay Health",
    from: "2025-05",
    to: "2026-04",
    zoneType: null,
    confidence: 0.95,
    minimumRankedSample: 30,
    network: proportionOf(129, 196),
    sites: [
      siteRow(orchardHill, 40, 64, 2),
      siteRow(tamsinGeneral, 84, 120, 1),
      siteRow(wexleyRehab, 5, 12, null),
    ],
    difference: null,
    ...overrides,
  };
}

export function buildTrends(overrides: Partial<TrendsResponse> = {}): TrendsResponse {
  const month = (m: string, audits: number, ready: number, lower: number, upper: number) => {
    const p = ready / audits;
    return { month: m, audits, allClear: ready, p, lower, upper, outside: p < lower || p > upper };
  };
  return {
    from: "2025-05",
    to: "2026-04",
    zoneType: null,
    sites: [
      {
        siteId: orchardHill.id,
        siteName: orchardHill.name,
        centre: 0.625,
        points: [month("2026-02", 20, 13, 0.3, 0.95), month("2026-03", 22, 14, 0.31, 0.94)],
      },
      {
        siteId: tamsinGeneral.id,
        siteName: tamsinGeneral.name,
        centre: 0.7,
        points: [
          month("2026-02", 40, 30, 0.48, 0.92),
          month("2026-03", 40, 12, 0.48, 0.92),
          month("2026-04", 40, 31, 0.48, 0.92),
        ],
      },
      { siteId: wexleyRehab.id, siteName: wexleyRehab.name, centre: null, points: [] },
    ],
    aging: [
      {
        siteId: tamsinGeneral.id,
        siteName: tamsinGeneral.name,
        unfinished: { "0-7": 4, "8-30": 3, "31-90": 2, "90+": 1 },
        overdue: { "0-7": 2, "8-30": 1, "31-90": 0, "90+": 1 },
      },
    ],
    closeTimes: [
      {
        siteId: tamsinGeneral.id,
        siteName: tamsinGeneral.name,
        severity: "critical",
        closed: 9,
        medianDays: 1.5,
      },
    ],
    ...overrides,
  };
}

export const doffingSpace = {
  spaceId: "4f9e6d30-7b8c-4d9e-8f01-2b3c4d5e6f81",
  floorId: "5a0f7e41-8c9d-4e0f-9a12-3c4d5e6f7092",
};

export function buildDrillDown(overrides: Partial<SiteDrillDown> = {}): SiteDrillDown {
  return {
    siteId: tamsinGeneral.id,
    siteName: tamsinGeneral.name,
    from: "2025-05",
    to: "2026-04",
    spaces: [
      {
        spaceId: doffingSpace.spaceId,
        spaceName: "Doffing area 4",
        zoneType: "doffing_area",
        floorId: doffingSpace.floorId,
        floorName: "Ward 4 East",
        readiness: proportionOf(9, 12),
        lastVerdict: "gaps_to_fix",
        lastAuditAt: "2026-04-02T09:00:00.000Z",
        unfinishedActions: 2,
        overdueActions: 1,
      },
    ],
    ...overrides,
  };
}

type ObservationFigures = ObservationCommitteeResponse["network"];

function stepRate(
  sequenceKey: string,
  stepKey: string,
  stepText: string,
  breached: number,
  n: number,
) {
  return {
    sequenceKey,
    sequenceTitle: "Removing PPE, example 1 (gloves first)",
    stepKey,
    stepText,
    breached: proportionOf(breached, n),
    suppressed: false,
  };
}

/**
 * The network: 40 removal observations; glove removal breached in 12 (30.0%), gown removal in 8,
 * hand hygiene before leaving in 2; 31 of 40 with every hand-hygiene moment (77.5%), 110 of 120
 * moments; 9 of 12 coached staff clean next time. Tamsin Bay General holds them all; Orchard Hill
 * observed 3 staff members only, so its figures are suppressed.
 */
export function buildObservationFigures(
  overrides: Partial<ObservationCommitteeResponse> = {},
): ObservationCommitteeResponse {
  const steps = [
    stepRate("standard-removal-1", "remove-gloves", "Remove gloves", 12, 40),
    stepRate("standard-removal-1", "remove-gown", "Remove gown", 8, 40),
    stepRate(
      "standard-removal-1",
      "hand-hygiene-exit",
      "Perform hand hygiene before leaving",
      2,
      40,
    ),
  ];
  const network: ObservationFigures = {
    observations: 40,
    suppressed: false,
    steps,
    mostErrorProne: steps,
    handHygieneAllMoments: { ...proportionOf(31, 40), suppressed: false },
    handHygieneMomentRate: 110 / 120,
    perMonth: [
      { month: "2026-03", observations: 18 },
      { month: "2026-04", observations: 22 },
    ],
    cleanAfterCoaching: { ...proportionOf(9, 12), suppressed: false },
  };
  const suppressed: ObservationFigures = {
    observations: 4,
    suppressed: true,
    steps: [],
    mostErrorProne: [],
    handHygieneAllMoments: { ...proportionOf(0, 0), suppressed: true },
    handHygieneMomentRate: null,
    perMonth: [],
    cleanAfterCoaching: { ...proportionOf(0, 0), suppressed: true },
  };
  return {
    from: "2025-05",
    to: "2026-04",
    confidence: 0.95,
    minimumRankedSample: 30,
    minimumStaffCodes: 5,
    network,
    sites: [
      { ...network, siteId: tamsinGeneral.id, siteName: tamsinGeneral.name },
      { ...suppressed, siteId: orchardHill.id, siteName: orchardHill.name },
    ],
    ...overrides,
  };
}
