import { zodResolver } from "@hookform/resolvers/zod";
import { passwordResetRequestSchema } from "@shared/schemas/people";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

import { useRequestPasswordReset } from "../api/request-password-reset";

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(passwordResetRequestSchema), defaultValues: { email: "" } });

  const submit = handleSubmit((body) => {
    request.mutate(body, { onError: (error) => showServerFieldErrors(error, setError, ["email"]) });
  });

  if (request.isSuccess) {
    return (
      <Alert role="status" tone="success" title="Check your e-mail">
        {request.data}
      </Alert>
    );
  }

  const formMessage = formLevelMessage(
    request.error,
    ["email"],
    "The reset link could not be requested. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not send a reset link">
          {formMessage}
        </Alert>
      ) : null}
      <TextField
        label="E-mail"
        type="email"
        inputMode="email"
        autoComplete="username"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.email?.message}
        {...register("email")}
      />
      <Button
        type="submit"
        size="lg"
        disabled={request.isPending}
        aria-busy={request.isPending || undefined}
        className="mt-1 w-full"
      >
        {request.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Send reset link
      </Button>
    </form>
  );
}
