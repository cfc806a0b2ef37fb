import { linkTokenParamsSchema } from "@shared/schemas/people";
import type { QueryClient } from "@tanstack/react-query";
import { type LoaderFunctionArgs, useNavigate, useParams } from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { Card } from "@/components/ui/card";
import { PageSpinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import {
  passwordResetQueryOptions,
  usePasswordReset,
} from "@/features/auth/api/get-password-reset";
import { useResetPassword } from "@/features/auth/api/reset-password";
import { LinkInvalid } from "@/features/auth/components/link-invalid";
import { NewPasswordForm } from "@/features/auth/components/new-password-form";

import { LinkCheckFailed } from "./link-check-failed";

export function resetPasswordLoader(queryClient: QueryClient) {
  return ({ params }: LoaderFunctionArgs) => {
    const parsed = linkTokenParamsSchema.safeParse(params);
    if (parsed.success) {
      void queryClient.prefetchQuery(passwordResetQueryOptions(parsed.data.token));
    }
    return null;
  };
}

function ResetPassword({ token }: { token: string }) {
  const navigate = useNavigate();
  const reset = usePasswordReset(token);
  const complete = useResetPassword(token);

  if (reset.isPending) return <PageSpinner label="Opening your reset link…" />;
  if (reset.isError) {
    return (
      <LinkCheckFailed error={reset.error} onRetry={() => void reset.refetch()} offerNewResetLink />
    );
  }

  return (
    <Card className="p-6 md:p-8">
      <title>Choose a new password · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight">Choose a new password</h1>
      <p className="mt-2 mb-6 text-ink-muted">
        For <span className="font-semibold wrap-anywhere text-ink">{reset.data.email}</span>. Once
        it is changed you are signed in here and signed out on every other device.
      </p>
      <NewPasswordForm
        email={reset.data.email}
        submitLabel="Change password and sign in"
        mutation={complete}
        onSuccess={() => void navigate(paths.home.getHref(), { replace: true })}
      />
    </Card>
  );
}

export function ResetPasswordRoute() {
  const parsed = linkTokenParamsSchema.safeParse(useParams());
  return (
    <StandaloneLayout>
      {parsed.success ? (
        <ResetPassword key={parsed.data.token} token={parsed.data.token} />
      ) : (
        <LinkInvalid
          message={parsed.error.issues[0]?.message ?? "This link is not complete."}
          offerNewResetLink
        />
      )}
    </StandaloneLayout>
  );
}
