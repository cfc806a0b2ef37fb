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
          path: paths.signInProblem.path,
          lazy: async () => {
            const { SignInProblemRoute } = await import("./routes/sign-in-problem");
            return { Component: SignInProblemRoute };
          },
        },
        {
          path: paths.welcome.path,
          lazy: async () => {
            const { WelcomeRoute, welcomeLoader } = await import("./routes/welcome");
            return { Component: WelcomeRoute, loader: welcomeLoader(queryClient) };
          },
        },
        {
          path: paths.forgotPassword.path,
          lazy: async () => {
            const { ForgotPasswordRoute } = await import("./routes/forgot-password");
            return { Component: ForgotPasswordRoute };
          },
        },
        {
          path: paths.resetPassword.path,
          lazy: async () => {
            const { ResetPasswordRoute, resetPasswordLoader } =
              await import("./routes/reset-password");
            return { Component: ResetPasswordRoute, loader: resetPasswordLoader(queryClient) };
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
              path: paths.newSite.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { NewSiteRoute } = await import("./routes/new-site");
                return { Component: NewSiteRoute };
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
              path: paths.editSite.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { EditSiteRoute, editSiteLoader } = await import("./routes/edit-site");
                return { Component: EditSiteRoute, loader: editSiteLoader(queryClient) };
              },
            },
            {
              path: paths.siteDue.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SiteDueRoute, siteDueLoader } = await import("./routes/site-due");
                return { Component: SiteDueRoute, loader: siteDueLoader(queryClient) };
              },
            },
            {
              path: paths.qrSheet.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { QrSheetRoute, qrSheetLoader } = await import("./routes/qr-sheet");
                return { Component: QrSheetRoute, loader: qrSheetLoader(queryClient) };
              },
            },
            {
              path: paths.spaceAudits.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SpaceAuditsRoute, spaceAuditsLoader } =
                  await import("./routes/space-audits");
                return { Component: SpaceAuditsRoute, loader: spaceAuditsLoader(queryClient) };
              },
            },
            {
              path: paths.siteActions.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SiteActionsRoute, siteActionsLoader } =
                  await import("./routes/site-actions");
                return { Component: SiteActionsRoute, loader: siteActionsLoader(queryClient) };
              },
            },
            {
              path: paths.myActions.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { MyActionsRoute, myActionsLoader } = await import("./routes/my-actions");
                return { Component: MyActionsRoute, loader: myActionsLoader(queryClient) };
              },
            },
            {
              path: paths.action.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { ActionRoute, actionLoader } = await import("./routes/action");
                return { Component: ActionRoute, loader: actionLoader(queryClient) };
              },
            },
            {
              path: paths.committee.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { CommitteeRoute, committeeLoader } = await import("./routes/committee");
                return { Component: CommitteeRoute, loader: committeeLoader(queryClient) };
              },
            },
            {
              path: paths.committeeSite.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { CommitteeSiteRoute, committeeSiteLoader } =
                  await import("./routes/committee-site");
                return { Component: CommitteeSiteRoute, loader: committeeSiteLoader(queryClient) };
              },
            },
            {
              path: paths.admin.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { AdminRoute, adminLoader } = await import("./routes/admin");
                return { Component: AdminRoute, loader: adminLoader(queryClient) };
              },
            },
            {
              path: paths.sequences.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SequencesRoute, sequencesLoader } = await import("./routes/sequences");
                return { Component: SequencesRoute, loader: sequencesLoader(queryClient) };
              },
            },
            {
              path: paths.checklists.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { ChecklistsRoute, checklistsLoader } = await import("./routes/checklists");
                return { Component: ChecklistsRoute, loader: checklistsLoader(queryClient) };
              },
            },
            {
              path: paths.floor.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { FloorRoute, floorLoader } = await import("./routes/floor");
                return { Component: FloorRoute, loader: floorLoader(queryClient) };
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
            {
              path: paths.people.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { PeopleRoute, peopleLoader } = await import("./routes/people");
                return { Component: PeopleRoute, loader: peopleLoader(queryClient) };
              },
            },
            {
              path: paths.invitePerson.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { InvitePersonRoute, invitePersonLoader } =
                  await import("./routes/invite-person");
                return { Component: InvitePersonRoute, loader: invitePersonLoader(queryClient) };
              },
            },
            {
              path: paths.person.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { PersonRoute, personLoader } = await import("./routes/person");
                return { Component: PersonRoute, loader: personLoader(queryClient) };
              },
            },
            {
              path: paths.mailbox.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { MailboxRoute, mailboxLoader } = await import("./routes/mailbox");
                return { Component: MailboxRoute, loader: mailboxLoader(queryClient) };
              },
            },
            {
              path: paths.signInSettings.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { SignInSettingsRoute, signInSettingsLoader } =
                  await import("./routes/sign-in-settings");
                return {
                  Component: SignInSettingsRoute,
                  loader: signInSettingsLoader(queryClient),
                };
              },
            },
            {
              path: paths.undeliveredMail.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { UndeliveredMailRoute, undeliveredMailLoader } =
                  await import("./routes/undelivered-mail");
                return {
                  Component: UndeliveredMailRoute,
                  loader: undeliveredMailLoader(queryClient),
                };
              },
            },
          ],
        },
        {
          // Audits open from the phone's own store, so this frame does not insist on the network.
          errorElement: <RouteError standalone />,
          lazy: async () => {
            const { AuditLayout, auditLayoutLoader } = await import("./routes/audit-layout");
            return { Component: AuditLayout, loader: auditLayoutLoader(queryClient) };
          },
          children: [
            {
              path: paths.audit.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { AuditRoute } = await import("./routes/audit");
                return { Component: AuditRoute };
              },
            },
            {
              path: paths.startAudit.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { StartAuditRoute } = await import("./routes/start-audit");
                return { Component: StartAuditRoute };
              },
            },
            {
              path: paths.startObservation.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { StartObservationRoute } = await import("./routes/observe");
                return { Component: StartObservationRoute };
              },
            },
            {
              path: paths.observation.path,
              errorElement: <RouteError />,
              lazy: async () => {
                const { ObservationRoute } = await import("./routes/observe");
                return { Component: ObservationRoute };
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
