import type { PressureNowResponse } from "@shared/schemas/pressure-site";
import type { ReactNode } from "react";

import { describeRoom, needsAttention } from "../lib/pressure-words";
import { PressureStateBadge } from "./pressure-state-badge";

/**
 * For a due list: a function giving, for a room whose pressure needs someone now, its state in
 * words (shown ahead of the last audit's verdict), and nothing for every other space.
 */
export function liveStateOf(
  pressure: PressureNowResponse | undefined,
): (spaceId: string) => ReactNode {
  const rooms = new Map(
    (pressure?.rooms ?? [])
      .filter((room) => needsAttention(room.state))
      .map((room) => [room.spaceId, room]),
  );
  return (spaceId) => {
    const room = rooms.get(spaceId);
    if (!room || !pressure) return null;
    return (
      <span className="flex flex-col items-end gap-0.5 text-right">
        <PressureStateBadge state={room.state} />
        <span className="text-xs text-ink-muted">{describeRoom(room, pressure.asOf)}</span>
      </span>
    );
  };
}
