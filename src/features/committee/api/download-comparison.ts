import { apiSearch, type CommitteeView } from "../lib/committee-view";
import { type DownloadedFile, type DownloadOptions, downloadFile } from "../lib/download-file";

export function comparisonExportPath(view: CommitteeView): string {
  return `/api/committee/comparison/export${apiSearch(view)}`;
}

/** The comparison as CSV, one row per site and measure. */
export function downloadComparison(
  view: CommitteeView,
  options?: DownloadOptions,
): Promise<DownloadedFile> {
  return downloadFile(
    comparisonExportPath(view),
    `site-comparison-${view.from}-to-${view.to}.csv`,
    options,
  );
}
