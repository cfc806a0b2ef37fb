import type { PlanPoint } from "@shared/calc/plan-geometry";

/** What a tap on the map means right now. Only one tool is active at a time. */
export type MapTool =
  | { kind: "idle" }
  | { kind: "scale"; points: PlanPoint[] }
  | { kind: "measure"; points: PlanPoint[] }
  | { kind: "draw"; corners: PlanPoint[]; finished: boolean }
  | { kind: "place" };

export type MapToolKind = Exclude<MapTool["kind"], "idle">;

export type MapToolAction =
  | { type: "start"; tool: MapToolKind }
  | { type: "tap"; point: PlanPoint }
  | { type: "undo-corner" }
  | { type: "finish-shape" }
  | { type: "keep-drawing" }
  | { type: "pick-again" }
  | { type: "close" };

export const idleTool: MapTool = { kind: "idle" };

export const minimumCorners = 3;

export function canFinishShape(tool: MapTool): boolean {
  return tool.kind === "draw" && !tool.finished && tool.corners.length >= minimumCorners;
}

export function mapToolReducer(tool: MapTool, action: MapToolAction): MapTool {
  switch (action.type) {
    case "start":
      switch (action.tool) {
        case "scale":
        case "measure":
          return { kind: action.tool, points: [] };
        case "draw":
          return { kind: "draw", corners: [], finished: false };
        case "place":
          return { kind: "place" };
      }
      return tool;
    case "tap":
      if (tool.kind === "draw") {
        return tool.finished ? tool : { ...tool, corners: [...tool.corners, action.point] };
      }
      if (tool.kind === "scale") {
        // Two points make the reference; further taps wait for "Pick again".
        return tool.points.length < 2 ? { ...tool, points: [...tool.points, action.point] } : tool;
      }
      if (tool.kind === "measure") {
        // A third tap starts the next measurement.
        return {
          ...tool,
          points: tool.points.length < 2 ? [...tool.points, action.point] : [action.point],
        };
      }
      return tool;
    case "undo-corner":
      if (tool.kind !== "draw" || tool.finished || tool.corners.length === 0) return tool;
      return { ...tool, corners: tool.corners.slice(0, -1) };
    case "finish-shape":
      return canFinishShape(tool)
        ? { ...(tool as Extract<MapTool, { kind: "draw" }>), finished: true }
        : tool;
    case "keep-drawing":
      return tool.kind === "draw" && tool.finished ? { ...tool, finished: false } : tool;
    case "pick-again":
      return tool.kind === "scale" || tool.kind === "measure" ? { ...tool, points: [] } : tool;
    case "close":
      return idleTool;
  }
}
