import { apiSearch, type CommitteeView } from "../lib/committee-view";
import { type DownloadedFile, type DownloadOptions, downloadFile } from "../lib/download-file";

export function reportPath(view: CommitteeView): string {
  return `/api/committee/report${apiSearch(view)}`;
}

/** The monthly committee report as PDF: comparison, charts, overdue actions, cautions; sent with its size. */
export function downloadReport(
  view: CommitteeView,
  options?: DownloadOptions,
): Promise<DownloadedFile> {
  return downloadFile(reportPath(view), `committee-report-${view.from}-to-${view.to}.pdf`, options);
}
