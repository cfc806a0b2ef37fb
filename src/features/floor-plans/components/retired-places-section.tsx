import type { RetiredFloor, RetiredSpace, RetirementResult } from "@shared/schemas/retirement";
import { zoneTypeLabels } from "@shared/zones";
import { useId, useState } from "react";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/error-message";
import { formatDateTime } from "@/lib/format";

import { useRetiredPlaces } from "../api/get-retired-places";
import { useRestoreFloor } from "../api/restore-floor";
import { useRestoreSpace } from "../api/restore-space";

function retiredLine(place: { retiredAt: string; retiredByName: string | null }) {
  return `Retired ${formatDateTime(place.retiredAt)}${place.retiredByName ? ` by ${place.retiredByName}` : ""}`;
}

/** What a restore brought back, in words. */
export function restoredText(result: RetirementResult): string {
  const parts = [`${result.name} is back.`];
  if (result.kind === "floor" && result.spaces > 0)
    parts.push(`${result.spaces} ${result.spaces === 1 ? "space" : "spaces"} came back with it.`);
  if (result.actions > 0)
    parts.push(
      `${result.actions} corrective ${result.actions === 1 ? "action" : "actions"} made Done by the retirement ${result.actions === 1 ? "is" : "are"} back in the work list.`,
    );
  return parts.join(" ");
}

function FloorRow({
  floor,
  onRestored,
}: {
  floor: RetiredFloor;
  onRestored: (text: string) => void;
}) {
  const restore = useRestoreFloor();
  return (
    <li className="flex flex-col gap-2 py-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block font-semibold">
            {floor.building} · Level {floor.level} · {floor.name}
          </span>
          <span className="block text-sm text-ink-muted">{retiredLine(floor)}</span>
        </span>
        <Button
          variant="secondary"
          disabled={restore.isPending}
          onClick={() =>
            restore.mutate(
              { floorId: floor.id },
              { onSuccess: (result) => onRestored(restoredText(result)) },
            )
          }
        >
          Restore floor <span className="sr-only">{floor.name}</span>
        </Button>
      </div>
      {restore.isError ? (
        <Alert role="alert" tone="error">
          {errorMessage(restore.error)}
        </Alert>
      ) : null}
    </li>
  );
}

function SpaceRow({
  space,
  historyHref,
  onRestored,
}: {
  space: RetiredSpace;
  historyHref: (spaceId: string) => string;
  onRestored: (text: string) => void;
}) {
  const restore = useRestoreSpace();
  return (
    <li className="flex flex-col gap-2 py-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block font-semibold">{space.name}</span>
          <span className="block text-sm text-ink-muted">
            {zoneTypeLabels[space.zoneType]} · {space.floorName}
          </span>
          <span className="block text-sm text-ink-muted">{retiredLine(space)}</span>
        </span>
        <span className="flex flex-wrap items-center gap-2">
          <Link
            to={historyHref(space.id)}
            className="inline-flex min-h-tap items-center px-2 font-semibold text-brand-700 underline"
          >
            Audit history <span className="sr-only">of {space.name}</span>
          </Link>
          {space.floorRetired ? (
            <Badge tone="muted">Comes back with its floor</Badge>
          ) : (
            <Button
              variant="secondary"
              disabled={restore.isPending}
              onClick={() =>
                restore.mutate(
                  { spaceId: space.id },
                  { onSuccess: (result) => onRestored(restoredText(result)) },
                )
              }
            >
              Restore space <span className="sr-only">{space.name}</span>
            </Button>
          )}
        </span>
      </div>
      {restore.isError ? (
        <Alert role="alert" tone="error">
          {errorMessage(restore.error)}
        </Alert>
      ) : null}
    </li>
  );
}

export interface RetiredPlacesSectionProps {
  siteId: string;
  historyHref: (spaceId: string) => string;
}

/**
 * Floors and spaces retired at the site, for administrators: each can be restored exactly as it
 * was, and a retired space's audit history stays one tap away.
 */
export function RetiredPlacesSection({ siteId, historyHref }: RetiredPlacesSectionProps) {
  const retired = useRetiredPlaces(siteId);
  const headingId = useId();
  const [restored, setRestored] = useState<string | null>(null);

  let body;
  if (retired.isPending) body = <Spinner label="Loading retired floors and spaces…" />;
  else if (retired.isError)
    body = (
      <Alert role="alert" tone="error" title="We could not load the retired floors and spaces">
        <p>{retired.error.message}</p>
      </Alert>
    );
  else if (retired.data.floors.length === 0 && retired.data.spaces.length === 0)
    body = <p className="text-ink-muted">Nothing is retired at this site.</p>;
  else
    body = (
      <>
        {retired.data.floors.length > 0 ? (
          <>
            <h3 className="mt-2 font-semibold">Retired floors</h3>
            <ul className="divide-y divide-surface-line">
              {retired.data.floors.map((floor) => (
                <FloorRow key={floor.id} floor={floor} onRestored={setRestored} />
              ))}
            </ul>
          </>
        ) : null}
        {retired.data.spaces.length > 0 ? (
          <>
            <h3 className="mt-2 font-semibold">Retired spaces</h3>
            <ul className="divide-y divide-surface-line">
              {retired.data.spaces.map((space) => (
                <SpaceRow
                  key={space.id}
                  space={space}
                  historyHref={historyHref}
                  onRestored={setRestored}
                />
              ))}
            </ul>
          </>
        ) : null}
      </>
    );

  return (
    <Card>
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Retired floors and spaces
        </h2>
        <p className="mt-1 mb-3 text-ink-muted">
          Hidden from the plan, the due list and new audits; their history is kept. Restoring brings
          back what one retirement hid.
        </p>
        {restored ? (
          <Alert role="status" tone="success" className="mb-3">
            {restored}
          </Alert>
        ) : null}
        {body}
      </section>
    </Card>
  );
}
