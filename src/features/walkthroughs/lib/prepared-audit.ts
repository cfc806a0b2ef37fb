import { minimumAirChangesFor } from "@shared/calc/ventilation";
import type { AuditDetail } from "@shared/schemas/audits";
import type { ChecklistVersion } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

export interface PreparedSpace {
  id: string;
  siteId: string;
  name: string;
  zoneType: ZoneType;
  constructionClass: "new_or_renovated" | "existing" | null;
  volumeM3: number | null;
}

export interface PreparedAuditInput {
  auditId: string;
  space: PreparedSpace;
  /** The published checklist for the space's zone type, as the phone keeps it. */
  checklist: Pick<ChecklistVersion, "id" | "version" | "zoneType" | "status" | "items">;
  auditor: { id: string; name: string };
  startedAt: Date;
}

/**
 * The audit as the server will pin it, built on the phone from what it keeps, so an audit can
 * begin with no signal. The server's own copy replaces it once the start arrives; it pins the
 * same checklist version, so the item ids answered here are the ones it knows.
 * Null when what is kept cannot make it (another zone type's checklist, or not a published one).
 */
export function prepareAuditDetail({
  auditId,
  space,
  checklist,
  auditor,
  startedAt,
}: PreparedAuditInput): AuditDetail | null {
  if (checklist.zoneType !== space.zoneType || checklist.status !== "published") return null;
  if (checklist.items.length === 0) return null;
  const ventilated = space.zoneType === "isolation_room" || space.zoneType === "anteroom";
  return {
    audit: {
      id: auditId,
      siteId: space.siteId,
      spaceId: space.id,
      spaceName: space.name,
      zoneType: space.zoneType,
      spaceRetiredAt: null,
      checklistVersionId: checklist.id,
      checklistVersion: checklist.version,
      auditorId: auditor.id,
      auditorName: auditor.name,
      status: "draft",
      startedAt: startedAt.toISOString(),
      submittedAt: null,
      verdict: null,
      score: null,
      rulesVersion: null,
      verdictReasons: null,
    },
    items: checklist.items,
    answers: [],
    photos: [],
    room: ventilated
      ? {
          volumeM3: space.volumeM3,
          constructionClass: space.constructionClass,
          minimumAirChanges: minimumAirChangesFor(space.zoneType, space.constructionClass),
        }
      : null,
  };
}
