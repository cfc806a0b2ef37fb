import { sql } from "drizzle-orm";

import type { ZoneType } from "@shared/zones";

import type { DbOrTx } from "../../db/client";

export interface PressurePeriod {
  from: string;
  to: string;
  zoneType?: ZoneType;
}

const siteArray = (siteIds: readonly string[]) => sql`${`{${siteIds.join(",")}}`}::uuid[]`;

/**
 * The committee's room-pressure counts in one statement, one row of two JSON lists: the sites the
 * person may read (as the comparison chooses them) with how many monitors are mapped to their
 * rooms now, and one entry per room and month (months on the site's clock) with the minutes its
 * monitor sent a reading in, the seconds of out-of-range excursions inside the month (from the
 * first reading out of range, so the grace time counts, to the end or `now` for one still
 * running) and the excursions that started in the month. Grouped in PostgreSQL: the minutes are
 * summed from the hourly roll-ups' count of minutes with a reading, through their primary key,
 * one range per monitor and month (hours are UTC hours: a site on a half-hour offset has its
 * month's first and last half hour counted in the neighbouring month).
 */
export const pressureQueries = {
  figures: (
    networkId: string,
    onlyIds: readonly string[] | null,
    period: PressurePeriod,
    now: Date,
  ) => {
    const zone = period.zoneType ? sql`and sp.zone_type = ${period.zoneType}` : sql``;
    const at = sql`${now.toISOString()}::timestamptz`;
    return sql`
    with readable as (
      select id, name, time_zone from sites
       where network_id = ${networkId}
         ${onlyIds === null ? sql`` : sql`and id = any(${siteArray(onlyIds)})`}
    ), months as (
      select r.id as site_id, to_char(m.month, 'YYYY-MM') as month,
             (m.month::timestamp at time zone r.time_zone) as starts,
             ((m.month + interval '1 month')::timestamp at time zone r.time_zone) as ends
        from readable r
       cross join generate_series(${`${period.from}-01`}::date, ${`${period.to}-01`}::date,
                                  interval '1 month') as m(month)
    ), monitors as (
      select pm.site_id, pm.space_id, pm.monitor_id, pm.mapped_at,
             coalesce(pm.unmapped_at, 'infinity'::timestamptz) as unmapped_at
        from pressure_monitor_mappings pm
        join spaces sp on sp.id = pm.space_id ${zone}
       where pm.site_id in (select id from readable)
    ), monitored as (
      -- A monitor's hours count for the room it watched in that hour.
      select mo.site_id, mo.space_id, m.month, sum(ph.minutes_with_readings)::int as minutes
        from monitors mo
        join months m on m.site_id = mo.site_id
        join pressure_hours ph
          on ph.monitor_id = mo.monitor_id
         and ph.bucket_start >= greatest(m.starts, mo.mapped_at)
         and ph.bucket_start < least(m.ends, mo.unmapped_at)
       group by mo.site_id, mo.space_id, m.month
    ), excursions as (
      select pa.site_id, pa.space_id, m.month,
             count(*) filter (where pa.started_at >= m.starts)::int as started,
             sum(extract(epoch from least(coalesce(pa.ended_at, ${at}), m.ends)
                                    - greatest(pa.started_at, m.starts)))::float8 as seconds
        from pressure_alarms pa
        join spaces sp on sp.id = pa.space_id ${zone}
        join months m
          on m.site_id = pa.site_id
         and pa.started_at < m.ends and coalesce(pa.ended_at, ${at}) > m.starts
       where pa.kind = 'out_of_range' and pa.site_id in (select id from readable)
         and pa.started_at < ${at}
       group by pa.site_id, pa.space_id, m.month
    ), rooms as (
      select site_id, space_id from monitors
      union
      select site_id, space_id from excursions
    )
    select
      (select coalesce(json_agg(json_build_object(
                'site_id', r.id, 'site_name', r.name,
                'monitors', (select count(*) from monitors mo
                              where mo.site_id = r.id and mo.unmapped_at = 'infinity'))
              order by r.name, r.id), '[]')
         from readable r) as sites,
      (select coalesce(json_agg(json_build_object(
                'site_id', ro.site_id, 'space_id', ro.space_id, 'space_name', sp.name,
                'month', m.month,
                'minutes', coalesce(mon.minutes, 0),
                'seconds', coalesce(ex.seconds, 0),
                'started', coalesce(ex.started, 0))
              order by ro.site_id, f.level, f.name, sp.name, sp.id, m.month), '[]')
         from rooms ro
         join spaces sp on sp.id = ro.space_id
         join floors f on f.id = sp.floor_id
         join months m on m.site_id = ro.site_id
         left join monitored mon
           on mon.site_id = ro.site_id and mon.space_id = ro.space_id and mon.month = m.month
         left join excursions ex
           on ex.site_id = ro.site_id and ex.space_id = ro.space_id and ex.month = m.month
      ) as rooms`;
  },
};

export interface PressureSiteRow {
  site_id: string;
  site_name: string;
  monitors: number;
}

export interface PressureRoomMonthRow {
  site_id: string;
  space_id: string;
  space_name: string;
  month: string;
  minutes: number;
  seconds: number;
  started: number;
}

export async function pressureFigureRows(
  db: DbOrTx,
  networkId: string,
  onlyIds: readonly string[] | null,
  period: PressurePeriod,
  now: Date,
) {
  const result = await db.execute<{ sites: PressureSiteRow[]; rooms: PressureRoomMonthRow[] }>(
    pressureQueries.figures(networkId, onlyIds, period, now),
  );
  return result.rows[0]!;
}
