import { createBrowserRouter, RouterProvider } from "react-router-dom";

import { meQueryOptions } from "@/features/auth/api/get-me";
import { createQueryClient } from "@/lib/query-client";

import { preloadFirstPage } from "./first-page";
import { AppProvider } from "./provider";
import { type AppRouter, createRoutes, sendToSignIn } from "./router";

function createAppState() {
  // The router is created next; the callback runs only later, once a request fails.
  const queryClient = createQueryClient({
    onUnauthenticated: () => sendToSignIn(router, queryClient),
  });
  // Who is signed in decides what every page shows: ask at once, while the first page's own
  // files are still on their way, rather than after they arrive.
  void queryClient.prefetchQuery(meQueryOptions());
  // Then the opened page's own files: asked second, so the phone's few connections carry the
  // question of who is signed in before a screen's dozen files.
  preloadFirstPage(window.location.pathname, queryClient);
  const router: AppRouter = createBrowserRouter(createRoutes(queryClient));
  return { queryClient, router };
}

// One per page load: made on first render, not at import, and kept outside React so a strict-mode
// double render cannot leave a second router listening to the history.
let appState: ReturnType<typeof createAppState> | undefined;

export function App() {
  const { queryClient, router } = (appState ??= createAppState());
  return (
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  );
}
