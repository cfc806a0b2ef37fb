import { type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

export interface DeactivateBody {
  reason?: string;
}

/** Stops the person signing in and ends every session they have, on every device. */
export async function deactivatePerson(userId: string, body: DeactivateBody): Promise<Person> {
  const { person } = await apiRequest(`/api/people/${encodeURIComponent(userId)}/deactivate`, {
    method: "POST",
    body,
    schema: personResponseSchema,
  });
  return person;
}

export function deactivatePersonMutationOptions(queryClient: QueryClient, userId: string) {
  return mutationOptions({
    mutationKey: ["people", userId, "deactivate"],
    mutationFn: (body: DeactivateBody) => deactivatePerson(userId, body),
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useDeactivatePerson(userId: string) {
  const queryClient = useQueryClient();
  return useMutation(deactivatePersonMutationOptions(queryClient, userId));
}
