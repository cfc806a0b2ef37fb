import { zoneTypeLabels } from "@shared/zones";
import { useEffect } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";

import { useComparison } from "../api/get-comparison";
import { useObservationFigures } from "../api/get-observation-figures";
import { useTrends } from "../api/get-trends";
import { periodText } from "../lib/committee-format";
import { type CommitteeView, periodOf, viewErrors, viewToSearch } from "../lib/committee-view";
import { defaultPair } from "../lib/default-pair";
import { ActionAging } from "./action-aging";
import { CloseTimes } from "./close-times";
import { CommitteeDownloads } from "./committee-downloads";
import { CommitteeFilters } from "./committee-filters";
import "./committee-print.css";
import { ComparisonSection } from "./comparison-section";
import { DifferencePanel } from "./difference-panel";
import { ObservationsSection } from "./observations-section";
import { PChart } from "./p-chart";
import { PressureSection } from "./pressure-section";

export interface CommitteeOverviewProps {
  view: CommitteeView;
  /**
   * Puts a change to the view in the page address (fields left undefined are cleared);
   * `replace` when it only fills in defaults.
   */
  onViewChange: (change: Partial<CommitteeView>, options?: { replace?: boolean }) => void;
}

function LoadFailed({
  title,
  message,
  retry,
}: {
  title: string;
  message: string;
  retry: () => void;
}) {
  return (
    <Alert role="alert" tone="error" title={title}>
      <p>{message}</p>
      <Button variant="secondary" className="mt-3" onClick={retry}>
        Try again
      </Button>
    </Alert>
  );
}

/** The committee's picture of the network: comparison, difference, trends, actions, exports. */
export function CommitteeOverview({ view, onViewChange }: CommitteeOverviewProps) {
  const valid = Object.keys(viewErrors(view)).length === 0;
  const period = periodOf(view);
  const comparison = useComparison(view, { enabled: valid });
  const trends = useTrends(period, { enabled: valid });
  // Only watched here (the observations section fetches): room pressure waits until they are shown.
  const observations = useObservationFigures(period, { enabled: false });
  const data = comparison.data;
  const pair = data ? defaultPair(data) : null;
  const pairA = !view.siteA && !view.siteB ? pair?.siteA : undefined;
  const pairB = pair?.siteB;

  // The chosen pair goes into the address too, so a copied link shows the same comparison.
  useEffect(() => {
    if (pairA && pairB) onViewChange({ siteA: pairA, siteB: pairB }, { replace: true });
  }, [pairA, pairB, onViewChange]);

  const siteSearch = viewToSearch(period);
  const siteHref = (siteId: string) => paths.committeeSite.getHref(siteId, siteSearch);
  const sites = data?.sites.map((site) => ({ id: site.siteId, name: site.siteName })) ?? [];
  const scope = `${periodText(view.from, view.to)}, ${view.zoneType ? `${zoneTypeLabels[view.zoneType].toLowerCase()}s only` : "all zone types"}`;

  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Committee view</h1>
        <p className="mt-1 text-ink-muted">
          {data ? `${data.networkName}: ${scope}.` : `${scope[0]!.toUpperCase()}${scope.slice(1)}.`}
        </p>
      </div>
      <CautionNote />
      <CommitteeFilters view={view} sites={sites} onChange={onViewChange} />

      {!valid ? (
        <p className="text-ink-muted">Correct the period above to see the figures.</p>
      ) : comparison.isPending ? (
        <Spinner label="Loading the comparison…" className="py-8" />
      ) : comparison.isError ? (
        <LoadFailed
          title="We could not load the comparison"
          message={comparison.error.message}
          retry={() => void comparison.refetch()}
        />
      ) : comparison.data.sites.length === 0 ? (
        <EmptyState
          title="No sites to compare"
          description="You do not hold a role at any site yet."
        />
      ) : (
        <>
          <CommitteeDownloads view={view} />
          <ComparisonSection comparison={comparison.data} siteHref={siteHref} />
          {comparison.data.sites.length > 1 ? (
            <DifferencePanel comparison={comparison.data} siteA={view.siteA} siteB={view.siteB} />
          ) : null}
        </>
      )}

      {valid ? (
        trends.isPending ? (
          <Spinner label="Loading the trends…" className="py-8" />
        ) : trends.isError ? (
          <LoadFailed
            title="We could not load the trends"
            message={trends.error.message}
            retry={() => void trends.refetch()}
          />
        ) : (
          <>
            <section aria-labelledby="committee-trends" className="flex flex-col gap-6">
              <div>
                <h2 id="committee-trends" className="text-xl font-bold tracking-tight">
                  Readiness month by month
                </h2>
                <p className="mt-1 max-w-prose text-ink-muted">
                  A p-chart per site. Each month's limits depend on how many audits it had; a month
                  outside them is unlikely to be ordinary variation and is worth asking about.
                </p>
              </div>
              {trends.data.sites.map((site) => (
                <PChart key={site.siteId} site={site} />
              ))}
            </section>
            <section aria-labelledby="committee-aging" className="flex flex-col gap-4">
              <div>
                <h2 id="committee-aging" className="text-xl font-bold tracking-tight">
                  Corrective actions waiting
                </h2>
                <p className="mt-1 max-w-prose text-ink-muted">
                  As of today, whatever the period: actions not done yet by how long ago they were
                  raised, and overdue ones by how long past due.
                </p>
              </div>
              <ActionAging aging={trends.data.aging} />
            </section>
            <section aria-labelledby="committee-close-times" className="flex flex-col gap-4">
              <div>
                <h2 id="committee-close-times" className="text-xl font-bold tracking-tight">
                  Time to close
                </h2>
                <p className="mt-1 max-w-prose text-ink-muted">
                  Median days from raising an action to its confirmed fix, for fixes confirmed in
                  the period.
                </p>
              </div>
              <CloseTimes closeTimes={trends.data.closeTimes} />
            </section>
          </>
        )
      ) : null}

      {/* Last, and only once everything above has its size, so nothing on screen moves later. */}
      {valid && comparison.data && comparison.data.sites.length > 0 && !trends.isPending ? (
        <ObservationsSection period={period} />
      ) : null}
      {valid &&
      comparison.data &&
      comparison.data.sites.length > 0 &&
      !trends.isPending &&
      !observations.isPending ? (
        <PressureSection period={period} />
      ) : null}
    </div>
  );
}
