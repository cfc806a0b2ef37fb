import { type AppConfig, appConfigSchema } from "@shared/schemas/shell";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** How this installation runs (whether the demo mail catcher is on); fixed while it runs. */
export function getAppConfig({ signal }: { signal?: AbortSignal } = {}): Promise<AppConfig> {
  return apiRequest("/api/app-config", { schema: appConfigSchema, signal });
}

export function appConfigQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.appConfigs.current,
    queryFn: ({ signal }) => getAppConfig({ signal }),
    staleTime: Infinity,
  });
}

export function useAppConfig({ enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...appConfigQueryOptions(), enabled });
}
