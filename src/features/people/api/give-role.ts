import { type GrantInput, type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

export async function giveRole(userId: string, grant: GrantInput): Promise<Person> {
  const { person } = await apiRequest(`/api/people/${encodeURIComponent(userId)}/grants`, {
    method: "POST",
    body: grant,
    schema: personResponseSchema,
  });
  return person;
}

export function giveRoleMutationOptions(queryClient: QueryClient, userId: string) {
  return mutationOptions({
    mutationKey: ["people", userId, "grants", "give"],
    mutationFn: (grant: GrantInput) => giveRole(userId, grant),
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useGiveRole(userId: string) {
  const queryClient = useQueryClient();
  return useMutation(giveRoleMutationOptions(queryClient, userId));
}
