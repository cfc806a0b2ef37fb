import type { z } from "zod";

import { AppError } from "../lib/app-error";

/** Field key for an issue: its path inside the part (`email`, `roles.0.siteId`), or the part. */
function fieldKey(part: string, path: readonly PropertyKey[]): string {
  return path.length === 0 ? part : path.map(String).join(".");
}

/** Parses one part of a request (params, query, body); a failure is a 400 naming every field. */
export function parseInput<S extends z.ZodType>(
  schema: S,
  value: unknown,
  part: string,
): z.output<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;

  const fields: Record<string, string> = {};
  for (const issue of result.error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys)
        fields[fieldKey(part, [...issue.path, key])] ??= "Unknown field.";
      continue;
    }
    const key = fieldKey(part, issue.path);
    fields[key] ??=
      value === undefined && part === "body" ? "A JSON body is required." : issue.message;
  }
  const names = Object.keys(fields).join(", ");
  throw new AppError("validation_failed", 400, `Check these fields: ${names}.`, { fields });
}
