import {
  closeDispenserPairs,
  isUsableScale,
  minimumDispenserSpacingMetres,
} from "@shared/calc/hand-rub-spacing";
import { formatLength, metresToInches } from "@shared/calc/plan-geometry";
import type { Fixture } from "@shared/schemas/floors";

export const spacingRequirement = `at least ${Math.round(metresToInches(minimumDispenserSpacingMetres))} in (${minimumDispenserSpacingMetres.toFixed(2)} m)`;
export const spacingSource = "NFPA 101, 2012, 18.3.2.6 / 19.3.2.6";

export interface SpacingPair {
  a: Fixture;
  b: Fixture;
  distanceMetres: number;
  message: string;
}

export type SpacingCheck =
  | { kind: "no-scale"; stationCount: number; message: string }
  | { kind: "checked"; stationCount: number; pairs: SpacingPair[]; message: string };

export function spacingPairMessage(distanceMetres: number): string {
  return `Hand-rub stations ${formatLength(distanceMetres)} apart — ${spacingRequirement} is required (${spacingSource}).`;
}

/** Checks every pair of hand-rub stations on one floor against the minimum spacing. */
export function checkHandRubSpacing(
  fixtures: readonly Fixture[],
  metresPerUnit: number | null,
): SpacingCheck {
  const stations = fixtures.filter((fixture) => fixture.kind === "hand_rub_station");
  if (!isUsableScale(metresPerUnit)) {
    return {
      kind: "no-scale",
      stationCount: stations.length,
      message:
        "Spacing between hand-rub stations cannot be checked until the scale of this floor is set.",
    };
  }
  const byId = new Map(stations.map((station) => [station.id, station]));
  const pairs = closeDispenserPairs(stations, metresPerUnit).map((flag) => ({
    a: byId.get(flag.a)!,
    b: byId.get(flag.b)!,
    distanceMetres: flag.distanceMetres,
    message: spacingPairMessage(flag.distanceMetres),
  }));

  let message: string;
  if (pairs.length > 0) {
    message =
      pairs.length === 1
        ? "One pair of hand-rub stations is too close together."
        : `${pairs.length} pairs of hand-rub stations are too close together.`;
  } else if (stations.length < 2) {
    message =
      stations.length === 0
        ? "No hand-rub stations are placed on this floor yet."
        : "One hand-rub station is placed on this floor, so there is no spacing to check.";
  } else {
    message = `All ${stations.length} hand-rub stations on this floor are ${spacingRequirement} apart.`;
  }
  return { kind: "checked", stationCount: stations.length, pairs, message };
}

/** The ids of every station in a pair that is too close, to mark them on the map. */
export function flaggedStationIds(check: SpacingCheck): ReadonlySet<string> {
  if (check.kind !== "checked") return new Set();
  return new Set(check.pairs.flatMap((pair) => [pair.a.id, pair.b.id]));
}
