import { zodResolver } from "@hookform/resolvers/zod";
import type { Space, Suite } from "@shared/schemas/floors";
import { minimumAirChangesLabel } from "@shared/calc/ventilation";
import {
  constructionClasses,
  constructionClassLabels,
  zoneTypeLabels,
  zoneTypes,
} from "@shared/zones";
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { showServerFieldErrors } from "@/lib/form-errors";

import { useCreateSpace } from "../api/create-space";
import { useCreateSuite } from "../api/create-suite";
import { formatArea } from "../lib/measurements";
import {
  emptySpaceForm,
  newSuiteValue,
  spaceBodyFrom,
  spaceFieldNames,
  type SpaceFormOutput,
  spaceFormSchema,
  type SpaceFormValues,
  suiteChoiceOf,
} from "../lib/space-form-values";
import { ToolButtons } from "./tool-panel";

const zoneOptions = zoneTypes.map((zone) => ({ value: zone, label: zoneTypeLabels[zone] }));
const classOptions = constructionClasses.map((value) => ({
  value,
  label: constructionClassLabels[value],
}));

export interface SpaceFormProps {
  floorId: string;
  suites: readonly Suite[];
  polygon: [number, number][];
  /** The drawn outline's area, when the floor has a scale. */
  planAreaM2: number | null;
  onSaved: (space: Space) => void;
  onKeepDrawing: () => void;
  onCancel: () => void;
}

/** What the drawn outline is: its zone type, name, suite and, if known, its measurements. */
export function SpaceForm({
  floorId,
  suites,
  polygon,
  planAreaM2,
  onSaved,
  onKeepDrawing,
  onCancel,
}: SpaceFormProps) {
  const createSuite = useCreateSuite(floorId);
  const createSpace = useCreateSpace(floorId);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    formState: { errors, isSubmitting },
  } = useForm<SpaceFormValues, unknown, SpaceFormOutput>({
    resolver: zodResolver(spaceFormSchema),
    defaultValues: emptySpaceForm,
  });
  const zoneType = useWatch({ control, name: "zoneType" });
  const suite = useWatch({ control, name: "suite" });
  const constructionClass = useWatch({ control, name: "constructionClass" });
  const chosenClass = constructionClasses.find((value) => value === constructionClass);

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    const choice = suiteChoiceOf(values);
    let suiteId: string | null = choice.kind === "existing" ? choice.id : null;
    if (choice.kind === "new") {
      try {
        const created = await createSuite.mutateAsync({ name: choice.name });
        suiteId = created.id;
        // A retry after a refused space must not make a second suite of the same name.
        setValue("suite", created.id);
      } catch (error) {
        const message = isApiError(error) ? error.fieldError("name") : undefined;
        if (message) setError("suiteName", { type: "server", message }, { shouldFocus: true });
        else setFormError(isApiError(error) ? error.message : "The suite could not be added.");
        return;
      }
    }
    try {
      onSaved(await createSpace.mutateAsync(spaceBodyFrom(values, polygon, suiteId)));
    } catch (error) {
      if (!showServerFieldErrors(error, setError, spaceFieldNames)) {
        const polygonProblem = isApiError(error) ? error.fieldError("polygon") : undefined;
        setFormError(
          polygonProblem ??
            (isApiError(error) ? error.message : "The space could not be saved. Please try again."),
        );
      }
    }
  });

  const suiteOptions = [
    ...suites.map((item) => ({ value: item.id, label: item.name })),
    { value: newSuiteValue, label: "New suite…" },
  ];

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {formError ? (
        <Alert role="alert" tone="error" title="Could not save the space">
          {formError}
        </Alert>
      ) : null}
      <SelectField
        label="Zone type"
        placeholder="Choose a zone type"
        options={zoneOptions}
        error={errors.zoneType?.message}
        {...register("zoneType")}
      />
      <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextField
          label="Name"
          hint="As staff call it, such as Doffing area, Ward 6."
          autoComplete="off"
          error={errors.name?.message}
          {...register("name")}
        />
        <TextField
          label="Number"
          hint="Optional: the number on the door."
          autoComplete="off"
          error={errors.number?.message}
          {...register("number")}
        />
      </div>
      <SelectField
        label="Suite"
        hint="A suite groups the spaces that serve one isolation patient: the room, its anteroom, donning zone and doffing area."
        placeholder="No suite"
        options={suiteOptions}
        error={errors.suite?.message}
        {...register("suite")}
      />
      {suite === newSuiteValue ? (
        <TextField
          label="Suite name"
          hint="For example, Isolation suite 3."
          autoComplete="off"
          error={errors.suiteName?.message}
          {...register("suiteName")}
        />
      ) : null}
      {zoneType === "isolation_room" ? (
        <SelectField
          label="Construction class"
          hint={
            chosenClass
              ? `Air changes per hour: ${minimumAirChangesLabel(chosenClass)}.`
              : "Required: decides the air-change minimum the room is audited against (CDC)."
          }
          placeholder="Choose a class"
          options={classOptions}
          error={errors.constructionClass?.message}
          {...register("constructionClass")}
        />
      ) : null}
      <fieldset className="rounded-lg border border-surface-line p-3 sm:p-4">
        <legend className="px-1 text-sm font-semibold text-ink-muted">
          Measurements (optional)
        </legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField
            label="Volume (m³)"
            inputMode="decimal"
            autoComplete="off"
            error={errors.volumeM3?.message}
            {...register("volumeM3")}
          />
          <TextField
            label="Floor area (m²)"
            inputMode="decimal"
            autoComplete="off"
            hint={planAreaM2 !== null ? `From the plan: ${formatArea(planAreaM2)}.` : undefined}
            error={errors.floorAreaM2?.message}
            {...register("floorAreaM2")}
          />
          <TextField
            label="Ceiling height (m)"
            inputMode="decimal"
            autoComplete="off"
            error={errors.ceilingHeightM?.message}
            {...register("ceilingHeightM")}
          />
        </div>
      </fieldset>
      <ToolButtons>
        <Button type="submit" disabled={isSubmitting} aria-busy={isSubmitting || undefined}>
          {isSubmitting ? <SpinnerGlyph className="size-5" /> : null}
          Save space
        </Button>
        <Button variant="secondary" disabled={isSubmitting} onClick={onKeepDrawing}>
          Keep drawing
        </Button>
        <Button variant="secondary" disabled={isSubmitting} onClick={onCancel}>
          Cancel
        </Button>
      </ToolButtons>
    </form>
  );
}
