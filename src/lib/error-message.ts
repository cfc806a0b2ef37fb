/** What to tell a person about a failed request: the server's own words, or a plain fallback. */
export function errorMessage(error: unknown): string {
  return error instanceof Error ? error.message : "That did not work. Please try again.";
}
