import { useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmStep } from "@/components/ui/confirm-step";

import { useRetireSite } from "../api/retire-site";

export interface SiteRetirementProps {
  siteId: string;
  siteName: string;
  onRetired: (message: string) => void;
}

/** Retiring a whole site, for network-wide administrators, behind a plain-words confirmation. */
export function SiteRetirement({ siteId, siteName, onRetired }: SiteRetirementProps) {
  const retire = useRetireSite();
  const [confirming, setConfirming] = useState(false);
  const trigger = useRef<HTMLButtonElement>(null);
  const headingId = useId();

  return (
    <Card>
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Retire this site
        </h2>
        <p className="mt-1 text-ink-muted">
          For a site that no longer cares for patients in isolation. Its history is never deleted.
        </p>
        {!confirming ? (
          <Button
            ref={trigger}
            variant="secondary"
            className="mt-3"
            onClick={() => {
              retire.reset();
              setConfirming(true);
            }}
          >
            Retire site
          </Button>
        ) : (
          <ConfirmStep
            className="mt-3"
            title={`Retire ${siteName}?`}
            confirmLabel="Retire site"
            pending={retire.isPending}
            returnFocusRef={trigger}
            onCancel={() => setConfirming(false)}
            onConfirm={() =>
              retire.mutate(
                { siteId },
                {
                  onSuccess: (result) =>
                    onRetired(
                      `${result.name} is retired with ${result.floors} ${result.floors === 1 ? "floor" : "floors"} and ${result.spaces} ${result.spaces === 1 ? "space" : "spaces"}.`,
                    ),
                },
              )
            }
          >
            <p className="text-sm">
              The site leaves everyone&apos;s list of sites, and its floors and spaces leave the
              plans, due lists, QR sheets and new audits. Its audits, findings and corrective
              actions are kept in history, exports and the committee&apos;s figures.
            </p>
            <p className="text-sm">
              Corrective actions not done yet at the site become Done with the reason &ldquo;space
              retired&rdquo;; they do not count as fixed. A network-wide administrator can restore
              the site from &ldquo;Retired sites&rdquo; on the home page.
            </p>
            {retire.isError ? (
              <Alert role="alert" tone="error">
                {retire.error.message}
              </Alert>
            ) : null}
          </ConfirmStep>
        )}
      </section>
    </Card>
  );
}
