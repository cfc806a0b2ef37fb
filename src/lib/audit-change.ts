import type { QueryClient } from "@tanstack/react-query";

import { queryKeys } from "./query-keys";

export interface ChangedAudit {
  siteId: string;
  spaceId: string;
}

/**
 * What a submitted or amended audit changes beyond itself: a failed item opens or joins a
 * corrective action (the site's work list, its floor pins and counts, the owner's and the
 * checkers' lists), the space's due date moves, the space's history gains a line, and the
 * committee's figures count it. Every one of those is fetched again now if it is on screen, and
 * on its next use otherwise.
 */
export async function invalidateAfterAuditChange(
  queryClient: QueryClient,
  { siteId, spaceId }: ChangedAudit,
): Promise<void> {
  await Promise.all(
    [
      queryKeys.actions.site(siteId),
      queryKeys.actions.details,
      queryKeys.actions.mine,
      queryKeys.actions.toCheck,
      queryKeys.schedules.all,
      queryKeys.audits.space(spaceId),
      queryKeys.committee.all,
    ].map((queryKey) => queryClient.invalidateQueries({ queryKey })),
  );
}
