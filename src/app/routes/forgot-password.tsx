import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { Card } from "@/components/ui/card";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { ForgotPasswordForm } from "@/features/auth/components/forgot-password-form";

export function ForgotPasswordRoute() {
  return (
    <StandaloneLayout>
      <title>Reset your password · Lintel</title>
      <Card className="p-6 md:p-8">
        <h1 className="text-2xl font-bold tracking-tight">Reset your password</h1>
        <p className="mt-2 mb-6 text-ink-muted">
          Enter the e-mail address you sign in with. If it belongs to a Lintel account, we send it a
          link to choose a new password.
        </p>
        <ForgotPasswordForm />
      </Card>
      <p className="mt-6 text-center">
        <TextLink to={paths.signIn.getHref()}>Back to sign in</TextLink>
      </p>
    </StandaloneLayout>
  );
}
