import { apiSearch, type CommitteePeriod } from "../lib/committee-view";
import { type DownloadedFile, type DownloadOptions, downloadFile } from "../lib/download-file";

export function pressureExportPath(period: CommitteePeriod): string {
  return `/api/committee/pressure/export${apiSearch(period)}`;
}

/** The room-pressure figures of the period as CSV: per site and month, then per room. */
export function downloadPressure(
  period: CommitteePeriod,
  options?: DownloadOptions,
): Promise<DownloadedFile> {
  return downloadFile(
    pressureExportPath(period),
    `room-pressure-${period.from}-to-${period.to}.csv`,
    options,
  );
}
