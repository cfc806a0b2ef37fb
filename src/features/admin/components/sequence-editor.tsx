import { useId, useRef, useState } from "react";
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
import { ConfirmStep } from "@/components/ui/confirm-step";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { TextField } from "@/components/ui/text-field";

import { useDiscardSequenceDraft } from "../api/discard-sequence-draft";
import { usePublishSequence } from "../api/publish-sequence";
import { useSaveSequenceDraft } from "../api/save-sequence-draft";
import {
  breachKindLabels,
  breachKinds,
  newStep,
  type SequenceDraft,
  type SequenceFormValues,
  sequenceKindLabels,
  sequenceKeyFrom,
  sequenceResolver,
} from "../lib/sequence-form";
import { Checkbox, EditorActions, problemText, ReorderButtons } from "./editor-parts";

type Control_ = Control<SequenceFormValues, unknown, SequenceDraft>;

interface StepFieldsProps {
  index: number;
  count: number;
  control: Control_;
  register: UseFormRegister<SequenceFormValues>;
  errors: FieldErrors<SequenceFormValues>;
  onMove: (from: number, to: number) => void;
  onRemove: (index: number) => void;
}

function StepFields({
  index,
  count,
  control,
  register,
  errors,
  onMove,
  onRemove,
}: StepFieldsProps) {
  const legendId = useId();
  const stepKey = useWatch({ control, name: `steps.${index}.key` });
  const stepErrors = errors.steps?.[index];
  const number = index + 1;
  return (
    <li className="rounded-card border border-surface-line bg-surface p-4">
      <fieldset aria-labelledby={legendId} className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h3 id={legendId} className="font-semibold">
            Step {number}
            {stepKey ? null : <span className="ml-2 text-sm font-normal text-ink-muted">new</span>}
          </h3>
          <ReorderButtons
            index={index}
            count={count}
            name={`step ${number}`}
            removeLabel="Remove"
            canRemove={count > 1}
            onMove={onMove}
            onRemove={onRemove}
          />
        </div>
        <TextAreaField
          label="Read aloud"
          hint="The words the observer reads to the person, before they do the step."
          rows={3}
          error={stepErrors?.text?.message}
          {...register(`steps.${index}.text`)}
        />
        <Checkbox
          label="Includes a hand-hygiene moment"
          {...register(`steps.${index}.handHygiene`)}
        />
        <fieldset className="flex flex-col rounded-lg border border-surface-line p-3">
          <legend className="px-1 font-semibold">Breaches to watch for</legend>
          {breachKinds.map((kind) => (
            <label key={kind} className="flex min-h-tap items-center gap-3">
              <input
                type="checkbox"
                value={kind}
                className="size-5 shrink-0 accent-brand-700"
                {...register(`steps.${index}.watchFor`)}
              />
              {breachKindLabels[kind]}
            </label>
          ))}
          {stepErrors?.watchFor?.message ? (
            <p className="text-sm font-semibold text-verdict-not-ready">
              {stepErrors.watchFor.message}
            </p>
          ) : null}
        </fieldset>
        <TextField
          label="Reference"
          hint="The published source, or “Common practice”."
          autoComplete="off"
          error={stepErrors?.reference?.message}
          {...register(`steps.${index}.reference`)}
        />
      </fieldset>
    </li>
  );
}

export interface SequenceEditorProps {
  /** Null for a sequence that does not exist yet: its key is typed or made from the title. */
  sequenceKey: string | null;
  /** Keys already in use, so a new sequence does not take over another. */
  takenKeys: readonly string[];
  /** The version the draft would publish as. */
  nextVersion: number;
  initialValues: SequenceFormValues;
  hasSavedDraft: boolean;
  onDone: (message: string) => void;
  onCancel: () => void;
}

type Confirming = "publish" | "discard" | null;

/**
 * Edits a sequence's next version: reword, reorder, remove and add steps, save the draft and
 * publish it. Observations already recorded keep the version they followed.
 */
export function SequenceEditor({
  sequenceKey,
  takenKeys,
  nextVersion,
  initialValues,
  hasSavedDraft,
  onDone,
  onCancel,
}: SequenceEditorProps) {
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors, isDirty },
    reset,
  } = useForm<SequenceFormValues, unknown, SequenceDraft>({
    defaultValues: initialValues,
    resolver: sequenceResolver,
  });
  const { fields, append, move, remove } = useFieldArray({ control, name: "steps" });
  const title = useWatch({ control, name: "title" });
  const key = sequenceKey ?? initialValues.key;
  const typedKey = useWatch({ control, name: "key" });
  const targetKey = sequenceKey ?? typedKey;
  const save = useSaveSequenceDraft(targetKey);
  const publish = usePublishSequence(targetKey);
  const discard = useDiscardSequenceDraft(key);
  const [notice, setNotice] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<Confirming>(null);
  const publishButton = useRef<HTMLButtonElement>(null);
  const discardButton = useRef<HTMLButtonElement>(null);
  const busy = save.isPending || publish.isPending || discard.isPending;
  const failure = save.error ?? publish.error ?? discard.error;
  const name = title.trim() || "this sequence";

  /** A new sequence may not reuse a key: saving would replace that sequence's draft. */
  const keyTaken = (draft: SequenceDraft) => {
    if (sequenceKey === null && takenKeys.includes(draft.key)) {
      setError("key", { type: "validation", message: "Another sequence has this key already." });
      return true;
    }
    return false;
  };

  const onSave = handleSubmit(async (draft) => {
    setNotice(null);
    if (keyTaken(draft)) return;
    await save.mutateAsync(draft.body).then(
      () => {
        reset(undefined, { keepValues: true });
        setNotice(`Draft saved. Publish it as version ${nextVersion} when it is ready.`);
      },
      () => undefined,
    );
  });

  const askToPublish = handleSubmit((draft) => {
    setNotice(null);
    if (keyTaken(draft)) return;
    setConfirming("publish");
  });

  const onPublish = handleSubmit(async (draft) => {
    try {
      await save.mutateAsync(draft.body);
      await publish.mutateAsync();
      onDone(
        `${draft.body.title}, version ${nextVersion}, is published. Observations started from now on follow it.`,
      );
    } catch {
      setConfirming(null);
    }
  });

  return (
    <form
      noValidate
      onSubmit={(event) => void onSave(event)}
      className="flex flex-col gap-5"
      aria-label={`${name}, draft of version ${nextVersion}`}
    >
      <TextField
        label="Title"
        error={errors.title?.message}
        {...register("title", {
          // A new sequence's key is offered from its title; the administrator may change it.
          onBlur: () => {
            if (sequenceKey === null && getValues("key") === "")
              setValue("key", sequenceKeyFrom(getValues("title")));
          },
        })}
      />
      {sequenceKey === null ? (
        <TextField
          label="Key"
          hint="Lower-case letters, digits and dashes, such as removal-enhanced. It never changes."
          autoComplete="off"
          autoCapitalize="none"
          error={errors.key?.message}
          {...register("key")}
        />
      ) : null}
      <SelectField
        label="Kind"
        placeholder="Choose putting on or removal"
        options={(["putting_on", "removal"] as const).map((value) => ({
          value,
          label: sequenceKindLabels[value],
        }))}
        error={errors.kind?.message}
        {...register("kind")}
      />
      <TextAreaField
        label="Note"
        hint="Shown beside the title, for instance that the sequence is Lintel's draft from common practice."
        rows={2}
        error={errors.note?.message}
        {...register("note")}
      />
      <p className="text-sm text-ink-muted">
        Steps keep their history when reworded. Observations already recorded keep the version they
        followed.
      </p>
      {errors.steps?.root?.message ? (
        <Alert role="alert" tone="error">
          {errors.steps.root.message}
        </Alert>
      ) : null}
      <ol className="flex flex-col gap-4">
        {fields.map((field, index) => (
          <StepFields
            key={field.id}
            index={index}
            count={fields.length}
            control={control}
            register={register}
            errors={errors}
            onMove={move}
            onRemove={remove}
          />
        ))}
      </ol>
      <Button variant="secondary" className="self-start" onClick={() => append(newStep())}>
        Add step
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
      {confirming === "publish" ? (
        <ConfirmStep
          title={`Publish version ${nextVersion} of ${name}?`}
          confirmLabel={`Publish version ${nextVersion}`}
          pending={busy}
          returnFocusRef={publishButton}
          onConfirm={() => void onPublish()}
          onCancel={() => setConfirming(null)}
        >
          <p>
            Observers use it for every observation started from now on. Observations already
            recorded keep the version they followed, and a published version never changes.
          </p>
        </ConfirmStep>
      ) : null}
      {confirming === "discard" ? (
        <ConfirmStep
          title={`Discard the draft of version ${nextVersion}?`}
          confirmLabel="Discard draft"
          pending={busy}
          returnFocusRef={discardButton}
          onConfirm={() =>
            discard.mutate(undefined, {
              onSuccess: () => onDone(`The draft of ${name} is discarded.`),
              onError: () => setConfirming(null),
            })
          }
          onCancel={() => setConfirming(null)}
        >
          <p>The changes saved in it are lost. The published version stays in use.</p>
        </ConfirmStep>
      ) : null}

      <EditorActions>
        <Button type="submit" disabled={busy}>
          {save.isPending && !publish.isPending ? <SpinnerGlyph className="size-5" /> : null}
          Save draft
        </Button>
        <Button
          ref={publishButton}
          variant="secondary"
          disabled={busy}
          onClick={() => void askToPublish()}
        >
          Publish version {nextVersion}
        </Button>
        {hasSavedDraft ? (
          <Button
            ref={discardButton}
            variant="quiet"
            disabled={busy}
            onClick={() => setConfirming("discard")}
          >
            Discard draft
          </Button>
        ) : null}
        <Button variant="quiet" disabled={busy} onClick={onCancel}>
          {isDirty ? "Leave without saving" : "Back to sequences"}
        </Button>
      </EditorActions>
    </form>
  );
}
