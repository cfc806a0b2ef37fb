import type { Permission } from "@shared/permissions";
import {
  type ActionDetail,
  actionNoteBodySchema,
  actionReasonBodySchema,
} from "@shared/schemas/actions";
import {
  actionMoves,
  actionStateHints,
  availableMoves,
  type ActionMoveName,
} from "@shared/workflow/action-workflow";
import { useIsMutating } from "@tanstack/react-query";
import { type ChangeEvent, type FormEvent, type ReactNode, useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { FieldError } from "@/components/ui/field";
import { CameraIcon } from "@/components/ui/icons";
import { SelectField } from "@/components/ui/select-field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { isApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";

import { addProofMutationKey, useAddProof } from "../api/add-proof";
import { useAssignAction } from "../api/assign-action";
import { useActionAssignees } from "../api/get-action-assignees";
import { useMakeMove, type WordMove } from "../api/make-move";
import { createProofIds, mayResendUpload } from "../lib/proof-ids";

export interface ActionMovesProps {
  detail: ActionDetail;
  /** Whether the person holds a permission at the action's site. */
  can: (permission: Permission) => boolean;
}

/** The field's own message from the server, else the whole refusal when no field explains it. */
function refusal(error: unknown, field: string, fallback: string) {
  if (!error) return { field: undefined, form: null };
  if (!isApiError(error)) return { field: undefined, form: fallback };
  const message = error.fieldError(field);
  return message ? { field: message, form: null } : { field: undefined, form: error.message };
}

function FormProblem({ message }: { message: string | null }) {
  if (!message) return null;
  return (
    <Alert role="alert" tone="error">
      {message}
    </Alert>
  );
}

interface TextMoveProps {
  label: string;
  hint?: string;
  buttonLabel: string;
  field: "note" | "reason";
  variant?: "primary" | "secondary" | "danger";
  pending: boolean;
  /** The server's refusal of the last attempt. */
  error: unknown;
  /** An extra refusal shown beside another control (the photo), which the form must not repeat. */
  otherFieldKeys?: readonly string[];
  onSubmit: (text: string, done: () => void) => void;
}

/** One move that needs a few words; the text survives every refusal and clears only on success. */
function TextMove({
  label,
  hint,
  buttonLabel,
  field,
  variant = "primary",
  pending,
  error,
  otherFieldKeys = [],
  onSubmit,
}: TextMoveProps) {
  const [text, setText] = useState("");
  const [localError, setLocalError] = useState<string | undefined>(undefined);
  const schema = field === "note" ? actionNoteBodySchema : actionReasonBodySchema;
  const server = refusal(error, field, "That did not go through. Please try again.");
  const explainedElsewhere =
    isApiError(error) && otherFieldKeys.some((key) => error.fieldError(key));

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = schema.safeParse({ [field]: text });
    if (!parsed.success) {
      setLocalError(parsed.error.issues[0]?.message ?? "Write a few words first.");
      return;
    }
    setLocalError(undefined);
    onSubmit(text.trim(), () => setText(""));
  };

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3">
      <TextAreaField
        label={label}
        hint={hint}
        value={text}
        maxLength={2000}
        onChange={(event) => {
          setText(event.target.value);
          if (localError) setLocalError(undefined);
        }}
        error={localError ?? server.field}
      />
      {explainedElsewhere ? null : <FormProblem message={localError ? null : server.form} />}
      <Button type="submit" variant={variant} disabled={pending} className="self-start">
        {pending ? <SpinnerGlyph /> : null}
        {buttonLabel}
      </Button>
    </form>
  );
}

function photoProblem(error: unknown): string | null {
  if (!error) return null;
  if (!isApiError(error)) return "The photo could not be added. Please try again.";
  return error.fieldError("photo") ?? error.message;
}

interface ProofPickerProps {
  actionId: string;
  hasCurrentProof: boolean;
  /** Why sending was refused when it was about the photo. */
  proofError: string | undefined;
  onAdded: () => void;
}

export const proofInputLabel = actionMoves.add_photo.label;

/** Opens the camera on a phone; the photo uploads at once and joins this attempt's proof. */
function ProofPicker({ actionId, hasCurrentProof, proofError, onAdded }: ProofPickerProps) {
  const addProof = useAddProof(actionId);
  const [proofIds] = useState(() => createProofIds());
  const inputId = useId();
  const hintId = `${inputId}-hint`;
  const errorId = `${inputId}-error`;
  const input = useRef<HTMLInputElement>(null);
  const problem = photoProblem(addProof.error) ?? (addProof.isPending ? null : proofError);

  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = "";
    if (!file) return;
    addProof.mutate(
      { id: proofIds.idFor(file), file },
      {
        onSuccess: () => {
          proofIds.settle(file);
          onAdded();
        },
        onError: (error) => {
          // Kept after a lost reply, so choosing the same picture again sends the same id.
          if (!mayResendUpload(error)) proofIds.settle(file);
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-2">
      <label
        htmlFor={inputId}
        className={cn(
          "inline-flex min-h-tap cursor-pointer items-center justify-center gap-2 self-start rounded-lg border border-surface-line bg-surface px-5 py-3 text-lg font-semibold text-brand-800 hover:bg-brand-50",
          "has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-brand-600",
          addProof.isPending && "cursor-wait opacity-60",
        )}
      >
        {addProof.isPending ? <SpinnerGlyph /> : <CameraIcon />}
        {proofInputLabel}
        <input
          ref={input}
          id={inputId}
          type="file"
          accept="image/*"
          capture="environment"
          className="sr-only"
          disabled={addProof.isPending}
          aria-invalid={problem ? true : undefined}
          aria-describedby={cn(hintId, problem && errorId)}
          onChange={choose}
        />
      </label>
      <p id={hintId} className="text-sm text-ink-muted">
        {addProof.isPending
          ? "Uploading the photo…"
          : hasCurrentProof
            ? "There is a photo of this fix. Add another if it helps the auditor see it."
            : `A photo of the fix is needed before you can "${actionMoves.ask_check.label}".`}
      </p>
      {problem ? <FieldError id={errorId}>{problem}</FieldError> : null}
    </div>
  );
}

function AssignMove({ detail }: { detail: ActionDetail }) {
  const { action } = detail;
  const assignees = useActionAssignees(action.siteId);
  const assign = useAssignAction(action.id);
  const [choice, setChoice] = useState("");
  const [saved, setSaved] = useState<string | null>(null);
  const options = (assignees.data ?? [])
    .filter((person) => person.id !== action.assignee?.id)
    .map((person) => ({ value: person.id, label: person.name }));
  const server = refusal(assign.error, "assigneeId", "The owner could not be changed.");

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!choice) return;
    const name = options.find((option) => option.value === choice)?.label ?? "them";
    setSaved(null);
    assign.mutate(choice, {
      onSuccess: () => {
        setChoice("");
        setSaved(`The action is now ${name}'s.`);
      },
    });
  };

  if (assignees.isError) {
    return <p className="text-sm text-ink-muted">Who may own this action could not be loaded.</p>;
  }
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3">
      <SelectField
        label="New owner"
        placeholder={assignees.isPending ? "Loading…" : "Choose a facilities lead"}
        options={options}
        value={choice}
        onChange={(event) => setChoice(event.target.value)}
        error={server.field}
        hint={
          options.length === 0 && !assignees.isPending
            ? "No other facilities lead holds a role at this site."
            : undefined
        }
      />
      <FormProblem message={server.form} />
      {saved ? (
        <Alert role="status" tone="success">
          {saved}
        </Alert>
      ) : null}
      <Button
        type="submit"
        variant="secondary"
        disabled={!choice || assign.isPending}
        className="self-start"
      >
        {assign.isPending ? <SpinnerGlyph /> : null}
        {actionMoves.assign.label}
      </Button>
    </form>
  );
}

function MoveSection({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section
      aria-label={title}
      className="flex flex-col gap-3 border-t border-surface-line pt-4 first:border-t-0 first:pt-0"
    >
      <h3 className="font-semibold">{title}</h3>
      {children}
    </section>
  );
}

/** The words each move asks for, beside the hint the workflow table gives. */
const wordsFor: Partial<Record<WordMove, { label: string; hint: string; done: string }>> = {
  ask_check: {
    label: "Note for the auditor",
    hint: "Say what was fixed and where, so the auditor knows what to look for.",
    done: "An auditor of the site is asked to check the fix.",
  },
  confirm: {
    label: "What you saw",
    hint: "Say what you saw on site or in the photos.",
    done: "The fix is confirmed: this action is done.",
  },
  send_back: {
    label: "Why it goes back",
    hint: actionMoves.send_back.hint,
    done: "Sent back to its owner, who needs a new photo of the fix.",
  },
  reopen: {
    label: "Why reopen",
    hint: actionMoves.reopen.hint,
    done: "The action is reopened and back with its owner.",
  },
};

const moveDone: Record<WordMove, string> = {
  start: "You have started fixing this.",
  ask_check: wordsFor.ask_check!.done,
  confirm: wordsFor.confirm!.done,
  send_back: wordsFor.send_back!.done,
  reopen: wordsFor.reopen!.done,
};

interface WordMoveProps {
  move: WordMove;
  /** A photo upload in flight: asking for a check waits for it. */
  uploading: boolean;
  onDone: (message: string) => void;
  mutation: ReturnType<typeof useMakeMove>;
}

/** A move from the workflow table that needs a button and, at most, a few words. */
function WordMoveForm({ move, uploading, onDone, mutation }: WordMoveProps) {
  const rule = actionMoves[move];
  const words = wordsFor[move];
  if (!words) {
    return (
      <>
        <p className="text-sm text-ink-muted">{rule.hint}</p>
        <FormProblem message={mutation.error ? mutation.error.message : null} />
        <Button
          size="lg"
          className="self-start"
          disabled={mutation.isPending}
          onClick={() => mutation.mutate(undefined, { onSuccess: () => onDone(moveDone[move]) })}
        >
          {mutation.isPending ? <SpinnerGlyph /> : null}
          {rule.label}
        </Button>
      </>
    );
  }
  return (
    <>
      {rule.needs === "reason" ? null : <p className="text-sm text-ink-muted">{rule.hint}</p>}
      <TextMove
        label={words.label}
        hint={words.hint}
        buttonLabel={rule.label}
        field={rule.needs === "reason" ? "reason" : "note"}
        variant={move === "send_back" ? "danger" : move === "reopen" ? "secondary" : "primary"}
        pending={mutation.isPending || (rule.needsProofOfAttempt && uploading)}
        error={mutation.error}
        otherFieldKeys={rule.needsProofOfAttempt ? ["proof"] : []}
        onSubmit={(text, clear) =>
          mutation.mutate(text, {
            onSuccess: () => {
              clear();
              onDone(moveDone[move]);
            },
          })
        }
      />
    </>
  );
}

/**
 * What this person may do next: the moves the workflow table allows from the action's state to
 * someone holding their permissions at its site, in the table's order.
 */
export function ActionMoves({ detail, can }: ActionMovesProps) {
  const { action, proofs } = detail;
  const mutations: Record<WordMove, ReturnType<typeof useMakeMove>> = {
    start: useMakeMove(action.id, "start"),
    ask_check: useMakeMove(action.id, "ask_check"),
    confirm: useMakeMove(action.id, "confirm"),
    send_back: useMakeMove(action.id, "send_back"),
    reopen: useMakeMove(action.id, "reopen"),
  };
  const uploading = useIsMutating({ mutationKey: addProofMutationKey(action.id) }) > 0;
  const [notice, setNotice] = useState<string | null>(null);
  const hasCurrentProof = proofs.some((proof) => proof.current);
  const askCheck = mutations.ask_check;
  const proofError = isApiError(askCheck.error) ? askCheck.error.fieldError("proof") : undefined;
  const moves = availableMoves(action.state, can);

  const section = (move: ActionMoveName): ReactNode => {
    const title = move === "add_photo" ? "Photo of the fix" : actionMoves[move].label;
    if (move === "add_photo") {
      return (
        <MoveSection key={move} title={title}>
          <ProofPicker
            actionId={action.id}
            hasCurrentProof={hasCurrentProof}
            proofError={proofError}
            onAdded={() => {
              askCheck.reset();
              setNotice("The photo is added.");
            }}
          />
        </MoveSection>
      );
    }
    if (move === "assign") {
      return (
        <MoveSection key={move} title="Owner">
          <AssignMove detail={detail} />
        </MoveSection>
      );
    }
    return (
      <MoveSection key={move} title={title}>
        <WordMoveForm
          move={move}
          uploading={uploading}
          mutation={mutations[move]}
          onDone={(message) => setNotice(message)}
        />
      </MoveSection>
    );
  };

  return (
    <Card>
      <h2 className="text-lg font-semibold">What happens next</h2>
      {notice ? (
        <Alert role="status" tone="success" className="mt-3">
          {notice}
        </Alert>
      ) : null}
      {moves.length === 0 ? (
        <p className="mt-2 text-ink-muted">
          {actionStateHints[action.state]}{" "}
          {action.state === "done" ? "An auditor may reopen it if the gap returns." : null}
        </p>
      ) : (
        <div className="mt-4 flex flex-col gap-4" onSubmitCapture={() => setNotice(null)}>
          {moves.map(section)}
        </div>
      )}
    </Card>
  );
}
