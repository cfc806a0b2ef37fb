import type { ComponentProps } from "react";

import { controlStyles, Field } from "./field";

export interface SelectOption {
  value: string;
  label: string;
}

export interface SelectFieldProps extends Omit<ComponentProps<"select">, "id" | "children"> {
  label: string;
  options: readonly SelectOption[];
  /** A first, empty choice such as "Choose a role". */
  placeholder?: string;
  error?: string;
  hint?: string;
}

export function SelectField({
  label,
  options,
  placeholder,
  error,
  hint,
  className,
  ...selectProps
}: SelectFieldProps) {
  return (
    <Field label={label} error={error} hint={hint} className={className}>
      {(control) => (
        <select {...control} className={controlStyles(Boolean(error), "pr-8")} {...selectProps}>
          {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
          {options.map((option) => (
            <option key={option.value} value={option.value}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}
