import { describe, expect, it } from "vitest";

import {
  canFinishShape,
  idleTool,
  type MapTool,
  type MapToolAction,
  mapToolReducer,
} from "@/features/floor-plans/lib/map-tool";

function run(actions: MapToolAction[], start: MapTool = idleTool): MapTool {
  return actions.reduce(mapToolReducer, start);
}

const tap = (x: number, y: number): MapToolAction => ({ type: "tap", point: { x, y } });

describe("drawing a space", () => {
  it("when taps follow Draw a space, then each adds a corner in order", () => {
    const tool = run([{ type: "start", tool: "draw" }, tap(1, 1), tap(5, 1), tap(5, 5)]);

    expect(tool).toEqual({
      kind: "draw",
      corners: [
        { x: 1, y: 1 },
        { x: 5, y: 1 },
        { x: 5, y: 5 },
      ],
      finished: false,
    });
  });

  it("when Undo corner is pressed, then the last corner goes, and with none left nothing changes", () => {
    const drawn = run([{ type: "start", tool: "draw" }, tap(1, 1), tap(5, 1)]);

    const undone = mapToolReducer(drawn, { type: "undo-corner" });
    expect(undone.kind === "draw" && undone.corners).toEqual([{ x: 1, y: 1 }]);

    const empty = run([{ type: "undo-corner" }, { type: "undo-corner" }], undone);
    expect(empty.kind === "draw" && empty.corners).toEqual([]);
  });

  it("when fewer than three corners are placed, then the shape cannot be finished", () => {
    const two = run([{ type: "start", tool: "draw" }, tap(1, 1), tap(5, 1)]);

    expect(canFinishShape(two)).toBe(false);
    expect(mapToolReducer(two, { type: "finish-shape" })).toBe(two);
  });

  it("when three corners are placed and the shape finished, then further taps and undo leave it alone", () => {
    const three = run([{ type: "start", tool: "draw" }, tap(1, 1), tap(5, 1), tap(5, 5)]);
    expect(canFinishShape(three)).toBe(true);

    const finished = mapToolReducer(three, { type: "finish-shape" });
    expect(finished).toMatchObject({ kind: "draw", finished: true });
    expect(canFinishShape(finished)).toBe(false);
    expect(run([tap(9, 9), { type: "undo-corner" }], finished)).toEqual(finished);
  });

  it("when Keep drawing follows a finished shape, then corners can be added again", () => {
    const finished = run([
      { type: "start", tool: "draw" },
      tap(1, 1),
      tap(5, 1),
      tap(5, 5),
      { type: "finish-shape" },
    ]);

    const more = run([{ type: "keep-drawing" }, tap(1, 5)], finished);

    expect(more.kind === "draw" && more.corners).toHaveLength(4);
    expect(more).toMatchObject({ finished: false });
  });

  it("when the tool is closed, then the drawing is dropped", () => {
    const drawn = run([{ type: "start", tool: "draw" }, tap(1, 1)]);
    expect(mapToolReducer(drawn, { type: "close" })).toEqual(idleTool);
  });
});

describe("picking points for the scale and for measuring", () => {
  it("when two points are tapped for the scale, then a third tap is ignored until Pick again", () => {
    const two = run([{ type: "start", tool: "scale" }, tap(100, 760), tap(300, 760)]);
    expect(two.kind === "scale" && two.points).toEqual([
      { x: 100, y: 760 },
      { x: 300, y: 760 },
    ]);

    expect(mapToolReducer(two, tap(500, 500))).toEqual(two);
    expect(run([{ type: "pick-again" }, tap(7, 7)], two)).toEqual({
      kind: "scale",
      points: [{ x: 7, y: 7 }],
    });
  });

  it("when a third point is tapped while measuring, then a new measurement starts from it", () => {
    const tool = run([{ type: "start", tool: "measure" }, tap(0, 0), tap(40, 0), tap(9, 9)]);
    expect(tool).toEqual({ kind: "measure", points: [{ x: 9, y: 9 }] });
  });

  it("when nothing is active, then a tap changes nothing", () => {
    expect(mapToolReducer(idleTool, tap(1, 1))).toBe(idleTool);
    expect(mapToolReducer({ kind: "place" }, tap(1, 1))).toEqual({ kind: "place" });
  });
});
