import { type MailboxMessage, mailboxResponseSchema } from "@shared/schemas/people";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** What the local mail catcher has received, newest first. */
export async function getMailbox({ signal }: { signal?: AbortSignal } = {}): Promise<
  MailboxMessage[]
> {
  const { messages } = await apiRequest("/api/dev/mailbox", {
    schema: mailboxResponseSchema,
    signal,
  });
  return messages;
}

export function mailboxQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.mailboxMessages.list,
    queryFn: ({ signal }) => getMailbox({ signal }),
    // A message may arrive any moment after an invitation is sent: always read afresh.
    staleTime: 0,
  });
}

export function useMailbox() {
  return useQuery(mailboxQueryOptions());
}
