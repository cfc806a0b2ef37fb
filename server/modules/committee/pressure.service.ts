import { monthsOf } from "@shared/calc/observation-stats";
import { eventRate } from "@shared/calc/poisson-interval";
import { committeeConfidence } from "@shared/calc/proportion";
import type { RoleGrant } from "@shared/roles";
import type { CommitteeQuery } from "@shared/schemas/committee";
import {
  type CommitteePressureResponse,
  pressureRateBase,
  type PressureRoomMonth,
} from "@shared/schemas/committee-pressure";

import type { Database } from "../../db/client";
import { grantedSiteIds } from "./committee.service";
import { pressureFigureRows } from "./pressure.repository";

/**
 * Per readable site and month: hours out of range per monitored room, and excursions per 1,000
 * monitored hours with the exact Poisson interval. A site with no monitor mapped (and no
 * excursion on record) has no months: "no monitors", not zero.
 */
export async function pressureFigures(
  db: Database,
  networkId: string,
  grants: readonly RoleGrant[],
  query: Pick<CommitteeQuery, "from" | "to" | "zoneType">,
  now: Date = new Date(),
): Promise<CommitteePressureResponse> {
  const period = { from: query.from, to: query.to, zoneType: query.zoneType };
  const found = await pressureFigureRows(db, networkId, grantedSiteIds(grants), period, now);
  const months = monthsOf(query.from, query.to);
  const roomsOf = new Map<string, Map<string, PressureRoomMonth[]>>();
  for (const row of found.rooms) {
    const byMonth = roomsOf.get(row.site_id) ?? new Map<string, PressureRoomMonth[]>();
    roomsOf.set(row.site_id, byMonth);
    const list = byMonth.get(row.month) ?? [];
    byMonth.set(row.month, list);
    list.push({
      spaceId: row.space_id,
      spaceName: row.space_name,
      monitoredHours: row.minutes / 60,
      hoursOutOfRange: row.seconds / 3600,
      excursions: row.started,
    });
  }
  return {
    from: query.from,
    to: query.to,
    zoneType: query.zoneType ?? null,
    confidence: committeeConfidence,
    per: pressureRateBase,
    sites: found.sites.map((site) => {
      const byMonth = roomsOf.get(site.site_id);
      return {
        siteId: site.site_id,
        siteName: site.site_name,
        monitors: site.monitors,
        months: byMonth
          ? months.map((month) => {
              const rooms = byMonth.get(month) ?? [];
              const excursions = rooms.reduce((sum, room) => sum + room.excursions, 0);
              const monitoredHours = rooms.reduce((sum, room) => sum + room.monitoredHours, 0);
              const rate = eventRate(
                excursions,
                monitoredHours,
                pressureRateBase,
                committeeConfidence,
              );
              return {
                month,
                excursions,
                monitoredHours,
                hoursOutOfRange: rooms.reduce((sum, room) => sum + room.hoursOutOfRange, 0),
                rate: rate && { rate: rate.rate, lower: rate.lower, upper: rate.upper },
                rooms,
              };
            })
          : [],
      };
    }),
  };
}
