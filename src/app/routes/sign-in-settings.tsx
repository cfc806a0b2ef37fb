import type { IdentityProviderSettings } from "@shared/schemas/identity-provider";
import type { QueryClient } from "@tanstack/react-query";
import { type ReactNode, useId, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import {
  identityProviderQueryOptions,
  useIdentityProvider,
} from "@/features/admin/api/get-identity-provider";
import { ConnectionTest } from "@/features/admin/components/connection-test";
import { IdentityProviderForm } from "@/features/admin/components/identity-provider-form";
import { RegisterAddresses } from "@/features/admin/components/register-addresses";
import { RemoveIdentityProvider } from "@/features/admin/components/remove-identity-provider";
import { useAuthorization } from "@/lib/authorization";
import { formatDateTime } from "@/lib/format";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";
import { signInSettingsPermission } from "../navigation-items";

export function signInSettingsLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, signInSettingsPermission))
      void queryClient.prefetchQuery(identityProviderQueryOptions());
    return null;
  };
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  const headingId = useId();
  return (
    <Card>
      <section aria-labelledby={headingId} className="flex flex-col gap-4">
        <h2 id={headingId} className="text-lg font-semibold">
          {title}
        </h2>
        {children}
      </section>
    </Card>
  );
}

/** What is in force now, in words, including the administrator's declaration about addresses. */
function ProviderSummary({ provider }: { provider: IdentityProviderSettings }) {
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        People with an address at{" "}
        <span className="font-semibold">{provider.domains.join(", ")}</span> are offered{" "}
        <span className="font-semibold">&ldquo;Sign in with {provider.name}&rdquo;</span>
        {provider.passwordAllowed
          ? ", and may still sign in with a Lintel password."
          : ". Lintel passwords are not used for them."}
      </p>
      <p>
        {provider.clientSecretStored
          ? "A client secret is stored (encrypted, never shown)."
          : "No client secret is stored yet."}{" "}
        Last changed {formatDateTime(provider.updatedAt)}.
      </p>
      {provider.assumeVerifiedEmail ? (
        <Alert tone="warning" title="Addresses are taken as verified">
          An administrator declared that this provider only issues verified e-mail addresses, so
          Lintel does not ask the provider whether each address is verified. The declaration is
          recorded in the change log.
        </Alert>
      ) : null}
    </div>
  );
}

function SignInSettingsPage() {
  const settings = useIdentityProvider();
  const [notice, setNotice] = useState<string | null>(null);

  if (settings.isPending) return <Spinner label="Loading the sign-in settings…" className="py-8" />;
  if (settings.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the sign-in settings">
        <p>{settings.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void settings.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  const { provider, redirectUri, postLogoutRedirectUri } = settings.data;
  return (
    <div className="flex flex-col gap-6">
      {notice ? (
        <Alert role="status" tone="success">
          {notice}
        </Alert>
      ) : null}
      <Section title={provider ? provider.name : "No identity provider yet"}>
        {provider ? (
          <ProviderSummary provider={provider} />
        ) : (
          <p className="text-sm">
            Everyone signs in with a Lintel password. Register Lintel at your organisation&apos;s
            identity provider with the two addresses below, then fill in the settings it gives you.
          </p>
        )}
      </Section>
      <Section title="Register Lintel at the provider">
        <RegisterAddresses
          redirectUri={provider?.redirectUri ?? redirectUri}
          postLogoutRedirectUri={provider?.postLogoutRedirectUri ?? postLogoutRedirectUri}
        />
      </Section>
      <Section title={provider ? "Settings" : "Add the provider"}>
        <IdentityProviderForm
          // A fresh form after each save or removal: the secret box empties, the rest shows what is stored.
          key={provider?.updatedAt ?? "none"}
          saved={provider}
          onSaved={(saved) =>
            setNotice(
              `Saved. People with an address at ${saved.domains.join(", ")} are now offered “Sign in with ${saved.name}”.`,
            )
          }
        />
      </Section>
      {provider ? (
        <>
          <Section title="Test the connection">
            <ConnectionTest key={provider.updatedAt} />
          </Section>
          <Section title="Remove the provider">
            <RemoveIdentityProvider
              name={provider.name}
              onRemoved={() =>
                setNotice(
                  `${provider.name} was removed. Everyone signs in with a Lintel password again.`,
                )
              }
            />
          </Section>
        </>
      ) : null}
    </div>
  );
}

/** A network-wide administrator connects the network's own identity provider (OpenID Connect). */
export function SignInSettingsRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere(signInSettingsPermission)) return <NotAvailable />;
  return (
    <>
      <title>Sign-in · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Sign-in</h1>
      <p className="mt-2 mb-6 max-w-prose text-ink-muted">
        Let people sign in with your organisation&apos;s own account through its identity provider
        (OpenID Connect). Roles stay in Lintel: only people your network has invited can sign in.
      </p>
      <SignInSettingsPage />
    </>
  );
}
