import { useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";

import { useRemoveIdentityProvider } from "../api/remove-identity-provider";
import { problemText } from "./editor-parts";

/** Takes the provider away, after saying what follows for the people it signs in. */
export function RemoveIdentityProvider({
  name,
  onRemoved,
}: {
  name: string;
  onRemoved: () => void;
}) {
  const remove = useRemoveIdentityProvider();
  const [confirming, setConfirming] = useState(false);
  const trigger = useRef<HTMLButtonElement>(null);

  return (
    <div className="flex flex-col gap-3">
      {remove.isError ? (
        <Alert role="alert" tone="error" title="Not removed">
          <p>{problemText(remove.error)}</p>
        </Alert>
      ) : null}
      <Button
        ref={trigger}
        variant="secondary"
        className="self-start"
        disabled={confirming}
        onClick={() => setConfirming(true)}
      >
        Remove provider
      </Button>
      {confirming ? (
        <ConfirmStep
          title={`Remove ${name}?`}
          confirmLabel="Remove provider"
          cancelLabel="Keep it"
          pending={remove.isPending}
          returnFocusRef={trigger}
          onConfirm={() =>
            remove.mutate(undefined, {
              onSuccess: () => {
                setConfirming(false);
                onRemoved();
              },
            })
          }
          onCancel={() => setConfirming(false)}
        >
          <p>
            Nobody can sign in through {name} any more. People of its domains sign in with a Lintel
            password again, and those who never had one set it with &ldquo;Forgot your
            password?&rdquo;.
          </p>
        </ConfirmStep>
      ) : null}
    </div>
  );
}
