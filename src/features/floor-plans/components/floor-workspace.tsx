import type { PlanPoint } from "@shared/calc/plan-geometry";
import { isUsableScale } from "@shared/calc/hand-rub-spacing";
import type { FloorDetail, Space } from "@shared/schemas/floors";
import { fixtureKindLabels, fixtureKinds, type FixtureKind, type ZoneType } from "@shared/zones";
import type { Map as LeafletMap } from "leaflet";
import {
  lazy,
  type ReactNode,
  Suspense,
  useCallback,
  useMemo,
  useReducer,
  useRef,
  useState,
} from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { isApiError } from "@/lib/api-client";

import { useCreateFixture } from "../api/create-fixture";
import type { MapPin } from "../lib/map-pins";
import { idleTool, type MapToolKind, mapToolReducer } from "../lib/map-tool";
import { formatScale } from "../lib/measurements";
import { formatPlanPoint, latLngToPlan, tidyPlanPoint } from "../lib/plan-coordinates";
import { spaceTitle } from "../lib/space-groups";
import { checkHandRubSpacing, flaggedStationIds } from "../lib/spacing-check";
import { applyZoneFilter, setZoneVisible, showAllZones, type ZoneFilter } from "../lib/zone-filter";
import { DrawPanel } from "./draw-panel";
import type { FloorMapFocus } from "./floor-map";
import { MapKey } from "./map-key";
import { MapToolbar } from "./map-toolbar";
import { MeasurePanel } from "./measure-panel";
import { PlaceFixturePanel, type PlacementDraft } from "./place-fixture-panel";
import { ScalePanel } from "./scale-panel";
import { SpaceList, spaceAreaText } from "./space-list";
import { SpacingCheckPanel } from "./spacing-check-panel";

// Leaflet and the map are fetched only when a plan is on screen.
const FloorMap = lazy(() => import("./floor-map").then((module) => ({ default: module.FloorMap })));

function isFixtureKind(value: string): value is FixtureKind {
  return (fixtureKinds as readonly string[]).includes(value);
}

function placementError(error: unknown): string {
  if (!isApiError(error)) return "The fixture could not be placed. Please try again.";
  return error.fieldError("x") ?? error.fieldError("y") ?? error.message;
}

export interface FloorWorkspaceProps {
  detail: FloorDetail;
  plan: { imageId: string; width: number; height: number };
  canEdit: boolean;
  /** Links or buttons the page adds to each space in the list (such as starting an audit). */
  spaceActions?: (space: Space) => ReactNode;
  /** Markers the page adds to the plan; the floor plan knows only where they go. */
  pins?: readonly MapPin[];
  /** More of the key, for what the page pins (with its own filters). */
  pinKey?: ReactNode;
}

/** The plan, its tools, the spacing check, the key and the list of spaces for one floor. */
export function FloorWorkspace({
  detail,
  plan,
  canEdit,
  spaceActions,
  pins,
  pinKey,
}: FloorWorkspaceProps) {
  const { floor, suites, spaces, fixtures } = detail;
  // A scale that measures nothing (zero, negative, not finite) counts as no scale at all.
  const metresPerUnit = isUsableScale(floor.metresPerUnit) ? floor.metresPerUnit : null;

  const [tool, dispatch] = useReducer(mapToolReducer, idleTool);
  const [selectedSpaceId, setSelectedSpaceId] = useState<string | null>(null);
  const [zoneFilter, setZoneFilter] = useState<ZoneFilter>(showAllZones);
  const [lastPoint, setLastPoint] = useState<PlanPoint | null>(null);
  const [map, setMap] = useState<LeafletMap | null>(null);
  const [focus, setFocus] = useState<FloorMapFocus | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [placement, setPlacement] = useState<PlacementDraft>({ kind: "", label: "" });
  const [placementNotice, setPlacementNotice] = useState<string | null>(null);
  const [placementProblem, setPlacementProblem] = useState<string | null>(null);
  const mapArea = useRef<HTMLDivElement>(null);
  const createFixture = useCreateFixture(floor.id);

  const selectedSpace = spaces.find((space) => space.id === selectedSpaceId) ?? null;
  const visible = useMemo(
    () => applyZoneFilter({ spaces, fixtures }, zoneFilter),
    [spaces, fixtures, zoneFilter],
  );
  const spacing = useMemo(
    () => checkHandRubSpacing(fixtures, metresPerUnit),
    [fixtures, metresPerUnit],
  );
  const flagged = useMemo(() => flaggedStationIds(spacing), [spacing]);
  const spaceNames = useMemo(
    () => new Map(spaces.map((space) => [space.id, spaceTitle(space)])),
    [spaces],
  );
  const spacingLines = useMemo(() => {
    if (spacing.kind !== "checked") return [];
    const shown = new Set(visible.fixtures.map((fixture) => fixture.id));
    return spacing.pairs
      .filter((pair) => shown.has(pair.a.id) && shown.has(pair.b.id))
      .map((pair) => [pair.a, pair.b] as const);
  }, [spacing, visible.fixtures]);

  const placeAt = (point: PlanPoint) => {
    if (!selectedSpace) return;
    if (!isFixtureKind(placement.kind)) {
      setPlacementProblem("Choose a fixture type first, then tap its spot on the plan.");
      return;
    }
    const kind = placement.kind;
    const where = spaceTitle(selectedSpace);
    setPlacementProblem(null);
    setPlacementNotice(null);
    createFixture.mutate(
      {
        spaceId: selectedSpace.id,
        body: { kind, x: point.x, y: point.y, label: placement.label.trim() || null },
      },
      {
        onSuccess: () =>
          setPlacementNotice(
            `${fixtureKindLabels[kind]} placed in ${where}. Tap again to place another, or choose Done.`,
          ),
        onError: (error) => setPlacementProblem(placementError(error)),
      },
    );
  };

  const handleTap = (raw: PlanPoint) => {
    const point = tidyPlanPoint(raw);
    setLastPoint(point);
    if (tool.kind === "place") placeAt(point);
    else if (tool.kind !== "idle") dispatch({ type: "tap", point });
  };

  const tapAtCentre = map ? () => handleTap(latLngToPlan(map.getCenter())) : undefined;

  const startTool = (kind: MapToolKind) => {
    setNotice(null);
    setPlacementNotice(null);
    setPlacementProblem(null);
    dispatch({ type: "start", tool: kind });
  };
  const closeTool = () => dispatch({ type: "close" });

  const showSpace = (spaceId: string) => {
    setSelectedSpaceId(spaceId);
    const space = spaces.find((item) => item.id === spaceId);
    if (space)
      setFocus((previous) => ({ polygon: space.polygon, request: (previous?.request ?? 0) + 1 }));
    const reduceMotion = window.matchMedia?.("(prefers-reduced-motion: reduce)").matches ?? true;
    mapArea.current?.scrollIntoView?.({
      block: "nearest",
      behavior: reduceMotion ? "auto" : "smooth",
    });
  };

  const changeZoneVisible = (zoneType: ZoneType, shown: boolean) => {
    setZoneFilter((current) => setZoneVisible(current, zoneType, shown));
    if (!shown && selectedSpace?.zoneType === zoneType) setSelectedSpaceId(null);
  };

  const selectFromMap = useCallback((spaceId: string) => setSelectedSpaceId(spaceId), []);

  const spaceSaved = (space: Space) => {
    closeTool();
    setSelectedSpaceId(space.id);
    setNotice(`${spaceTitle(space)} is saved and selected.`);
  };

  let panel = null;
  if (tool.kind === "scale") {
    panel = (
      <ScalePanel
        floorId={floor.id}
        points={tool.points}
        onPickAgain={() => dispatch({ type: "pick-again" })}
        onCancel={closeTool}
        onSaved={() => {
          closeTool();
          setNotice("The scale is saved.");
        }}
        onUseCentre={tapAtCentre}
      />
    );
  } else if (tool.kind === "measure" && metresPerUnit !== null) {
    panel = (
      <MeasurePanel
        points={tool.points}
        metresPerUnit={metresPerUnit}
        onDone={closeTool}
        onUseCentre={tapAtCentre}
      />
    );
  } else if (tool.kind === "draw") {
    panel = (
      <DrawPanel
        floorId={floor.id}
        suites={suites}
        corners={tool.corners}
        finished={tool.finished}
        metresPerUnit={metresPerUnit}
        onUndoCorner={() => dispatch({ type: "undo-corner" })}
        onFinishShape={() => dispatch({ type: "finish-shape" })}
        onKeepDrawing={() => dispatch({ type: "keep-drawing" })}
        onCancel={closeTool}
        onSaved={spaceSaved}
        onUseCentre={tapAtCentre}
      />
    );
  } else if (tool.kind === "place") {
    panel = (
      <PlaceFixturePanel
        spaceTitle={selectedSpace ? spaceTitle(selectedSpace) : null}
        draft={placement}
        onDraftChange={(draft) => {
          setPlacement(draft);
          setPlacementProblem(null);
        }}
        pending={createFixture.isPending}
        error={placementProblem}
        notice={placementNotice}
        onDone={closeTool}
        onUseCentre={tapAtCentre}
      />
    );
  }

  const selectedArea = selectedSpace ? spaceAreaText(selectedSpace, metresPerUnit) : null;

  return (
    <div className="flex flex-col gap-4">
      <MapToolbar
        tool={tool}
        canEdit={canEdit}
        hasScale={metresPerUnit !== null}
        hasSelectedSpace={selectedSpace !== null}
        onStart={startTool}
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_19rem]">
        <div className="flex min-w-0 flex-col gap-4">
          <div
            ref={mapArea}
            className="relative isolate h-[65vh] min-h-80 w-full overflow-hidden rounded-card border border-surface-line bg-surface-sunken md:h-[70vh]"
          >
            <Suspense
              fallback={
                <div className="flex h-full items-center justify-center">
                  <Spinner label="Loading the map…" />
                </div>
              }
            >
              <FloorMap
                plan={plan}
                spaces={visible.spaces}
                fixtures={visible.fixtures}
                spaceNames={spaceNames}
                selectedSpaceId={selectedSpace?.id ?? null}
                flaggedFixtureIds={flagged}
                spacingLines={spacingLines}
                tool={tool}
                focus={focus}
                onTap={handleTap}
                onSelectSpace={selectFromMap}
                onMapReady={setMap}
                pins={pins}
              />
            </Suspense>
            {tool.kind !== "idle" ? (
              <svg
                aria-hidden="true"
                viewBox="0 0 32 32"
                className="pointer-events-none absolute top-1/2 left-1/2 z-[500] size-8 -translate-x-1/2 -translate-y-1/2 text-brand-900 opacity-70"
              >
                <path
                  d="M16 2v10M16 20v10M2 16h10M20 16h10"
                  stroke="currentColor"
                  strokeWidth="2"
                />
                <circle cx="16" cy="16" r="2" fill="currentColor" />
              </svg>
            ) : null}
          </div>

          <div className="flex flex-col gap-1 text-sm">
            <p data-testid="plan-point-readout" className="text-ink-muted">
              Last point: {lastPoint ? formatPlanPoint(lastPoint) : "none yet"}
            </p>
            <p>
              {metresPerUnit !== null
                ? `Scale set: ${formatScale(metresPerUnit)}`
                : canEdit
                  ? "No scale yet. Use Set scale with two points a known distance apart."
                  : "No scale is set for this plan yet, so areas and distances cannot be measured."}
            </p>
            {selectedSpace ? (
              <div className="flex flex-wrap items-center gap-x-3">
                <p>
                  Selected: <span className="font-semibold">{spaceTitle(selectedSpace)}</span>
                  {selectedArea ? ` · ${selectedArea}` : ""}
                </p>
                <Button
                  variant="quiet"
                  className="-ml-2 px-2"
                  onClick={() => setSelectedSpaceId(null)}
                >
                  Clear selection
                </Button>
              </div>
            ) : tool.kind === "idle" ? (
              <p className="text-ink-muted">Tap a space on the plan, or choose one in the list.</p>
            ) : null}
          </div>

          {notice && tool.kind === "idle" ? (
            <Alert role="status" tone="success">
              {notice}
            </Alert>
          ) : null}
          {panel}
          <SpacingCheckPanel check={spacing} spaceNames={spaceNames} />
        </div>

        <div className="flex min-w-0 flex-col gap-6">
          {pinKey}
          <MapKey filter={zoneFilter} onZoneVisibleChange={changeZoneVisible} />
          <SpaceList
            floorId={floor.id}
            suites={suites}
            spaces={visible.spaces}
            fixtures={visible.fixtures}
            hiddenCount={spaces.length - visible.spaces.length}
            metresPerUnit={metresPerUnit}
            selectedSpaceId={selectedSpace?.id ?? null}
            flaggedFixtureIds={flagged}
            canEdit={canEdit}
            onShowSpace={showSpace}
            spaceActions={spaceActions}
          />
        </div>
      </div>
    </div>
  );
}
