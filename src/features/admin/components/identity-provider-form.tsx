import type { IdentityProviderSettings } from "@shared/schemas/identity-provider";
import { useMemo } from "react";
import { useForm, useWatch } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { FieldError } from "@/components/ui/field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { formLevelMessage } from "@/lib/form-errors";

import { useSaveIdentityProvider } from "../api/save-identity-provider";
import {
  formFieldOf,
  formFromSettings,
  identityProviderFieldNames,
  type IdentityProviderFormValues,
  identityProviderResolver,
} from "../lib/identity-provider-form";
import { Checkbox } from "./editor-parts";

export interface IdentityProviderFormProps {
  /** The saved settings, or null when the network has no provider yet. */
  saved: IdentityProviderSettings | null;
  onSaved: (provider: IdentityProviderSettings) => void;
}

/** The network's provider: where it is, Lintel's credentials there, and whom it signs in. */
export function IdentityProviderForm({ saved, onSaved }: IdentityProviderFormProps) {
  const save = useSaveIdentityProvider();
  const secretStored = saved?.clientSecretStored ?? false;
  const resolver = useMemo(() => identityProviderResolver(secretStored), [secretStored]);
  const {
    control,
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<IdentityProviderFormValues, unknown, Parameters<typeof save.mutate>[0]>({
    resolver,
    defaultValues: formFromSettings(saved),
  });
  const assumeVerified = useWatch({ control, name: "assumeVerifiedEmail" });

  const submit = handleSubmit((body) => {
    save.mutate(body, {
      onSuccess: onSaved,
      onError: (error) => {
        if (!isApiError(error)) return;
        let focus = true;
        for (const [serverName, message] of Object.entries(error.fields)) {
          const field = formFieldOf(serverName);
          if (!field || errors[field]) continue;
          setError(field, { type: "server", message }, { shouldFocus: focus });
          focus = false;
        }
      },
    });
  });

  const serverFieldNames = Object.keys(isApiError(save.error) ? save.error.fields : {}).filter(
    (name) => formFieldOf(name) !== null,
  );
  const formMessage = formLevelMessage(
    save.error,
    [...identityProviderFieldNames, ...serverFieldNames],
    "The settings could not be saved. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Not saved">
          {formMessage}
        </Alert>
      ) : null}
      <TextField
        label="Name"
        hint="People see it on the sign-in button: “Sign in with …”."
        autoComplete="off"
        error={errors.name?.message}
        {...register("name")}
      />
      <TextField
        label="Issuer URL"
        hint="The provider's address, starting with https://."
        type="url"
        inputMode="url"
        autoComplete="off"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.issuerUrl?.message}
        {...register("issuerUrl")}
      />
      <TextField
        label="Client id"
        hint="What the provider calls Lintel once you have registered it there."
        autoComplete="off"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.clientId?.message}
        {...register("clientId")}
      />
      <TextField
        label="Client secret"
        hint={
          secretStored
            ? "A secret is stored; leave empty to keep it. It is never shown again."
            : "Stored encrypted and never shown again."
        }
        type="password"
        autoComplete="new-password"
        error={errors.clientSecret?.message}
        {...register("clientSecret")}
      />
      <TextAreaField
        label="E-mail domains"
        hint="One a line, without the @, e.g. example.org. People with these addresses are offered this provider; a domain can belong to one network only."
        rows={3}
        autoCapitalize="none"
        spellCheck={false}
        error={errors.domains?.message}
        {...register("domains")}
      />
      <div className="flex flex-col gap-1.5">
        <Checkbox
          label="Password sign-in allowed for these domains"
          {...register("passwordAllowed")}
        />
        <p className="text-sm text-ink-muted">
          Leave it ticked while people still sign in with a Lintel password. Without it, they sign
          in only through the provider, and cannot reset a Lintel password.
        </p>
        {errors.passwordAllowed?.message ? (
          <FieldError>{errors.passwordAllowed.message}</FieldError>
        ) : null}
      </div>
      <div className="flex flex-col gap-1.5">
        <Checkbox
          label="This provider only issues verified e-mail addresses"
          {...register("assumeVerifiedEmail")}
        />
        <p className="text-sm text-ink-muted">
          Lintel lets someone in only when the provider says their e-mail address is verified. Tick
          this only if your provider never says so but every address it issues is one your
          organisation controls.
        </p>
        {assumeVerified ? (
          <Alert tone="warning" title="Caution">
            Anyone who can set an e-mail address at this provider could then sign in as the Lintel
            account with that address. This declaration is recorded in the change log with your
            name, and shown on this page.
          </Alert>
        ) : null}
        {errors.assumeVerifiedEmail?.message ? (
          <FieldError>{errors.assumeVerifiedEmail.message}</FieldError>
        ) : null}
      </div>
      <Button
        type="submit"
        className="self-start"
        disabled={save.isPending}
        aria-busy={save.isPending || undefined}
      >
        {save.isPending ? <SpinnerGlyph className="size-5" /> : null}
        {saved ? "Save changes" : "Save provider"}
      </Button>
    </form>
  );
}
