import { afterEach, beforeEach, vi } from "vitest";

// A console.error during a test means something went wrong that the assertions did not catch.
let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.mocked(console.error).mockRestore();
  if (errors.length > 0) {
    throw new Error(
      `console.error was called during the test:\n${errors.map((a) => a.map(String).join(" ")).join("\n")}`,
    );
  }
});
