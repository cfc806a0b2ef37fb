import { type MeResponse, meResponseSchema } from "@shared/schemas/auth";
import type { SetPasswordBody } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { rememberSignedInPerson } from "./get-me";

export function acceptInvitation(token: string, body: SetPasswordBody): Promise<MeResponse> {
  return apiRequest(`/api/invitations/${encodeURIComponent(token)}/accept`, {
    method: "POST",
    body,
    schema: meResponseSchema,
  });
}

/** Setting the first password also signs the new person in. */
export function acceptInvitationMutationOptions(queryClient: QueryClient, token: string) {
  return mutationOptions({
    mutationKey: ["invitations", token, "accept"],
    mutationFn: (body: SetPasswordBody) => acceptInvitation(token, body),
    onSuccess: (me) => rememberSignedInPerson(queryClient, me, queryKeys.invitations.detail(token)),
  });
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation(acceptInvitationMutationOptions(queryClient, token));
}
