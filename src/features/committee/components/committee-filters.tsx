import { type ZoneType, zoneTypeLabels, zoneTypes } from "@shared/zones";
import { useState } from "react";

import { SelectField } from "@/components/ui/select-field";
import { TextField } from "@/components/ui/text-field";

import { type CommitteeView, isMonth, viewErrors } from "../lib/committee-view";

export interface CommitteeFiltersProps {
  view: CommitteeView;
  /** The sites the person can read, once known. */
  sites: readonly { id: string; name: string }[];
  /** Only the fields that changed; an undefined one is cleared. */
  onChange: (change: Partial<CommitteeView>) => void;
}

const zoneOptions = zoneTypes.map((zoneType) => ({
  value: zoneType,
  label: zoneTypeLabels[zoneType],
}));

/**
 * Period, zone type and the pair of sites. A month field may be half typed; only a whole month
 * changes the view, and the field keeps what was typed until then.
 */
export function CommitteeFilters({ view, sites, onChange }: CommitteeFiltersProps) {
  const [draft, setDraft] = useState<{ from?: string; to?: string }>({});
  const errors = viewErrors(view);
  const siteOptions = sites.map((site) => ({ value: site.id, label: site.name }));

  const changeMonth = (field: "from" | "to", value: string) => {
    if (isMonth(value)) {
      setDraft((current) => ({ ...current, [field]: undefined }));
      onChange({ [field]: value });
    } else {
      setDraft((current) => ({ ...current, [field]: value }));
    }
  };

  return (
    <div
      role="search"
      aria-label="Choose what the committee view shows"
      className="grid grid-cols-2 items-start gap-3 rounded-card border border-surface-line bg-surface p-4 md:grid-cols-6 print:hidden"
    >
      <TextField
        label="From"
        className="md:col-span-2"
        type="month"
        value={draft.from ?? view.from}
        max={view.to}
        error={draft.from !== undefined ? "A month such as 2026-03." : errors.from}
        onChange={(event) => changeMonth("from", event.target.value)}
      />
      <TextField
        label="To"
        className="md:col-span-2"
        type="month"
        value={draft.to ?? view.to}
        min={view.from}
        error={draft.to !== undefined ? "A month such as 2026-03." : errors.to}
        onChange={(event) => changeMonth("to", event.target.value)}
      />
      <SelectField
        label="Zone type"
        className="col-span-2"
        placeholder="All zone types"
        options={zoneOptions}
        value={view.zoneType ?? ""}
        onChange={(event) =>
          onChange({ zoneType: (event.target.value as ZoneType | "") || undefined })
        }
      />
      <SelectField
        label="Site A"
        className="md:col-span-3"
        options={siteOptions}
        value={view.siteA ?? ""}
        disabled={siteOptions.length < 2}
        error={errors.siteA}
        onChange={(event) => onChange({ siteA: event.target.value })}
      />
      <SelectField
        label="Site B"
        className="md:col-span-3"
        options={siteOptions}
        value={view.siteB ?? ""}
        disabled={siteOptions.length < 2}
        error={errors.siteB}
        onChange={(event) => onChange({ siteB: event.target.value })}
      />
    </div>
  );
}
