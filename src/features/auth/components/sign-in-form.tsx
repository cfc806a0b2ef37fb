import { zodResolver } from "@hookform/resolvers/zod";
import { type MeResponse, signInBodySchema } from "@shared/schemas/auth";
import type { SignInMethodResponse } from "@shared/schemas/identity-provider";
import { useEffect, useRef, useState } from "react";
import { type Resolver, useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button, buttonStyles } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { TextLink } from "@/components/ui/text-link";
import { isApiError } from "@/lib/api-client";
import { leaveAppFor } from "@/lib/leave-app";
import { signOutPending } from "@/lib/phone-person";

import { endPendingSignOut } from "../api/get-me";
import { useSignIn } from "../api/sign-in";
import { useSignInMethod } from "../api/get-sign-in-method";
import { domainOf, providerStartHref } from "../lib/provider-start";

interface SignInValues {
  email: string;
  password: string;
}

const fieldNames = ["email", "password"] as const;

// The method's body is the address alone, checked as the contract's `signInMethodBodySchema` does.
const checkAddress = zodResolver(signInBodySchema.pick({ email: true }));
const checkPassword = zodResolver(signInBodySchema);

/** Before the method is known, the address alone is checked. */
const addressResolver: Resolver<SignInValues> = (values, context, options) =>
  checkAddress({ email: values.email }, context, options as never) as ReturnType<
    Resolver<SignInValues>
  >;
/** Once a password is asked, address and password. */
const passwordResolver: Resolver<SignInValues> = (values, context, options) =>
  checkPassword(values, context, options as never) as ReturnType<Resolver<SignInValues>>;

interface Method extends SignInMethodResponse {
  email: string;
}

export interface SignInFormProps {
  /** Where to go once signed in: a path of this app, checked by the page ("/" when none). */
  next: string;
  forgotPasswordHref: string;
  onSuccess: (me: MeResponse) => void;
}

/**
 * E-mail first: "Continue" asks Lintel how this address signs in (decided by its domain, never by
 * whether the person exists), then offers the network's provider, the password field, or both.
 * Changing the address asks again.
 */
export function SignInForm({ next, forgotPasswordHref, onSuccess }: SignInFormProps) {
  const signIn = useSignIn();
  const askMethod = useSignInMethod();
  const [method, setMethod] = useState<Method | null>(null);
  const [leaveProblem, setLeaveProblem] = useState<string | null>(null);
  const providerLink = useRef<HTMLAnchorElement>(null);

  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    clearErrors,
    formState: { errors },
  } = useForm<SignInValues>({
    // The form reads its options afresh on each render: the check follows the step on screen.
    resolver: method?.password ? passwordResolver : addressResolver,
    defaultValues: { email: "", password: "" },
  });

  // The organisation's own sign-in first; on a phone, focusing the password would also cover it
  // with the keyboard.
  useEffect(() => {
    if (!method) return;
    if (method.provider) providerLink.current?.focus();
    else if (method.password) setFocus("password");
  }, [method, setFocus]);

  const showFieldErrors = (error: unknown) => {
    if (!isApiError(error)) return;
    for (const name of fieldNames) {
      const message = error.fieldError(name);
      if (message) setError(name, { type: "server", message }, { shouldFocus: true });
    }
  };

  const submit = handleSubmit(({ email, password }) => {
    if (!method) {
      askMethod.mutate(
        { email },
        { onSuccess: (answer) => setMethod({ ...answer, email }), onError: showFieldErrors },
      );
    } else if (method.password) {
      signIn.mutate({ email, password }, { onSuccess, onError: showFieldErrors });
    }
  });

  const emailField = register("email", {
    onChange: () => {
      // Another address may sign in another way: ask again.
      if (!method) return;
      setMethod(null);
      signIn.reset();
      setLeaveProblem(null);
      clearErrors("password");
    },
  });

  // Messages that belong to no single field (wrong credentials, too many attempts, no network).
  const error = method ? signIn.error : askMethod.error;
  const fieldMessages = isApiError(error)
    ? fieldNames.filter((name) => error.fieldError(name))
    : [];
  const formMessage =
    leaveProblem ??
    (error && fieldMessages.length === 0
      ? isApiError(error)
        ? error.message
        : "Signing in did not work. Please try again."
      : null);

  const providerHref =
    method?.provider && typeof window !== "undefined"
      ? providerStartHref(method.provider.startUrl, next, window.location.origin)
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
        {...emailField}
      />
      {!method ? (
        <Button
          type="submit"
          size="lg"
          disabled={askMethod.isPending}
          aria-busy={askMethod.isPending || undefined}
          className="mt-1 w-full"
        >
          {askMethod.isPending ? <SpinnerGlyph className="size-5" /> : null}
          Continue
        </Button>
      ) : null}
      {method?.provider ? (
        <div className="flex flex-col gap-2">
          {providerHref ? (
            <a
              ref={providerLink}
              href={providerHref}
              className={buttonStyles({ size: "lg", className: "w-full text-center" })}
              onClick={(event) => {
                if (!signOutPending()) return;
                // Someone signed out here with no signal: end that session before this one begins.
                event.preventDefault();
                endPendingSignOut().then(
                  () => leaveAppFor(providerHref),
                  () =>
                    setLeaveProblem("No connection to Lintel. Check your network and try again."),
                );
              }}
            >
              Sign in with {method.provider.name}
            </a>
          ) : (
            <Alert tone="error" title="Could not offer your organisation's sign-in">
              Please reload the page and try again.
            </Alert>
          )}
          <p className="text-sm text-ink-muted">
            {method.provider.name} checks who you are, then sends you back to Lintel.
          </p>
        </div>
      ) : null}
      {method?.provider && method.password ? (
        <p className="text-center text-sm font-semibold text-ink-muted">
          or with your Lintel password
        </p>
      ) : null}
      {method?.password ? (
        <>
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
            variant={method.provider ? "secondary" : "primary"}
            disabled={signIn.isPending}
            aria-busy={signIn.isPending || undefined}
            className="mt-1 w-full"
          >
            {signIn.isPending ? <SpinnerGlyph className="size-5" /> : null}
            Sign in
          </Button>
          <p className="text-center">
            <TextLink to={forgotPasswordHref}>Forgot your password?</TextLink>
          </p>
        </>
      ) : null}
      {method && !method.password && !method.provider ? (
        // The contract always offers one; should a reply ever offer neither, say so in words.
        <Alert tone="error" title="No way to sign in">
          Addresses at {domainOf(method.email)} cannot sign in to Lintel just now. Ask your
          administrator.
        </Alert>
      ) : null}
    </form>
  );
}
