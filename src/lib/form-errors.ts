import type { FieldValues, Path, UseFormSetError } from "react-hook-form";

import { isApiError } from "./api-client";

/**
 * Puts the server's messages beside the fields they name and focuses the first. Returns whether
 * any matched.
 */
export function showServerFieldErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: readonly Path<T>[],
): boolean {
  if (!isApiError(error)) return false;
  let matched = false;
  for (const name of fieldNames) {
    const message = error.fieldError(name);
    if (!message) continue;
    setError(name, { type: "server", message }, { shouldFocus: !matched });
    matched = true;
  }
  return matched;
}

/**
 * The message for the form as a whole: shown only when no field explains the refusal (wrong
 * credentials, too many attempts, no network).
 */
export function formLevelMessage(
  error: unknown,
  fieldNames: readonly string[],
  fallback: string,
): string | null {
  if (!error) return null;
  if (!isApiError(error)) return fallback;
  if (fieldNames.some((name) => error.fieldError(name))) return null;
  return error.message;
}
