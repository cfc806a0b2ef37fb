import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useRef, useState } from "react";
import { useNavigate } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import type { UnsentWork } from "@/features/walkthroughs/lib/offline-store";
import { leaveAppFor } from "@/lib/leave-app";

import { signOutOfPhone, type UnsentChoice, unsentWorkOnPhone } from "./sign-out";
import { holdSignedOutNotice, type SignedOutNotice } from "./signed-out-notice";

/** "2 audits with 14 changes", in words, and the observations not yet in Lintel. */
export function describeUnsent({ audits, observations, changes }: UnsentWork): string {
  const observationWords = `${observations} ${observations === 1 ? "observation" : "observations"}`;
  if (audits === 0 && observations > 0) return observationWords;
  const auditWords = `${audits} ${audits === 1 ? "audit" : "audits"}`;
  const also = observations > 0 ? ` and ${observationWords}` : "";
  if (changes === 0) return `${auditWords} not yet submitted${also}`;
  const changed =
    audits > 0 && observations > 0
      ? ""
      : ` with ${changes} ${changes === 1 ? "change" : "changes"}`;
  return `${auditWords}${changed}${also}`;
}

/** Whether the unsent work is one thing ("is saved") or more ("are saved"). */
export function unsentIsOne({ audits, observations }: UnsentWork): boolean {
  return audits + observations === 1;
}

type Step =
  | { kind: "idle" }
  | { kind: "choose"; work: UnsentWork }
  | { kind: "confirm-discard"; work: UnsentWork };

/**
 * Signing out on a phone that may be shared: work not yet in Lintel is named, and the person
 * chooses to keep it for their next sign-in here (nobody else can see or send it) or discard it.
 */
export function SignOutPanel() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [step, setStep] = useState<Step>({ kind: "idle" });
  const [leaving, setLeaving] = useState(false);
  const discardButton = useRef<HTMLButtonElement>(null);

  // Both work with no signal: the choice is about this phone, and the sign-out finishes here.
  const signOut = useMutation({
    networkMode: "always",
    mutationFn: ({ choice }: { choice: UnsentChoice; hadWork: boolean }) =>
      signOutOfPhone(queryClient, choice),
    onSuccess: ({ reachedLintel, providerSignOutUrl }, { choice, hadWork }) => {
      const state: SignedOutNotice = {
        signedOut: { kept: choice === "keep" && hadWork, reachedLintel },
      };
      if (providerSignOutUrl) {
        // Signed in through the network's provider: end that session too. The provider sends the
        // browser back to sign-in, where the notice is shown.
        holdSignedOutNotice(state);
        setLeaving(true);
        leaveAppFor(providerSignOutUrl);
        return;
      }
      void navigate(paths.signIn.getHref(), { replace: true, state });
    },
  });
  const checking = useMutation({
    networkMode: "always",
    mutationFn: unsentWorkOnPhone,
    onSuccess: (work) => {
      if (work.audits === 0 && work.observations === 0 && work.changes === 0)
        signOut.mutate({ choice: "keep", hadWork: false });
      else setStep({ kind: "choose", work });
    },
    // The phone's store could not be read: say so rather than lose anything silently.
  });

  const busy = signOut.isPending || checking.isPending || leaving;

  return (
    <>
      {signOut.isError || checking.isError ? (
        <Alert role="alert" tone="error" title="Could not sign you out" className="mt-3">
          {(signOut.error ?? checking.error)?.message}
        </Alert>
      ) : null}
      {step.kind === "idle" ? (
        <Button
          variant="secondary"
          className="mt-4"
          disabled={busy}
          aria-busy={busy || undefined}
          onClick={() => checking.mutate()}
        >
          {busy ? <SpinnerGlyph className="size-5" /> : null}
          Sign out
        </Button>
      ) : (
        <div
          role="group"
          aria-labelledby="unsent-work-title"
          className="mt-4 flex flex-col gap-4 rounded-lg border-2 border-brand-200 bg-brand-50 p-4"
        >
          <div>
            <h3 id="unsent-work-title" className="font-semibold">
              Not yet in Lintel
            </h3>
            <p className="mt-1">
              {describeUnsent(step.work)} {unsentIsOne(step.work) ? "is" : "are"} saved only on this
              phone.
            </p>
          </div>
          {step.kind === "choose" ? (
            <div className="flex flex-col gap-3">
              <Button
                disabled={busy}
                aria-busy={busy || undefined}
                onClick={() => signOut.mutate({ choice: "keep", hadWork: true })}
              >
                {signOut.isPending || leaving ? <SpinnerGlyph className="size-5" /> : null}
                Keep it and send it when I sign in here again
              </Button>
              <p className="text-sm text-ink-muted">
                It stays on this phone under your name. Nobody else who signs in here can see it,
                and it is never sent under their name.
              </p>
              <Button
                ref={discardButton}
                variant="secondary"
                disabled={busy}
                onClick={() => setStep({ kind: "confirm-discard", work: step.work })}
              >
                Discard it
              </Button>
              <Button variant="quiet" disabled={busy} onClick={() => setStep({ kind: "idle" })}>
                Stay signed in
              </Button>
            </div>
          ) : (
            <ConfirmStep
              title={`Discard ${describeUnsent(step.work)}?`}
              confirmLabel="Discard and sign out"
              cancelLabel="Go back"
              pending={signOut.isPending || leaving}
              returnFocusRef={discardButton}
              onConfirm={() => signOut.mutate({ choice: "discard", hadWork: true })}
              onCancel={() => setStep({ kind: "choose", work: step.work })}
            >
              <p>
                They have not reached Lintel and cannot be recovered: answers, readings and photos
                of {step.work.audits === 1 ? "this audit" : "these audits"} are deleted from this
                phone, and {step.work.audits === 1 ? "it has" : "they have"} to be done again.
              </p>
            </ConfirmStep>
          )}
        </div>
      )}
    </>
  );
}
