import type { Site } from "@shared/schemas/site";

import { Card } from "@/components/ui/card";
import { formatCoordinate, formatLocalTime, formatTimeZone } from "@/lib/format";

export interface SiteDetailsProps {
  site: Site;
}

export function SiteDetails({ site }: SiteDetailsProps) {
  const localTime = formatLocalTime(site.timeZone);
  const rows = [
    { term: "Address", value: site.address },
    { term: "Time zone", value: formatTimeZone(site.timeZone) },
    ...(localTime ? [{ term: "Local time now", value: localTime }] : []),
    {
      term: "Location",
      value: `${formatCoordinate(site.latitude, "N", "S")}, ${formatCoordinate(site.longitude, "E", "W")}`,
    },
  ];

  return (
    <Card>
      <h2 className="text-lg font-semibold">Site details</h2>
      <dl className="mt-3 grid gap-x-6 gap-y-3 sm:grid-cols-[max-content_1fr]">
        {rows.map((row) => (
          <div key={row.term} className="contents">
            <dt className="text-sm font-semibold text-ink-muted sm:text-base">{row.term}</dt>
            <dd className="-mt-2 text-ink sm:mt-0">{row.value}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}
