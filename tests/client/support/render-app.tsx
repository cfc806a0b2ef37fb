import { render } from "@testing-library/react";
import { userEvent } from "@testing-library/user-event";
import { createMemoryRouter, RouterProvider } from "react-router-dom";

import { AppProvider } from "@/app/provider";
import { type AppRouter, createRoutes, sendToSignIn } from "@/app/router";
import { createQueryClient } from "@/lib/query-client";

/** The whole app at a URL, as the browser would run it, with `fetch` stubbed by the test. */
export function renderApp(url: string) {
  // The router is created next; the callback runs only later, once a request fails.
  const queryClient = createQueryClient({
    onUnauthenticated: () => sendToSignIn(router, queryClient),
  });
  const router: AppRouter = createMemoryRouter(createRoutes(queryClient), {
    initialEntries: [url],
  });
  const user = userEvent.setup();
  render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { router, queryClient, user };
}
