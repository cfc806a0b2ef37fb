import type { ComponentProps } from "react";

import { controlStyles, Field } from "./field";

export interface TextFieldProps extends Omit<ComponentProps<"input">, "id"> {
  label: string;
  /** Shown below the field and announced with it; marks the field invalid. */
  error?: string;
  /** A short help text, also tied to the field. */
  hint?: string;
}

export function TextField({ label, error, hint, className, ...inputProps }: TextFieldProps) {
  return (
    <Field label={label} error={error} hint={hint} className={className}>
      {(control) => (
        <input {...control} className={controlStyles(Boolean(error))} {...inputProps} />
      )}
    </Field>
  );
}
