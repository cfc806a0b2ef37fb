import { floorParamsSchema } from "@shared/schemas/floors";
import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import { Link, type LoaderFunctionArgs, useNavigate, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button, buttonStyles } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { siteActionsQueryOptions, useSiteActions } from "@/features/actions/api/get-site-actions";
import { FloorActionsKey } from "@/features/actions/components/floor-actions-key";
import { applyPinFilter, type PinFilter, showAllPins } from "@/features/actions/lib/action-filters";
import { actionPinHtml, actionPinTitle } from "@/features/actions/lib/action-pins";
import { floorQueryOptions, useFloor } from "@/features/floor-plans/api/get-floor";
import { FloorPlanView } from "@/features/floor-plans/components/floor-plan-view";
import { FloorRetirement } from "@/features/floor-plans/components/floor-retirement";
import type { MapPin } from "@/features/floor-plans/lib/map-pins";
import { usePressureNow } from "@/features/pressure-now/api/get-pressure-now";
import { FloorPressureList } from "@/features/pressure-now/components/floor-pressure-list";
import { pressurePins } from "@/features/pressure-now/lib/pressure-pins";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";
import { isObservedZone } from "@/features/walkthroughs/lib/observation-flow";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { isSignedIn } from "../session";

const floorPageParamsSchema = siteParamsSchema.extend(floorParamsSchema.shape);

const openOn = (floorId: string) => ({ state: "unfinished", floorId }) as const;

export function floorLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = floorPageParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(floorQueryOptions(parsed.data.floorId));
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(
        siteActionsQueryOptions(parsed.data.siteId, openOn(parsed.data.floorId)),
      );
    }
    return null;
  };
}

function FloorNotFound({ siteId }: { siteId?: string }) {
  return (
    <>
      <title>Floor not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This floor is not available"
        description="It may have been removed, or it belongs to a site where you hold no role."
        action={
          <TextLink to={siteId ? paths.site.getHref(siteId) : paths.home.getHref()}>
            {siteId ? "Back to the site" : "Back to my sites"}
          </TextLink>
        }
      />
    </>
  );
}

function FloorPage({ siteId, floorId }: { siteId: string; floorId: string }) {
  const { can } = useAuthorization();
  const floor = useFloor(floorId);
  const site = useSite(siteId);
  const navigate = useNavigate();
  const actions = useSiteActions(siteId, openOn(floorId));
  const pressure = usePressureNow(siteId);
  const [pinFilter, setPinFilter] = useState<PinFilter>(showAllPins);
  const shownActions = useMemo(
    () => applyPinFilter(actions.data ?? [], pinFilter),
    [actions.data, pinFilter],
  );
  const floorSpaces = floor.data?.spaces;
  const pins = useMemo<MapPin[]>(
    () => [
      // A room out of negative pressure, or silent, is marked over the room with its words.
      ...pressurePins(pressure.data?.rooms ?? [], floorSpaces ?? []).map((pin) => ({
        ...pin,
        onSelect: () => void navigate(paths.spaceAudits.getHref(pin.id.slice("pressure-".length))),
      })),
      ...shownActions.map((action) => ({
        id: action.id,
        position: action.position,
        html: actionPinHtml(action),
        title: actionPinTitle(action),
        onSelect: () => void navigate(paths.action.getHref(action.id)),
      })),
    ],
    [shownActions, navigate, pressure.data, floorSpaces],
  );

  if (floor.isPending) return <Spinner label="Loading floor…" className="py-8" />;
  if (floor.isError) {
    if (isApiError(floor.error) && floor.error.status === 404) {
      return <FloorNotFound siteId={siteId} />;
    }
    return (
      <>
        <h1 className="mb-4 text-2xl font-bold tracking-tight">Floor</h1>
        <Alert role="alert" tone="error" title="We could not load this floor">
          <p>{floor.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void floor.refetch()}>
            Try again
          </Button>
        </Alert>
      </>
    );
  }
  // A floor reached through another site's address is not shown under this one.
  if (floor.data.floor.siteId !== siteId) return <FloorNotFound siteId={siteId} />;

  const { name, building, level } = floor.data.floor;
  const siteName = site.data?.name;
  const mayAudit = can("conduct:audit:site", siteId);
  return (
    <>
      <title>{`${name} · ${siteName ?? "Floor"} · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.site.getHref(siteId)}>{siteName ?? "Back to the site"}</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">{name}</h1>
      <p className="mt-1 mb-6 text-ink-muted">
        {building} · Level {level}
      </p>
      <div className="flex flex-col gap-6">
        <FloorPressureList pressure={pressure.data} floorId={floorId} />
        <FloorPlanView
          detail={floor.data}
          canEdit={can("update:site:site", siteId)}
          pins={pins}
          pinKey={
            <FloorActionsKey
              filter={pinFilter}
              onFilterChange={setPinFilter}
              total={actions.data?.length ?? 0}
              shown={shownActions.length}
              loading={actions.isPending}
              failed={actions.isError}
            />
          }
          spaceActions={(space) => (
            <>
              {mayAudit ? (
                <Link
                  to={paths.startAudit.getHref(space.id)}
                  className={buttonStyles({ className: "px-3 py-1.5" })}
                >
                  Start audit
                </Link>
              ) : null}
              {mayAudit && isObservedZone(space.zoneType) ? (
                <Link
                  to={paths.startObservation.getHref(space.id)}
                  className={buttonStyles({ variant: "secondary", className: "px-3 py-1.5" })}
                >
                  Observe putting on or removal
                </Link>
              ) : null}
              <Link
                to={paths.spaceAudits.getHref(space.id)}
                className={buttonStyles({ variant: "quiet", className: "px-3" })}
              >
                Audit history
              </Link>
            </>
          )}
        />
        {can("update:site:site", siteId) ? (
          <FloorRetirement
            floorId={floorId}
            floorName={name}
            spaceCount={floor.data.spaces.length}
            onGone={(notice) =>
              void navigate(paths.site.getHref(siteId), { replace: true, state: { notice } })
            }
          />
        ) : null}
        <CautionNote />
      </div>
    </>
  );
}

export function FloorRoute() {
  const parsed = floorPageParamsSchema.safeParse(useParams());
  if (!parsed.success) return <FloorNotFound />;
  const { siteId, floorId } = parsed.data;
  return <FloorPage key={floorId} siteId={siteId} floorId={floorId} />;
}
