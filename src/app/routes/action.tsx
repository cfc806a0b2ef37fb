import { actionParamsSchema } from "@shared/schemas/actions";
import type { QueryClient } from "@tanstack/react-query";
import { useMemo } from "react";
import { type LoaderFunctionArgs, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { actionQueryOptions, useAction } from "@/features/actions/api/get-action";
import { ActionMoves } from "@/features/actions/components/action-moves";
import { ActionView } from "@/features/actions/components/action-view";
import { actionPinHtml, actionPinTitle } from "@/features/actions/lib/action-pins";
import { PlanSpot } from "@/features/floor-plans/components/plan-spot";
import type { MapPin } from "@/features/floor-plans/lib/map-pins";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { isSignedIn } from "../session";

export function actionLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = actionParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(actionQueryOptions(parsed.data.actionId));
    }
    return null;
  };
}

function ActionNotFound() {
  return (
    <>
      <title>Action not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This corrective action is not available"
        description="It may not exist, or it belongs to a site where you hold no role."
        action={<TextLink to={paths.home.getHref()}>Back to my sites</TextLink>}
      />
    </>
  );
}

function ActionPage({ actionId }: { actionId: string }) {
  const { can } = useAuthorization();
  const detail = useAction(actionId);
  const data = detail.data;
  const pins = useMemo<MapPin[]>(
    () =>
      data
        ? [
            {
              id: data.action.id,
              position: data.action.position,
              html: actionPinHtml(data.action),
              title: actionPinTitle(data.action),
            },
          ]
        : [],
    [data],
  );

  if (detail.isPending) return <Spinner label="Loading the action…" className="py-8" />;
  if (detail.isError) {
    if (isApiError(detail.error) && detail.error.status === 404) return <ActionNotFound />;
    return (
      <>
        <h1 className="mb-4 text-2xl font-bold tracking-tight">Corrective action</h1>
        <Alert role="alert" tone="error" title="We could not load this action">
          <p>{detail.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void detail.refetch()}>
            Try again
          </Button>
        </Alert>
      </>
    );
  }

  const { action, plan } = detail.data;
  const siteId = action.siteId;
  return (
    <>
      <title>{`${action.title} · ${action.spaceName} · Lintel`}</title>
      <ActionView
        detail={detail.data}
        siteHref={paths.site.getHref(siteId)}
        floorHref={paths.floor.getHref(siteId, action.floorId)}
        location={
          plan ? (
            <PlanSpot
              plan={plan}
              polygon={plan.spacePolygon}
              pins={pins}
              label={`Where ${action.spaceName} is on ${action.floorName}`}
            />
          ) : (
            <p className="text-ink-muted">This floor has no plan yet.</p>
          )
        }
        moves={<ActionMoves detail={detail.data} can={(permission) => can(permission, siteId)} />}
      />
    </>
  );
}

export function ActionRoute() {
  const parsed = actionParamsSchema.safeParse(useParams());
  if (!parsed.success) return <ActionNotFound />;
  return <ActionPage key={parsed.data.actionId} actionId={parsed.data.actionId} />;
}
