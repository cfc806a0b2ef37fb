import type { ActionDetail } from "@shared/schemas/actions";
import type { QueryClient } from "@tanstack/react-query";

import { actionQueryKey } from "./get-action";
import { myActionsQueryKey } from "./get-my-actions";
import { myChecksQueryKey } from "./get-my-checks";

/**
 * Every move replies with the whole action: it replaces the page at once, and the lists that show
 * the action's status, owner or due mark are fetched again.
 */
export async function storeMovedAction(queryClient: QueryClient, detail: ActionDetail) {
  queryClient.setQueryData(actionQueryKey(detail.action.id), detail);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: actionQueryKey(detail.action.id) }),
    queryClient.invalidateQueries({ queryKey: ["actions", "site", detail.action.siteId] }),
    queryClient.invalidateQueries({ queryKey: myActionsQueryKey }),
    queryClient.invalidateQueries({ queryKey: myChecksQueryKey }),
  ]);
}
