import { zodResolver } from "@hookform/resolvers/zod";
import { text } from "@shared/schemas/common";
import { changePasswordBodySchema } from "@shared/schemas/people";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

import { useChangePassword } from "../api/change-password";
import { passwordHint, passwordsDifferMessage } from "./new-password-form";

const changePasswordFormSchema = changePasswordBodySchema
  .extend({ repeatNewPassword: text() })
  .refine((values) => values.newPassword === values.repeatNewPassword, {
    message: passwordsDifferMessage,
    path: ["repeatNewPassword"],
  });

const fieldNames = ["currentPassword", "newPassword"] as const;

export interface ChangePasswordFormProps {
  /** Whose password this is, so a password manager updates the right entry. */
  email: string;
}

export function ChangePasswordForm({ email }: ChangePasswordFormProps) {
  const change = useChangePassword();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(changePasswordFormSchema),
    defaultValues: { currentPassword: "", newPassword: "", repeatNewPassword: "" },
  });

  const submit = handleSubmit(({ currentPassword, newPassword }) => {
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => reset(),
        onError: (error) => showServerFieldErrors(error, setError, fieldNames),
      },
    );
  });

  const formMessage = formLevelMessage(
    change.error,
    fieldNames,
    "Your password could not be changed. Please try again.",
  );

  // Wrong current passwords count like failed sign-ins; past the limit the server waits it out.
  const paused = isApiError(change.error) && change.error.status === 429;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {formMessage ? (
        <Alert
          role="alert"
          tone="error"
          title={paused ? "Password change paused" : "Could not change your password"}
        >
          {formMessage}
          {paused ? " Your password has not changed." : null}
        </Alert>
      ) : null}
      {change.isSuccess ? (
        <Alert role="status" tone="success" title="Password changed">
          Any other phones or computers signed in to your account have been signed out. This one
          stays signed in.
        </Alert>
      ) : null}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <TextField
        label="Current password"
        type="password"
        autoComplete="current-password"
        error={errors.currentPassword?.message}
        {...register("currentPassword")}
      />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={passwordHint}
        error={errors.newPassword?.message}
        {...register("newPassword")}
      />
      <TextField
        label="Repeat new password"
        type="password"
        autoComplete="new-password"
        error={errors.repeatNewPassword?.message}
        {...register("repeatNewPassword")}
      />
      <Button
        type="submit"
        variant="secondary"
        disabled={change.isPending}
        aria-busy={change.isPending || undefined}
        className="self-start"
      >
        {change.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Change password
      </Button>
    </form>
  );
}
