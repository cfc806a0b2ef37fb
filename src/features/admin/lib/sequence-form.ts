import {
  type BreachKind,
  breachKinds,
  defaultRetentionDays,
  observationSettingsBodySchema,
  type SequenceDraftBody,
  sequenceDraftBodySchema,
  type SequenceKind,
  sequenceParamsSchema,
  type SequenceVersion,
} from "@shared/schemas/observations";
import type { FieldErrors, Resolver } from "react-hook-form";
import { set } from "react-hook-form";

import { problemAt } from "./form-problems";

export interface StepFormValues {
  /** Empty for a new step; kept when a step is reworded so its breach history follows it. */
  key: string;
  text: string;
  handHygiene: boolean;
  watchFor: BreachKind[];
  reference: string;
}

export interface SequenceFormValues {
  /** The sequence's key: fixed once it exists, typed (or made from the title) for a new one. */
  key: string;
  title: string;
  kind: SequenceKind | "";
  note: string;
  steps: StepFormValues[];
}

// The observer's screen and the editor use the same words.
export { breachKindLabels, sequenceKindLabels } from "@shared/observations/words";

export { breachKinds };

export function newStep(): StepFormValues {
  return { key: "", text: "", handHygiene: false, watchFor: [], reference: "" };
}

export function newSequenceForm(): SequenceFormValues {
  return { key: "", title: "", kind: "", note: "", steps: [newStep()] };
}

export function formFromVersion(version: SequenceVersion): SequenceFormValues {
  return {
    key: version.key,
    title: version.title,
    kind: version.kind,
    note: version.note ?? "",
    steps: [...version.steps]
      .sort((a, b) => a.position - b.position)
      .map((step) => ({
        key: step.key,
        text: step.text,
        handHygiene: step.handHygiene,
        watchFor: breachKinds.filter((kind) => step.watchFor.includes(kind)),
        reference: step.reference ?? "",
      })),
  };
}

/** A key for a new sequence made from its title: "Removal, enhanced" → "removal-enhanced". */
export function sequenceKeyFrom(title: string): string {
  return (
    title
      .toLowerCase()
      .normalize("NFKD")
      // Accents come apart from their letters; drop them rather than turn them into dashes.
      .replace(/\p{M}/gu, "")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60)
      .replace(/-+$/, "")
  );
}

/** A checkbox group hands back `false` when nothing is ticked and a string when one box is. */
function ticked(value: unknown): BreachKind[] {
  const values = Array.isArray(value) ? value : typeof value === "string" ? [value] : [];
  return breachKinds.filter((kind) => values.includes(kind));
}

/** The form as the request body the contract expects. */
export function bodyFromForm(values: SequenceFormValues): unknown {
  return {
    title: values.title,
    kind: values.kind === "" ? undefined : values.kind,
    note: values.note.trim() === "" ? null : values.note,
    steps: values.steps.map((step) => {
      const body: Record<string, unknown> = {
        text: step.text,
        handHygiene: step.handHygiene,
        watchFor: ticked(step.watchFor),
        reference: step.reference.trim() === "" ? null : step.reference,
      };
      if (step.key) body.key = step.key;
      return body;
    }),
  };
}

/** What the editor hands on: the sequence's key and the draft's body. */
export interface SequenceDraft {
  key: string;
  body: SequenceDraftBody;
}

/** Where a message about the request body belongs in the form. */
function formPath(path: readonly PropertyKey[]): string {
  const parts = path.map(String);
  if (parts[0] === "steps" && parts.length === 1) return "steps.root";
  if (parts[0] === "steps" && parts[2] === "watchFor") return `steps.${parts[1]}.watchFor`;
  return parts.join(".") || "root";
}

/** Checks the form against the shared draft contract (and the key for a new sequence). */
export const sequenceResolver: Resolver<SequenceFormValues, unknown, SequenceDraft> = async (
  values,
) => {
  const errors: FieldErrors<SequenceFormValues> = {};
  const key = sequenceParamsSchema.safeParse({ key: values.key });
  if (!key.success)
    set(errors, "key", { type: "validation", message: key.error.issues[0]!.message });
  const parsed = sequenceDraftBodySchema.safeParse(bodyFromForm(values));
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = formPath(issue.path);
      // The first message for a field is the one to show.
      if (!problemAt(errors, path))
        set(errors, path, { type: "validation", message: issue.message });
    }
  }
  if (parsed.success && key.success)
    return { values: { key: key.data.key, body: parsed.data }, errors: {} };
  const none: Record<string, never> = {};
  return { values: none, errors };
};

/** The network's retention period for observation detail, in days, as the contract bounds it. */
export const retentionBounds = { min: 30, max: 3650, default: defaultRetentionDays } as const;

/** The days typed, or the reason they cannot be saved, in the contract's own words. */
export function readRetentionDays(
  value: string,
): { ok: true; days: number } | { ok: false; message: string } {
  const trimmed = value.trim();
  if (!/^\d+$/.test(trimmed)) return { ok: false, message: "A whole number of days." };
  const parsed = observationSettingsBodySchema.safeParse({ retentionDays: Number(trimmed) });
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]!.message };
  return { ok: true, days: parsed.data.retentionDays };
}

/** "730 days (about 2 years)": the period in words an administrator checks at a glance. */
export function retentionText(days: number): string {
  let about: string;
  if (days >= 365) {
    const years = Math.round((days / 365) * 2) / 2;
    about = `about ${years} ${years === 1 ? "year" : "years"}`;
  } else {
    const months = Math.max(1, Math.round(days / 30.4));
    about = `about ${months} ${months === 1 ? "month" : "months"}`;
  }
  return `${days.toLocaleString("en")} days (${about})`;
}
