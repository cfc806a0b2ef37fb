import type { QueryClient } from "@tanstack/react-query";

import { paths } from "@/config/paths";
import { myActionsQueryOptions } from "@/features/actions/api/get-my-actions";
import { MyActions } from "@/features/actions/components/my-actions";

import { isSignedIn } from "../session";

export function myActionsLoader(queryClient: QueryClient) {
  return async () => {
    if (await isSignedIn(queryClient)) void queryClient.prefetchQuery(myActionsQueryOptions());
    return null;
  };
}

export function MyActionsRoute() {
  return (
    <>
      <title>Corrective actions · Lintel</title>
      <MyActions actionHref={paths.action.getHref} showAll headingLevel={1} />
    </>
  );
}
