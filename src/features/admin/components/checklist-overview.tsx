import type { ChecklistsResponse, ChecklistVersion } from "@shared/schemas/checklists";
import { type ZoneType, zoneTypeLabels } from "@shared/zones";
import { useId } from "react";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format";

import { quantityUnits, responseLabels, severityLabels } from "../lib/checklist-form";

function itemLimit(item: ChecklistVersion["items"][number]): string | null {
  if (!item.threshold) return null;
  const unit = item.quantity ? ` ${quantityUnits[item.quantity]}` : "";
  return `${item.threshold.op === ">=" ? "at least" : "at most"} ${item.threshold.value}${unit}`;
}

function ChecklistCard({
  entry,
  onEdit,
}: {
  entry: ChecklistsResponse["checklists"][number];
  onEdit: (zoneType: ZoneType) => void;
}) {
  const headingId = useId();
  const { published, draft, defaultUpdate } = entry;
  const items = [...published.items].sort((a, b) => a.position - b.position);
  return (
    <Card>
      <section aria-labelledby={headingId} className="flex flex-col gap-3">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <h2 id={headingId} className="text-lg font-semibold">
              {zoneTypeLabels[entry.zoneType]}
            </h2>
            <p className="text-sm text-ink-muted">
              {published.title} · version {published.version}
              {published.publishedAt
                ? `, published ${formatDateTime(published.publishedAt)}`
                : ""}{" "}
              · {items.length} {items.length === 1 ? "item" : "items"}
            </p>
          </div>
          <div className="flex flex-wrap items-center gap-2">
            {draft ? <Badge tone="pending">Draft of version {draft.version}</Badge> : null}
            <Button onClick={() => onEdit(entry.zoneType)}>
              Edit draft
              <span className="sr-only"> for {zoneTypeLabels[entry.zoneType].toLowerCase()}</span>
            </Button>
          </div>
        </div>
        {defaultUpdate && draft ? (
          <Alert
            tone="info"
            title={`Lintel's default checklist has a version ${defaultUpdate.revision}`}
          >
            <p>
              Your network changed this checklist, so the new default was not published over it. It
              waits as the draft of version {draft.version}, beside your version {published.version}
              . Open the draft, keep your own changes, and publish it when it is right; until then
              every audit uses version {published.version}.
            </p>
          </Alert>
        ) : null}
        <details>
          <summary className="min-h-tap cursor-pointer py-2 font-semibold text-brand-800">
            Items in version {published.version}
          </summary>
          <ol className="mt-2 flex flex-col divide-y divide-surface-line">
            {items.map((item, index) => (
              <li key={item.id} className="py-2">
                <p>
                  <span className="text-ink-muted tabular-nums">{index + 1}. </span>
                  {item.text}
                </p>
                <p className="text-sm text-ink-muted">
                  {severityLabels[item.severity]} · {responseLabels[item.response]}
                  {itemLimit(item) ? ` · ${itemLimit(item)}` : ""}
                  {item.photoOnFail ? " · photo when failed" : ""}
                </p>
                {item.reference ? (
                  <p className="text-xs text-ink-subtle">Reference: {item.reference}</p>
                ) : null}
              </li>
            ))}
          </ol>
        </details>
      </section>
    </Card>
  );
}

export interface ChecklistOverviewProps {
  checklists: ChecklistsResponse["checklists"];
  onEdit: (zoneType: ZoneType) => void;
}

/** Each zone type's checklist as published, with the way into its next draft. */
export function ChecklistOverview({ checklists, onEdit }: ChecklistOverviewProps) {
  return (
    <div className="flex flex-col gap-4">
      {checklists.map((entry) => (
        <ChecklistCard key={entry.zoneType} entry={entry} onEdit={onEdit} />
      ))}
    </div>
  );
}
