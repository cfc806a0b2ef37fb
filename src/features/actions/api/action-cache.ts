import type { ActionDetail } from "@shared/schemas/actions";
import type { QueryClient } from "@tanstack/react-query";

import { queryKeys } from "@/lib/query-keys";

/**
 * Every move replies with the whole action: it replaces the page at once, and the lists that show
 * the action's status, owner or due mark are fetched again.
 */
export async function storeMovedAction(queryClient: QueryClient, detail: ActionDetail) {
  queryClient.setQueryData(queryKeys.actions.detail(detail.action.id), detail);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: queryKeys.actions.detail(detail.action.id) }),
    queryClient.invalidateQueries({ queryKey: queryKeys.actions.site(detail.action.siteId) }),
    queryClient.invalidateQueries({ queryKey: queryKeys.actions.mine }),
    queryClient.invalidateQueries({ queryKey: queryKeys.actions.toCheck }),
  ]);
}
