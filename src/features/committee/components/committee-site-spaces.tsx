import { minimumRankedSample, type SiteDrillDown } from "@shared/schemas/committee";
import { zoneTypeLabels } from "@shared/zones";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { paths } from "@/config/paths";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";

import { useCommitteeSite } from "../api/get-committee-site";
import { useObservationFigures } from "../api/get-observation-figures";
import { tableStyles } from "../lib/chart-style";
import { intervalText, percentText, periodText } from "../lib/committee-format";
import { type CommitteePeriod, viewErrors, viewToSearch } from "../lib/committee-view";
import "./committee-print.css";
import { ObservationsSection } from "./observations-section";
import { PressureSection } from "./pressure-section";

type Space = SiteDrillDown["spaces"][number];

function SpacesTable({ siteId, spaces }: { siteId: string; spaces: readonly Space[] }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Spaces</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Space
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
              Last verdict
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Actions not done
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Overdue
            </th>
          </tr>
        </thead>
        <tbody>
          {spaces.map((space) => (
            <tr key={space.spaceId}>
              <th scope="row" className={cn(tableStyles.cell, "text-left font-normal")}>
                <span className="block font-semibold">{space.spaceName}</span>
                <span className="block text-ink-muted">
                  {`${zoneTypeLabels[space.zoneType]} · ${space.floorName}`}
                </span>
                <span className="mt-1 flex flex-wrap gap-x-3 gap-y-1 print:hidden">
                  <TextLink
                    to={paths.spaceAudits.getHref(space.spaceId)}
                    aria-label={`Audit history of ${space.spaceName}`}
                  >
                    Audit history
                  </TextLink>
                  <TextLink
                    to={paths.floor.getHref(siteId, space.floorId)}
                    aria-label={`${space.floorName} floor plan, for ${space.spaceName}`}
                  >
                    Floor plan
                  </TextLink>
                </span>
              </th>
              <td className={tableStyles.number}>{space.readiness.n}</td>
              <td className={cn(tableStyles.number, "font-semibold")}>
                {space.readiness.rate === null ? "—" : percentText(space.readiness.rate)}
              </td>
              <td className={cn(tableStyles.number, "whitespace-nowrap")}>
                {space.readiness.rate === null
                  ? "No audits"
                  : intervalText(space.readiness.interval)}
              </td>
              <td className={tableStyles.cell}>
                {space.lastVerdict ? (
                  <>
                    <VerdictBadge verdict={space.lastVerdict} />
                    {space.lastAuditAt ? (
                      <span className="mt-1 block text-ink-muted">
                        {formatDateTime(space.lastAuditAt)}
                      </span>
                    ) : null}
                  </>
                ) : (
                  <span className="text-ink-muted">Not audited yet</span>
                )}
              </td>
              <td className={tableStyles.number}>{space.unfinishedActions}</td>
              <td
                className={cn(
                  tableStyles.number,
                  space.overdueActions > 0 && "font-semibold text-verdict-not-ready",
                )}
              >
                {space.overdueActions}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export interface CommitteeSiteSpacesProps {
  siteId: string;
  period: CommitteePeriod;
}

/** One site's spaces for the committee: readiness with intervals, last verdict, actions. */
export function CommitteeSiteSpaces({ siteId, period }: CommitteeSiteSpacesProps) {
  const valid = Object.keys(viewErrors(period)).length === 0;
  const site = useCommitteeSite(siteId, period, { enabled: valid });
  // Only watched here (the observations section fetches): room pressure waits until they are shown.
  const observations = useObservationFigures(period, { enabled: false });
  const backHref = paths.committee.getHref(viewToSearch(period));
  const name = site.data?.siteName;
  const small = site.data?.spaces.some((space) => space.readiness.smallSample) ?? false;

  return (
    <div className="flex flex-col gap-6">
      <title>{`${name ?? "Site"} · Committee view · Lintel`}</title>
      <div>
        <p className="text-sm print:hidden">
          <TextLink to={backHref}>Back to the committee view</TextLink>
        </p>
        <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">{name ?? "Site"}</h1>
        <p className="mt-1 text-ink-muted">
          {`Spaces and their readiness, ${periodText(period.from, period.to)}${period.zoneType ? `, ${zoneTypeLabels[period.zoneType].toLowerCase()}s only` : ""}.`}
        </p>
      </div>
      <CautionNote />
      <p className="print:hidden">
        <TextLink to={paths.siteActions.getHref(siteId)}>
          {`Corrective actions at ${name ?? "this site"}`}
        </TextLink>
      </p>
      {!valid ? (
        <Alert role="alert" tone="error" title="This period cannot be shown">
          <p>{Object.values(viewErrors(period))[0]}</p>
        </Alert>
      ) : site.isPending ? (
        <Spinner label="Loading the spaces…" className="py-8" />
      ) : site.isError ? (
        <Alert role="alert" tone="error" title="We could not load the spaces">
          <p>{site.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void site.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : site.data.spaces.length === 0 ? (
        <p className="text-ink-muted">This site has no spaces yet.</p>
      ) : (
        <>
          <SpacesTable siteId={siteId} spaces={site.data.spaces} />
          {small ? (
            <p className="max-w-prose text-sm text-ink-muted">
              {`A single space rarely has ${minimumRankedSample} audits in a period, so its interval is wide: read these figures as a guide to where to look, not as a ranking.`}
            </p>
          ) : null}
        </>
      )}
      {/* Below the spaces, once they are shown (so nothing above it moves later), and only for
          a site the person may read. */}
      {valid && site.isSuccess ? <ObservationsSection period={period} siteId={siteId} /> : null}
      {valid && site.isSuccess && !observations.isPending ? (
        <PressureSection period={period} siteId={siteId} />
      ) : null}
    </div>
  );
}
