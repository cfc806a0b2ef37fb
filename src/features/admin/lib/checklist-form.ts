import type { Severity } from "@shared/calc/verdict";
import {
  type ChecklistDraftBody,
  checklistDraftBodySchema,
  type ChecklistVersion,
  type quantities,
  type responseKinds,
} from "@shared/schemas/checklists";
import { type FieldErrors, type Resolver, set } from "react-hook-form";

import { parseNumberText } from "@/lib/form-values";

import { problemAt } from "./form-problems";

type ResponseKind = (typeof responseKinds)[number];
type Quantity = (typeof quantities)[number];

export interface ChoiceFormValues {
  /** Kept for existing options so answers stay matched; made from the label for new ones. */
  value: string;
  label: string;
  passes: boolean;
}

export interface ItemFormValues {
  /** Empty for a new item; kept when an item is reworded so its history follows it. */
  key: string;
  text: string;
  severity: Severity | "";
  response: ResponseKind;
  quantity: Quantity | "";
  thresholdOp: ">=" | "<=" | "";
  thresholdValue: string;
  choices: ChoiceFormValues[];
  reference: string;
  photoOnFail: boolean;
}

export interface DraftFormValues {
  title: string;
  items: ItemFormValues[];
}

export const responseLabels: Record<ResponseKind, string> = {
  check: "Pass or fail",
  reading: "Reading with a unit",
  count: "Count",
  choice: "Choice of options",
};

export const quantityLabels: Record<Quantity, string> = {
  pressure: "Pressure (Pa)",
  airflow: "Airflow (m³/h)",
  air_changes: "Air changes per hour",
  percent: "Percent",
  minutes: "Minutes",
};

/** The unit limits are written in: the stored one. */
export const quantityUnits: Record<Quantity, string> = {
  pressure: "Pa",
  airflow: "m³/h",
  air_changes: "ACH",
  percent: "%",
  minutes: "min",
};

/** Severities in words, the same everywhere. */
export { severityLabels } from "@shared/calc/verdict";

export function newItem(): ItemFormValues {
  return {
    key: "",
    text: "",
    severity: "",
    response: "check",
    quantity: "",
    thresholdOp: "",
    thresholdValue: "",
    choices: [
      { value: "", label: "", passes: true },
      { value: "", label: "", passes: false },
    ],
    reference: "",
    photoOnFail: true,
  };
}

export function formFromVersion(version: ChecklistVersion): DraftFormValues {
  return {
    title: version.title,
    items: [...version.items]
      .sort((a, b) => a.position - b.position)
      .map((item) => ({
        key: item.key,
        text: item.text,
        severity: item.severity,
        response: item.response,
        quantity: item.quantity ?? "",
        thresholdOp: item.threshold?.op ?? "",
        thresholdValue: item.threshold ? String(item.threshold.value) : "",
        choices: item.choices?.map((choice) => ({ ...choice })) ?? newItem().choices,
        reference: item.reference ?? "",
        photoOnFail: item.photoOnFail,
      })),
  };
}

function slug(label: string): string {
  return (
    label
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 40) || "option"
  );
}

function choiceValues(choices: readonly ChoiceFormValues[]): string[] {
  const taken = new Set(choices.map((choice) => choice.value).filter(Boolean));
  return choices.map((choice) => {
    if (choice.value) return choice.value;
    const base = slug(choice.label);
    let value = base;
    for (let n = 2; taken.has(value); n += 1) value = `${base.slice(0, 36)}-${n}`;
    taken.add(value);
    return value;
  });
}

/** Where a message about the request body belongs in the form. */
function formPath(path: readonly PropertyKey[]): string {
  const [first, index, field, ...rest] = path.map(String);
  if (first !== "items" || index === undefined) return path.map(String).join(".") || "root";
  if (field === undefined) return "items.root";
  if (field === "threshold")
    return `items.${index}.${rest[0] === "op" ? "thresholdOp" : "thresholdValue"}`;
  if (field === "choices") {
    return rest.length >= 2
      ? `items.${index}.choices.${rest[0]}.${rest[1]}`
      : `items.${index}.choices.root`;
  }
  return `items.${index}.${field}`;
}

/** The form as the request body, with the problems found turning it into one. */
export function bodyFromForm(values: DraftFormValues): {
  candidate: unknown;
  problems: [string, string][];
} {
  const problems: [string, string][] = [];
  const items = values.items.map((item, index) => {
    const body: Record<string, unknown> = {
      text: item.text,
      severity: item.severity === "" ? undefined : item.severity,
      response: item.response,
      reference: item.reference.trim() === "" ? null : item.reference,
      photoOnFail: item.photoOnFail,
    };
    if (item.key) body.key = item.key;
    if (item.response === "reading") body.quantity = item.quantity === "" ? null : item.quantity;
    if (item.response === "reading" || item.response === "count") {
      if (item.thresholdOp === "") {
        body.threshold = null;
      } else {
        const value = parseNumberText(item.thresholdValue);
        if (value === undefined || Number.isNaN(value)) {
          problems.push([`items.${index}.thresholdValue`, "Enter the limit as a number."]);
        } else {
          body.threshold = { op: item.thresholdOp, value };
        }
      }
    }
    if (item.response === "choice") {
      const values = choiceValues(item.choices);
      body.choices = item.choices.map((choice, at) => ({
        value: values[at],
        label: choice.label,
        passes: choice.passes,
      }));
    }
    return body;
  });
  return { candidate: { title: values.title, items }, problems };
}

/** Checks the form against the shared draft contract and hands on the body it becomes. */
export const draftResolver: Resolver<DraftFormValues, unknown, ChecklistDraftBody> = async (
  values,
) => {
  const { candidate, problems } = bodyFromForm(values);
  const parsed = checklistDraftBodySchema.safeParse(candidate);
  const errors: FieldErrors<DraftFormValues> = {};
  for (const [path, message] of problems) set(errors, path, { type: "validation", message });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = formPath(issue.path);
      // The first message for a field is the one to show.
      if (!problemAt(errors, path))
        set(errors, path, { type: "validation", message: issue.message });
    }
  }
  if (parsed.success && problems.length === 0) return { values: parsed.data, errors: {} };
  return { values: {}, errors };
};
