import type { PressureNowResponse } from "@shared/schemas/pressure-site";
import { useId } from "react";

import { describeRoom, needsAttention } from "../lib/pressure-words";
import { PressureStateBadge } from "./pressure-state-badge";

/**
 * Beside the plan: the rooms of this floor whose pressure needs someone now, in words, matching
 * the pins drawn on them. Nothing while every room is fine.
 */
export function FloorPressureList({
  pressure,
  floorId,
}: {
  pressure: PressureNowResponse | undefined;
  floorId: string;
}) {
  const headingId = useId();
  const rooms = (pressure?.rooms ?? []).filter(
    (room) => room.floorId === floorId && needsAttention(room.state),
  );
  if (!pressure || rooms.length === 0) return null;
  return (
    <section
      aria-labelledby={headingId}
      className="rounded-lg border-2 border-verdict-not-ready bg-surface p-3"
    >
      <h2 id={headingId} className="font-semibold">
        Room pressure now
      </h2>
      <ul className="mt-2 flex flex-col gap-2">
        {rooms.map((room) => (
          <li key={room.spaceId} className="flex flex-col gap-1">
            <div className="flex flex-wrap items-center gap-2">
              <span className="font-semibold text-brand-800">{room.spaceName}</span>
              <PressureStateBadge state={room.state} />
            </div>
            <span className="text-sm text-ink-muted">{describeRoom(room, pressure.asOf)}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
