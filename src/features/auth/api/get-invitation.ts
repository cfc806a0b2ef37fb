import { type InvitationInfo, invitationInfoSchema } from "@shared/schemas/people";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Who an invitation link is for; fails with `link_invalid` once used, replaced or expired. */
export function getInvitation(
  token: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<InvitationInfo> {
  return apiRequest(`/api/invitations/${encodeURIComponent(token)}`, {
    schema: invitationInfoSchema,
    signal,
  });
}

export function invitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: queryKeys.invitations.detail(token),
    // A link's state changes only when it is used (then this page is left) or replaced.
    staleTime: Infinity,
    refetchOnWindowFocus: false,
    queryFn: ({ signal }) => getInvitation(token, { signal }),
  });
}

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
