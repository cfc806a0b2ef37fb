import { type UndeliveredMail, undeliveredMailListSchema } from "@shared/schemas/mail";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** E-mail to the network's people that may not have arrived, newest first. */
export async function getUndeliveredMail({ signal }: { signal?: AbortSignal } = {}): Promise<
  UndeliveredMail[]
> {
  const { mail } = await apiRequest("/api/mail/undelivered", {
    schema: undeliveredMailListSchema,
    signal,
  });
  return mail;
}

export function undeliveredMailQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.undeliveredMails.list,
    queryFn: ({ signal }) => getUndeliveredMail({ signal }),
  });
}

export function useUndeliveredMail({ enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...undeliveredMailQueryOptions(), enabled });
}
