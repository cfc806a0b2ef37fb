import { zodResolver } from "@hookform/resolvers/zod";
import type { MeResponse } from "@shared/schemas/auth";
import { text } from "@shared/schemas/common";
import { type SetPasswordBody, setPasswordBodySchema } from "@shared/schemas/people";
import type { UseMutationResult } from "@tanstack/react-query";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { isApiError } from "@/lib/api-client";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

export const passwordHint =
  "At least 12 characters. Long phrases are good; common passwords are refused.";

export const passwordsDifferMessage = "The two passwords are not the same. Type it again.";

const newPasswordFormSchema = setPasswordBodySchema
  .extend({ repeatPassword: text() })
  .refine((values) => values.password === values.repeatPassword, {
    message: passwordsDifferMessage,
    path: ["repeatPassword"],
  });

export interface NewPasswordFormProps {
  /** Whose password this is, so a password manager files it under the right account. */
  email: string;
  submitLabel: string;
  mutation: UseMutationResult<MeResponse, Error, SetPasswordBody>;
  onSuccess: (me: MeResponse) => void;
}

/** Choose a password twice, for a first sign-in from an invitation or a reset link. */
export function NewPasswordForm({ email, submitLabel, mutation, onSuccess }: NewPasswordFormProps) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(newPasswordFormSchema),
    defaultValues: { password: "", repeatPassword: "" },
  });

  const submit = handleSubmit(({ password }) => {
    mutation.mutate(
      { password },
      {
        onSuccess,
        onError: (error) => showServerFieldErrors(error, setError, ["password"]),
      },
    );
  });

  const error = mutation.error;
  const formMessage = formLevelMessage(
    error,
    ["password"],
    "Your password could not be saved. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not set your password">
          <p>{formMessage}</p>
          {isApiError(error) && error.code === "link_invalid" ? (
            <p className="mt-2">
              <TextLink to={paths.signIn.getHref()}>Go to sign in</TextLink>
            </p>
          ) : null}
        </Alert>
      ) : null}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={passwordHint}
        error={errors.password?.message}
        {...register("password")}
      />
      <TextField
        label="Repeat password"
        type="password"
        autoComplete="new-password"
        error={errors.repeatPassword?.message}
        {...register("repeatPassword")}
      />
      <Button
        type="submit"
        size="lg"
        disabled={mutation.isPending}
        aria-busy={mutation.isPending || undefined}
        className="mt-1 w-full"
      >
        {mutation.isPending ? <SpinnerGlyph className="size-5" /> : null}
        {submitLabel}
      </Button>
    </form>
  );
}
