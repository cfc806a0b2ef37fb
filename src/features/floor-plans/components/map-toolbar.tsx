import { Button } from "@/components/ui/button";

import type { MapTool, MapToolKind } from "../lib/map-tool";

export interface MapToolbarProps {
  tool: MapTool;
  canEdit: boolean;
  hasScale: boolean;
  hasSelectedSpace: boolean;
  onStart: (tool: MapToolKind) => void;
}

interface ToolButton {
  tool: MapToolKind;
  label: string;
  editorsOnly: boolean;
}

const toolButtons: readonly ToolButton[] = [
  { tool: "scale", label: "Set scale", editorsOnly: true },
  { tool: "draw", label: "Draw a space", editorsOnly: true },
  { tool: "place", label: "Place a fixture", editorsOnly: true },
  { tool: "measure", label: "Measure", editorsOnly: false },
];

/**
 * The tools above the map. While one is in use the others wait, so a half-drawn outline is never
 * thrown away by a stray press; the panel below the map finishes or cancels it.
 */
export function MapToolbar({
  tool,
  canEdit,
  hasScale,
  hasSelectedSpace,
  onStart,
}: MapToolbarProps) {
  const visible = toolButtons.filter((button) => canEdit || !button.editorsOnly);
  return (
    <div aria-label="Plan tools" role="group" className="flex flex-wrap gap-2">
      {visible.map((button) => {
        const active = tool.kind === button.tool;
        const unavailable =
          (button.tool === "place" && !hasSelectedSpace) ||
          (button.tool === "measure" && !hasScale);
        return (
          <Button
            key={button.tool}
            variant={active ? "primary" : "secondary"}
            aria-pressed={active}
            disabled={!active && (tool.kind !== "idle" || unavailable)}
            onClick={() => {
              if (!active) onStart(button.tool);
            }}
          >
            {button.label}
          </Button>
        );
      })}
    </div>
  );
}
