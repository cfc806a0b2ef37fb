import { zodResolver } from "@hookform/resolvers/zod";
import { type GrantInput, grantInputSchema } from "@shared/schemas/people";
import { useState } from "react";
import { type Resolver, useForm, useWatch } from "react-hook-form";
import type { z } from "zod";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

import { useGiveRole } from "../api/give-role";
import {
  describeGrant,
  emptyGrantDraft,
  type GrantDraft,
  grantFromDraft,
  type ManageableSite,
  networkWideValue,
  offersNetworkWide,
  roleOptions,
  siteErrorMessage,
  siteOptions,
} from "./grant-options";

const validateGrant = zodResolver(grantInputSchema);

const grantResolver: Resolver<GrantDraft, unknown, GrantInput> = (values, context, options) =>
  validateGrant(
    grantFromDraft(values) as z.input<typeof grantInputSchema>,
    context,
    options as unknown as Parameters<typeof validateGrant>[2],
  );

const fieldNames = ["role", "siteId"] as const;

export interface GiveRoleFormProps {
  userId: string;
  manageableSites: readonly ManageableSite[];
  canGrantNetworkWide: boolean;
}

export function GiveRoleForm({ userId, manageableSites, canGrantNetworkWide }: GiveRoleFormProps) {
  const giveRole = useGiveRole(userId);
  const [given, setGiven] = useState<string | null>(null);
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    reset,
    formState: { errors },
  } = useForm<GrantDraft, unknown, GrantInput>({
    resolver: grantResolver,
    defaultValues: emptyGrantDraft(manageableSites),
  });
  const draft = useWatch({ control });
  const roleField = register("role");

  const submit = handleSubmit((grant) => {
    setGiven(null);
    giveRole.mutate(grant, {
      onSuccess: (person) => {
        const added = person.grants.find(
          (held) => held.role === grant.role && held.siteId === grant.siteId,
        );
        setGiven(added ? describeGrant(added) : "The role");
        reset(emptyGrantDraft(manageableSites));
      },
      onError: (error) => showServerFieldErrors(error, setError, fieldNames),
    });
  });

  const formMessage = formLevelMessage(
    giveRole.error,
    fieldNames,
    "The role could not be given. Please try again.",
  );

  return (
    <form
      noValidate
      onSubmit={submit}
      aria-labelledby="give-role-heading"
      className="flex flex-col gap-4"
    >
      <h3 id="give-role-heading" className="font-semibold">
        Give a role
      </h3>
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not give the role">
          {formMessage}
        </Alert>
      ) : null}
      {given && !giveRole.isPending ? (
        <Alert role="status" tone="success">
          {`Given: ${given}.`}
        </Alert>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Role"
          placeholder="Choose a role"
          options={roleOptions}
          error={errors.role?.message}
          {...roleField}
          onChange={async (event) => {
            await roleField.onChange(event);
            if (
              draft.siteId === networkWideValue &&
              !offersNetworkWide(event.target.value, canGrantNetworkWide)
            ) {
              setValue("siteId", "");
            }
          }}
        />
        <SelectField
          label="Site"
          placeholder="Choose a site"
          options={siteOptions(draft.role ?? "", manageableSites, canGrantNetworkWide)}
          error={siteErrorMessage(
            { role: draft.role ?? "", siteId: draft.siteId ?? "" },
            errors.siteId?.message,
          )}
          {...register("siteId")}
        />
      </div>
      <Button
        type="submit"
        variant="secondary"
        disabled={giveRole.isPending}
        aria-busy={giveRole.isPending || undefined}
        className="self-start"
      >
        {giveRole.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Give role
      </Button>
    </form>
  );
}
