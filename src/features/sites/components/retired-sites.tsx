import type { RetiredSite } from "@shared/schemas/retirement";
import { useId, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format";

import { useRetiredSites } from "../api/get-retired-sites";
import { useRestoreSite } from "../api/restore-site";

function RetiredSiteRow({
  site,
  onRestored,
}: {
  site: RetiredSite;
  onRestored: (text: string) => void;
}) {
  const restore = useRestoreSite();
  return (
    <li className="flex flex-col gap-2 py-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block font-semibold">{site.name}</span>
          <span className="block text-sm text-ink-muted">
            Retired {formatDateTime(site.retiredAt)}
            {site.retiredByName ? ` by ${site.retiredByName}` : ""}
          </span>
        </span>
        <Button
          variant="secondary"
          disabled={restore.isPending}
          onClick={() =>
            restore.mutate(
              { siteId: site.id },
              {
                onSuccess: (result) =>
                  onRestored(
                    `${result.name} is back with ${result.floors} ${result.floors === 1 ? "floor" : "floors"} and ${result.spaces} ${result.spaces === 1 ? "space" : "spaces"}.`,
                  ),
              },
            )
          }
        >
          Restore site <span className="sr-only">{site.name}</span>
        </Button>
      </div>
      {restore.isError ? (
        <Alert role="alert" tone="error">
          {restore.error.message}
        </Alert>
      ) : null}
    </li>
  );
}

/** Retired sites of the network with Restore, for network-wide administrators; hidden when none. */
export function RetiredSites() {
  const retired = useRetiredSites();
  const headingId = useId();
  const [restored, setRestored] = useState<string | null>(null);
  if (!restored && (!retired.data || retired.data.length === 0)) return null;

  return (
    <Card className="mt-6">
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Retired sites
        </h2>
        <p className="mt-1 mb-3 text-ink-muted">
          Hidden from site lists and new audits; their history stays in the committee&apos;s
          figures.
        </p>
        {restored ? (
          <Alert role="status" tone="success" className="mb-3">
            {restored}
          </Alert>
        ) : null}
        <ul className="divide-y divide-surface-line">
          {(retired.data ?? []).map((site) => (
            <RetiredSiteRow key={site.id} site={site} onRestored={setRestored} />
          ))}
        </ul>
      </section>
    </Card>
  );
}
