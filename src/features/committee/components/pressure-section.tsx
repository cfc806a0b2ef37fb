import {
  type CommitteePressureResponse,
  hoursText,
  type PressureRate,
  type PressureSiteFigures,
  rateText,
} from "@shared/schemas/committee-pressure";
import { zoneTypeLabels } from "@shared/zones";
import { useId, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import { usePressureFigures } from "../api/get-pressure-figures";
import { tableStyles } from "../lib/chart-style";
import { monthText } from "../lib/committee-format";
import { type CommitteePeriod, monthOf } from "../lib/committee-view";

/** The month the room tables open on: the period's last month, or this one if the period runs on. */
function openingMonth(period: CommitteePeriod, now: Date = new Date()): string {
  const current = monthOf(now);
  if (period.to <= current) return period.to;
  return period.from > current ? period.from : current;
}

/** "2.1 (0.3 to 7.6)", the interval free to go under the rate on a narrow screen. */
function RateWords({ rate }: { rate: PressureRate }) {
  const words = rateText(rate);
  const cut = words.indexOf(" (");
  return (
    <>
      <span className="font-semibold">{words.slice(0, cut)}</span>{" "}
      <span className="inline-block whitespace-nowrap">{words.slice(cut + 1)}</span>
    </>
  );
}

function SiteMonths({ site, per }: { site: PressureSiteFigures; per: number }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Excursions month by month</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Month
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Excursions in monitored hours
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              {`Per ${per.toLocaleString("en-GB")} h (95% interval)`}
            </th>
          </tr>
        </thead>
        <tbody>
          {site.months.map((month) => (
            <tr key={month.month}>
              <th scope="row" className={cn(tableStyles.cell, "font-normal whitespace-nowrap")}>
                {monthText(month.month)}
              </th>
              <td className={tableStyles.number}>
                <span className="font-semibold">{month.excursions}</span>{" "}
                <span className="inline-block whitespace-nowrap text-ink-muted">
                  {`in ${hoursText(month.monitoredHours)} h`}
                </span>
              </td>
              <td className={tableStyles.number}>
                {month.rate ? (
                  <RateWords rate={month.rate} />
                ) : (
                  <span className="text-ink-muted">Not monitored</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function RoomHours({ site, month }: { site: PressureSiteFigures; month: string }) {
  const shown = site.months.find((entry) => entry.month === month);
  if (!shown) return null;
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>
          {`Hours out of range by room, ${monthText(month, "long")}`}
        </caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Room
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Hours out of range
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Monitored hours
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Excursions
            </th>
          </tr>
        </thead>
        <tbody>
          {shown.rooms.map((room) => (
            <tr key={room.spaceId}>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                {room.spaceName}
              </th>
              <td
                className={cn(
                  tableStyles.number,
                  room.hoursOutOfRange > 0 && "font-semibold text-verdict-not-ready",
                )}
              >
                {hoursText(room.hoursOutOfRange)}
              </td>
              <td className={tableStyles.number}>{hoursText(room.monitoredHours)}</td>
              <td className={tableStyles.number}>{room.excursions}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function SitePressure({
  site,
  month,
  per,
  named,
}: {
  site: PressureSiteFigures;
  month: string;
  per: number;
  named: boolean;
}) {
  const headingId = useId();
  const body =
    site.months.length === 0 ? (
      <p className="text-ink-muted">
        No monitors: no room here has a pressure monitor mapped to it, so there is nothing to count.
      </p>
    ) : (
      <>
        <SiteMonths site={site} per={per} />
        <RoomHours site={site} month={month} />
      </>
    );
  if (!named) return <div className="flex flex-col gap-4">{body}</div>;
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-4">
      <h3 id={headingId} className="text-lg font-semibold">
        {site.siteName}
        {site.months.length === 0 ? (
          <span className="font-normal text-ink-muted">: no monitors</span>
        ) : null}
      </h3>
      {site.months.length === 0 ? null : body}
    </section>
  );
}

function MonthChooser({
  response,
  month,
  onChoose,
}: {
  response: CommitteePressureResponse;
  month: string;
  onChoose: (month: string) => void;
}) {
  const months = response.sites.find((site) => site.months.length > 0)?.months ?? [];
  if (months.length < 2) return null;
  return (
    <SelectField
      label="Rooms in the month of"
      className="max-w-md"
      value={month}
      options={months.map((entry) => ({
        value: entry.month,
        label: monthText(entry.month, "long"),
      }))}
      onChange={(event) => onChoose(event.target.value)}
    />
  );
}

export interface PressureSectionProps {
  period: CommitteePeriod;
  /** On a site's page, that site only; otherwise every site the person may read. */
  siteId?: string;
}

/**
 * Live room pressure for the committee: per site and month, excursions per 1,000 monitored hours
 * with the exact Poisson interval, and hours out of range per room.
 */
export function PressureSection({ period, siteId }: PressureSectionProps) {
  const figures = usePressureFigures(period);
  const [month, setMonth] = useState(() => openingMonth(period));
  const months = figures.data?.sites.find((site) => site.months.length > 0)?.months ?? [];
  // A month outside the period (after the period changed) falls back to the opening month.
  const shownMonth = months.some((entry) => entry.month === month) ? month : openingMonth(period);
  const sites = figures.data?.sites.filter((site) => !siteId || site.siteId === siteId) ?? [];

  return (
    <section aria-labelledby="committee-pressure" className="flex flex-col gap-4">
      <div>
        <h2 id="committee-pressure" className="text-xl font-bold tracking-tight">
          Room pressure
        </h2>
        <p className="mt-1 max-w-prose text-ink-muted">
          From the rooms&apos; pressure monitors, month by month on each site&apos;s clock.
          Monitored hours are the minutes in which a room&apos;s monitor sent at least one reading,
          divided by 60. Hours out of range run from the first reading out of range (the grace time
          counts) to the end of the excursion. An excursion counts in the month it started. The rate
          is excursions per 1,000 monitored hours with its exact 95% interval (Garwood).
          {period.zoneType
            ? ` Only ${zoneTypeLabels[period.zoneType].toLowerCase()}s are counted.`
            : ""}
        </p>
      </div>
      {figures.isPending ? (
        <Spinner label="Loading the room pressure…" className="py-8" />
      ) : figures.isError ? (
        <Alert role="alert" tone="error" title="We could not load the room pressure">
          <p>{figures.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void figures.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : sites.length === 0 ? (
        <p className="text-ink-muted">No site to show.</p>
      ) : (
        <>
          {sites.some((site) => site.months.length > 0) ? (
            <MonthChooser response={figures.data} month={shownMonth} onChoose={setMonth} />
          ) : null}
          {sites.map((site) => (
            <SitePressure
              key={site.siteId}
              site={site}
              month={shownMonth}
              per={figures.data.per}
              named={!siteId}
            />
          ))}
          <p className="max-w-prose text-sm text-ink-muted">
            Lintel is not a life-safety alarm system and does not replace the building&apos;s own
            alarms.
          </p>
        </>
      )}
    </section>
  );
}
