import { distanceMetres, formatLength, type PlanPoint } from "@shared/calc/plan-geometry";

import { Button } from "@/components/ui/button";

import { ToolButtons, ToolPanel } from "./tool-panel";

export interface MeasurePanelProps {
  points: readonly PlanPoint[];
  metresPerUnit: number;
  onDone: () => void;
  onUseCentre?: () => void;
}

export function MeasurePanel({ points, metresPerUnit, onDone, onUseCentre }: MeasurePanelProps) {
  const [a, b] = points;
  const instruction =
    a && b
      ? `Distance: ${formatLength(distanceMetres(a, b, metresPerUnit))}`
      : a
        ? "Tap the second point"
        : "Tap the first point";
  return (
    <ToolPanel title="Measure" instruction={instruction} onUseCentre={onUseCentre}>
      {a && b ? (
        <p className="text-sm text-ink-muted">Tap the plan again to measure another distance.</p>
      ) : null}
      <ToolButtons>
        <Button variant="secondary" onClick={onDone}>
          Done
        </Button>
      </ToolButtons>
    </ToolPanel>
  );
}
