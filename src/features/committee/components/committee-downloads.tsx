import { downloadAudits } from "../api/download-audits";
import { downloadComparison } from "../api/download-comparison";
import { downloadObservations } from "../api/download-observations";
import { downloadPressure } from "../api/download-pressure";
import { downloadReport } from "../api/download-report";
import { type CommitteeView, periodOf } from "../lib/committee-view";
import { DownloadButton } from "./download-button";

export const downloadLabels = {
  report: "Download the monthly report (PDF)",
  comparison: "Download the comparison (CSV)",
  audits: "Download the audits (CSV)",
  observations: "Download the observation figures (CSV)",
  pressure: "Download the room pressure figures (CSV)",
} as const;

/** The exports of the view on screen: the same period, zone type and pair of sites. */
export function CommitteeDownloads({ view }: { view: CommitteeView }) {
  return (
    <section
      aria-labelledby="committee-downloads"
      className="rounded-card border border-surface-line bg-surface p-4 print:hidden"
    >
      <h2 id="committee-downloads" className="text-lg font-semibold">
        Reports and exports
      </h2>
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <DownloadButton
          label={downloadLabels.report}
          what="the monthly report (PDF)"
          download={(options) => downloadReport(view, options)}
        />
        <DownloadButton
          label={downloadLabels.comparison}
          what="the comparison (CSV)"
          countsRows
          download={(options) => downloadComparison(view, options)}
        />
        <DownloadButton
          label={downloadLabels.audits}
          what="the audits (CSV)"
          countsRows
          download={(options) => downloadAudits(view, options)}
        />
        <DownloadButton
          label={downloadLabels.observations}
          what="the observation figures (CSV)"
          countsRows
          download={(options) => downloadObservations(view, options)}
        />
        <DownloadButton
          label={downloadLabels.pressure}
          what="the room pressure figures (CSV)"
          countsRows
          download={(options) => downloadPressure(periodOf(view), options)}
        />
      </div>
    </section>
  );
}
