import { useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { errorMessage } from "@/lib/error-message";

import { useDeleteFloor } from "../api/delete-floor";
import { useRetireFloor } from "../api/retire-floor";
import { DeleteRefusal } from "./delete-refusal";

export interface FloorRetirementProps {
  floorId: string;
  floorName: string;
  spaceCount: number;
  /** Where to go once the floor has left the site's list (retired or deleted). */
  onGone: (message: string) => void;
}

/** Retire or delete the whole floor, for administrators, each behind a plain-words confirmation. */
export function FloorRetirement({ floorId, floorName, spaceCount, onGone }: FloorRetirementProps) {
  const retire = useRetireFloor();
  const remove = useDeleteFloor();
  const [confirming, setConfirming] = useState<"retire" | "delete" | null>(null);
  const retireTrigger = useRef<HTMLButtonElement>(null);
  const deleteTrigger = useRef<HTMLButtonElement>(null);
  const headingId = useId();
  const spaces = spaceCount === 1 ? "its 1 space" : `its ${spaceCount} spaces`;

  return (
    <Card>
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Retire or delete this floor
        </h2>
        <p className="mt-1 text-ink-muted">
          A floor whose spaces have been audited is retired, never deleted, so its history stays.
        </p>
        {!confirming ? (
          <div className="mt-3 flex flex-wrap gap-3">
            <Button
              ref={retireTrigger}
              variant="secondary"
              onClick={() => {
                retire.reset();
                setConfirming("retire");
              }}
            >
              Retire floor
            </Button>
            <Button
              ref={deleteTrigger}
              variant="quiet"
              onClick={() => {
                remove.reset();
                setConfirming("delete");
              }}
            >
              Delete floor
            </Button>
          </div>
        ) : null}
        {confirming === "retire" ? (
          <ConfirmStep
            className="mt-3"
            title={`Retire ${floorName}?`}
            confirmLabel="Retire floor"
            pending={retire.isPending}
            returnFocusRef={retireTrigger}
            onCancel={() => setConfirming(null)}
            onConfirm={() =>
              retire.mutate(
                { floorId },
                {
                  onSuccess: (result) =>
                    onGone(
                      `${result.name} is retired with ${result.spaces} ${result.spaces === 1 ? "space" : "spaces"}.${result.actions > 0 ? ` ${result.actions} unfinished corrective ${result.actions === 1 ? "action is" : "actions are"} now Done as “space retired”.` : ""}`,
                    ),
                },
              )
            }
          >
            <p className="text-sm">
              The floor and {spaces} leave the site&apos;s plans, the due list, QR sheets and new
              audits. Their audits, findings and corrective actions are kept in history, exports and
              the committee&apos;s figures.
            </p>
            <p className="text-sm">
              Corrective actions not done yet on this floor become Done with the reason &ldquo;space
              retired&rdquo;; they do not count as fixed. An administrator can restore the floor
              from the site page, and everything this step hides comes back with it.
            </p>
            {retire.isError ? (
              <Alert role="alert" tone="error">
                {errorMessage(retire.error)}
              </Alert>
            ) : null}
          </ConfirmStep>
        ) : null}
        {confirming === "delete" ? (
          <ConfirmStep
            className="mt-3"
            title={`Delete ${floorName}?`}
            confirmLabel="Delete floor"
            pending={remove.isPending}
            returnFocusRef={deleteTrigger}
            onCancel={() => setConfirming(null)}
            onConfirm={() =>
              remove.mutate(floorId, { onSuccess: () => onGone(`${floorName} is deleted.`) })
            }
          >
            <p className="text-sm">
              The floor, its plan and {spaces} are removed for good. Only a floor none of whose
              spaces was ever audited or had a corrective action can be deleted; otherwise retire
              it.
            </p>
            {remove.isError ? (
              <DeleteRefusal
                error={remove.error}
                onRetireInstead={() => {
                  retire.reset();
                  setConfirming("retire");
                }}
              />
            ) : null}
          </ConfirmStep>
        ) : null}
      </section>
    </Card>
  );
}
