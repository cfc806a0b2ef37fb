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
    // Built app only (the development server has no worker): by the build's mode, so the browser
    // tests, which build with NODE_ENV=test, run the same worker as a phone does.
    if (import.meta.env.MODE === "production") registerServiceWorker();
  }, []);
  return (
    <QueryClientProvider client={queryClient}>
      {children}
      <UpdatePrompt />
    </QueryClientProvider>
  );
}
