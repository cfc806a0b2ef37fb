import type { ChecklistDraftBody } from "@shared/schemas/checklists";
import { quantities, responseKinds } from "@shared/schemas/checklists";
import { severities } from "@shared/calc/verdict";
import { type ZoneType, zoneTypeLabels } from "@shared/zones";
import { useId, useState } from "react";
import {
  type Control,
  type FieldErrors,
  useFieldArray,
  useForm,
  type UseFormRegister,
  useWatch,
} from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { TextField } from "@/components/ui/text-field";

import { useDiscardChecklistDraft } from "../api/discard-checklist-draft";
import { usePublishChecklist } from "../api/publish-checklist";
import { useSaveChecklistDraft } from "../api/save-checklist-draft";
import { Checkbox, EditorActions, problemText, ReorderButtons } from "./editor-parts";
import {
  type DraftFormValues,
  draftResolver,
  newItem,
  quantityLabels,
  quantityUnits,
  responseLabels,
  severityLabels,
} from "../lib/checklist-form";

interface ItemFieldsProps {
  index: number;
  count: number;
  control: Control<DraftFormValues, unknown, ChecklistDraftBody>;
  register: UseFormRegister<DraftFormValues>;
  errors: FieldErrors<DraftFormValues>;
  onMove: (from: number, to: number) => void;
  onRetire: (index: number) => void;
}

function ChoiceFields({
  index,
  control,
  register,
  errors,
}: Omit<ItemFieldsProps, "count" | "onMove" | "onRetire">) {
  const { fields, append, remove } = useFieldArray({ control, name: `items.${index}.choices` });
  const itemErrors = errors.items?.[index];
  return (
    <fieldset className="flex flex-col gap-3 rounded-lg border border-surface-line p-3">
      <legend className="px-1 font-semibold">Options</legend>
      {fields.map((field, at) => (
        <div key={field.id} className="grid grid-cols-[minmax(0,1fr)_auto] items-end gap-3">
          <TextField
            label={`Option ${at + 1}`}
            error={itemErrors?.choices?.[at]?.label?.message}
            {...register(`items.${index}.choices.${at}.label`)}
          />
          <div className="flex items-center gap-2">
            <Checkbox label="Passes" {...register(`items.${index}.choices.${at}.passes`)} />
            {fields.length > 2 ? (
              <Button variant="quiet" className="px-2" onClick={() => remove(at)}>
                Remove <span className="sr-only">option {at + 1}</span>
              </Button>
            ) : null}
          </div>
        </div>
      ))}
      {itemErrors?.choices?.root?.message ? (
        <p className="text-sm font-semibold text-verdict-not-ready">
          {itemErrors.choices.root.message}
        </p>
      ) : null}
      {fields.length < 8 ? (
        <Button
          variant="secondary"
          className="self-start"
          onClick={() => append({ value: "", label: "", passes: false })}
        >
          Add option
        </Button>
      ) : null}
    </fieldset>
  );
}

function ItemFields({
  index,
  count,
  control,
  register,
  errors,
  onMove,
  onRetire,
}: ItemFieldsProps) {
  const legendId = useId();
  const response = useWatch({ control, name: `items.${index}.response` });
  const quantity = useWatch({ control, name: `items.${index}.quantity` });
  const itemKey = useWatch({ control, name: `items.${index}.key` });
  const itemErrors = errors.items?.[index];
  const number = index + 1;

  return (
    <li className="rounded-card border border-surface-line bg-surface p-4">
      <fieldset aria-labelledby={legendId} className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h3 id={legendId} className="font-semibold">
            Item {number}
            {itemKey ? null : <span className="ml-2 text-sm font-normal text-ink-muted">new</span>}
          </h3>
          <ReorderButtons
            index={index}
            count={count}
            name={`item ${number}`}
            removeLabel="Retire"
            onMove={onMove}
            onRemove={onRetire}
          />
        </div>
        <TextAreaField
          label="Text"
          rows={2}
          error={itemErrors?.text?.message}
          {...register(`items.${index}.text`)}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Severity"
            placeholder="Choose a severity"
            options={severities.map((value) => ({ value, label: severityLabels[value] }))}
            error={itemErrors?.severity?.message}
            {...register(`items.${index}.severity`)}
          />
          <SelectField
            label="How the auditor answers"
            hint="Pass or fail, a measured reading, a count, or one of a few choices."
            options={responseKinds.map((value) => ({ value, label: responseLabels[value] }))}
            error={itemErrors?.response?.message}
            {...register(`items.${index}.response`)}
          />
        </div>
        {response === "reading" ? (
          <SelectField
            label="Quantity"
            placeholder="Choose what is measured"
            options={quantities.map((value) => ({ value, label: quantityLabels[value] }))}
            error={itemErrors?.quantity?.message}
            {...register(`items.${index}.quantity`)}
          />
        ) : null}
        {response === "reading" || response === "count" ? (
          <div className="grid gap-4 sm:grid-cols-2">
            <SelectField
              label="Limit"
              options={[
                { value: "", label: "None: the auditor judges" },
                { value: ">=", label: "At least" },
                { value: "<=", label: "At most" },
              ]}
              error={itemErrors?.thresholdOp?.message}
              {...register(`items.${index}.thresholdOp`)}
            />
            <TextField
              label={`Limit value${response === "reading" && quantity ? ` (${quantityUnits[quantity]})` : ""}`}
              inputMode="decimal"
              autoComplete="off"
              error={itemErrors?.thresholdValue?.message}
              {...register(`items.${index}.thresholdValue`)}
            />
          </div>
        ) : null}
        {response === "choice" ? (
          <ChoiceFields index={index} control={control} register={register} errors={errors} />
        ) : null}
        <TextField
          label="Reference"
          hint="The published source, or “Common practice”."
          autoComplete="off"
          error={itemErrors?.reference?.message}
          {...register(`items.${index}.reference`)}
        />
        <Checkbox label="Needs a photo when failed" {...register(`items.${index}.photoOnFail`)} />
      </fieldset>
    </li>
  );
}

export interface ChecklistEditorProps {
  zoneType: ZoneType;
  /** The version the draft would publish as. */
  nextVersion: number;
  initialValues: DraftFormValues;
  hasSavedDraft: boolean;
  onDone: (message: string) => void;
  onCancel: () => void;
}

/**
 * Edits a zone type's next checklist: reword, reorder, retire and add items, save the draft and
 * publish it. Audits already started keep the version they began with.
 */
export function ChecklistEditor({
  zoneType,
  nextVersion,
  initialValues,
  hasSavedDraft,
  onDone,
  onCancel,
}: ChecklistEditorProps) {
  const {
    control,
    register,
    handleSubmit,
    formState: { errors, isDirty },
    reset,
  } = useForm<DraftFormValues, unknown, ChecklistDraftBody>({
    defaultValues: initialValues,
    resolver: draftResolver,
  });
  const { fields, append, move, remove } = useFieldArray({ control, name: "items" });
  const save = useSaveChecklistDraft(zoneType);
  const publish = usePublishChecklist(zoneType);
  const discard = useDiscardChecklistDraft(zoneType);
  const [notice, setNotice] = useState<string | null>(null);
  const busy = save.isPending || publish.isPending || discard.isPending;
  const failure = save.error ?? publish.error ?? discard.error;
  const label = zoneTypeLabels[zoneType];

  const onSave = handleSubmit(async (body) => {
    setNotice(null);
    await save.mutateAsync(body).then(
      () => {
        reset(undefined, { keepValues: true });
        setNotice(`Draft saved. Publish it as version ${nextVersion} when it is ready.`);
      },
      () => undefined,
    );
  });

  const onPublish = handleSubmit(async (body) => {
    setNotice(null);
    try {
      await save.mutateAsync(body);
      await publish.mutateAsync();
      onDone(`${label} checklist version ${nextVersion} is published. New audits use it.`);
    } catch {
      // The mutation's error is shown below.
    }
  });

  return (
    <form
      noValidate
      onSubmit={(event) => void onSave(event)}
      className="flex flex-col gap-5"
      aria-label={`${label} checklist, draft of version ${nextVersion}`}
    >
      <TextField label="Title" error={errors.title?.message} {...register("title")} />
      <p className="text-sm text-ink-muted">
        Items keep their history when reworded. Retired items leave new audits but stay in past
        ones.
      </p>
      {errors.items?.root?.message ? (
        <Alert role="alert" tone="error">
          {errors.items.root.message}
        </Alert>
      ) : null}
      <ol className="flex flex-col gap-4">
        {fields.map((field, index) => (
          <ItemFields
            key={field.id}
            index={index}
            count={fields.length}
            control={control}
            register={register}
            errors={errors}
            onMove={move}
            onRetire={remove}
          />
        ))}
      </ol>
      <Button variant="secondary" className="self-start" onClick={() => append(newItem())}>
        Add item
      </Button>

      {failure ? (
        <Alert role="alert" tone="error" title="Not saved">
          <p>{problemText(failure)}</p>
        </Alert>
      ) : null}
      {notice ? (
        <Alert role="status" tone="success">
          {notice}
        </Alert>
      ) : null}

      <EditorActions>
        <Button type="submit" disabled={busy}>
          {save.isPending && !publish.isPending ? <SpinnerGlyph className="size-5" /> : null}
          Save draft
        </Button>
        <Button variant="secondary" disabled={busy} onClick={() => void onPublish()}>
          {publish.isPending ? <SpinnerGlyph className="size-5" /> : null}
          Publish version {nextVersion}
        </Button>
        {hasSavedDraft ? (
          <Button
            variant="quiet"
            disabled={busy}
            onClick={() =>
              discard.mutate(undefined, {
                onSuccess: () => onDone(`The ${label.toLowerCase()} draft is discarded.`),
              })
            }
          >
            Discard draft
          </Button>
        ) : null}
        <Button variant="quiet" disabled={busy} onClick={onCancel}>
          {isDirty ? "Leave without saving" : "Back to checklists"}
        </Button>
      </EditorActions>
    </form>
  );
}
