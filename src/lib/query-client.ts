import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";

import { isApiError } from "./api-client";

export interface QueryClientHooks {
  /** Called when any request finds the session gone, so the app can send the person to sign in. */
  onUnauthenticated?: () => void;
}

const maxRetries = 2;

function shouldRetry(failureCount: number, error: unknown): boolean {
  // A 4xx answer will not change on retry; only connection trouble and server errors might.
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < maxRetries;
}

function isSessionGone(error: unknown): boolean {
  return isApiError(error) && error.code === "unauthenticated";
}

export function createQueryClient({ onUnauthenticated }: QueryClientHooks = {}): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isSessionGone(error)) onUnauthenticated?.();
      },
    }),
    mutationCache: new MutationCache({
      onError: (error) => {
        if (isSessionGone(error)) onUnauthenticated?.();
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: shouldRetry,
      },
      mutations: {
        retry: false,
      },
    },
  });
}
