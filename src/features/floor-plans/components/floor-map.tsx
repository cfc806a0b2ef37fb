import "leaflet/dist/leaflet.css";
import "./floor-map.css";

import type { PlanPoint } from "@shared/calc/plan-geometry";
import type { Fixture, Space } from "@shared/schemas/floors";
import { fixtureKindLabels, type FixtureKind } from "@shared/zones";
import {
  CRS,
  type DivIcon,
  divIcon,
  type LatLngBoundsExpression,
  latLngBounds,
  type Map as LeafletMap,
  type PathOptions,
} from "leaflet";
import { useEffect, useMemo, useRef } from "react";
import {
  CircleMarker,
  ImageOverlay,
  MapContainer,
  Marker,
  Polygon,
  Polyline,
  useMap,
  useMapEvents,
} from "react-leaflet";

import { cn } from "@/lib/cn";
import { usePlanImageUrl } from "@/lib/use-plan-image";

import { fixtureMarkerHtml } from "../lib/fixture-symbols";
import type { MapPin } from "../lib/map-pins";
import type { MapTool } from "../lib/map-tool";
import { PinMarkers } from "./pin-markers";
import {
  latLngToPlan,
  planBounds,
  type PlanSize,
  planToLatLng,
  polygonToLatLngs,
} from "../lib/plan-coordinates";
import { spacingWarningColour, zoneStyles } from "../lib/zone-styles";

export const floorMapLabel = "Floor plan map";

const toolColour = "#102b2d";
const noPins: readonly MapPin[] = [];
const iconCache = new Map<string, DivIcon>();

function fixtureIcon(kind: FixtureKind, flagged: boolean, selected: boolean): DivIcon {
  const key = `${kind}|${flagged}|${selected}`;
  let icon = iconCache.get(key);
  if (!icon) {
    icon = divIcon({
      html: fixtureMarkerHtml(kind, { flagged, selected }),
      className: "lintel-fixture-icon",
      iconSize: [36, 36],
      iconAnchor: [18, 18],
    });
    iconCache.set(key, icon);
  }
  return icon;
}

function spaceLook(space: Space, selected: boolean): PathOptions {
  const style = zoneStyles[space.zoneType];
  return {
    color: style.colour,
    dashArray: style.dashArray,
    weight: selected ? 5 : 3,
    lineCap: "round",
    fillColor: style.colour,
    fillOpacity: selected ? 0.35 : 0.16,
  };
}

export interface FloorMapFocus {
  polygon: readonly (readonly [number, number])[];
  /** Changes on every request, so asking twice for the same space still moves the map. */
  request: number;
}

export interface FloorMapProps {
  plan: PlanSize & { imageId: string };
  spaces: readonly Space[];
  fixtures: readonly Fixture[];
  spaceNames: ReadonlyMap<string, string>;
  selectedSpaceId: string | null;
  flaggedFixtureIds: ReadonlySet<string>;
  spacingLines: readonly (readonly [PlanPoint, PlanPoint])[];
  tool: MapTool;
  focus: FloorMapFocus | null;
  onTap: (point: PlanPoint) => void;
  onSelectSpace: (spaceId: string) => void;
  onMapReady: (map: LeafletMap | null) => void;
  /** Markers a page adds (such as open corrective actions), drawn above the fixtures. */
  pins?: readonly MapPin[];
}

interface MapBehaviourProps {
  bounds: LatLngBoundsExpression;
  picking: boolean;
  focus: FloorMapFocus | null;
  onTap: (point: PlanPoint) => void;
  onMapReady: (map: LeafletMap | null) => void;
}

/** Wiring that needs the Leaflet map itself: taps, naming, zoom limits and moving to a space. */
function MapBehaviour({ bounds, picking, focus, onTap, onMapReady }: MapBehaviourProps) {
  const tap = useRef(onTap);
  useEffect(() => {
    tap.current = onTap;
  }, [onTap]);

  const map = useMapEvents({
    click: (event) => tap.current(latLngToPlan(event.latlng)),
  });

  useEffect(() => {
    const container = map.getContainer();
    container.setAttribute("role", "region");
    container.setAttribute("aria-label", floorMapLabel);
  }, [map]);

  useEffect(() => {
    // Let people zoom out a little past the whole plan, never to a speck.
    map.setMinZoom(Math.min(0, map.getBoundsZoom(bounds) - 1));
    map.setMaxBounds(latLngBounds(bounds as [number, number][]).pad(0.5));
  }, [map, bounds]);

  useEffect(() => {
    // Quick taps while drawing must add corners, not zoom in under the finger.
    if (picking) map.doubleClickZoom.disable();
    else map.doubleClickZoom.enable();
  }, [map, picking]);

  useEffect(() => {
    onMapReady(map);
    return () => onMapReady(null);
  }, [map, onMapReady]);

  const request = focus?.request;
  useEffect(() => {
    if (!focus || focus.polygon.length === 0) return;
    map.fitBounds(latLngBounds(polygonToLatLngs(focus.polygon)), {
      padding: [40, 40],
      maxZoom: Math.max(map.getZoom(), 1),
    });
    // Only a new request moves the map; a refetched polygon does not.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [map, request]);

  return null;
}

function ToolOverlay({ tool }: { tool: MapTool }) {
  const points =
    tool.kind === "draw"
      ? tool.corners
      : tool.kind === "scale" || tool.kind === "measure"
        ? tool.points
        : [];
  if (points.length === 0) return null;
  const positions = points.map(planToLatLng);
  const line: PathOptions = { color: toolColour, weight: 3, dashArray: "6 6", interactive: false };
  return (
    <>
      {tool.kind === "draw" && tool.finished ? (
        <Polygon
          positions={positions}
          pathOptions={{ ...line, fillColor: toolColour, fillOpacity: 0.15 }}
        />
      ) : positions.length > 1 ? (
        <Polyline positions={positions} pathOptions={line} />
      ) : null}
      {positions.map((position, index) => (
        <CircleMarker
          key={index}
          center={position}
          radius={index === 0 ? 7 : 5}
          pathOptions={{
            color: "#ffffff",
            weight: 2,
            fillColor: toolColour,
            fillOpacity: 1,
            interactive: false,
          }}
        />
      ))}
    </>
  );
}

function fixtureTitle(fixture: Fixture, spaceName: string | undefined, flagged: boolean): string {
  const what = fixture.label
    ? `${fixtureKindLabels[fixture.kind]}: ${fixture.label}`
    : fixtureKindLabels[fixture.kind];
  const where = spaceName ? ` in ${spaceName}` : "";
  return `${what}${where}${flagged ? " (too close to another hand-rub station)" : ""}`;
}

/** Ask Leaflet to re-measure once the container has its final size (after layout settles). */
function SizeWatcher() {
  const map = useMap();
  useEffect(() => {
    if (typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver(() => map.invalidateSize());
    observer.observe(map.getContainer());
    return () => observer.disconnect();
  }, [map]);
  return null;
}

/**
 * The plan with its spaces and fixtures on a flat Leaflet map. Kept in its own module so the
 * Leaflet code downloads only when a plan is shown.
 */
export function FloorMap({
  plan,
  spaces,
  fixtures,
  spaceNames,
  selectedSpaceId,
  flaggedFixtureIds,
  spacingLines,
  tool,
  focus,
  onTap,
  onSelectSpace,
  onMapReady,
  pins = noPins,
}: FloorMapProps) {
  const { width, height, imageId } = plan;
  const planUrl = usePlanImageUrl(imageId);
  const bounds = useMemo(() => planBounds({ width, height }), [width, height]);
  const picking = tool.kind !== "idle";
  // Layers keep Leaflet's "interactive" from creation: remount them when it changes, so taps
  // during a tool pass through spaces and markers to the map.
  const layerKey = picking ? "picking" : "browsing";

  return (
    <MapContainer
      crs={CRS.Simple}
      bounds={bounds}
      boundsOptions={{ padding: [12, 12] }}
      minZoom={-8}
      maxZoom={4}
      zoomSnap={0.25}
      zoomDelta={0.5}
      wheelPxPerZoomLevel={120}
      maxBoundsViscosity={0.8}
      attributionControl={false}
      className={cn("lintel-map h-full w-full", picking && "is-picking")}
    >
      {planUrl ? <ImageOverlay url={planUrl} bounds={bounds} pane="tilePane" /> : null}
      {spaces.map((space) => (
        <Polygon
          key={`${space.id}:${layerKey}`}
          positions={polygonToLatLngs(space.polygon)}
          pathOptions={spaceLook(space, space.id === selectedSpaceId)}
          interactive={!picking}
          eventHandlers={{ click: () => onSelectSpace(space.id) }}
        />
      ))}
      {spacingLines.map(([a, b]) => (
        <Polyline
          key={`${a.x},${a.y}-${b.x},${b.y}`}
          positions={[planToLatLng(a), planToLatLng(b)]}
          pathOptions={{
            color: spacingWarningColour,
            weight: 3,
            dashArray: "8 6",
            interactive: false,
          }}
        />
      ))}
      <ToolOverlay tool={tool} />
      {fixtures.map((fixture) => {
        const flagged = flaggedFixtureIds.has(fixture.id);
        const title = fixtureTitle(fixture, spaceNames.get(fixture.spaceId), flagged);
        return (
          <Marker
            key={`${fixture.id}:${layerKey}:${title}`}
            position={planToLatLng(fixture)}
            icon={fixtureIcon(fixture.kind, flagged, fixture.spaceId === selectedSpaceId)}
            title={title}
            interactive={!picking}
            keyboard={!picking}
            eventHandlers={{ click: () => onSelectSpace(fixture.spaceId) }}
          />
        );
      })}
      <PinMarkers pins={pins} interactive={!picking} layerKey={layerKey} />
      <MapBehaviour
        bounds={bounds}
        picking={picking}
        focus={focus}
        onTap={onTap}
        onMapReady={onMapReady}
      />
      <SizeWatcher />
    </MapContainer>
  );
}
