import { type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

export async function reactivatePerson(userId: string): Promise<Person> {
  const { person } = await apiRequest(`/api/people/${encodeURIComponent(userId)}/reactivate`, {
    method: "POST",
    body: {},
    schema: personResponseSchema,
  });
  return person;
}

export function reactivatePersonMutationOptions(queryClient: QueryClient, userId: string) {
  return mutationOptions({
    mutationKey: ["people", userId, "reactivate"],
    mutationFn: () => reactivatePerson(userId),
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useReactivatePerson(userId: string) {
  const queryClient = useQueryClient();
  return useMutation(reactivatePersonMutationOptions(queryClient, userId));
}
