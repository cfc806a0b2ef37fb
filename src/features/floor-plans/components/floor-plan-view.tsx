import type { FloorDetail, Space } from "@shared/schemas/floors";
import type { ReactNode } from "react";

import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";

import type { MapPin } from "../lib/map-pins";
import { FloorWorkspace } from "./floor-workspace";
import { PlanUploadForm } from "./plan-upload-form";

export interface FloorPlanViewProps {
  detail: FloorDetail;
  /** May change this site's floors, spaces and fixtures. */
  canEdit: boolean;
  /** Links or buttons the page adds to each space in the list (such as starting an audit). */
  spaceActions?: (space: Space) => ReactNode;
  /** Markers the page adds to the plan, such as open corrective actions. */
  pins?: readonly MapPin[];
  /** The key and filters for those markers, shown beside the plan's own key. */
  pinKey?: ReactNode;
}

/** The floor's plan with everything on it, or the way to get a plan there first. */
export function FloorPlanView({ detail, canEdit, spaceActions, pins, pinKey }: FloorPlanViewProps) {
  const { floor } = detail;

  if (!floor.plan) {
    if (!canEdit) {
      return (
        <EmptyState
          title="No floor plan yet"
          description="Once an administrator of this site uploads the plan, its isolation rooms, anterooms, donning zones and doffing areas appear here with their fixtures."
        />
      );
    }
    return (
      <Card>
        <h2 className="text-lg font-semibold">Add the floor plan</h2>
        <p className="mt-1 mb-4 text-ink-muted">
          Upload an image of this floor&apos;s plan. Then set its scale, outline the spaces and pin
          the fixtures an audit looks for.
        </p>
        <PlanUploadForm floorId={floor.id} hasPlan={false} />
      </Card>
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <FloorWorkspace
        key={floor.id}
        detail={detail}
        plan={floor.plan}
        canEdit={canEdit}
        spaceActions={spaceActions}
        pins={pins}
        pinKey={pinKey}
      />
      {canEdit ? (
        <Card>
          <h2 className="text-lg font-semibold">Plan image</h2>
          <p className="mt-1 mb-4 text-ink-muted">
            Replace the image when the drawing is updated, for example after building work.
          </p>
          <PlanUploadForm floorId={floor.id} hasPlan />
        </Card>
      ) : null}
    </div>
  );
}
