import { minimumAirChangesLabel, noConstructionClassNotice } from "@shared/calc/ventilation";

import { CautionNote } from "@/components/ui/caution-note";

import type { VentilationFigures } from "../lib/ventilation-figures";
import { JudgementLine } from "./answer-controls";

function minutes(value: number | null): string {
  if (value === null) return "—";
  return value < 10 ? `${value.toFixed(1)} min` : `${Math.round(value)} min`;
}

function figure(value: number | null, decimals = 1): string {
  return value === null ? "—" : value.toFixed(decimals).replace(/\.0+$/, "");
}

/** Air changes, the class minimum and clearance times, with the standing caution beside them. */
export function VentilationPanel({ figures }: { figures: VentilationFigures }) {
  const { airChanges, minimumAirChanges } = figures;
  // Typed and worked-out figures that disagree are not judged here: the auditor says which is right.
  const meets =
    airChanges === null || minimumAirChanges === null || figures.airChangesDisagree
      ? null
      : airChanges >= minimumAirChanges
        ? "pass"
        : "fail";
  return (
    <div className="grid gap-3 md:grid-cols-2">
      <section
        aria-label="Ventilation figures"
        className="rounded-lg border border-surface-line bg-surface-sunken p-3 text-sm"
      >
        <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-1.5">
          <dt className="text-ink-muted">Air changes per hour</dt>
          <dd className="text-right font-semibold">
            {figure(airChanges)}
            {figures.airChangesFrom === "airflow" ? (
              <span className="block text-xs font-normal text-ink-muted">
                from {figure(figures.airflow, 0)} m³/h ÷ {figure(figures.volumeM3)} m³
              </span>
            ) : null}
          </dd>
          {figures.typedAirChanges !== null && figures.workedOutAirChanges !== null ? (
            <>
              <dt className="text-ink-muted">Typed by the auditor</dt>
              <dd className="text-right font-semibold">{figure(figures.typedAirChanges)}</dd>
            </>
          ) : null}
          <dt className="text-ink-muted">Minimum for this room</dt>
          <dd className="text-right font-semibold">
            {figures.judgedClass === null
              ? minimumAirChanges === null
                ? "Not recorded"
                : `≥ ${minimumAirChanges}`
              : minimumAirChangesLabel(figures.judgedClass)}
          </dd>
          <dt className="text-ink-muted">To remove 99% once empty</dt>
          <dd className="text-right font-semibold">{minutes(figures.minutesTo99)}</dd>
          <dt className="text-ink-muted">To remove 99.9% once empty</dt>
          <dd className="text-right font-semibold">{minutes(figures.minutesTo999)}</dd>
        </dl>
        {meets ? (
          <div className="mt-2">
            <JudgementLine outcome={meets}>
              {meets === "pass"
                ? "At or above the minimum for the room's construction class."
                : "Below the minimum for the room's construction class."}
            </JudgementLine>
          </div>
        ) : null}
        {figures.classUnset ? (
          <p className="mt-2 text-sm font-semibold text-ink">{noConstructionClassNotice}</p>
        ) : null}
        {figures.airChangesDisagree ? (
          <p className="mt-2 text-sm font-semibold text-ink">
            Typed and worked-out air changes differ by more than 10 %: the air-change item says
            which to keep.
          </p>
        ) : null}
        {figures.volumeM3 === null ? (
          <p className="mt-2 text-xs text-ink-muted">
            The room volume is not recorded, so air changes come from the reading alone.
          </p>
        ) : null}
        <p className="mt-2 text-xs text-ink-muted">
          Clearance times assume a well-mixed, empty room; poor mixing takes longer.
        </p>
      </section>
      <CautionNote />
    </div>
  );
}
