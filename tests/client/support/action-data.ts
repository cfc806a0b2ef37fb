import type { MeResponse } from "@shared/schemas/auth";
import type { ActionDetail, ActionSummary } from "@shared/schemas/actions";

import { tamsinGeneral } from "./api-stub";
import { buildSpace, floorId } from "./floor-data";

export const actionId = "1a2b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d";

export const facilitiesLead: MeResponse = {
  user: {
    id: "6c7d8e9f-0a1b-4c2d-9e3f-4a5b6c7d8e9f",
    email: "jonah.whitlock@example.org",
    name: "Jonah Whitlock",
  },
  roles: [{ role: "facilities_lead", siteId: tamsinGeneral.id }],
};

export const siteAuditor: MeResponse = {
  user: {
    id: "7d8e9f0a-1b2c-4d3e-8f4a-5b6c7d8e9f0a",
    email: "ines.marlow@example.org",
    name: "Ines Marlow",
  },
  roles: [{ role: "auditor", siteId: tamsinGeneral.id }],
};

export const committeeMember: MeResponse = {
  user: {
    id: "8e9f0a1b-2c3d-4e4f-9a5b-6c7d8e9f0a1b",
    email: "odette.frain@example.org",
    name: "Odette Frain",
  },
  roles: [{ role: "committee_member", siteId: null }],
};

/** An action at Tamsin Bay General; override what the test is about. */
export function buildAction(overrides: Partial<ActionSummary> = {}): ActionSummary {
  return {
    id: actionId,
    siteId: tamsinGeneral.id,
    siteName: tamsinGeneral.name,
    siteTimeZone: "Europe/London",
    spaceId: buildSpace().id,
    spaceName: "Doffing area 4",
    zoneType: "doffing_area",
    floorId,
    floorName: "Ward 4 East",
    itemKey: "doffing.dirty-chair",
    title: "Dirty chair present and labelled",
    severity: "critical",
    state: "to_fix",
    assignee: { id: facilitiesLead.user.id, name: facilitiesLead.user.name },
    openedAt: "2026-03-30T08:00:00.000Z",
    dueAt: "2026-03-31T08:00:00.000Z",
    closedAt: null,
    daysToClose: null,
    closeReason: null,
    spaceRetiredAt: null,
    overdue: false,
    findingCount: 1,
    position: { x: 975, y: 225 },
    ...overrides,
  };
}

export function buildActionDetail(
  action: Partial<ActionSummary> = {},
  overrides: Partial<Omit<ActionDetail, "action">> = {},
): ActionDetail {
  return {
    action: buildAction(action),
    findings: [
      {
        id: "2b3c4d5e-6f70-4b8c-9d0e-1f2a3b4c5d6e",
        auditId: "3c4d5e6f-7081-4c9d-8e0f-2a3b4c5d6e7f",
        auditedAt: "2026-03-30T08:00:00.000Z",
        auditorName: siteAuditor.user.name,
        itemText: "A dirty chair is present in the doffing area and labelled.",
        severity: "critical",
        note: "No chair at all; staff sat on the bin lid.",
        photos: [{ imageId: "4d5e6f70-8192-4dae-9f10-3b4c5d6e7f80" }],
      },
    ],
    proofs: [],
    timeline: [
      {
        id: "5e6f7081-92a3-4ebf-8a21-4c5d6e7f8091",
        at: "2026-03-30T08:00:00.000Z",
        kind: "opened",
        actorName: siteAuditor.user.name,
        fromState: null,
        toState: "to_fix",
        text: null,
      },
    ],
    plan: {
      imageId: "7c2d9b63-0e1f-4a2b-9c34-5d6e7f809102",
      width: 1200,
      height: 800,
      spacePolygon: buildSpace().polygon,
    },
    ...overrides,
  };
}
