import type { QueryClient } from "@tanstack/react-query";
import type { createBrowserRouter, RouteObject } from "react-router-dom";

import { PageSpinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";

import { ProtectedLayout, protectedLoader } from "./routes/protected-layout";
import { RouteError } from "./routes/route-error";
import { forgetSignedInPerson } from "./session";

export type AppRouter = ReturnType<typeof createBrowserRouter>;

/**
 * Every URL of the app. Page modules load on first visit so a phone downloads only what it
 * shows; the sign-in check is not lazy so a signed-out visit is turned away at once.
 */
export function createRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      errorElement: <RouteError standalone />,
      hydrateFallbackElement: <PageSpinner />,
      children: [
        {
          path: paths.signIn.path,
          lazy: async () => {
            const { SignInRoute, signInLoader } = await import("./routes/sign-in");
            return { Component: SignInRoute, loader: signInLoader(queryClient) };
          },
        },
        {
          loader: protectedLoader(queryClient),
          element: <ProtectedLayout />,
          children: [
            {
              index: true,
              errorElement: <RouteError />,
              lazy: async () => {
                const { HomeRoute, homeLoader } = await import("./routes/home");
                return { Component: HomeRoute, loader: homeLoader(queryClient) };
              },
            },
            {
              path: paths.site.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SiteRoute, siteLoader } = await import("./routes/site");
                return { Component: SiteRoute, loader: siteLoader(queryClient) };
              },
            },
            {
              path: paths.account.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { AccountRoute, accountLoader } = await import("./routes/account");
                return { Component: AccountRoute, loader: accountLoader(queryClient) };
              },
            },
          ],
        },
        {
          path: "*",
          lazy: async () => {
            const { NotFoundRoute } = await import("./routes/not-found");
            return { Component: NotFoundRoute };
          },
        },
      ],
    },
  ];
}

/**
 * What happens when any request finds the session gone: forget the person and ask them to sign
 * in again, coming back to where they were.
 */
export function sendToSignIn(router: AppRouter, queryClient: QueryClient): void {
  const { pathname, search } = router.state.location;
  if (pathname === paths.signIn.path) return;
  forgetSignedInPerson(queryClient);
  void router.navigate(paths.signIn.getHref(`${pathname}${search}`), { replace: true });
}
