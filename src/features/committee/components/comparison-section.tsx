import { verdictLabels } from "@shared/calc/verdict";
import { itemCategoryLabels } from "@shared/checklists/categories";
import type { ComparisonResponse, Proportion } from "@shared/schemas/committee";
import { Link } from "react-router-dom";

import { Badge } from "@/components/ui/badge";
import { linkStyles } from "@/components/ui/text-link";
import { VerdictIcon } from "@/components/ui/verdict-badge";
import { cn } from "@/lib/cn";

import { tableStyles } from "../lib/chart-style";
import { intervalText, percentText } from "../lib/committee-format";
import { ProportionFigure } from "./proportion-figure";
import { ReadinessChart } from "./readiness-chart";

export const smallSampleLabel = "Small sample — not ranked";

export interface ComparisonSectionProps {
  comparison: ComparisonResponse;
  /** Where a site's name leads: its spaces for the same period. */
  siteHref: (siteId: string) => string;
}

function ReadinessCells({ proportion }: { proportion: Proportion }) {
  if (proportion.rate === null) {
    return (
      <>
        <td className={tableStyles.number}>0</td>
        <td className={tableStyles.cell} colSpan={2}>
          No audits in this period
        </td>
      </>
    );
  }
  return (
    <>
      <td className={tableStyles.number}>{proportion.n.toLocaleString()}</td>
      <td className={cn(tableStyles.number, "font-semibold")}>{percentText(proportion.rate)}</td>
      <td className={cn(tableStyles.number, "whitespace-nowrap")}>
        {intervalText(proportion.interval)}
      </td>
    </>
  );
}

type VerdictTally = ComparisonResponse["sites"][number]["verdicts"];

const verdictOrder = ["all_clear", "gaps_to_fix", "hold"] as const;

/**
 * The three verdict counts, one per line, each behind the verdict's own shape (the word is there
 * for screen readers and on hover) so the column stays narrow on a tablet.
 */
function VerdictCounts({ verdicts }: { verdicts: VerdictTally }) {
  return (
    <ul className="whitespace-nowrap">
      {verdictOrder.map((verdict) => (
        <li key={verdict} title={verdictLabels[verdict]} className="flex items-center gap-1.5">
          <VerdictIcon verdict={verdict} />
          <span className="sr-only">{`${verdictLabels[verdict]}: `}</span>
          <span className="tabular-nums">{verdicts[verdict].toLocaleString()}</span>
        </li>
      ))}
    </ul>
  );
}

function SiteTable({ comparison, siteHref }: ComparisonSectionProps) {
  const totals = comparison.sites.reduce<VerdictTally>(
    (sum, site) => ({
      all_clear: sum.all_clear + site.verdicts.all_clear,
      gaps_to_fix: sum.gaps_to_fix + site.verdicts.gaps_to_fix,
      hold: sum.hold + site.verdicts.hold,
    }),
    { all_clear: 0, gaps_to_fix: 0, hold: 0 },
  );
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Readiness by site</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Rank
            </th>
            <th scope="col" className={tableStyles.head}>
              Site
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Audits
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Readiness
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              95% interval
            </th>
            <th scope="col" className={tableStyles.head}>
              Verdicts
            </th>
          </tr>
        </thead>
        <tbody>
          {comparison.sites.map((site) => (
            <tr key={site.siteId}>
              <td className={tableStyles.cell}>
                {site.rank === null ? (
                  <Badge tone="pending" className="whitespace-normal">
                    {smallSampleLabel}
                  </Badge>
                ) : (
                  <span className="font-semibold">{site.rank}</span>
                )}
              </td>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                <Link to={siteHref(site.siteId)} className={linkStyles}>
                  {site.siteName}
                </Link>
              </th>
              <ReadinessCells proportion={site.readiness} />
              <td className={tableStyles.cell}>
                <VerdictCounts verdicts={site.verdicts} />
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="font-semibold">
            <td className={tableStyles.cell} />
            <th scope="row" className={cn(tableStyles.cell, "text-left")}>
              All sites together
            </th>
            <ReadinessCells proportion={comparison.network} />
            <td className={tableStyles.cell}>
              <VerdictCounts verdicts={totals} />
            </td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}

function CategoryTable({ comparison }: Pick<ComparisonSectionProps, "comparison">) {
  const categories = Object.keys(itemCategoryLabels).filter((category) =>
    comparison.sites.some((site) => site.categories.some((entry) => entry.category === category)),
  ) as (keyof typeof itemCategoryLabels)[];
  if (categories.length === 0) {
    return <p className="text-ink-muted">No answers in this period to group.</p>;
  }
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>
          Compliance by item group: answers that passed out of those that applied
        </caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Item group
            </th>
            {comparison.sites.map((site) => (
              <th
                key={site.siteId}
                scope="col"
                className={cn(tableStyles.head, "text-right whitespace-normal")}
              >
                {site.siteName}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {categories.map((category) => (
            <tr key={category}>
              <th scope="row" className={cn(tableStyles.cell, "font-semibold")}>
                {itemCategoryLabels[category]}
              </th>
              {comparison.sites.map((site) => {
                const entry = site.categories.find((candidate) => candidate.category === category);
                return (
                  <td key={site.siteId} className={tableStyles.number}>
                    <ProportionFigure
                      proportion={entry ?? { n: 0, rate: null, interval: null, smallSample: false }}
                      empty="No answers"
                    />
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Readiness per site with intervals, as a table and a chart, then compliance by item group. */
export function ComparisonSection({ comparison, siteHref }: ComparisonSectionProps) {
  return (
    <section aria-labelledby="committee-comparison" className="flex flex-col gap-4">
      <h2 id="committee-comparison" className="text-xl font-bold tracking-tight">
        Readiness by site
      </h2>
      <p className="max-w-prose text-ink-muted">
        {`Readiness is the share of audits whose verdict was “${verdictLabels.all_clear}”.`} Each
        figure comes with its 95% interval: the range the true rate most likely lies in, given how
        many audits there were.
      </p>
      <ReadinessChart
        comparison={comparison}
        table={<SiteTable comparison={comparison} siteHref={siteHref} />}
      />
      <ul aria-hidden="true" className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-muted">
        {verdictOrder.map((verdict) => (
          <li key={verdict} className="flex items-center gap-1.5">
            <VerdictIcon verdict={verdict} />
            {verdictLabels[verdict]}
          </li>
        ))}
      </ul>
      <p className="max-w-prose text-sm text-ink-muted">
        {`Sites with fewer than ${comparison.minimumRankedSample} audits in the period are flagged “small sample” rather than ranked: their interval is too wide for a place in a ranking to mean much. The threshold of ${comparison.minimumRankedSample} audits is Lintel's own rule.`}
      </p>
      <h3 className="mt-2 text-lg font-semibold">Compliance by item group</h3>
      <CategoryTable comparison={comparison} />
    </section>
  );
}
