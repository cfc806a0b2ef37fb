import { airChangesAgree, minimumAirChangesLabel } from "@shared/calc/ventilation";
import type { Outcome } from "@shared/calc/verdict";
import type { ReadingUnit } from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import { type ReactNode, type Ref, useCallback, useEffect, useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { CautionNote } from "@/components/ui/caution-note";
import { controlStyles, Field } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import { TextAreaField } from "@/components/ui/text-area-field";
import { parseNumberText } from "@/lib/form-values";

import {
  type AnswerFields,
  criticalNotApplicableMessage,
  emptyAnswer,
  isJudgedByValue,
  missingEntry,
  needsNote,
  needsPhoto,
  outcomeFromEntry,
  type RoomFacts,
  thresholdFor,
} from "../lib/answer-rules";
import type { LocalAnswer, LocalPhoto } from "../lib/offline-store";
import {
  defaultUnit,
  formatReading,
  fromStoredUnit,
  otherUnits,
  toStoredUnit,
  unitsByQuantity,
} from "../lib/reading-units";
import {
  airChangesConfirmationLine,
  airChangesConfirmedPrefix,
  round1,
  type VentilationFigures,
} from "../lib/ventilation-figures";
import { ChoiceButtons, JudgementLine, OutcomeButtons, SeverityBadge } from "./answer-controls";
import { PhotoPicker } from "./photo-picker";
import { VentilationPanel } from "./ventilation-panel";

interface Texts {
  value: string;
  unit: ReadingUnit | null;
  count: string;
  note: string;
}

function textsOf(item: ChecklistItem, answer: LocalAnswer | undefined): Texts {
  return {
    value: answer?.value != null ? String(answer.value) : "",
    unit: answer?.unit ?? (item.quantity ? defaultUnit(item.quantity) : null),
    count: answer?.count != null ? String(answer.count) : "",
    note: answer?.note ?? "",
  };
}

function numberOrNull(text: string): number | null {
  const parsed = parseNumberText(text);
  return parsed === undefined || Number.isNaN(parsed) ? null : parsed;
}

function fieldsOf(item: ChecklistItem, texts: Texts, base: AnswerFields): AnswerFields {
  const note = texts.note.trim() === "" ? null : texts.note;
  if (item.response === "reading") {
    return { ...base, value: numberOrNull(texts.value), unit: texts.unit, note };
  }
  if (item.response === "count") {
    const count = numberOrNull(texts.count);
    return {
      ...base,
      count: count !== null && Number.isInteger(count) && count >= 0 ? count : null,
      note,
    };
  }
  return { ...base, note };
}

function entryProblem(item: ChecklistItem, texts: Texts): string | undefined {
  if (item.response === "reading") {
    const value = parseNumberText(texts.value);
    if (value !== undefined && Number.isNaN(value)) return "Enter a number, such as -2.5.";
  }
  if (item.response === "count") {
    const count = parseNumberText(texts.count);
    if (count !== undefined && (Number.isNaN(count) || !Number.isInteger(count) || count < 0)) {
      return "Enter a whole number, zero or more.";
    }
  }
  return undefined;
}

function limitText(item: ChecklistItem, room: RoomFacts, unit: ReadingUnit | null): string | null {
  const threshold = thresholdFor(item, room);
  if (!threshold) return null;
  const direction = threshold.op === ">=" ? "or more" : "or less";
  if (item.response === "count") return `${threshold.value} ${direction}`;
  if (!item.quantity || !unit) return null;
  if (item.quantity === "air_changes" && !item.threshold && room?.minimumAirChanges) {
    // The class minimum, worded the same way everywhere it is shown.
    const judged = room.constructionClass ?? "new_or_renovated";
    return minimumAirChangesLabel(judged);
  }
  const shown = formatReading(fromStoredUnit(threshold.value, unit), unit);
  const others = otherUnits(threshold.value, item.quantity, unit);
  return `${shown} ${direction}${others.length > 0 ? ` (${others.join(", ")})` : ""}`;
}

type Sign = "negative" | "positive";

/** The sign the typed reading has: a leading minus is negative even before a digit follows. */
function signOf(text: string): Sign | null {
  const trimmed = text.trim();
  if (trimmed.startsWith("-") || trimmed.startsWith("−")) return "negative";
  const value = numberOrNull(trimmed);
  return value !== null && value > 0 ? "positive" : null;
}

function withSign(text: string, sign: Sign): string {
  const unsigned = text.trim().replace(/^[-−+]\s*/, "");
  return sign === "negative" ? `-${unsigned}` : unsigned;
}

/** Whether the item's limit asks for a negative reading (pressure below the corridor's). */
function expectsNegative(item: ChecklistItem, room: RoomFacts): boolean {
  const threshold = thresholdFor(item, room);
  return item.quantity === "pressure" && threshold?.op === "<=" && threshold.value < 0;
}

/** Negative or positive, as two buttons beside the reading so the sign cannot be missed. */
function SignChoice({ sign, onChoose }: { sign: Sign | null; onChoose: (sign: Sign) => void }) {
  const options: { value: Sign; label: string; detail: string }[] = [
    { value: "negative", label: "− Negative", detail: "air flows in" },
    { value: "positive", label: "+ Positive", detail: "air flows out" },
  ];
  return (
    <fieldset className="flex flex-col gap-1.5">
      <legend className="mb-1.5 text-sm font-semibold">Direction of the reading</legend>
      <div className="grid grid-cols-2 gap-2">
        {options.map((option) => {
          const selected = sign === option.value;
          return (
            <button
              key={option.value}
              type="button"
              aria-pressed={selected}
              onClick={() => onChoose(option.value)}
              className={cn(
                "flex min-h-tap flex-col items-center justify-center rounded-lg border-2 px-2 py-1.5 text-center leading-tight font-semibold",
                selected
                  ? option.value === "negative"
                    ? "border-brand-700 bg-brand-50 text-brand-800"
                    : "border-verdict-conditions bg-verdict-conditions/10 text-ink"
                  : "border-surface-line bg-surface text-ink hover:border-brand-300",
              )}
            >
              <span>{option.label}</span>
              <span className="text-xs font-normal">{option.detail}</span>
            </button>
          );
        })}
      </div>
    </fieldset>
  );
}

const saveDelayMs = 600;

export interface ItemStepProps {
  item: ChecklistItem;
  answer: LocalAnswer | undefined;
  photos: readonly LocalPhoto[];
  removablePhotos: ReadonlySet<string>;
  room: RoomFacts;
  /** For isolation rooms: figures to show beside airflow and air-change readings. */
  ventilation: VentilationFigures | null;
  /** Why Lintel refused this item's answer or the submission, if it did. */
  refusal: string | null;
  headingRef?: Ref<HTMLHeadingElement>;
  onSave: (fields: AnswerFields) => Promise<void>;
  onAddPhoto: (file: File) => Promise<void>;
  onRemovePhoto: (photoId: string) => Promise<boolean>;
  /** What the page shows beside this item (a room's recorded pressure beside its pressure item). */
  aside?: ReactNode;
}

/**
 * One checklist item: its text, severity and reference, and the way it is answered. Buttons save
 * at once; typed values save a moment after typing stops, and when the field is left.
 */
export function ItemStep({
  item,
  answer,
  photos,
  removablePhotos,
  room,
  ventilation,
  refusal,
  headingRef,
  onSave,
  onAddPhoto,
  onRemovePhoto,
  aside,
}: ItemStepProps) {
  const headingId = useId();
  const [texts, setTexts] = useState<Texts>(() => textsOf(item, answer));
  const [saveProblem, setSaveProblem] = useState<string | null>(null);
  const pending = useRef<AnswerFields | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const judged = isJudgedByValue(item, room);
  const stored: AnswerFields = answer ?? emptyAnswer;

  // The latest callback, so a save due after a re-render still reaches the current store.
  const onSaveRef = useRef(onSave);
  useEffect(() => {
    onSaveRef.current = onSave;
  }, [onSave]);

  // A save flushed as the step closes settles after it is gone: only a shown step hears back.
  const shown = useRef(true);
  useEffect(() => {
    shown.current = true;
    return () => {
      shown.current = false;
    };
  }, []);

  const save = useCallback((fields: AnswerFields) => {
    onSaveRef.current(fields).then(
      () => {
        if (shown.current) setSaveProblem(null);
      },
      (error: unknown) => {
        if (!shown.current) return;
        setSaveProblem(
          error instanceof Error ? error.message : "This answer could not be kept on the phone.",
        );
      },
    );
  }, []);

  const flush = useCallback(() => {
    clearTimeout(timer.current);
    const fields = pending.current;
    pending.current = null;
    if (fields) save(fields);
  }, [save]);

  // Leaving the item (Next, Back, the list) keeps what was typed.
  useEffect(() => flush, [flush]);

  // What the auditor just did shows at once; once the phone has stored it (the answer gets a new
  // id) the stored answer speaks again, including any outcome the server decided.
  const [recent, setRecent] = useState<{
    basedOn: string | null;
    outcome: Outcome | null;
    choice: string | null;
  } | null>(null);
  const current = recent && recent.basedOn === (answer?.id ?? null) ? recent : null;
  const shownOutcome = current ? current.outcome : stored.outcome;
  const shownChoice = current ? current.choice : stored.choice;

  const outcomeAfterTyping = (fields: AnswerFields): Outcome | null => {
    if (!judged) return shownOutcome;
    const decided = outcomeFromEntry(item, fields, room);
    if (decided) return decided;
    return shownOutcome === "not_applicable" ? "not_applicable" : null;
  };

  const remember = (outcome: Outcome | null, choice: string | null = shownChoice) =>
    setRecent({ basedOn: answer?.id ?? null, outcome, choice });

  const typed = (change: Partial<Texts>) => {
    const next = { ...texts, ...change };
    setTexts(next);
    const fields = fieldsOf(item, next, stored);
    const outcome = outcomeAfterTyping(fields);
    remember(outcome);
    pending.current = { ...fields, outcome };
    clearTimeout(timer.current);
    timer.current = setTimeout(flush, saveDelayMs);
  };

  const chooseOutcome = (outcome: Outcome) => {
    clearTimeout(timer.current);
    pending.current = null;
    const base = fieldsOf(item, texts, stored);
    const choice = item.response === "choice" && outcome === "not_applicable" ? null : base.choice;
    remember(outcome, choice);
    save({ ...base, outcome, choice });
  };

  const chooseOption = (value: string) => {
    clearTimeout(timer.current);
    pending.current = null;
    const fields = { ...fieldsOf(item, texts, stored), choice: value };
    const outcome = outcomeFromEntry(item, fields, room);
    remember(outcome, value);
    save({ ...fields, outcome });
  };

  // A tap on the sign is a decision, like Pass or Fail: it is kept at once.
  const chooseSign = (sign: Sign) => {
    typed({ value: withSign(texts.value, sign) });
    flush();
  };

  const takeWorkedOut = (workedOut: number) => typed({ value: round1(workedOut), unit: "ach" });

  const confirmTyped = (typedAch: number, workedOut: number) => {
    const line = airChangesConfirmationLine(typedAch, workedOut);
    typed({ note: texts.note.trim() === "" ? line : `${texts.note.trim()}\n${line}` });
  };

  const liveOutcome = shownOutcome;
  const live = fieldsOf(item, texts, stored);
  const quantity = item.response === "reading" ? item.quantity : null;
  const problem =
    entryProblem(item, texts) ?? missingEntry(item, { ...live, outcome: liveOutcome }) ?? undefined;
  const limit = limitText(item, room, texts.unit);
  const noteMissing = needsNote(item, { ...stored, outcome: liveOutcome, note: texts.note });
  const photoMissing = needsPhoto(item, { ...stored, outcome: liveOutcome }, photos.length);
  const negativeExpected = expectsNegative(item, room);
  const sign = quantity === "pressure" ? signOf(texts.value) : null;
  const achCheck =
    quantity === "air_changes" &&
    ventilation?.workedOutAirChanges != null &&
    live.value !== null &&
    live.unit !== null
      ? {
          typed: toStoredUnit(live.value, live.unit),
          workedOut: ventilation.workedOutAirChanges,
        }
      : null;
  const achUnconfirmed =
    achCheck !== null &&
    !airChangesAgree(achCheck.typed, achCheck.workedOut) &&
    !texts.note.includes(airChangesConfirmedPrefix);
  const outcomeOptions: Outcome[] = judged
    ? ["not_applicable"]
    : ["pass", "fail", "not_applicable"];

  return (
    <article aria-labelledby={headingId} className="flex flex-col gap-5">
      <div className="flex flex-col gap-2">
        <div className="flex flex-wrap items-center gap-2">
          <SeverityBadge severity={item.severity} />
          {item.photoOnFail ? (
            <span className="text-sm text-ink-muted">Photo needed if it fails</span>
          ) : null}
        </div>
        <h2
          id={headingId}
          ref={headingRef}
          tabIndex={-1}
          className="text-xl leading-snug font-semibold outline-none md:text-2xl"
        >
          {item.text}
        </h2>
        {item.reference ? (
          <p className="text-xs text-ink-muted">Reference: {item.reference}</p>
        ) : null}
      </div>
      {aside}

      {quantity ? (
        <div className="flex flex-col gap-3">
          <div className="grid grid-cols-[minmax(0,1fr)_auto] items-end gap-3">
            <Field label="Reading" error={problem}>
              {(control) => (
                <input
                  {...control}
                  inputMode="decimal"
                  autoComplete="off"
                  className={controlStyles(Boolean(problem), "text-lg")}
                  value={texts.value}
                  onChange={(event) => typed({ value: event.target.value })}
                  onBlur={flush}
                />
              )}
            </Field>
            {unitsByQuantity[quantity].length > 1 ? (
              <Field label="Unit">
                {(control) => (
                  <select
                    {...control}
                    className={controlStyles(false, "pr-8")}
                    value={texts.unit ?? ""}
                    onChange={(event) => typed({ unit: event.target.value as ReadingUnit })}
                    onBlur={flush}
                  >
                    {unitsByQuantity[quantity].map((choice) => (
                      <option key={choice.unit} value={choice.unit}>
                        {choice.label}
                      </option>
                    ))}
                  </select>
                )}
              </Field>
            ) : (
              <p className="min-h-tap py-2 font-semibold text-ink-muted">
                {unitsByQuantity[quantity][0]!.label}
              </p>
            )}
          </div>
          {quantity === "pressure" ? (
            <>
              <SignChoice sign={sign} onChoose={chooseSign} />
              <p className="text-sm text-ink-muted">
                Negative pressure is entered as a negative number, such as −2.5 Pa or −0.01 in. w.c.
              </p>
            </>
          ) : null}
          {negativeExpected && live.value !== null && live.value > 0 ? (
            <Alert role="alert" tone="warning" title="Positive reading: air flows out of the room">
              <p>
                This room should be negative to the corridor. If the gauge shows air flowing in,
                choose Negative; if it really is positive, the room fails this check.
              </p>
            </Alert>
          ) : null}
          {live.value !== null && live.unit ? (
            <p className="text-sm text-ink-muted">
              {formatReading(live.value, live.unit, 4)}
              {otherUnits(toStoredUnit(live.value, live.unit), quantity, live.unit).map(
                (text) => ` = ${text}`,
              )}
            </p>
          ) : null}
          {achCheck ? (
            <p className="text-sm text-ink-muted">
              Typed {round1(achCheck.typed)} ACH · worked out from airflow ÷ volume{" "}
              {round1(achCheck.workedOut)} ACH
            </p>
          ) : null}
          {limit ? (
            <JudgementLine
              outcome={
                achUnconfirmed && liveOutcome === "pass"
                  ? null
                  : liveOutcome === "pass" || liveOutcome === "fail"
                    ? liveOutcome
                    : null
              }
            >
              {achUnconfirmed && liveOutcome === "pass"
                ? `Cannot pass until confirmed: limit ${limit}`
                : liveOutcome === "pass"
                  ? `Passes: limit ${limit}`
                  : liveOutcome === "fail"
                    ? `Fails: limit ${limit}`
                    : `Limit: ${limit}`}
            </JudgementLine>
          ) : null}
          {achCheck && achUnconfirmed ? (
            <Alert role="alert" tone="warning" title="Which air-change figure is right?">
              <p>
                The typed {round1(achCheck.typed)} ACH and the {round1(achCheck.workedOut)} ACH
                worked out from airflow ÷ volume differ by more than 10 %. Confirm one before the
                item can pass.
              </p>
              <div className="mt-2 grid gap-2">
                <button
                  type="button"
                  className="min-h-tap rounded-lg border-2 border-surface-line bg-surface px-3 py-2 text-left font-semibold hover:border-brand-300"
                  onClick={() => takeWorkedOut(achCheck.workedOut)}
                >
                  Use the worked-out {round1(achCheck.workedOut)} ACH
                </button>
                <button
                  type="button"
                  className="min-h-tap rounded-lg border-2 border-surface-line bg-surface px-3 py-2 text-left font-semibold hover:border-brand-300"
                  onClick={() => confirmTyped(achCheck.typed, achCheck.workedOut)}
                >
                  The typed {round1(achCheck.typed)} ACH is right
                </button>
              </div>
            </Alert>
          ) : null}
          {ventilation && (quantity === "airflow" || quantity === "air_changes") ? (
            <VentilationPanel figures={ventilation} />
          ) : (
            <CautionNote />
          )}
        </div>
      ) : null}

      {item.response === "count" ? (
        <div className="flex flex-col gap-3">
          <Field label="Count" error={problem}>
            {(control) => (
              <input
                {...control}
                inputMode="numeric"
                autoComplete="off"
                className={controlStyles(Boolean(problem), "max-w-40 text-lg")}
                value={texts.count}
                onChange={(event) => typed({ count: event.target.value })}
                onBlur={flush}
              />
            )}
          </Field>
          {limit ? (
            <JudgementLine
              outcome={liveOutcome === "pass" || liveOutcome === "fail" ? liveOutcome : null}
            >
              {liveOutcome === "pass"
                ? `Passes: needs ${limit}`
                : liveOutcome === "fail"
                  ? `Fails: needs ${limit}`
                  : `Needs ${limit}`}
            </JudgementLine>
          ) : null}
        </div>
      ) : null}

      {item.response === "choice" && item.choices ? (
        <ChoiceButtons choices={item.choices} chosen={shownChoice} onChoose={chooseOption} />
      ) : null}

      <OutcomeButtons options={outcomeOptions} chosen={liveOutcome} onChoose={chooseOutcome} />

      <TextAreaField
        label="Note"
        rows={2}
        value={texts.note}
        error={noteMissing ? criticalNotApplicableMessage : undefined}
        hint={
          item.severity === "critical"
            ? "Critical item: not applicable needs a note saying why."
            : undefined
        }
        onChange={(event) => typed({ note: event.target.value })}
        onBlur={flush}
      />

      <PhotoPicker
        itemText={item.text}
        photos={photos}
        removable={removablePhotos}
        needsPhoto={photoMissing}
        onAdd={onAddPhoto}
        onRemove={onRemovePhoto}
      />

      {refusal ? (
        <Alert role="alert" tone="error" title="Lintel did not accept this answer">
          <p>{refusal}</p>
        </Alert>
      ) : null}
      {saveProblem ? (
        <Alert role="alert" tone="error" title="Not kept on this phone">
          <p>{saveProblem}</p>
        </Alert>
      ) : null}
    </article>
  );
}
