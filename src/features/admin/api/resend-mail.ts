import { type ResendResult, resendResultSchema } from "@shared/schemas/mail";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Puts an uncertain or failed e-mail back in the outbox; asking twice sends it once. */
export function resendMail(mailId: string): Promise<ResendResult> {
  return apiRequest(`/api/mail/${encodeURIComponent(mailId)}/resend`, {
    method: "POST",
    body: {},
    schema: resendResultSchema,
  });
}

export function resendMailMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["undelivered-mails", "resend"],
    mutationFn: (mailId: string) => resendMail(mailId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.undeliveredMails.list }),
  });
}

export function useResendMail() {
  const queryClient = useQueryClient();
  return useMutation(resendMailMutationOptions(queryClient));
}
