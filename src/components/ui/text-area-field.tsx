import type { ComponentProps } from "react";

import { controlStyles, Field } from "./field";

export interface TextAreaFieldProps extends Omit<ComponentProps<"textarea">, "id"> {
  label: string;
  error?: string;
  hint?: string;
}

export function TextAreaField({ label, error, hint, className, ...props }: TextAreaFieldProps) {
  return (
    <Field label={label} error={error} hint={hint} className={className}>
      {(control) => (
        <textarea
          rows={3}
          {...control}
          className={controlStyles(Boolean(error), "resize-y")}
          {...props}
        />
      )}
    </Field>
  );
}
