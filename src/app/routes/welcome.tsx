import { linkTokenParamsSchema } from "@shared/schemas/people";
import type { QueryClient } from "@tanstack/react-query";
import { type LoaderFunctionArgs, useNavigate, useParams } from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { Card } from "@/components/ui/card";
import { PageSpinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { useAcceptInvitation } from "@/features/auth/api/accept-invitation";
import { invitationQueryOptions, useInvitation } from "@/features/auth/api/get-invitation";
import { LinkInvalid } from "@/features/auth/components/link-invalid";
import { NewPasswordForm } from "@/features/auth/components/new-password-form";

import { LinkCheckFailed } from "./link-check-failed";

export function welcomeLoader(queryClient: QueryClient) {
  return ({ params }: LoaderFunctionArgs) => {
    const parsed = linkTokenParamsSchema.safeParse(params);
    if (parsed.success) void queryClient.prefetchQuery(invitationQueryOptions(parsed.data.token));
    return null;
  };
}

function Welcome({ token }: { token: string }) {
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);

  if (invitation.isPending) return <PageSpinner label="Opening your invitation…" />;
  if (invitation.isError) {
    return <LinkCheckFailed error={invitation.error} onRetry={() => void invitation.refetch()} />;
  }

  const { name, email } = invitation.data;
  return (
    <Card className="p-6 md:p-8">
      <title>Welcome · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight">{`Welcome, ${name}`}</h1>
      <p className="mt-2 mb-6 text-ink-muted">
        Choose a password to finish setting up your Lintel account for{" "}
        <span className="font-semibold wrap-anywhere text-ink">{email}</span>.
      </p>
      <NewPasswordForm
        email={email}
        submitLabel="Set password and sign in"
        mutation={accept}
        onSuccess={() => void navigate(paths.home.getHref(), { replace: true })}
      />
    </Card>
  );
}

export function WelcomeRoute() {
  const parsed = linkTokenParamsSchema.safeParse(useParams());
  return (
    <StandaloneLayout>
      {parsed.success ? (
        <Welcome key={parsed.data.token} token={parsed.data.token} />
      ) : (
        <LinkInvalid message={parsed.error.issues[0]?.message ?? "This link is not complete."} />
      )}
    </StandaloneLayout>
  );
}
