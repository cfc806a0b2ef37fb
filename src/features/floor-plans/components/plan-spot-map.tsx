import "leaflet/dist/leaflet.css";
import "./floor-map.css";

import { CRS, latLngBounds } from "leaflet";
import { useEffect, useMemo } from "react";
import { ImageOverlay, MapContainer, Polygon, useMap } from "react-leaflet";

import { usePlanImageUrl } from "@/lib/use-plan-image";

import type { MapPin } from "../lib/map-pins";
import { planBounds, type PlanSize, polygonToLatLngs } from "../lib/plan-coordinates";
import { PinMarkers } from "./pin-markers";

export interface PlanSpotMapProps {
  plan: PlanSize & { imageId: string };
  polygon: readonly (readonly [number, number])[];
  pins: readonly MapPin[];
  label: string;
}

const outline = {
  color: "#a3212b",
  weight: 4,
  dashArray: "2 6",
  lineCap: "round" as const,
  fillColor: "#a3212b",
  fillOpacity: 0.18,
  interactive: false,
};

function Naming({ label }: { label: string }) {
  const map = useMap();
  useEffect(() => {
    const container = map.getContainer();
    container.setAttribute("role", "region");
    container.setAttribute("aria-label", label);
  }, [map, label]);
  return null;
}

/** A small read-only view of one spot on a plan: the space outlined and its pins. */
export function PlanSpotMap({ plan, polygon, pins, label }: PlanSpotMapProps) {
  const { width, height, imageId } = plan;
  const planUrl = usePlanImageUrl(imageId);
  const whole = useMemo(() => planBounds({ width, height }), [width, height]);
  const spot = useMemo(
    () =>
      polygon.length > 0 ? latLngBounds(polygonToLatLngs(polygon)).pad(1.5) : latLngBounds(whole),
    [polygon, whole],
  );
  return (
    <MapContainer
      crs={CRS.Simple}
      bounds={spot}
      minZoom={-8}
      maxZoom={3}
      zoomSnap={0.25}
      dragging={false}
      scrollWheelZoom={false}
      doubleClickZoom={false}
      keyboard={false}
      attributionControl={false}
      className="lintel-map h-full w-full"
    >
      {planUrl ? <ImageOverlay url={planUrl} bounds={whole} pane="tilePane" /> : null}
      {polygon.length > 0 ? (
        <Polygon positions={polygonToLatLngs(polygon)} pathOptions={outline} />
      ) : null}
      <PinMarkers pins={pins} />
      <Naming label={label} />
    </MapContainer>
  );
}
