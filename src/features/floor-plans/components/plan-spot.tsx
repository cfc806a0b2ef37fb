import { lazy, Suspense } from "react";

import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import type { PlanSpotMapProps } from "./plan-spot-map";

// Leaflet is fetched only when a spot is on screen.
const PlanSpotMap = lazy(() =>
  import("./plan-spot-map").then((module) => ({ default: module.PlanSpotMap })),
);

export interface PlanSpotProps extends PlanSpotMapProps {
  className?: string;
}

/** Where something is on a floor, as a small map that only shows. */
export function PlanSpot({ className, ...props }: PlanSpotProps) {
  return (
    <div
      className={cn(
        "relative isolate h-64 w-full overflow-hidden rounded-card border border-surface-line bg-surface-sunken md:h-80",
        className,
      )}
    >
      <Suspense
        fallback={
          <div className="flex h-full items-center justify-center">
            <Spinner label="Loading the map…" />
          </div>
        }
      >
        <PlanSpotMap {...props} />
      </Suspense>
    </div>
  );
}
