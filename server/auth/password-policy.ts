import { dictionary } from "@zxcvbn-ts/language-common";

import { AppError } from "../lib/app-error";

// Length without composition rules, and a check against a list of commonly used passwords, in the
// manner of NIST SP 800-63B §5.1.1.2. The list ships with the npm package (about 49,000 entries).
const common = new Set(
  (dictionary["passwords-common"] as string[]).map((word) => word.toLowerCase()),
);

export function passwordProblem(
  password: string,
  context: { email: string; name?: string },
): string | null {
  const lowered = password.toLowerCase();
  if (common.has(lowered))
    return "This password is on a list of commonly used passwords. Choose another.";
  if (/^(.)\1*$/.test(password)) return "A single repeated character is too easy to guess.";
  const localPart = context.email.split("@")[0]!.toLowerCase();
  if (
    lowered === context.email.toLowerCase() ||
    (localPart.length >= 4 && lowered.includes(localPart))
  ) {
    return "Do not use your e-mail address in your password.";
  }
  if (
    context.name &&
    lowered.replace(/\s+/g, "") === context.name.toLowerCase().replace(/\s+/g, "")
  ) {
    return "Do not use your name as your password.";
  }
  return null;
}

/** Throws a 400 naming `field` when the password is refused. */
export function assertAcceptablePassword(
  password: string,
  context: { email: string; name?: string },
  field: string,
): void {
  const problem = passwordProblem(password, context);
  if (problem)
    throw new AppError("validation_failed", 400, problem, { fields: { [field]: problem } });
}
