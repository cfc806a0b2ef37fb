import {
  type Breach,
  type BreachCause,
  breachCauses,
  type BreachKind,
  breachKinds,
  precheckKeys,
  type SequenceVersion,
  type SpaceProblem,
  spaceProblems,
  staffRoles,
} from "@shared/schemas/observations";
import { type ReactNode, useEffect, useId, useReducer, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/text-area-field";
import { TextField } from "@/components/ui/text-field";
import { cn } from "@/lib/cn";

import {
  breachesSoFar,
  type ObservationDraft,
  observationReducer,
  outcomeOnPhone,
  precheckComplete,
  sequenceKindsFor,
  setupProblem,
} from "../lib/observation-flow";
import {
  breachCauseLabels,
  breachKindLabels,
  describeBreaches,
  observationOutcomeLabels,
  precheckLabels,
  sequenceKindLabels,
  spaceProblemLabels,
  staffRoleLabels,
} from "@shared/observations/words";

export interface ObservationRecorderProps {
  initial: ObservationDraft;
  /** Published sequences as the phone knows them; null when none are kept yet. */
  sequences: readonly SequenceVersion[] | null;
  /** Writes the draft to the phone's store (after every change). */
  onSave: (draft: ObservationDraft) => void;
  /** The observer tapped "Finish" on the summary. */
  onFinish: (draft: ObservationDraft) => Promise<void>;
}

/** A choice that reads as a big button and is announced as pressed or not. */
function ChoiceButton({
  pressed,
  onClick,
  children,
  className,
}: {
  pressed: boolean;
  onClick: () => void;
  children: ReactNode;
  className?: string;
}) {
  return (
    <button
      type="button"
      aria-pressed={pressed}
      onClick={onClick}
      className={cn(
        "flex min-h-tap w-full items-center gap-2 rounded-lg border-2 px-3 py-2 text-left font-semibold",
        pressed
          ? "border-brand-700 bg-brand-700 text-white"
          : "border-surface-line bg-surface text-brand-800 hover:bg-brand-50",
        className,
      )}
    >
      <span
        aria-hidden="true"
        className={cn(
          "inline-flex size-5 shrink-0 items-center justify-center rounded-full border-2",
          pressed ? "border-white" : "border-ink-subtle",
        )}
      >
        {pressed ? <span className="size-2.5 rounded-full bg-white" /> : null}
      </span>
      <span>{children}</span>
    </button>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="flex flex-col gap-2">
      <h2 id={id} className="text-lg font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

function SetupScreen({
  draft,
  sequences,
  dispatch,
}: {
  draft: ObservationDraft;
  sequences: readonly SequenceVersion[] | null;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
}) {
  const [tried, setTried] = useState(false);
  const kinds = sequenceKindsFor(draft.zoneType);
  const fitting = (sequences ?? []).filter((sequence) => kinds.includes(sequence.kind));
  const problem = setupProblem(draft);
  const setPerson = (staffCode: string, staffRole = draft.staffRole) =>
    dispatch({ type: "set-person", staffCode, staffRole });
  return (
    <div className="flex flex-col gap-6">
      <Section title="Sequence">
        {fitting.length === 0 ? (
          <Alert tone="warning" title="No sequence on this phone">
            <p>
              Lintel has not sent a published sequence for this space yet. Open Lintel once with
              signal, or ask an administrator to publish one.
            </p>
          </Alert>
        ) : (
          <div className="flex flex-col gap-2" role="group" aria-label="Sequence">
            {fitting.map((sequence) => (
              <ChoiceButton
                key={sequence.id}
                pressed={draft.sequence?.id === sequence.id}
                onClick={() => dispatch({ type: "choose-sequence", sequence })}
              >
                {sequence.title}
                <span className="block text-sm font-normal">
                  {sequenceKindLabels[sequence.kind]} · {sequence.steps.length} steps · version{" "}
                  {sequence.version}
                  {sequence.note ? ` · ${sequence.note}` : ""}
                </span>
              </ChoiceButton>
            ))}
          </div>
        )}
      </Section>
      <Section title="Person observed">
        <p className="text-sm text-ink-muted">
          A staff code and role only, never a name. Lintel stores no names and no photos of observed
          staff; only this site&apos;s auditors and administrators see the code.
        </p>
        <TextField
          label="Staff code"
          value={draft.staffCode}
          autoCapitalize="characters"
          autoComplete="off"
          spellCheck={false}
          maxLength={16}
          onChange={(event) => setPerson(event.target.value)}
          error={
            tried && problem?.startsWith("Enter the staff code")
              ? "2 to 16 letters, digits or dashes — a staff code, not a name."
              : undefined
          }
        />
        <div role="group" aria-label="Role" className="grid grid-cols-2 gap-2">
          {staffRoles.map((role) => (
            <ChoiceButton
              key={role}
              pressed={draft.staffRole === role}
              onClick={() => setPerson(draft.staffCode, role)}
              className="text-sm"
            >
              {staffRoleLabels[role]}
            </ChoiceButton>
          ))}
        </div>
      </Section>
      {tried && problem ? (
        <p role="alert" className="font-semibold text-verdict-not-ready">
          {problem}
        </p>
      ) : null}
      <Button
        size="lg"
        onClick={() => {
          setTried(true);
          if (!problem) dispatch({ type: "begin", now: new Date() });
        }}
      >
        Check the area
      </Button>
    </div>
  );
}

function YesNo({
  label,
  value,
  onChange,
}: {
  label: string;
  value: boolean | null;
  onChange: (value: boolean) => void;
}) {
  return (
    <div role="group" aria-label={label} className="flex flex-col gap-2">
      <p className="font-semibold">{label}</p>
      <div className="grid grid-cols-2 gap-2">
        <ChoiceButton pressed={value === true} onClick={() => onChange(true)}>
          Yes
        </ChoiceButton>
        <ChoiceButton pressed={value === false} onClick={() => onChange(false)}>
          No
        </ChoiceButton>
      </div>
    </div>
  );
}

function PrecheckScreen({
  draft,
  dispatch,
}: {
  draft: ObservationDraft;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
}) {
  const complete = precheckComplete(draft);
  return (
    <Section title="Check the area first">
      <p className="text-sm text-ink-muted">Before anyone starts: is everything needed at hand?</p>
      <div className="flex flex-col gap-4">
        {precheckKeys.map((key) => (
          <YesNo
            key={key}
            label={precheckLabels[key]}
            value={draft.precheck[key]}
            onChange={(ok) => dispatch({ type: "precheck", key, ok })}
          />
        ))}
      </div>
      <Button
        size="lg"
        className="mt-2"
        disabled={!complete}
        onClick={() => dispatch({ type: "precheck-done" })}
      >
        Start the steps
      </Button>
      <Button variant="quiet" onClick={() => dispatch({ type: "back" })}>
        Back to the person observed
      </Button>
    </Section>
  );
}

function StepScreen({
  draft,
  dispatch,
}: {
  draft: ObservationDraft;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
}) {
  const sequence = draft.sequence!;
  const step = sequence.steps[draft.stepIndex]!;
  const record = draft.steps[draft.stepIndex];
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    heading.current?.focus();
  }, [draft.stepIndex]);
  return (
    <section aria-labelledby="observation-step" className="flex flex-col gap-4">
      <div>
        <p className="text-sm font-semibold text-ink-muted">
          Step {draft.stepIndex + 1} of {sequence.steps.length}
        </p>
        <div className="mt-1 h-2 overflow-hidden rounded-full bg-surface-line" aria-hidden="true">
          <div
            className="h-full bg-brand-700"
            style={{ width: `${((draft.stepIndex + 1) / sequence.steps.length) * 100}%` }}
          />
        </div>
      </div>
      <div className="rounded-lg border-2 border-brand-200 bg-surface p-4">
        <p className="text-sm font-semibold tracking-wide text-brand-800 uppercase">Read aloud</p>
        <h2
          id="observation-step"
          ref={heading}
          tabIndex={-1}
          className="mt-1 text-2xl leading-snug font-bold outline-none"
        >
          {step.text}
        </h2>
        {step.handHygiene ? (
          <p className="mt-2 inline-flex rounded-full bg-brand-50 px-3 py-1 text-sm font-semibold text-brand-800">
            Hand-hygiene moment
          </p>
        ) : null}
        {step.watchFor.length > 0 ? (
          <p className="mt-2 text-sm text-ink-muted">
            Watch for: {step.watchFor.map((kind) => breachKindLabels[kind]).join("; ")}
          </p>
        ) : null}
      </div>
      {record ? (
        <p className="text-sm font-semibold">
          Recorded:{" "}
          {record.breaches.length === 0
            ? "done"
            : `breach — ${record.breaches.map((b) => breachKindLabels[b.kind]).join("; ")}`}
        </p>
      ) : null}
      <div className="grid grid-cols-1 gap-3">
        <Button
          size="lg"
          className="min-h-20 text-xl"
          onClick={() => dispatch({ type: "step-done" })}
        >
          Done
        </Button>
        <Button
          size="lg"
          variant="secondary"
          className="min-h-16 border-2 border-verdict-not-ready text-verdict-not-ready"
          onClick={() => dispatch({ type: "open-breach" })}
        >
          Breach…
        </Button>
      </div>
      <Button variant="quiet" onClick={() => dispatch({ type: "back" })}>
        {draft.stepIndex === 0 ? "Back to the area check" : "Back to the previous step"}
      </Button>
    </section>
  );
}

function BreachScreen({
  draft,
  dispatch,
}: {
  draft: ObservationDraft;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
}) {
  const step = draft.sequence!.steps[draft.stepIndex]!;
  const [kind, setKind] = useState<BreachKind | null>(null);
  const [cause, setCause] = useState<BreachCause | null>(null);
  const [spaceProblem, setSpaceProblem] = useState<SpaceProblem | null>(null);
  const [note, setNote] = useState("");
  const [tried, setTried] = useState(false);
  // The breaches this step watches for come first.
  const kinds = [
    ...step.watchFor,
    ...breachKinds.filter((candidate) => !step.watchFor.includes(candidate)),
  ];
  const problem = !kind
    ? "Choose what went wrong."
    : !cause
      ? "Choose the cause: technique or the space."
      : cause === "space" && !spaceProblem
        ? "Choose what about the space."
        : null;
  const record = () => {
    setTried(true);
    if (problem || !kind || !cause) return;
    const breach: Breach = {
      kind,
      cause,
      spaceProblem: cause === "space" ? spaceProblem : null,
      note: note.trim() ? note.trim() : null,
    };
    dispatch({ type: "record-breach", breach });
  };
  return (
    <div className="flex flex-col gap-5">
      <div>
        <p className="text-sm font-semibold text-ink-muted">
          Breach at step {draft.stepIndex + 1} of {draft.sequence!.steps.length}
        </p>
        <h2 className="text-xl font-bold">{step.text}</h2>
      </div>
      <Section title="What went wrong">
        <div role="group" aria-label="What went wrong" className="flex flex-col gap-2">
          {kinds.map((candidate) => (
            <ChoiceButton
              key={candidate}
              pressed={kind === candidate}
              onClick={() => setKind(candidate)}
            >
              {breachKindLabels[candidate]}
            </ChoiceButton>
          ))}
        </div>
      </Section>
      <Section title="Cause">
        <div role="group" aria-label="Cause" className="grid grid-cols-2 gap-2">
          {breachCauses.map((candidate) => (
            <ChoiceButton
              key={candidate}
              pressed={cause === candidate}
              onClick={() => setCause(candidate)}
            >
              {breachCauseLabels[candidate]}
            </ChoiceButton>
          ))}
        </div>
        {cause === "space" ? (
          <div role="group" aria-label="What about the space" className="flex flex-col gap-2">
            <p className="font-semibold">What about the space</p>
            {spaceProblems.map((candidate) => (
              <ChoiceButton
                key={candidate}
                pressed={spaceProblem === candidate}
                onClick={() => setSpaceProblem(candidate)}
              >
                {spaceProblemLabels[candidate]}
              </ChoiceButton>
            ))}
            <p className="text-sm text-ink-muted">
              Lintel records this against the space&apos;s checklist item, where it joins or opens a
              corrective action.
            </p>
          </div>
        ) : null}
      </Section>
      <TextAreaField
        label="Note (optional)"
        value={note}
        maxLength={500}
        onChange={(event) => setNote(event.target.value)}
      />
      {tried && problem ? (
        <p role="alert" className="font-semibold text-verdict-not-ready">
          {problem}
        </p>
      ) : null}
      <Button size="lg" onClick={record}>
        Record breach
      </Button>
      <Button variant="quiet" onClick={() => dispatch({ type: "cancel-breach" })}>
        Cancel, back to the step
      </Button>
    </div>
  );
}

function CoachingScreen({
  draft,
  dispatch,
}: {
  draft: ObservationDraft;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
}) {
  const breaches = breachesSoFar(draft);
  return (
    <Section title="Coaching on the spot">
      <p className="text-sm text-ink-muted">
        {describeBreaches(
          breaches.map((entry) => entry.position),
          breaches.length,
        )}
        .
      </p>
      <YesNo
        label="Coaching given"
        value={draft.coachingGiven}
        onChange={(given) => dispatch({ type: "coaching", given, note: draft.coachingNote })}
      />
      {draft.coachingGiven ? (
        <TextAreaField
          label="What was coached (optional)"
          value={draft.coachingNote}
          maxLength={500}
          onChange={(event) =>
            dispatch({ type: "coaching", given: true, note: event.target.value })
          }
        />
      ) : null}
      <Button
        size="lg"
        className="mt-2"
        disabled={draft.coachingGiven === null}
        onClick={() => dispatch({ type: "coaching-done" })}
      >
        See the summary
      </Button>
      <Button variant="quiet" onClick={() => dispatch({ type: "back" })}>
        Back to the last step
      </Button>
    </Section>
  );
}

function SummaryScreen({
  draft,
  dispatch,
  onFinish,
}: {
  draft: ObservationDraft;
  dispatch: React.Dispatch<Parameters<typeof observationReducer>[1]>;
  onFinish: () => Promise<void>;
}) {
  const [finishing, setFinishing] = useState(false);
  const [failed, setFailed] = useState(false);
  const breaches = breachesSoFar(draft);
  const result = outcomeOnPhone(draft);
  const steps = draft.sequence!.steps;
  return (
    <div className="flex flex-col gap-5">
      <Section title="Summary">
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="font-semibold">Sequence</dt>
          <dd>{draft.sequence!.title}</dd>
          <dt className="font-semibold">Observed</dt>
          <dd>
            {draft.staffCode} · {draft.staffRole ? staffRoleLabels[draft.staffRole] : ""}
          </dd>
          <dt className="font-semibold">Steps</dt>
          <dd>{steps.length}</dd>
          <dt className="font-semibold">Outcome</dt>
          <dd>
            {result ? observationOutcomeLabels[result.outcome] : ""}
            {result && result.breachCount > 0
              ? ` — ${describeBreaches(result.breachedSteps, result.breachCount)}`
              : ""}
          </dd>
          {result && result.handHygiene.expected > 0 ? (
            <>
              <dt className="font-semibold">Hand hygiene</dt>
              <dd>
                {result.handHygiene.performed} of {result.handHygiene.expected} moments performed
              </dd>
            </>
          ) : null}
          <dt className="font-semibold">Coaching</dt>
          <dd>{draft.coachingGiven ? "Given on the spot" : "Not given"}</dd>
        </dl>
      </Section>
      <Section title="Area check">
        <ul className="flex flex-col gap-1">
          {precheckKeys.map((key) => (
            <li key={key}>
              {precheckLabels[key]}: <strong>{draft.precheck[key] ? "yes" : "no"}</strong>
            </li>
          ))}
        </ul>
      </Section>
      {breaches.length > 0 ? (
        <Section title="Breaches">
          <ul className="flex flex-col gap-2">
            {breaches.map(({ position, breach }, index) => (
              <li key={index} className="rounded-lg border border-surface-line bg-surface p-3">
                <p className="font-semibold">
                  Step {position}: {steps[position - 1]!.text}
                </p>
                <p>{breachKindLabels[breach.kind]}</p>
                <p className="text-sm text-ink-muted">
                  Cause: {breachCauseLabels[breach.cause]}
                  {breach.spaceProblem ? ` — ${spaceProblemLabels[breach.spaceProblem]}` : ""}
                </p>
                {breach.note ? <p className="text-sm">Note: {breach.note}</p> : null}
              </li>
            ))}
          </ul>
        </Section>
      ) : null}
      {failed ? (
        <Alert role="alert" tone="error" title="Not finished">
          <p>The observation could not be kept on this phone. Try again.</p>
        </Alert>
      ) : null}
      <Button
        size="lg"
        disabled={finishing}
        onClick={() => {
          setFinishing(true);
          setFailed(false);
          onFinish().catch(() => {
            setFailed(true);
            setFinishing(false);
          });
        }}
      >
        Finish
      </Button>
      <Button variant="quiet" onClick={() => dispatch({ type: "back" })}>
        Back to coaching
      </Button>
    </div>
  );
}

/**
 * Records one observation, one screen at a time: sequence and person, the area check, each step
 * read aloud (done, or a breach), coaching, and the summary. Every change is kept on the phone.
 */
export function ObservationRecorder({
  initial,
  sequences,
  onSave,
  onFinish,
}: ObservationRecorderProps) {
  const [draft, dispatch] = useReducer(observationReducer, initial);
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    onSave(draft);
  }, [draft, onSave]);
  useEffect(() => {
    // Each screen starts at its top (the last one's buttons were at the bottom); jsdom has no scrolling.
    if (!navigator.userAgent.includes("jsdom")) window.scrollTo({ top: 0 });
  }, [draft.phase, draft.stepIndex]);

  switch (draft.phase) {
    case "setup":
      return <SetupScreen draft={draft} sequences={sequences} dispatch={dispatch} />;
    case "precheck":
      return <PrecheckScreen draft={draft} dispatch={dispatch} />;
    case "steps":
      return <StepScreen draft={draft} dispatch={dispatch} />;
    case "breach":
      return <BreachScreen draft={draft} dispatch={dispatch} />;
    case "coaching":
      return <CoachingScreen draft={draft} dispatch={dispatch} />;
    case "summary":
      return <SummaryScreen draft={draft} dispatch={dispatch} onFinish={() => onFinish(draft)} />;
  }
}
