import { stringify } from "csv-stringify/sync";

import type { CommitteePressureResponse } from "@shared/schemas/committee-pressure";

import { asCell, cautionRow, csvPreamble } from "../../lib/csv";

const hours = (value: number) => value.toFixed(2);
const fixed = (value: number | null | undefined) =>
  value === null || value === undefined ? "" : value.toFixed(4);

export const pressureCsvColumns = (response: CommitteePressureResponse) => [
  "site",
  "month",
  "room",
  "monitored hours",
  "hours out of range",
  "excursions started",
  `excursions per ${response.per.toLocaleString("en-GB")} monitored hours`,
  "95% interval low (exact Poisson)",
  "95% interval high (exact Poisson)",
  "note",
];

/**
 * The room-pressure figures as CSV: per site and month one row for the site (room empty) with
 * its rate, then one row per monitored room. A site without monitors has one row saying so.
 */
export function pressureCsv(response: CommitteePressureResponse): string {
  const rows: unknown[][] = [];
  for (const site of response.sites) {
    if (site.months.length === 0) {
      rows.push([site.siteName, "", "", "", "", "", "", "", "", "No monitors"]);
      continue;
    }
    for (const month of site.months) {
      rows.push([
        site.siteName,
        month.month,
        "",
        hours(month.monitoredHours),
        hours(month.hoursOutOfRange),
        month.excursions,
        fixed(month.rate?.rate),
        fixed(month.rate?.lower),
        fixed(month.rate?.upper),
        month.rate ? "" : "Not monitored this month: no rate",
      ]);
      for (const room of month.rooms)
        rows.push([
          site.siteName,
          month.month,
          room.spaceName,
          hours(room.monitoredHours),
          hours(room.hoursOutOfRange),
          room.excursions,
          "",
          "",
          "",
          "",
        ]);
    }
  }
  const columns = pressureCsvColumns(response);
  const csv = stringify(
    rows.map((row) => row.map(asCell)),
    { header: true, columns },
  );
  return `${csvPreamble}${csv}${cautionRow(columns.length)}`;
}
