import { zodResolver } from "@hookform/resolvers/zod";
import { updateProfileBodySchema } from "@shared/schemas/people";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

import { useUpdateProfile } from "../api/update-profile";

export interface ProfileFormProps {
  name: string;
}

/** The name colleagues see on audits, actions and the people list. */
export function ProfileForm({ name }: ProfileFormProps) {
  const update = useUpdateProfile();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isDirty },
  } = useForm({ resolver: zodResolver(updateProfileBodySchema), defaultValues: { name } });

  const submit = handleSubmit((body) => {
    update.mutate(body, {
      onSuccess: (me) => reset({ name: me.user.name }),
      onError: (error) => showServerFieldErrors(error, setError, ["name"]),
    });
  });

  const formMessage = formLevelMessage(
    update.error,
    ["name"],
    "Your name could not be saved. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not save your name">
          {formMessage}
        </Alert>
      ) : null}
      {update.isSuccess && !isDirty ? (
        <Alert role="status" tone="success">
          Your name is saved.
        </Alert>
      ) : null}
      <TextField
        label="Name"
        autoComplete="name"
        error={errors.name?.message}
        {...register("name")}
      />
      <Button
        type="submit"
        variant="secondary"
        disabled={update.isPending}
        aria-busy={update.isPending || undefined}
        className="self-start"
      >
        {update.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Save name
      </Button>
    </form>
  );
}
