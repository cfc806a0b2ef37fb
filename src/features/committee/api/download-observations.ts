import { apiSearch, type CommitteePeriod } from "../lib/committee-view";
import { type DownloadedFile, type DownloadOptions, downloadFile } from "../lib/download-file";
import { observationPeriod } from "./get-observation-figures";

export function observationsExportPath(period: CommitteePeriod): string {
  return `/api/committee/observations/export${apiSearch(observationPeriod(period))}`;
}

/** The observation figures of the period as CSV, per site and for the network. */
export function downloadObservations(
  period: CommitteePeriod,
  options?: DownloadOptions,
): Promise<DownloadedFile> {
  return downloadFile(
    observationsExportPath(period),
    `observations-${period.from}-to-${period.to}.csv`,
    options,
  );
}
