import type { ObservationCommitteeResponse } from "@shared/schemas/observations";
import { useId, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import { useObservationFigures } from "../api/get-observation-figures";
import { tableStyles } from "../lib/chart-style";
import { countText, monthText, percentText } from "../lib/committee-format";
import type { CommitteePeriod } from "../lib/committee-view";
import {
  type FiguresChoice,
  figuresFor,
  type ObservationFigures,
  type StepBreachRate,
  stepsBySequence,
  suppressedCellText,
  suppressionText,
} from "../lib/observation-figures";
import { ProportionFigure } from "./proportion-figure";

/** A withheld figure says why, in place of the number. */
function Withheld({ minimumStaffCodes }: { minimumStaffCodes: number }) {
  return <span className="block text-ink-muted">{suppressedCellText(minimumStaffCodes)}</span>;
}

function StepTable({
  caption,
  steps,
  ranked,
  minimumStaffCodes,
}: {
  caption: string;
  steps: readonly StepBreachRate[];
  ranked: boolean;
  minimumStaffCodes: number;
}) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>{caption}</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              {ranked ? "Rank" : "Step"}
            </th>
            <th scope="col" className={tableStyles.head}>
              {ranked ? "Step" : "Read aloud"}
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Breached (95% interval)
            </th>
          </tr>
        </thead>
        <tbody>
          {steps.map((step, index) => (
            <tr key={`${step.sequenceKey}/${step.stepKey}`}>
              <td className={cn(tableStyles.cell, "tabular-nums")}>{index + 1}</td>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                {step.stepText}
                {ranked ? <span className="block text-ink-muted">{step.sequenceTitle}</span> : null}
              </th>
              <td className={tableStyles.number}>
                {step.suppressed ? (
                  <Withheld minimumStaffCodes={minimumStaffCodes} />
                ) : (
                  <ProportionFigure proportion={step.breached} empty="Not observed" />
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function KeyFigures({
  figures,
  minimumStaffCodes,
}: {
  figures: ObservationFigures;
  minimumStaffCodes: number;
}) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Hand hygiene and coaching</caption>
        <tbody>
          <tr>
            <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
              Observations with every hand-hygiene moment performed
            </th>
            <td className={tableStyles.number}>
              {figures.handHygieneAllMoments.suppressed ? (
                <Withheld minimumStaffCodes={minimumStaffCodes} />
              ) : (
                <ProportionFigure proportion={figures.handHygieneAllMoments} empty="No moments" />
              )}
            </td>
          </tr>
          <tr>
            <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
              Moments performed, counted one by one
              <span className="block text-ink-muted">
                No interval: the moments of one observation are not independent.
              </span>
            </th>
            <td className={cn(tableStyles.number, "font-semibold")}>
              {figures.handHygieneAllMoments.suppressed ? (
                <Withheld minimumStaffCodes={minimumStaffCodes} />
              ) : figures.handHygieneMomentRate === null ? (
                <span className="font-normal text-ink-muted">No moments</span>
              ) : (
                percentText(figures.handHygieneMomentRate)
              )}
            </td>
          </tr>
          <tr>
            <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
              Coached staff whose next observation was clean
            </th>
            <td className={tableStyles.number}>
              {figures.cleanAfterCoaching.suppressed ? (
                <Withheld minimumStaffCodes={minimumStaffCodes} />
              ) : (
                <ProportionFigure
                  proportion={figures.cleanAfterCoaching}
                  empty="Nobody observed again after coaching"
                />
              )}
            </td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}

function PerMonth({ perMonth }: { perMonth: ObservationFigures["perMonth"] }) {
  return (
    <div className={tableStyles.frame}>
      <table className={tableStyles.table}>
        <caption className={tableStyles.caption}>Observations per month</caption>
        <thead>
          <tr>
            <th scope="col" className={tableStyles.head}>
              Month
            </th>
            <th scope="col" className={cn(tableStyles.head, "text-right")}>
              Observations
            </th>
          </tr>
        </thead>
        <tbody>
          {perMonth.map((entry) => (
            <tr key={entry.month}>
              <th scope="row" className={cn(tableStyles.cell, "font-normal")}>
                {monthText(entry.month)}
              </th>
              <td className={tableStyles.number}>{entry.observations.toLocaleString()}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export interface ObservationFiguresPanelProps {
  name: string;
  figures: ObservationFigures;
  minimumStaffCodes: number;
  minimumRankedSample: number;
}

/** One site's (or the network's) observation figures, or why they are not shown. */
export function ObservationFiguresPanel({
  name,
  figures,
  minimumStaffCodes,
  minimumRankedSample,
}: ObservationFiguresPanelProps) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-4">
      <h3 id={headingId} className="text-lg font-semibold">
        {name}: {countText(figures.observations, "observation", "observations")}
      </h3>
      {figures.suppressed ? (
        <Alert tone="info" title="Figures not shown">
          <p>{suppressionText(minimumStaffCodes)}</p>
        </Alert>
      ) : figures.observations === 0 ? (
        <p className="text-ink-muted">No observations in this period.</p>
      ) : (
        <>
          <KeyFigures figures={figures} minimumStaffCodes={minimumStaffCodes} />
          {figures.mostErrorProne.length > 0 ? (
            <StepTable
              caption="The five most error-prone steps"
              steps={figures.mostErrorProne}
              ranked
              minimumStaffCodes={minimumStaffCodes}
            />
          ) : (
            <p className="max-w-prose text-sm text-ink-muted">
              {`No step is ranked yet: a step needs ${minimumRankedSample} observations in the period before its place in a ranking means much.`}
            </p>
          )}
          {stepsBySequence(figures.steps).map((group) => (
            <StepTable
              key={group.sequenceKey}
              caption={`Breaches per step: ${group.sequenceTitle}`}
              steps={group.steps}
              ranked={false}
              minimumStaffCodes={minimumStaffCodes}
            />
          ))}
          <PerMonth perMonth={figures.perMonth} />
        </>
      )}
    </section>
  );
}

function SiteChooser({
  response,
  choice,
  onChoose,
}: {
  response: ObservationCommitteeResponse;
  choice: FiguresChoice;
  onChoose: (choice: FiguresChoice) => void;
}) {
  return (
    <SelectField
      label="Show the figures of"
      className="max-w-md"
      value={choice.kind === "network" ? "" : choice.siteId}
      options={[
        { value: "", label: "All sites together" },
        ...response.sites.map((site) => ({ value: site.siteId, label: site.siteName })),
      ]}
      onChange={(event) =>
        onChoose(
          event.target.value === ""
            ? { kind: "network" }
            : { kind: "site", siteId: event.target.value },
        )
      }
    />
  );
}

export interface ObservationsSectionProps {
  period: CommitteePeriod;
  /** On a site's page, that site only; otherwise the network with a choice of site. */
  siteId?: string;
}

/**
 * What trained observers saw of putting-on and removal: breach rate per step with intervals, the
 * most error-prone steps, hand-hygiene compliance, observations per month, coaching's effect.
 */
export function ObservationsSection({ period, siteId }: ObservationsSectionProps) {
  const figures = useObservationFigures(period);
  const [choice, setChoice] = useState<FiguresChoice>({ kind: "network" });
  const shown = figures.data
    ? figuresFor(figures.data, siteId ? { kind: "site", siteId } : choice)
    : null;

  return (
    <section aria-labelledby="committee-observations" className="flex flex-col gap-4">
      <div>
        <h2 id="committee-observations" className="text-xl font-bold tracking-tight">
          Observed putting-on and removal
        </h2>
        <p className="mt-1 max-w-prose text-ink-muted">
          Each observation counts once per step: a step&apos;s breach rate is the share of
          observations with at least one breach there. Rates come with their 95% interval; small
          samples are flagged.
          {period.zoneType
            ? " They cover every donning zone, doffing area and anteroom, whatever zone type is chosen."
            : ""}
        </p>
      </div>
      {figures.isPending ? (
        <Spinner label="Loading the observations…" className="py-8" />
      ) : figures.isError ? (
        <Alert role="alert" tone="error" title="We could not load the observations">
          <p>{figures.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void figures.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : (
        <>
          {!siteId && figures.data.sites.length > 1 ? (
            <SiteChooser response={figures.data} choice={choice} onChoose={setChoice} />
          ) : null}
          {shown ? (
            <ObservationFiguresPanel
              name={shown.name}
              figures={shown.figures}
              minimumStaffCodes={figures.data.minimumStaffCodes}
              minimumRankedSample={figures.data.minimumRankedSample}
            />
          ) : (
            <p className="text-ink-muted">No observations at this site in this period.</p>
          )}
          <p className="max-w-prose text-sm text-ink-muted">
            {`Any figure that would describe fewer than ${figures.data.minimumStaffCodes} staff members is not shown, so that no one can be picked out. Staff are counted by their code; Lintel stores no names.`}
          </p>
        </>
      )}
    </section>
  );
}
