import { zodResolver } from "@hookform/resolvers/zod";
import { type CreateSiteBody, createSiteBodySchema, type Site } from "@shared/schemas/site";
import { type FieldErrors, useForm, type UseFormRegister } from "react-hook-form";
import { z } from "zod";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { TextField } from "@/components/ui/text-field";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";
import { numberText } from "@/lib/form-values";

import { useCreateSite } from "../api/create-site";
import { useUpdateSite } from "../api/update-site";

const siteFormSchema = z.object({
  name: createSiteBodySchema.shape.name,
  address: createSiteBodySchema.shape.address,
  timeZone: createSiteBodySchema.shape.timeZone,
  latitude: numberText(createSiteBodySchema.shape.latitude),
  longitude: numberText(createSiteBodySchema.shape.longitude),
});
type SiteFormValues = z.input<typeof siteFormSchema>;

const editSiteFormSchema = siteFormSchema.extend({
  reason: z.string().trim().max(500, { message: "At most 500 characters." }),
});
type EditSiteFormValues = z.input<typeof editSiteFormSchema>;

const siteFieldNames = ["name", "address", "timeZone", "latitude", "longitude"] as const;

let timeZoneNames: readonly string[] | undefined;

/** Every zone the browser knows, for suggestions; the server still checks the name. */
function knownTimeZones(): readonly string[] {
  if (!timeZoneNames) {
    const names =
      typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : [];
    timeZoneNames = names.includes("UTC") ? names : [...names, "UTC"];
  }
  return timeZoneNames;
}

interface SiteFieldsProps {
  register: UseFormRegister<SiteFormValues>;
  errors: FieldErrors<SiteFormValues>;
  listId: string;
}

function SiteFields({ register, errors, listId }: SiteFieldsProps) {
  return (
    <>
      <TextField
        label="Name"
        autoComplete="off"
        error={errors.name?.message}
        {...register("name")}
      />
      <TextAreaField
        label="Address"
        rows={2}
        autoComplete="off"
        error={errors.address?.message}
        {...register("address")}
      />
      <TextField
        label="Time zone"
        hint="A name such as Europe/London or America/Chicago; start typing for suggestions."
        list={listId}
        autoComplete="off"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.timeZone?.message}
        {...register("timeZone")}
      />
      <datalist id={listId}>
        {knownTimeZones().map((zone) => (
          <option key={zone} value={zone} />
        ))}
      </datalist>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Latitude"
          hint="Decimal degrees, north positive."
          inputMode="decimal"
          autoComplete="off"
          error={errors.latitude?.message}
          {...register("latitude")}
        />
        <TextField
          label="Longitude"
          hint="Decimal degrees, east positive."
          inputMode="decimal"
          autoComplete="off"
          error={errors.longitude?.message}
          {...register("longitude")}
        />
      </div>
    </>
  );
}

function SubmitButton({ pending, children }: { pending: boolean; children: string }) {
  return (
    <Button
      type="submit"
      size="lg"
      disabled={pending}
      aria-busy={pending || undefined}
      className="w-full sm:w-auto sm:self-start"
    >
      {pending ? <SpinnerGlyph className="size-5" /> : null}
      {children}
    </Button>
  );
}

export interface CreateSiteFormProps {
  onCreated: (site: Site) => void;
}

export function CreateSiteForm({ onCreated }: CreateSiteFormProps) {
  const create = useCreateSite();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SiteFormValues, unknown, CreateSiteBody>({
    resolver: zodResolver(siteFormSchema),
    defaultValues: { name: "", address: "", timeZone: "", latitude: "", longitude: "" },
  });

  const submit = handleSubmit((body) => {
    create.mutate(body, {
      onSuccess: onCreated,
      onError: (error) => showServerFieldErrors(error, setError, siteFieldNames),
    });
  });

  const formMessage = formLevelMessage(
    create.error,
    siteFieldNames,
    "The site could not be added. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not add the site">
          {formMessage}
        </Alert>
      ) : null}
      <SiteFields register={register} errors={errors} listId="new-site-time-zones" />
      <SubmitButton pending={create.isPending}>Add site</SubmitButton>
    </form>
  );
}

export interface EditSiteFormProps {
  site: Site;
  onSaved: (site: Site) => void;
}

export function EditSiteForm({ site, onSaved }: EditSiteFormProps) {
  const update = useUpdateSite(site.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<EditSiteFormValues, unknown, z.output<typeof editSiteFormSchema>>({
    resolver: zodResolver(editSiteFormSchema),
    defaultValues: {
      name: site.name,
      address: site.address,
      timeZone: site.timeZone,
      latitude: String(site.latitude),
      longitude: String(site.longitude),
      reason: "",
    },
  });

  const submit = handleSubmit(({ reason, ...values }) => {
    // Only what changed is sent, so the change log records what really moved.
    const changes: Partial<CreateSiteBody> = {};
    for (const name of siteFieldNames) {
      if (values[name] !== site[name]) Object.assign(changes, { [name]: values[name] });
    }
    if (Object.keys(changes).length === 0) {
      setError("root", { message: "Nothing has changed yet. Change a field, then save." });
      return;
    }
    update.mutate(
      { ...changes, ...(reason ? { reason } : {}) },
      {
        onSuccess: onSaved,
        onError: (error) =>
          showServerFieldErrors(error, setError, [...siteFieldNames, "reason"] as const),
      },
    );
  });

  const formMessage =
    errors.root?.message ??
    formLevelMessage(
      update.error,
      [...siteFieldNames, "reason"],
      "The changes could not be saved. Please try again.",
    );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not save the changes">
          {formMessage}
        </Alert>
      ) : null}
      <SiteFields register={register} errors={errors} listId="edit-site-time-zones" />
      <TextAreaField
        label="Reason for the change"
        hint="Optional. Kept in the site's change history."
        error={errors.reason?.message}
        {...register("reason")}
      />
      <SubmitButton pending={update.isPending}>Save changes</SubmitButton>
    </form>
  );
}
