import { type Severity, severities } from "@shared/calc/verdict";

import { Card } from "@/components/ui/card";

import { type PinFilter } from "../lib/action-filters";
import { severityLabels } from "../lib/action-labels";
import { AwaitingSymbol, OverdueSymbol, SeveritySymbol } from "./action-badges";

export interface FloorActionsKeyProps {
  filter: PinFilter;
  onFilterChange: (filter: PinFilter) => void;
  /** How many unfinished actions the floor has, and how many are on the map now. */
  total: number;
  shown: number;
  loading?: boolean;
  failed?: boolean;
}

/** The key to the action pins, with severity and overdue as filters. */
export function FloorActionsKey({
  filter,
  onFilterChange,
  total,
  shown,
  loading = false,
  failed = false,
}: FloorActionsKeyProps) {
  const toggle = (severity: Severity, on: boolean) => {
    const next = new Set(filter.severities);
    if (on) next.add(severity);
    else next.delete(severity);
    onFilterChange({ ...filter, severities: next });
  };
  return (
    <Card>
      <h2 className="text-lg font-semibold">Corrective actions not done yet</h2>
      <p aria-live="polite" className="mt-1 text-sm text-ink-muted">
        {loading
          ? "Loading the actions on this floor…"
          : failed
            ? "The actions on this floor could not be loaded."
            : total === 0
              ? "No unfinished actions on this floor."
              : `${shown} of ${total} on the plan. Tap a pin to open its action.`}
      </p>
      <fieldset className="mt-3">
        <legend className="text-sm font-semibold text-ink-muted">Severity on the map</legend>
        <ul className="mt-1">
          {severities.map((severity) => (
            <li key={severity}>
              <label className="flex min-h-tap cursor-pointer items-center gap-3">
                <input
                  type="checkbox"
                  className="size-5 accent-brand-700"
                  checked={filter.severities.has(severity)}
                  onChange={(event) => toggle(severity, event.target.checked)}
                />
                <SeveritySymbol severity={severity} className="size-5" />
                <span>{`${severityLabels[severity]} actions`}</span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <label className="mt-1 flex min-h-tap cursor-pointer items-center gap-3">
        <input
          type="checkbox"
          className="size-5 accent-brand-700"
          checked={filter.overdueOnly}
          onChange={(event) => onFilterChange({ ...filter, overdueOnly: event.target.checked })}
        />
        <span>Overdue actions only</span>
      </label>
      <ul className="mt-3 flex flex-col gap-2 text-sm">
        <li className="flex items-center gap-2">
          <OverdueSymbol className="size-5" />
          Overdue (a ring around the pin and a clock)
        </li>
        <li className="flex items-center gap-2">
          <AwaitingSymbol className="size-5" />
          Fix to check (proof sent, an auditor must look)
        </li>
      </ul>
    </Card>
  );
}
