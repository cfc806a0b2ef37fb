import { zodResolver } from "@hookform/resolvers/zod";
import { type InviteBody, inviteBodySchema, type Person } from "@shared/schemas/people";
import {
  type Control,
  type FieldErrors,
  type Resolver,
  useFieldArray,
  useForm,
  type UseFormRegister,
  type UseFormSetValue,
  useWatch,
} from "react-hook-form";
import type { z } from "zod";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { FieldError } from "@/components/ui/field";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { formLevelMessage } from "@/lib/form-errors";

import { useInvitePerson } from "../api/invite-person";
import {
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

interface InviteFormValues {
  name: string;
  email: string;
  grants: GrantDraft[];
}

const validateInvite = zodResolver(inviteBodySchema);

// The selects hold strings; the contract wants null for a network-wide grant. Convert, then let
// the shared schema decide, so its messages and field paths are the server's own.
const inviteResolver: Resolver<InviteFormValues, unknown, InviteBody> = (
  values,
  context,
  options,
) =>
  validateInvite(
    { ...values, grants: values.grants.map(grantFromDraft) } as z.input<typeof inviteBodySchema>,
    context,
    options as unknown as Parameters<typeof validateInvite>[2],
  );

/** Every field name the server may name, for the rows on screen now. */
function serverFieldNames(rowCount: number) {
  const names: string[] = ["name", "email"];
  for (let index = 0; index < rowCount; index += 1) {
    names.push(`grants.${index}.role`, `grants.${index}.siteId`, `grants.${index}`);
  }
  return [...names, "grants"];
}

interface GrantRowProps {
  index: number;
  rowCount: number;
  control: Control<InviteFormValues, unknown, InviteBody>;
  register: UseFormRegister<InviteFormValues>;
  setValue: UseFormSetValue<InviteFormValues>;
  errors: FieldErrors<InviteFormValues>;
  manageableSites: readonly ManageableSite[];
  canGrantNetworkWide: boolean;
  onRemove: () => void;
}

function GrantRow({
  index,
  rowCount,
  control,
  register,
  setValue,
  errors,
  manageableSites,
  canGrantNetworkWide,
  onRemove,
}: GrantRowProps) {
  const draft = useWatch({ control, name: `grants.${index}` });
  const roleField = register(`grants.${index}.role`);
  const rowErrors = errors.grants?.[index];

  return (
    <fieldset className="rounded-lg border border-surface-line p-3 sm:p-4">
      <legend className="px-1 text-sm font-semibold text-ink-muted">Role {index + 1}</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Role"
          placeholder="Choose a role"
          options={roleOptions}
          error={rowErrors?.role?.message}
          {...roleField}
          onChange={async (event) => {
            await roleField.onChange(event);
            // A per-site role cannot keep "All sites": ask for a site instead.
            if (
              draft?.siteId === networkWideValue &&
              !offersNetworkWide(event.target.value, canGrantNetworkWide)
            ) {
              setValue(`grants.${index}.siteId`, "");
            }
          }}
        />
        <SelectField
          label="Site"
          placeholder="Choose a site"
          options={siteOptions(draft?.role ?? "", manageableSites, canGrantNetworkWide)}
          error={siteErrorMessage(draft, rowErrors?.siteId?.message ?? rowErrors?.message)}
          {...register(`grants.${index}.siteId`)}
        />
      </div>
      {rowCount > 1 ? (
        <Button variant="quiet" className="mt-2 -ml-2" onClick={onRemove}>
          Remove <span className="sr-only">role {index + 1}</span>
        </Button>
      ) : null}
    </fieldset>
  );
}

export interface InviteFormProps {
  manageableSites: readonly ManageableSite[];
  canGrantNetworkWide: boolean;
  onInvited: (person: Person) => void;
}

export function InviteForm({ manageableSites, canGrantNetworkWide, onInvited }: InviteFormProps) {
  const invite = useInvitePerson();
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    formState: { errors },
  } = useForm<InviteFormValues, unknown, InviteBody>({
    resolver: inviteResolver,
    defaultValues: { name: "", email: "", grants: [emptyGrantDraft(manageableSites)] },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "grants" });

  const submit = handleSubmit((body) => {
    invite.mutate(body, {
      onSuccess: (person) => onInvited(person),
      onError: (error) => {
        if (!isApiError(error)) return;
        let focus = true;
        for (const name of serverFieldNames(fields.length)) {
          const message = error.fieldError(name);
          if (!message) continue;
          // A refusal of a whole role row is shown beside its site, where the fix usually is.
          const target = (/^grants\.\d+$/.test(name) ? `${name}.siteId` : name) as
            `grants.${number}.${"role" | "siteId"}` | "grants" | "name" | "email";
          setError(target, { type: "server", message }, { shouldFocus: focus });
          focus = false;
        }
      },
    });
  });

  const formMessage = formLevelMessage(
    invite.error,
    serverFieldNames(fields.length),
    "The invitation could not be sent. Please try again.",
  );
  const grantsMessage = errors.grants?.root?.message ?? errors.grants?.message;

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-6">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not send the invitation">
          {formMessage}
        </Alert>
      ) : null}

      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Name"
          autoComplete="off"
          error={errors.name?.message}
          {...register("name")}
        />
        <TextField
          label="E-mail"
          type="email"
          inputMode="email"
          autoComplete="off"
          autoCapitalize="none"
          spellCheck={false}
          error={errors.email?.message}
          {...register("email")}
        />
      </div>

      <section aria-labelledby="invite-roles-heading" className="flex flex-col gap-3">
        <div>
          <h2 id="invite-roles-heading" className="text-lg font-semibold">
            Roles
          </h2>
          <p className="text-sm text-ink-muted">
            What they may do, and where. You can add more roles later from their page.
          </p>
        </div>
        {fields.map((field, index) => (
          <GrantRow
            key={field.id}
            index={index}
            rowCount={fields.length}
            control={control}
            register={register}
            setValue={setValue}
            errors={errors}
            manageableSites={manageableSites}
            canGrantNetworkWide={canGrantNetworkWide}
            onRemove={() => remove(index)}
          />
        ))}
        {grantsMessage ? <FieldError>{grantsMessage}</FieldError> : null}
        <div>
          <Button
            variant="secondary"
            disabled={fields.length >= 30}
            onClick={() => append(emptyGrantDraft(manageableSites))}
          >
            Add another role
          </Button>
        </div>
      </section>

      <Button
        type="submit"
        size="lg"
        disabled={invite.isPending}
        aria-busy={invite.isPending || undefined}
        className="w-full sm:w-auto sm:self-start"
      >
        {invite.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Send invitation
      </Button>
    </form>
  );
}
