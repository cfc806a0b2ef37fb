import { type QueryClient, QueryClientProvider } from "@tanstack/react-query";
import type { ReactNode } from "react";

export interface AppProviderProps {
  queryClient: QueryClient;
  children: ReactNode;
}

export function AppProvider({ queryClient, children }: AppProviderProps) {
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
