import { type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

export async function removeRole(userId: string, grantId: string): Promise<Person> {
  const { person } = await apiRequest(
    `/api/people/${encodeURIComponent(userId)}/grants/${encodeURIComponent(grantId)}`,
    { method: "DELETE", schema: personResponseSchema },
  );
  return person;
}

export function removeRoleMutationOptions(queryClient: QueryClient, userId: string) {
  return mutationOptions({
    mutationKey: ["people", userId, "grants", "remove"],
    mutationFn: (grantId: string) => removeRole(userId, grantId),
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useRemoveRole(userId: string) {
  const queryClient = useQueryClient();
  return useMutation(removeRoleMutationOptions(queryClient, userId));
}
