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

  // Keys come from the request (an unknown field may be called `__proto__` or `toString`): collect
  // them in a Map, whose keys are only data, then build the envelope with own properties.
  const fields = new Map<string, string>();
  const note = (key: string, message: string) => {
    if (!fields.has(key)) fields.set(key, message);
  };
  for (const issue of result.error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys) note(fieldKey(part, [...issue.path, key]), "Unknown field.");
      continue;
    }
    note(
      fieldKey(part, issue.path),
      value === undefined && part === "body" ? "A JSON body is required." : issue.message,
    );
  }
  const names = [...fields.keys()].join(", ");
  throw new AppError("validation_failed", 400, `Check these fields: ${names}.`, {
    fields: Object.fromEntries(fields),
  });
}
