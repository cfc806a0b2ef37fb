import { type QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { type ReactNode, useEffect } from "react";

import { registerServiceWorker } from "@/lib/service-worker";

import { UpdatePrompt } from "./update-prompt";

export interface AppProviderProps {
  queryClient: QueryClient;
  children: ReactNode;
}

export function AppProvider({ queryClient, children }: AppProviderProps) {
  useEffect(() => {
    if (import.meta.env.PROD) registerServiceWorker();
  }, []);
  return (
    <QueryClientProvider client={queryClient}>
      {children}
      <UpdatePrompt />
    </QueryClientProvider>
  );
}
