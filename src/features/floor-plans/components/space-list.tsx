import type { Fixture, Space, Suite } from "@shared/schemas/floors";
import { minimumAirChangesLabel, noConstructionClassNotice } from "@shared/calc/ventilation";
import { fixtureKindLabels, zoneTypeLabels } from "@shared/zones";
import { type ReactNode, useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { errorMessage } from "@/lib/error-message";
import { cn } from "@/lib/cn";

import { useDeleteFixture } from "../api/delete-fixture";
import { useDeleteSpace } from "../api/delete-space";
import { useRetireSpace } from "../api/retire-space";
import { formatArea, planAreaSquareMetres } from "../lib/measurements";
import { groupSpacesBySuite, spaceTitle } from "../lib/space-groups";
import { DeleteRefusal } from "./delete-refusal";
import { FixtureSymbol, ZoneSwatch } from "./symbols";

export function spaceAreaText(space: Space, metresPerUnit: number | null): string | null {
  if (space.floorAreaM2 !== null) return `Floor area ${formatArea(space.floorAreaM2)}`;
  const fromPlan = planAreaSquareMetres(space.polygon, metresPerUnit);
  return fromPlan === null ? null : `About ${formatArea(fromPlan)} on the plan`;
}

interface FixtureRowProps {
  fixture: Fixture;
  floorId: string;
  flagged: boolean;
  canEdit: boolean;
}

function FixtureRow({ fixture, floorId, flagged, canEdit }: FixtureRowProps) {
  const remove = useDeleteFixture(floorId);
  const [confirming, setConfirming] = useState(false);
  const trigger = useRef<HTMLButtonElement>(null);
  const name = fixtureKindLabels[fixture.kind];

  return (
    <li className="flex flex-col gap-2 py-1.5">
      <div className="flex items-center gap-2">
        <FixtureSymbol kind={fixture.kind} className={cn(flagged && "border-verdict-not-ready")} />
        <span className="min-w-0 flex-1 text-sm">
          {name}
          {fixture.label ? <span className="text-ink-muted"> — {fixture.label}</span> : null}
        </span>
        {flagged ? <Badge tone="pending">Too close</Badge> : null}
        {canEdit && !confirming ? (
          <Button
            ref={trigger}
            variant="quiet"
            className="px-3"
            onClick={() => {
              remove.reset();
              setConfirming(true);
            }}
          >
            Delete <span className="sr-only">{name.toLowerCase()}</span>
          </Button>
        ) : null}
      </div>
      {confirming ? (
        <ConfirmStep
          title={`Delete this ${name.toLowerCase()}?`}
          confirmLabel="Delete fixture"
          pending={remove.isPending}
          returnFocusRef={trigger}
          onCancel={() => setConfirming(false)}
          onConfirm={() => remove.mutate(fixture.id, { onSuccess: () => setConfirming(false) })}
        >
          {remove.isError ? (
            <Alert role="alert" tone="error">
              {errorMessage(remove.error)}
            </Alert>
          ) : null}
        </ConfirmStep>
      ) : null}
    </li>
  );
}

interface SpaceItemProps {
  space: Space;
  fixtures: readonly Fixture[];
  floorId: string;
  metresPerUnit: number | null;
  selected: boolean;
  flaggedFixtureIds: ReadonlySet<string>;
  canEdit: boolean;
  onShow: (spaceId: string) => void;
  actions?: ReactNode;
}

function SpaceItem({
  space,
  fixtures,
  floorId,
  metresPerUnit,
  selected,
  flaggedFixtureIds,
  canEdit,
  onShow,
  actions,
}: SpaceItemProps) {
  const remove = useDeleteSpace(floorId);
  const retire = useRetireSpace();
  const [confirming, setConfirming] = useState<"delete" | "retire" | null>(null);
  const deleteTrigger = useRef<HTMLButtonElement>(null);
  const retireTrigger = useRef<HTMLButtonElement>(null);
  const title = spaceTitle(space);
  const area = spaceAreaText(space, metresPerUnit);

  return (
    <li
      className={cn(
        "rounded-lg border bg-surface p-3",
        selected ? "border-brand-600 ring-2 ring-brand-300" : "border-surface-line",
      )}
    >
      <button
        type="button"
        aria-pressed={selected}
        onClick={() => onShow(space.id)}
        className="flex min-h-tap w-full items-start gap-3 rounded-md text-left hover:bg-brand-50"
      >
        <ZoneSwatch zoneType={space.zoneType} className="mt-0.5" />
        <span className="min-w-0">
          <span className="block font-semibold text-brand-800">{title}</span>{" "}
          <span className="block text-sm text-ink-muted">
            {zoneTypeLabels[space.zoneType]}
            {area ? ` · ${area}` : ""}
          </span>
          {space.zoneType === "isolation_room" ? (
            <span className="block text-sm text-ink-muted">
              {space.constructionClass
                ? `Air changes: ${minimumAirChangesLabel(space.constructionClass)}`
                : noConstructionClassNotice}
            </span>
          ) : null}
        </span>
      </button>
      {actions ? <div className="mt-2 flex flex-wrap items-center gap-2">{actions}</div> : null}
      {fixtures.length > 0 ? (
        <ul aria-label={`Fixtures in ${title}`} className="mt-2 divide-y divide-surface-line">
          {fixtures.map((fixture) => (
            <FixtureRow
              key={fixture.id}
              fixture={fixture}
              floorId={floorId}
              flagged={flaggedFixtureIds.has(fixture.id)}
              canEdit={canEdit}
            />
          ))}
        </ul>
      ) : (
        <p className="mt-1 text-sm text-ink-muted">No fixtures placed yet.</p>
      )}
      {canEdit && !confirming ? (
        <div className="mt-1 -ml-2 flex flex-wrap gap-1">
          <Button
            ref={retireTrigger}
            variant="quiet"
            className="px-3"
            onClick={() => {
              retire.reset();
              setConfirming("retire");
            }}
          >
            Retire space <span className="sr-only">{title}</span>
          </Button>
          <Button
            ref={deleteTrigger}
            variant="quiet"
            className="px-3"
            onClick={() => {
              remove.reset();
              setConfirming("delete");
            }}
          >
            Delete space <span className="sr-only">{title}</span>
          </Button>
        </div>
      ) : null}
      {confirming === "retire" ? (
        <ConfirmStep
          className="mt-2"
          title={`Retire ${title}?`}
          confirmLabel="Retire space"
          pending={retire.isPending}
          returnFocusRef={retireTrigger}
          onCancel={() => setConfirming(null)}
          onConfirm={() => retire.mutate({ spaceId: space.id })}
        >
          <p className="text-sm">
            It leaves the plan, the due list, QR sheets and new audits. Its audits, findings and
            corrective actions are kept in its history, in exports and in the committee&apos;s
            figures.
          </p>
          <p className="text-sm">
            Corrective actions not done yet here become Done with the reason &ldquo;space
            retired&rdquo;; they do not count as fixed.
          </p>
          <p className="text-sm">
            An administrator can restore it from &ldquo;Retired floors and spaces&rdquo; on the site
            page.
          </p>
          {retire.isError ? (
            <Alert role="alert" tone="error">
              {errorMessage(retire.error)}
            </Alert>
          ) : null}
        </ConfirmStep>
      ) : null}
      {confirming === "delete" ? (
        <ConfirmStep
          className="mt-2"
          title={`Delete ${title}?`}
          confirmLabel="Delete space"
          pending={remove.isPending}
          returnFocusRef={deleteTrigger}
          onCancel={() => setConfirming(null)}
          onConfirm={() => remove.mutate(space.id)}
        >
          <p className="text-sm">
            {fixtures.length === 0
              ? "Its outline is removed from the plan for good."
              : `Its outline and its ${fixtures.length === 1 ? "fixture are" : `${fixtures.length} fixtures are`} removed from the plan for good.`}{" "}
            Only a space that was never audited and has no corrective actions can be deleted;
            otherwise retire it.
          </p>
          {remove.isError ? (
            <DeleteRefusal
              error={remove.error}
              onRetireInstead={() => {
                retire.reset();
                setConfirming("retire");
              }}
            />
          ) : null}
        </ConfirmStep>
      ) : null}
    </li>
  );
}

export interface SpaceListProps {
  floorId: string;
  suites: readonly Suite[];
  spaces: readonly Space[];
  fixtures: readonly Fixture[];
  hiddenCount: number;
  metresPerUnit: number | null;
  selectedSpaceId: string | null;
  flaggedFixtureIds: ReadonlySet<string>;
  canEdit: boolean;
  onShowSpace: (spaceId: string) => void;
  /** Links or buttons the page adds to each space (such as starting an audit). */
  spaceActions?: (space: Space) => ReactNode;
}

/** Every space on the floor as text, grouped by suite: the way through without the map. */
export function SpaceList({
  floorId,
  suites,
  spaces,
  fixtures,
  hiddenCount,
  metresPerUnit,
  selectedSpaceId,
  flaggedFixtureIds,
  canEdit,
  onShowSpace,
  spaceActions,
}: SpaceListProps) {
  const headingId = useId();
  const groups = groupSpacesBySuite(spaces, suites);

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h2 id={headingId} className="text-lg font-semibold">
        Spaces
      </h2>
      {hiddenCount > 0 ? (
        <p className="text-sm text-ink-muted">
          {hiddenCount === 1
            ? "1 space is hidden by the zone type filters."
            : `${hiddenCount} spaces are hidden by the zone type filters.`}
        </p>
      ) : null}
      {spaces.length === 0 && hiddenCount === 0 ? (
        <p className="text-ink-muted">
          {canEdit
            ? "No spaces are drawn yet. Use Draw a space to outline the first one on the plan."
            : "No spaces are drawn on this plan yet."}
        </p>
      ) : null}
      {groups.map((group) => (
        <div key={group.suite?.id ?? "no-suite"}>
          <h3 className="mb-2 text-sm font-semibold tracking-wide text-ink-muted uppercase">
            {group.suite ? group.suite.name : "Not in a suite"}
          </h3>
          <ul className="flex flex-col gap-2">
            {group.spaces.map((space) => (
              <SpaceItem
                key={space.id}
                space={space}
                fixtures={fixtures.filter((fixture) => fixture.spaceId === space.id)}
                floorId={floorId}
                metresPerUnit={metresPerUnit}
                selected={space.id === selectedSpaceId}
                flaggedFixtureIds={flaggedFixtureIds}
                canEdit={canEdit}
                onShow={onShowSpace}
                actions={spaceActions?.(space)}
              />
            ))}
          </ul>
        </div>
      ))}
    </section>
  );
}
