import { apiSearch, type CommitteeView } from "../lib/committee-view";
import { type DownloadedFile, type DownloadOptions, downloadFile } from "../lib/download-file";

export function auditsExportPath(view: CommitteeView): string {
  return `/api/committee/audits/export${apiSearch(view)}`;
}

/** Every submitted audit in the period as CSV; streamed, so its size is not known in advance. */
export function downloadAudits(
  view: CommitteeView,
  options?: DownloadOptions,
): Promise<DownloadedFile> {
  return downloadFile(auditsExportPath(view), `audits-${view.from}-to-${view.to}.csv`, options);
}
