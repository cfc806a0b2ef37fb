import { divIcon } from "leaflet";
import { useMemo } from "react";
import { Marker } from "react-leaflet";

import { type MapPin, pinMarkerSize, spreadPins } from "../lib/map-pins";
import { planToLatLng } from "../lib/plan-coordinates";

export interface PinMarkersProps {
  pins: readonly MapPin[];
  interactive?: boolean;
  /** Remounts the markers when Leaflet's interactivity must change. */
  layerKey?: string;
}

/** The page's own pins, each with its title and tap; stacked pins are fanned out. */
export function PinMarkers({ pins, interactive = true, layerKey = "" }: PinMarkersProps) {
  const placed = useMemo(
    () =>
      spreadPins(pins).map((pin) => {
        const half = pinMarkerSize / 2;
        const icon = divIcon({
          html: pin.html,
          className: "lintel-pin-icon",
          iconSize: [pinMarkerSize, pinMarkerSize],
          iconAnchor: [half - pin.offset[0], half - pin.offset[1]],
        });
        return { pin, icon };
      }),
    [pins],
  );
  return (
    <>
      {placed.map(({ pin, icon }) => {
        const selectable = interactive && pin.onSelect !== undefined;
        return (
          <Marker
            key={`${pin.id}:${layerKey}:${pin.title}:${selectable}`}
            position={planToLatLng(pin.position)}
            icon={icon}
            title={pin.title}
            alt={pin.title}
            interactive={selectable}
            keyboard={selectable}
            zIndexOffset={1000}
            eventHandlers={selectable ? { click: () => pin.onSelect?.() } : undefined}
          />
        );
      })}
    </>
  );
}
