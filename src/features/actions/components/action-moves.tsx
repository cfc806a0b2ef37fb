import {
  type ActionDetail,
  actionNoteBodySchema,
  actionReasonBodySchema,
} from "@shared/schemas/actions";
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
import { useRejectAction } from "../api/reject-action";
import { useReopenAction } from "../api/reopen-action";
import { useRequestVerification } from "../api/request-verification";
import { useStartAction } from "../api/start-action";
import { useVerifyAction } from "../api/verify-action";
import { createProofIds, mayResendUpload } from "../lib/proof-ids";

export interface ActionMovesProps {
  detail: ActionDetail;
  /** Facilities lead: start, add proof, send for verification. */
  mayWork: boolean;
  /** Auditor: verify, reject, reopen. */
  mayVerify: boolean;
  /** Administrator or facilities lead: give the action to someone else. */
  mayAssign: boolean;
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

export const proofInputLabel = "Add a photo of the fix";

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
            ? "This attempt has a photo. Add another if it helps the auditor see the fix."
            : "A photo of this attempt is needed before the fix can be sent for verification."}
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
        label="Give to"
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
        Change owner
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

/** What this person may do next, given the action's status and their role at its site. */
export function ActionMoves({ detail, mayWork, mayVerify, mayAssign }: ActionMovesProps) {
  const { action, proofs } = detail;
  const start = useStartAction(action.id);
  const send = useRequestVerification(action.id);
  const uploading = useIsMutating({ mutationKey: addProofMutationKey(action.id) }) > 0;
  const verify = useVerifyAction(action.id);
  const reject = useRejectAction(action.id);
  const reopen = useReopenAction(action.id);
  const [notice, setNotice] = useState<string | null>(null);
  const hasCurrentProof = proofs.some((proof) => proof.current);
  const status = action.status;

  const proofError = isApiError(send.error) ? send.error.fieldError("proof") : undefined;
  const done = (message: string, clear?: () => void) => () => {
    clear?.();
    setNotice(message);
  };

  const sections: ReactNode[] = [];
  if (mayWork && status === "open") {
    sections.push(
      <MoveSection key="start" title="Start the fix">
        <p className="text-sm text-ink-muted">
          Say you have begun, so the auditors know the gap is being dealt with.
        </p>
        <FormProblem message={start.error ? start.error.message : null} />
        <Button
          size="lg"
          className="self-start"
          disabled={start.isPending}
          onClick={() => {
            setNotice(null);
            start.mutate(undefined, { onSuccess: done("Work on this action has started.") });
          }}
        >
          {start.isPending ? <SpinnerGlyph /> : null}
          Start work
        </Button>
      </MoveSection>,
    );
  }
  if (mayWork && (status === "open" || status === "in_progress")) {
    sections.push(
      <MoveSection key="proof" title="Proof of the fix">
        <ProofPicker
          actionId={action.id}
          hasCurrentProof={hasCurrentProof}
          proofError={proofError}
          onAdded={() => {
            send.reset();
            setNotice("The photo is added.");
          }}
        />
      </MoveSection>,
    );
  }
  if (mayWork && status === "in_progress") {
    sections.push(
      <MoveSection key="send" title="Send for verification">
        <TextMove
          label="Note for the auditor"
          hint="Say what was fixed and where, so the auditor knows what to look for."
          buttonLabel="Send for verification"
          field="note"
          pending={send.isPending || uploading}
          error={send.error}
          otherFieldKeys={["proof"]}
          onSubmit={(note, clear) => {
            setNotice(null);
            send.mutate(note, { onSuccess: done("Sent for verification.", clear) });
          }}
        />
      </MoveSection>,
    );
  }
  if (mayVerify && status === "awaiting_verification") {
    sections.push(
      <MoveSection key="verify" title="Verify the fix">
        <TextMove
          label="Verification note"
          hint="Say what you saw on site or in the photos."
          buttonLabel="Verify and close"
          field="note"
          pending={verify.isPending}
          error={verify.error}
          onSubmit={(note, clear) => {
            setNotice(null);
            verify.mutate(note, { onSuccess: done("Verified and closed.", clear) });
          }}
        />
      </MoveSection>,
      <MoveSection key="reject" title="Reject the proof">
        <TextMove
          label="Reason for rejecting"
          hint="The action goes back to in progress and needs a new photo of the fix."
          buttonLabel="Reject"
          field="reason"
          variant="danger"
          pending={reject.isPending}
          error={reject.error}
          onSubmit={(reason, clear) => {
            setNotice(null);
            reject.mutate(reason, {
              onSuccess: done("The proof is rejected; the action is back in progress.", clear),
            });
          }}
        />
      </MoveSection>,
    );
  }
  if (mayVerify && status === "closed") {
    sections.push(
      <MoveSection key="reopen" title="Reopen">
        <TextMove
          label="Reason for reopening"
          hint="The action keeps its history and its original due time."
          buttonLabel="Reopen"
          field="reason"
          variant="secondary"
          pending={reopen.isPending}
          error={reopen.error}
          onSubmit={(reason, clear) => {
            setNotice(null);
            reopen.mutate(reason, { onSuccess: done("The action is reopened.", clear) });
          }}
        />
      </MoveSection>,
    );
  }
  if (mayAssign && status !== "closed") {
    sections.push(
      <MoveSection key="assign" title="Owner">
        <AssignMove detail={detail} />
      </MoveSection>,
    );
  }

  return (
    <Card>
      <h2 className="text-lg font-semibold">What happens next</h2>
      {notice ? (
        <Alert role="status" tone="success" className="mt-3">
          {notice}
        </Alert>
      ) : null}
      {sections.length === 0 ? (
        <p className="mt-2 text-ink-muted">
          {status === "closed"
            ? "This action is closed. An auditor may reopen it if the gap returns."
            : status === "awaiting_verification"
              ? "The fix is waiting for an auditor to verify it."
              : "The facilities lead who owns this action is working on it."}
        </p>
      ) : (
        <div className="mt-4 flex flex-col gap-4">{sections}</div>
      )}
    </Card>
  );
}
