import type { Site } from "@shared/schemas/site";
import { Link } from "react-router-dom";

import { Card } from "@/components/ui/card";
import { ClockIcon, PinIcon } from "@/components/ui/icons";
import { formatLocalTime, formatTimeZone } from "@/lib/format";

export interface SiteCardProps {
  site: Site;
  href: string;
}

export function SiteCard({ site, href }: SiteCardProps) {
  const localTime = formatLocalTime(site.timeZone);
  return (
    <Card className="relative flex h-full flex-col gap-3 transition-shadow focus-within:shadow-md hover:shadow-md">
      <h2 className="text-lg leading-snug font-semibold">
        {/* The link covers the whole card so a thumb can hit it anywhere. */}
        <Link
          to={href}
          className="text-brand-800 after:absolute after:inset-0 after:rounded-card hover:underline"
        >
          {site.name}
        </Link>
      </h2>
      <p className="flex items-start gap-2 text-ink-muted">
        <PinIcon className="mt-1" />
        <span>{site.address}</span>
      </p>
      <p className="mt-auto flex items-center gap-2 text-sm text-ink-muted">
        <ClockIcon />
        <span>
          {formatTimeZone(site.timeZone)}
          {localTime ? (
            <>
              {" · "}
              <span className="font-semibold text-ink">{localTime}</span> local time
            </>
          ) : null}
        </span>
      </p>
    </Card>
  );
}
