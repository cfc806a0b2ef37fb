import { type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

/** Sends a fresh invitation link; the link sent before stops working. */
export async function resendInvitation(userId: string): Promise<Person> {
  const { person } = await apiRequest(`/api/people/${encodeURIComponent(userId)}/invitation`, {
    method: "POST",
    body: {},
    schema: personResponseSchema,
  });
  return person;
}

export function resendInvitationMutationOptions(queryClient: QueryClient, userId: string) {
  return mutationOptions({
    mutationKey: ["people", userId, "invitation"],
    mutationFn: () => resendInvitation(userId),
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useResendInvitation(userId: string) {
  const queryClient = useQueryClient();
  return useMutation(resendInvitationMutationOptions(queryClient, userId));
}
