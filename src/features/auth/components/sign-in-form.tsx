import { zodResolver } from "@hookform/resolvers/zod";
import { type MeResponse, type SignInBody, signInBodySchema } from "@shared/schemas/auth";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";

import { useSignIn } from "../api/sign-in";

const fieldNames = ["email", "password"] as const satisfies readonly (keyof SignInBody)[];

export interface SignInFormProps {
  onSuccess: (me: MeResponse) => void;
}

export function SignInForm({ onSuccess }: SignInFormProps) {
  const signIn = useSignIn();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(signInBodySchema),
    defaultValues: { email: "", password: "" },
  });

  const submit = handleSubmit((body) => {
    signIn.mutate(body, {
      onSuccess,
      onError: (error) => {
        if (!isApiError(error)) return;
        for (const name of fieldNames) {
          const message = error.fieldError(name);
          if (message) setError(name, { type: "server", message }, { shouldFocus: true });
        }
      },
    });
  });

  // Messages that belong to no single field (wrong credentials, too many attempts, no network).
  const error = signIn.error;
  const fieldMessages = isApiError(error)
    ? fieldNames.filter((name) => error.fieldError(name))
    : [];
  const formMessage =
    error && fieldMessages.length === 0
      ? isApiError(error)
        ? error.message
        : "Signing in did not work. Please try again."
      : null;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not sign you in">
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
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register("password")}
      />
      <Button
        type="submit"
        size="lg"
        disabled={signIn.isPending}
        aria-busy={signIn.isPending || undefined}
        className="mt-1 w-full"
      >
        {signIn.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Sign in
      </Button>
    </form>
  );
}
