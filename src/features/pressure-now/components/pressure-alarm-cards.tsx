import type { PressureNowResponse, PressureRoomNow } from "@shared/schemas/pressure-site";
import { useId, useState } from "react";
import { Link } from "react-router-dom";

import { Button, buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format";

import { usePressureNowAt } from "../api/get-pressure-now";
import { describeAlarm, needsAttention } from "../lib/pressure-words";
import { AcknowledgeSheet } from "./acknowledge-sheet";
import { PressureStateBadge } from "./pressure-state-badge";

export interface PressureAlarmCardsProps {
  siteIds: readonly string[];
  /** Whether the person may acknowledge alarms at the site. */
  canAcknowledge: (siteId: string) => boolean;
  /** The room's own page. */
  spaceHref: (spaceId: string) => string;
}

interface OpenAlarm {
  site: PressureNowResponse;
  room: PressureRoomNow & { alarm: NonNullable<PressureRoomNow["alarm"]> };
}

/** Every open alarm at the sites given, the oldest first. */
export function openAlarmsOf(sites: readonly PressureNowResponse[]): OpenAlarm[] {
  return sites
    .flatMap((site) =>
      site.rooms.flatMap((room) =>
        room.alarm && needsAttention(room.state)
          ? [{ site, room: { ...room, alarm: room.alarm } }]
          : [],
      ),
    )
    .sort((a, b) => Date.parse(a.room.alarm.since) - Date.parse(b.room.alarm.since));
}

function AlarmCard({
  site,
  room,
  canAcknowledge,
  spaceHref,
}: OpenAlarm &
  Omit<PressureAlarmCardsProps, "siteIds" | "canAcknowledge"> & {
    canAcknowledge: boolean;
  }) {
  const headingId = useId();
  const [sheetOpen, setSheetOpen] = useState(false);
  const { alarm } = room;
  const words = describeAlarm(alarm, site.asOf);
  const title = `${room.spaceName}, ${site.siteName}`;
  return (
    <li
      aria-labelledby={headingId}
      className="rounded-lg border border-l-4 border-surface-line border-l-verdict-not-ready bg-surface p-3"
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 id={headingId} className="min-w-0 font-semibold text-brand-800">
          {title}
        </h3>
        <PressureStateBadge state={room.state} />
      </div>
      <p className="mt-1 font-semibold text-ink">
        {words.charAt(0).toUpperCase() + words.slice(1)}
      </p>
      <p className="text-sm text-ink-muted">
        {room.floorName} · since {formatDateTime(alarm.since)}
        {alarm.critical ? " · past the action limit: a critical finding" : ""}
      </p>
      {alarm.acknowledgedAt ? (
        <p className="mt-2 rounded-md bg-surface-sunken p-2 text-sm" data-acknowledged="true">
          Acknowledged by {alarm.acknowledgedByName ?? "someone no longer here"},{" "}
          {formatDateTime(alarm.acknowledgedAt)}: “{alarm.acknowledgementNote}”
        </p>
      ) : null}
      <div className="mt-3 flex flex-wrap items-center gap-2">
        {!alarm.acknowledgedAt && canAcknowledge ? (
          <Button aria-describedby={headingId} onClick={() => setSheetOpen(true)}>
            Acknowledge
          </Button>
        ) : null}
        <Link
          to={spaceHref(room.spaceId)}
          aria-describedby={headingId}
          className={buttonStyles({ variant: "secondary", className: "px-3" })}
        >
          Open the room
        </Link>
      </div>
      {sheetOpen ? (
        <AcknowledgeSheet
          siteId={site.siteId}
          alarmId={alarm.id}
          summary={`${title} — ${words}`}
          onClose={() => setSheetOpen(false)}
        />
      ) : null}
    </li>
  );
}

/**
 * Home's alarm card: each room out of range past its grace, or silent, at the person's sites,
 * with who acknowledged it. Nothing is shown while every room is fine.
 */
export function PressureAlarmCards({
  siteIds,
  canAcknowledge,
  spaceHref,
}: PressureAlarmCardsProps) {
  const headingId = useId();
  const { sites } = usePressureNowAt(siteIds);
  const alarms = openAlarmsOf(sites);
  if (alarms.length === 0) return null;
  return (
    <Card className="mb-6 border-verdict-not-ready">
      <section aria-labelledby={headingId}>
        <h2 id={headingId} className="text-lg font-semibold">
          Room pressure alarms <span className="font-normal text-ink-muted">({alarms.length})</span>
        </h2>
        <p className="mt-1 text-sm text-ink-muted">
          From the rooms' monitors. Lintel is not a life-safety alarm: the building's own alarms
          still apply.
        </p>
        <ul aria-label="Room pressure alarms" className="mt-3 flex flex-col gap-2">
          {alarms.map((alarm) => (
            <AlarmCard
              key={alarm.room.alarm.id}
              {...alarm}
              canAcknowledge={canAcknowledge(alarm.site.siteId)}
              spaceHref={spaceHref}
            />
          ))}
        </ul>
      </section>
    </Card>
  );
}
