import { zodResolver } from "@hookform/resolvers/zod";
import { floorBodySchema } from "@shared/schemas/floors";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";
import { numberText } from "@/lib/form-values";

import { type CreateFloorBody, useCreateFloor } from "../api/create-floor";

const floorFormSchema = z.object({
  building: floorBodySchema.shape.building,
  level: numberText(floorBodySchema.shape.level),
  name: floorBodySchema.shape.name,
});
type FloorFormValues = z.input<typeof floorFormSchema>;

const fieldNames = ["building", "level", "name"] as const;

export interface AddFloorFormProps {
  siteId: string;
}

export function AddFloorForm({ siteId }: AddFloorFormProps) {
  const create = useCreateFloor(siteId);
  const [added, setAdded] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<FloorFormValues, unknown, CreateFloorBody>({
    resolver: zodResolver(floorFormSchema),
    defaultValues: { building: "", level: "", name: "" },
  });

  const submit = handleSubmit((body) => {
    setAdded(null);
    create.mutate(body, {
      onSuccess: (floor) => {
        // Keep the building: the next floor is usually in the same one.
        reset({ building: floor.building, level: "", name: "" });
        setAdded(`${floor.name} is added.`);
      },
      onError: (error) => showServerFieldErrors(error, setError, fieldNames),
    });
  });

  const formMessage = formLevelMessage(
    create.error,
    fieldNames,
    "The floor could not be added. Please try again.",
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {formMessage ? (
        <Alert role="alert" tone="error" title="Could not add the floor">
          {formMessage}
        </Alert>
      ) : null}
      {added ? (
        <Alert role="status" tone="success">
          {added}
        </Alert>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,2fr)]">
        <TextField
          label="Building"
          hint="Such as Main block."
          autoComplete="off"
          error={errors.building?.message}
          {...register("building")}
        />
        <TextField
          label="Level"
          hint="0 is the ground floor."
          autoComplete="off"
          error={errors.level?.message}
          {...register("level")}
        />
        <TextField
          label="Name"
          hint="Such as Ward 4 East."
          autoComplete="off"
          error={errors.name?.message}
          {...register("name")}
        />
      </div>
      <Button
        type="submit"
        variant="secondary"
        disabled={create.isPending}
        aria-busy={create.isPending || undefined}
        className="self-start"
      >
        {create.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Add floor
      </Button>
    </form>
  );
}
