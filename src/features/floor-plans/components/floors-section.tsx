import type { Floor } from "@shared/schemas/floors";
import { useId } from "react";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";

import { useFloors } from "../api/get-floors";
import { AddFloorForm } from "./add-floor-form";

export function floorLine(floor: Pick<Floor, "building" | "level" | "name">): string {
  return `${floor.building} · Level ${floor.level} · ${floor.name}`;
}

export interface FloorsSectionProps {
  siteId: string;
  canEdit: boolean;
  floorHref: (floorId: string) => string;
}

/** The site's floors, each leading to its plan; editors add floors here. */
export function FloorsSection({ siteId, canEdit, floorHref }: FloorsSectionProps) {
  const floors = useFloors(siteId);
  const headingId = useId();
  const addHeadingId = useId();

  let body;
  if (floors.isPending) body = <Spinner label="Loading floors…" className="py-2" />;
  else if (floors.isError) {
    body = (
      <Alert role="alert" tone="error" title="We could not load the floors">
        <p>{floors.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void floors.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  } else if (floors.data.length === 0) {
    body = (
      <p className="text-ink-muted">
        {canEdit
          ? "No floors yet. Add the first floor below, then upload its plan."
          : "No floors have been set up at this site yet."}
      </p>
    );
  } else {
    body = (
      <ul className="divide-y divide-surface-line">
        {floors.data.map((floor) => (
          <li key={floor.id}>
            <Link
              to={floorHref(floor.id)}
              className="flex min-h-tap flex-wrap items-center justify-between gap-x-4 gap-y-1 py-3 font-semibold text-brand-800 hover:underline"
            >
              <span>{floorLine(floor)}</span>
              {floor.plan ? null : <Badge tone="muted">No plan yet</Badge>}
            </Link>
          </li>
        ))}
      </ul>
    );
  }

  return (
    <Card>
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Floors
        </h2>
        <p className="mt-1 mb-3 text-ink-muted">
          Each floor&apos;s plan with its isolation rooms, anterooms, donning zones and doffing
          areas, and the fixtures an audit looks for pinned where they stand.
        </p>
        {body}
      </section>
      {canEdit ? (
        <section aria-labelledby={addHeadingId} className="mt-6 border-t border-surface-line pt-5">
          <h3 id={addHeadingId} className="mb-3 font-semibold">
            Add a floor
          </h3>
          <AddFloorForm siteId={siteId} />
        </section>
      ) : null}
    </Card>
  );
}
