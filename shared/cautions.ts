/**
 * The product's standing caution, one text for every place readings and verdicts go: the phone's
 * screens, the committee report and every CSV export.
 */
export const cautionText =
  "Lintel supports an infection prevention programme; it does not replace it. Readiness verdicts and scores are Lintel's own rules on top of the cited sources, not a published standard. Ventilation figures are the auditor's readings, not a certification: defer to the facility's engineers, local codes and the authority having jurisdiction.";
