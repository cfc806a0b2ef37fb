import { type InviteBody, type Person, personResponseSchema } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { personChanged } from "./get-person";

export async function invitePerson(body: InviteBody): Promise<Person> {
  const { person } = await apiRequest("/api/people/invitations", {
    method: "POST",
    body,
    schema: personResponseSchema,
  });
  return person;
}

export function invitePersonMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["people", "invite"],
    mutationFn: invitePerson,
    onSuccess: (person) => personChanged(queryClient, person),
  });
}

export function useInvitePerson() {
  const queryClient = useQueryClient();
  return useMutation(invitePersonMutationOptions(queryClient));
}
