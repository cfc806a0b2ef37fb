import { stringify } from "csv-stringify/sync";

import type { Proportion } from "@shared/schemas/committee";
import type {
  ObservationCommitteeResponse,
  ObservationFigures,
} from "@shared/schemas/observations";

import { asCell, cautionRow, csvPreamble } from "../../lib/csv";

const fixed = (value: number | null | undefined) =>
  value === null || value === undefined ? "" : value.toFixed(4);

/** The label of the network's rows: every site the person may read, added up. */
export const networkLabel = "All sites you can read";

export const observationCsvColumns = (response: ObservationCommitteeResponse) => [
  "site",
  "measure",
  "sequence",
  "step",
  "month",
  "count",
  "out of",
  "share (0 to 1)",
  "95% interval low (Wilson)",
  "95% interval high (Wilson)",
  `small sample (fewer than ${response.minimumRankedSample})`,
  `withheld (fewer than ${response.minimumStaffCodes} staff codes)`,
  "most error-prone rank",
];

interface Row {
  measure: string;
  sequence?: string;
  step?: string;
  month?: string;
  count?: number | null;
  outOf?: number | null;
  share?: number | null;
  interval?: Proportion["interval"];
  smallSample?: boolean | null;
  withheld?: boolean;
  rank?: number | null;
}

const fromProportion = (p: Proportion & { suppressed?: boolean }, withheld = p.suppressed) =>
  withheld
    ? { withheld: true }
    : {
        count: p.successes,
        outOf: p.n,
        share: p.rate,
        interval: p.interval,
        smallSample: p.smallSample,
        withheld: false,
      };

function rowsOf(figures: ObservationFigures): Row[] {
  const rows: Row[] = [
    { measure: "Observations", count: figures.observations, withheld: false },
    ...figures.perMonth.map((month) => ({
      measure: "Observations in the month",
      month: month.month,
      count: month.observations,
      withheld: false,
    })),
  ];
  if (figures.suppressed) {
    rows.push({ measure: "Breach rates, hand hygiene and coaching", withheld: true });
    return rows;
  }
  for (const step of figures.steps) {
    const rank = figures.mostErrorProne.indexOf(step);
    rows.push({
      measure: "Breach at the step: observations with a breach out of observations",
      sequence: step.sequenceTitle,
      step: step.stepText,
      ...fromProportion(step.breached, step.suppressed),
      rank: rank === -1 ? null : rank + 1,
    });
  }
  rows.push({
    measure: "Hand hygiene: observations with every moment performed",
    ...fromProportion(figures.handHygieneAllMoments),
  });
  rows.push({
    measure: "Hand hygiene: moments performed out of moments expected (no interval)",
    share: figures.handHygieneMomentRate,
    withheld: figures.handHygieneAllMoments.suppressed,
  });
  rows.push({
    measure: "Coached, observed again: staff codes whose next observation was clean",
    ...fromProportion(figures.cleanAfterCoaching),
  });
  return rows;
}

/** The committee's observation figures as CSV: one row per site (and the network) and measure. */
export function observationCsv(response: ObservationCommitteeResponse): string {
  const columns = observationCsvColumns(response);
  const records: unknown[][] = [];
  const add = (site: string, figures: ObservationFigures) => {
    for (const row of rowsOf(figures))
      records.push([
        site,
        row.measure,
        row.sequence ?? "",
        row.step ?? "",
        row.month ?? "",
        row.count ?? "",
        row.outOf ?? "",
        fixed(row.share),
        fixed(row.interval?.lower),
        fixed(row.interval?.upper),
        row.smallSample === undefined || row.smallSample === null
          ? ""
          : row.smallSample
            ? "yes"
            : "no",
        row.withheld ? "yes" : "no",
        row.rank ?? "",
      ]);
  };
  for (const site of response.sites) add(site.siteName, site);
  add(networkLabel, response.network);
  const csv = stringify(
    records.map((record) => record.map(asCell)),
    { header: true, columns },
  );
  return `${csvPreamble}${csv}${cautionRow(columns.length)}`;
}
