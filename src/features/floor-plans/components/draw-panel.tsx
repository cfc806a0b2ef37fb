import { distanceMetres, formatLength, type PlanPoint } from "@shared/calc/plan-geometry";
import type { Space, Suite } from "@shared/schemas/floors";

import { Button } from "@/components/ui/button";

import { minimumCorners } from "../lib/map-tool";
import { planAreaSquareMetres } from "../lib/measurements";
import { pointsToPolygon } from "../lib/plan-coordinates";
import { SpaceForm } from "./space-form";
import { ToolButtons, ToolPanel } from "./tool-panel";

export interface DrawPanelProps {
  floorId: string;
  suites: readonly Suite[];
  corners: readonly PlanPoint[];
  finished: boolean;
  metresPerUnit: number | null;
  onUndoCorner: () => void;
  onFinishShape: () => void;
  onKeepDrawing: () => void;
  onCancel: () => void;
  onSaved: (space: Space) => void;
  onUseCentre?: () => void;
}

function drawingInstruction(count: number): string {
  if (count === 0) return "Tap the plan at the first corner of the space.";
  const placed = count === 1 ? "1 corner placed." : `${count} corners placed.`;
  return count >= minimumCorners
    ? `${placed} Tap the next corner, or finish the shape.`
    : `${placed} Tap the next corner.`;
}

export function DrawPanel({
  floorId,
  suites,
  corners,
  finished,
  metresPerUnit,
  onUndoCorner,
  onFinishShape,
  onKeepDrawing,
  onCancel,
  onSaved,
  onUseCentre,
}: DrawPanelProps) {
  const polygon = pointsToPolygon(corners);

  if (finished) {
    return (
      <ToolPanel title="Draw a space" instruction="Say what this space is, then save it.">
        <SpaceForm
          floorId={floorId}
          suites={suites}
          polygon={polygon}
          planAreaM2={planAreaSquareMetres(polygon, metresPerUnit)}
          onSaved={onSaved}
          onKeepDrawing={onKeepDrawing}
          onCancel={onCancel}
        />
      </ToolPanel>
    );
  }

  const last = corners.at(-1);
  const beforeLast = corners.at(-2);
  return (
    <ToolPanel
      title="Draw a space"
      instruction={drawingInstruction(corners.length)}
      onUseCentre={onUseCentre}
    >
      <p className="text-sm text-ink-muted">
        Go round the space&apos;s walls corner by corner; the last corner joins back to the first.
      </p>
      {last && beforeLast && metresPerUnit !== null ? (
        <p className="text-sm">
          Last side: {formatLength(distanceMetres(beforeLast, last, metresPerUnit))}
        </p>
      ) : null}
      <ToolButtons>
        <Button variant="secondary" disabled={corners.length === 0} onClick={onUndoCorner}>
          Undo corner
        </Button>
        <Button disabled={corners.length < minimumCorners} onClick={onFinishShape}>
          Finish shape
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </ToolButtons>
    </ToolPanel>
  );
}
