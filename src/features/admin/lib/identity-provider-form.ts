import {
  type IdentityProviderBody,
  identityProviderBodySchema,
  type IdentityProviderSettings,
} from "@shared/schemas/identity-provider";
import type { FieldErrors, Resolver } from "react-hook-form";

/** The settings form as typed: domains in one box, the secret empty unless it is being replaced. */
export interface IdentityProviderFormValues {
  name: string;
  issuerUrl: string;
  clientId: string;
  clientSecret: string;
  domains: string;
  passwordAllowed: boolean;
  assumeVerifiedEmail: boolean;
}

export const identityProviderFieldNames = [
  "name",
  "issuerUrl",
  "clientId",
  "clientSecret",
  "domains",
  "passwordAllowed",
  "assumeVerifiedEmail",
] as const satisfies readonly (keyof IdentityProviderFormValues)[];

export function formFromSettings(
  settings: IdentityProviderSettings | null,
): IdentityProviderFormValues {
  return {
    name: settings?.name ?? "",
    issuerUrl: settings?.issuerUrl ?? "",
    clientId: settings?.clientId ?? "",
    clientSecret: "",
    domains: settings?.domains.join("\n") ?? "",
    // A new provider starts with passwords still allowed: switching them off is a choice.
    passwordAllowed: settings?.passwordAllowed ?? true,
    assumeVerifiedEmail: settings?.assumeVerifiedEmail ?? false,
  };
}

/** Domains typed one a line, or separated by commas or spaces. */
export function readDomains(text: string): string[] {
  return text.split(/[\s,;]+/).filter((domain) => domain.length > 0);
}

/** What is sent: an empty secret is left out, so the stored one is kept. */
export function bodyFromForm(values: IdentityProviderFormValues) {
  const { clientSecret, domains, ...rest } = values;
  return {
    ...rest,
    domains: readDomains(domains),
    ...(clientSecret.length > 0 ? { clientSecret } : {}),
  };
}

/**
 * Checks the form with the shared contract, so its messages are the server's own. A domain's
 * problem names the domain, since they share one box; a secret is needed until one is stored.
 */
export function identityProviderResolver(
  secretStored: boolean,
): Resolver<IdentityProviderFormValues, unknown, IdentityProviderBody> {
  return (values) => {
    const body = bodyFromForm(values);
    const parsed = identityProviderBodySchema.safeParse(body);
    const errors: FieldErrors<IdentityProviderFormValues> = {};
    for (const issue of parsed.success ? [] : parsed.error.issues) {
      const [field, index] = issue.path;
      const name = identityProviderFieldNames.find((candidate) => candidate === field);
      if (!name || errors[name]) continue;
      const domain = typeof index === "number" ? body.domains[index] : undefined;
      errors[name] = {
        type: issue.code,
        message: domain === undefined ? issue.message : `“${domain}”: ${issue.message}`,
      };
    }
    if (!secretStored && !body.clientSecret && !errors.clientSecret) {
      errors.clientSecret = {
        type: "required",
        message: "Enter the client secret the provider gave you for Lintel.",
      };
    }
    if (parsed.success && Object.keys(errors).length === 0)
      return { values: parsed.data, errors: {} };
    return { values: {}, errors };
  };
}

/** Which form field a server's field name belongs to (`domains.2` → `domains`). */
export function formFieldOf(serverName: string): keyof IdentityProviderFormValues | null {
  const [first] = serverName.replace(/^body\./, "").split(".");
  return identityProviderFieldNames.find((name) => name === first) ?? null;
}
