import type { ConnectionTestResponse } from "@shared/schemas/identity-provider";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";

import { useTestIdentityProvider } from "../api/test-identity-provider";
import { problemText } from "./editor-parts";

type Step = ConnectionTestResponse["steps"][number];

const stepNames: Record<Step["step"], string> = {
  address: "The provider's address",
  discovery: "The provider's published settings",
  client: "Lintel's client id and secret",
};

function outcomeOf(ok: boolean | null): { word: string; mark: string; className: string } {
  if (ok === true) return { word: "Passed", mark: "✓", className: "text-verdict-ready" };
  if (ok === false) return { word: "Failed", mark: "✕", className: "text-verdict-not-ready" };
  return { word: "Not tried", mark: "–", className: "text-ink-muted" };
}

/** "Test the connection": each step with its outcome in words and what Lintel found. */
export function ConnectionTest() {
  const test = useTestIdentityProvider();

  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-muted">
        Tries the saved settings: the provider&apos;s address, its published settings, then whether
        it accepts Lintel&apos;s client id and secret. Nobody is signed in.
      </p>
      <Button
        variant="secondary"
        className="self-start"
        disabled={test.isPending}
        aria-busy={test.isPending || undefined}
        onClick={() => test.mutate()}
      >
        {test.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Test the connection
      </Button>
      {test.isError ? (
        <Alert role="alert" tone="error" title="The test could not run">
          <p>{problemText(test.error)}</p>
        </Alert>
      ) : null}
      {test.data ? (
        <div role="status" className="flex flex-col gap-3">
          <p className="font-semibold">
            {test.data.ok
              ? "The connection works."
              : "The connection does not work yet: see the step that failed."}
          </p>
          <ol className="flex flex-col gap-2">
            {test.data.steps.map((step) => {
              const outcome = outcomeOf(step.ok);
              return (
                <li
                  key={step.step}
                  className="rounded-lg border border-surface-line bg-surface p-3 text-sm"
                >
                  <p className="flex flex-wrap items-baseline gap-x-2 font-semibold">
                    <span className={outcome.className}>
                      <span aria-hidden="true">{outcome.mark} </span>
                      {outcome.word}
                    </span>
                    <span>{stepNames[step.step]}</span>
                  </p>
                  <p className="mt-1">{step.words}</p>
                </li>
              );
            })}
          </ol>
        </div>
      ) : null}
    </div>
  );
}
