import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { Button, buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { isApiError, isTemporarilyUnavailable } from "@/lib/api-client";

function describe(error: unknown): { title: string; detail: string } {
  if (isRouteErrorResponse(error) && error.status === 404) {
    return {
      title: "Page not found",
      detail: "There is nothing at this address. It may have been mistyped, or the page has moved.",
    };
  }
  if (isTemporarilyUnavailable(error)) {
    return { title: "Lintel is unavailable for a moment", detail: error.message };
  }
  if (isApiError(error)) return { title: "Something went wrong", detail: error.message };
  return {
    title: "Something went wrong",
    detail:
      "An unexpected problem stopped this page from loading. Try again, or go back to your sites.",
  };
}

export interface RouteErrorProps {
  /** True when no app frame is around it (the sign-in check itself failed). */
  standalone?: boolean;
}

/** Shown in place of a page that failed to load or draw; offers a way back either way. */
export function RouteError({ standalone = false }: RouteErrorProps) {
  const { title, detail } = describe(useRouteError());
  const panel = (
    <Card className="p-6 md:p-8">
      <title>{`${title} · Lintel`}</title>
      <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
      <p className="mt-2 text-ink-muted">{detail}</p>
      <div className="mt-6 flex flex-wrap gap-3">
        <Button onClick={() => window.location.reload()}>Try again</Button>
        <Link to={paths.home.getHref()} className={buttonStyles({ variant: "secondary" })}>
          Go to my sites
        </Link>
      </div>
    </Card>
  );
  return standalone ? <StandaloneLayout>{panel}</StandaloneLayout> : panel;
}
