import {
  type CommitteePressureResponse,
  hoursText,
  rateText,
} from "@shared/schemas/committee-pressure";

export interface ReportDrawing {
  addPage: () => void;
  heading: (text: string) => void;
  paragraph: (text: string, size: number, color: string) => void;
  table: (columns: string[], rows: string[][]) => void;
}

export const pressureReportHeaders = {
  sites: ["Site", "Month", "Excursions", "Monitored hours", "Per 1,000 h (95% interval)"],
  rooms: ["Site", "Month", "Room", "Monitored hours", "Hours out of range", "Excursions"],
} as const;

/**
 * The report's "Room pressure" page: per site and month the excursions per 1,000 monitored hours
 * with the exact interval, then the hours out of range per room. Sites without monitors are named.
 */
export function pressureSection(
  figures: CommitteePressureResponse,
  draw: ReportDrawing,
  colours: { ink: string; muted: string },
) {
  draw.addPage();
  draw.heading("Room pressure");
  draw.paragraph(
    `From the rooms' pressure monitors, per site and month on the site's clock. Monitored hours: the minutes in which a room's monitor sent at least one reading, divided by 60. Hours out of range: the time of the room's excursions inside the month, from the first reading out of range (so the grace time counts) to the end of the excursion. An excursion is counted in the month it started. Rates are excursions per ${figures.per.toLocaleString("en-GB")} monitored hours with the exact (Garwood) Poisson ${Math.round(figures.confidence * 100)}% interval. Lintel is not a life-safety alarm system and does not replace the building's own alarms.`,
    9,
    colours.muted,
  );
  const monitored = figures.sites.filter((site) => site.months.length > 0);
  const without = figures.sites.filter((site) => site.months.length === 0);
  if (without.length > 0)
    draw.paragraph(
      `No monitors: ${without.map((site) => site.siteName).join(", ")}.`,
      9,
      colours.ink,
    );
  if (monitored.length === 0) return;
  draw.table(
    [...pressureReportHeaders.sites],
    monitored.flatMap((site) =>
      site.months.map((month) => [
        site.siteName,
        month.month,
        String(month.excursions),
        hoursText(month.monitoredHours),
        month.rate ? rateText(month.rate) : "Not monitored",
      ]),
    ),
  );
  draw.heading("Hours out of range by room");
  draw.table(
    [...pressureReportHeaders.rooms],
    monitored.flatMap((site) =>
      site.months.flatMap((month) =>
        month.rooms.map((room) => [
          site.siteName,
          month.month,
          room.spaceName,
          hoursText(room.monitoredHours),
          hoursText(room.hoursOutOfRange),
          String(room.excursions),
        ]),
      ),
    ),
  );
}
