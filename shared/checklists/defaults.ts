import { minimumNegativePressurePascals } from "../calc/ventilation";
import type { Severity } from "../calc/verdict";
import type { ZoneType } from "../zones";

/**
 * How an item is answered. Every item can also be marked not applicable.
 * - `check`: pass or fail.
 * - `reading`: a measured value in a quantity's SI unit, passed or failed against a threshold.
 * - `count`: a whole number, passed when it reaches the minimum.
 * - `choice`: one of a few options, some of which pass.
 */
export type ResponseKind = "check" | "reading" | "count" | "choice";

/** Quantities a reading can be: stored in SI, shown in the auditor's unit. */
export type Quantity = "pressure" | "airflow" | "air_changes" | "percent" | "minutes";

export interface DefaultItem {
  /** Stable across versions: answers and trends follow the key even when the wording changes. */
  key: string;
  text: string;
  severity: Severity;
  response: ResponseKind;
  quantity?: Quantity;
  /** For readings and counts: the value must be at least / at most this (SI units). */
  threshold?: { op: ">=" | "<="; value: number };
  choices?: { value: string; label: string; passes: boolean }[];
  /**
   * The published source that states the rule, or "Common practice" for a rule with no such
   * source. Never a source that says less than the item.
   */
  reference: string | null;
  photoOnFail: boolean;
  /** "Not applicable" is accepted only with a note saying why. */
  naNeedsNote?: boolean;
}

export interface DefaultChecklist {
  title: string;
  items: DefaultItem[];
}

/** The version of Lintel's default checklists in `defaultChecklists` (version 1: defaults-v1.ts). */
export const defaultChecklistRevision = 2;

/** Items an isolation-room checklist can never lose: together they confirm inward airflow. */
export const requiredIsolationRoomKeys = ["room.pressure", "room.smoke-test"] as const;

export const commonPractice = "Common practice";
const practice = commonPractice;
const cdcPpe = "CDC, Sequence for Putting On / How to Safely Remove PPE (CS250672)";
const cdcHandHygiene =
  "CDC, Guideline for Hand Hygiene in Health-Care Settings, MMWR 2002;51(RR-16)";
const osha = "OSHA 29 CFR 1910.134";
const cdcTb =
  "CDC, Guidelines for Preventing the Transmission of M. tuberculosis in Health-Care Settings, MMWR 2005;54(RR-17)";
const cdcEnvironmental =
  "CDC, Guidelines for Environmental Infection Control in Health-Care Facilities (2003)";
const nfpa = "NFPA 101 Life Safety Code (2012) 18.3.2.6 / 19.3.2.6";

const check = (
  key: string,
  text: string,
  severity: Severity,
  reference: string,
  photoOnFail = true,
): DefaultItem => ({ key, text, severity, response: "check", reference, photoOnFail });

export const defaultChecklists: Record<ZoneType, DefaultChecklist> = {
  donning_zone: {
    title: "Donning zone readiness",
    items: [
      check(
        "don.ppe-stock",
        "Every kind of PPE in use is stocked in every size staff use",
        "critical",
        practice,
      ),
      check(
        "don.respirator-sizes",
        "Respirators match the models and sizes staff were fit-tested for",
        "critical",
        `${osha} (f)(2)`,
      ),
      check(
        "don.fit-test-records",
        "Fit-test records of the staff on duty are current (within the last 12 months)",
        "major",
        `${osha} (f)(2)`,
        false,
      ),
      check("don.hand-rub-present", "Hand-rub station present and not empty", "critical", practice),
      check("don.hand-rub-expiry", "Hand rub within its expiry date", "major", practice),
      {
        key: "don.hand-rub-alcohol",
        text: "Hand rub alcohol content, at least 60 % (percent, from the label)",
        severity: "major",
        response: "reading",
        quantity: "percent",
        threshold: { op: ">=", value: 60 },
        reference: `${cdcHandHygiene} (60–95 %)`,
        photoOnFail: true,
      },
      {
        key: "don.hand-rub-alcohol-max",
        text: "Hand rub alcohol content, at most 95 % (percent, from the label)",
        severity: "major",
        response: "reading",
        quantity: "percent",
        threshold: { op: "<=", value: 95 },
        reference: `${cdcHandHygiene} (60–95 %); ${nfpa}`,
        photoOnFail: true,
      },
      check(
        "don.dispenser-ignition",
        "No ignition source (socket, switch, heater) beside, above or below a hand-rub dispenser within 1 in (25 mm)",
        "major",
        nfpa,
      ),
      check(
        "don.dispenser-volume",
        "Each hand-rub dispenser holds at most 1.2 L (0.32 gal) in rooms and corridors",
        "major",
        nfpa,
      ),
      check(
        "don.corridor-width",
        "Corridor at least 6 ft (1830 mm) wide where hand-rub dispensers are installed",
        "major",
        nfpa,
      ),
      check("don.clean-chair", "Clean chair present and labelled as clean", "minor", practice),
      {
        key: "don.mirror-or-observer",
        text: "Mirror or trained observer available for a self-check",
        severity: "major",
        response: "choice",
        choices: [
          { value: "mirror", label: "Mirror", passes: true },
          { value: "observer", label: "Observer", passes: true },
          { value: "neither", label: "Neither", passes: false },
        ],
        reference: practice,
        photoOnFail: true,
      },
      check("don.order-poster", "Putting-on order displayed at eye level", "minor", cdcPpe),
      check(
        "don.integrity-check",
        "A place to check PPE for damage before use",
        "minor",
        practice,
        false,
      ),
      check("don.no-used-items", "No used PPE or waste in the donning zone", "major", practice),
      check("don.clear-floor", "Floor clear; nothing stored on the floor", "minor", practice),
      check(
        "don.seal-check-guide",
        "User seal check instructions displayed beside the respirators",
        "minor",
        practice,
        false,
      ),
    ],
  },
  doffing_area: {
    title: "Doffing area readiness",
    items: [
      check("doff.separate", "Physically separate from the donning zone", "critical", practice),
      check(
        "doff.clean-dirty-line",
        "A line on the floor marks the clean side from the dirty side",
        "major",
        practice,
      ),
      {
        ...check(
          "doff.dirty-chair",
          "Dirty chair present and labelled as dirty",
          "critical",
          practice,
        ),
        naNeedsNote: true,
      },
      check(
        "doff.no-clean-chair-mixed",
        "No clean chair mixed in with the dirty side",
        "critical",
        practice,
      ),
      check(
        "doff.clean-chair-clean-side",
        "Clean chair for the last steps labelled and on the clean side",
        "major",
        practice,
      ),
      check(
        "doff.hand-rub-reach",
        "Hand rub within reach of every removal step without walking back",
        "critical",
        practice,
      ),
      {
        key: "doff.hand-rub-stations",
        text: "Number of working hand-rub stations",
        severity: "major",
        response: "count",
        threshold: { op: ">=", value: 2 },
        reference: practice,
        photoOnFail: true,
      },
      check(
        "doff.dispenser-spacing",
        "Hand-rub dispensers at least 48 in (1.22 m) apart",
        "major",
        nfpa,
      ),
      check(
        "doff.dispenser-ignition",
        "No ignition source (socket, switch, heater) beside, above or below a hand-rub dispenser within 1 in (25 mm)",
        "major",
        nfpa,
      ),
      check(
        "doff.dispenser-volume",
        "Each hand-rub dispenser holds at most 1.2 L (0.32 gal) in rooms and corridors",
        "major",
        nfpa,
      ),
      check(
        "doff.sink",
        "Sink with soap and paper towels near by, for visibly soiled hands",
        "major",
        practice,
      ),
      check("doff.bins-hands-free", "Waste bins hands-free and lidded", "major", practice),
      check("doff.bins-fill", "Bins not filled past three-quarters", "minor", practice),
      check(
        "doff.eye-protection-container",
        "Labelled container for reusable eye protection waiting to be cleaned",
        "major",
        practice,
      ),
      check("doff.spare-gloves", "Spare clean gloves in several sizes", "major", practice),
      check("doff.wipes", "Disinfectant wipes available", "major", practice),
      check("doff.order-poster", "Removal order displayed at eye level", "minor", cdcPpe),
      {
        key: "doff.mirror-or-observer",
        text: "Mirror or observer position for the removal steps",
        severity: "major",
        response: "choice",
        choices: [
          { value: "mirror", label: "Mirror", passes: true },
          { value: "observer", label: "Observer position", passes: true },
          { value: "neither", label: "Neither", passes: false },
        ],
        reference: practice,
        photoOnFail: true,
      },
      check(
        "doff.no-clean-supplies",
        "No clean supplies stored in the doffing area",
        "major",
        practice,
      ),
      check(
        "doff.hand-hygiene-after",
        "Prompt for hand hygiene after all PPE is removed",
        "minor",
        cdcPpe,
        false,
      ),
      check(
        "doff.respirator-last",
        "Respirator removed outside the room, after the door is closed (signage shows it)",
        "minor",
        practice,
        false,
      ),
      check(
        "doff.floor-clear",
        "Floor clear and dry; no trip hazards around the dirty chair",
        "minor",
        practice,
      ),
    ],
  },
  isolation_room: {
    title: "Isolation room checks",
    items: [
      {
        key: "room.pressure",
        text: "Pressure differential to the corridor (negative)",
        severity: "critical",
        response: "reading",
        quantity: "pressure",
        threshold: { op: "<=", value: -minimumNegativePressurePascals },
        reference: cdcTb,
        photoOnFail: true,
      },
      check(
        "room.smoke-test",
        "Visual (smoke or tissue) test at the door shows air moving into the room",
        "critical",
        practice,
        false,
      ),
      check(
        "room.monitor-present",
        "Pressure monitor present and showing a reading",
        "major",
        practice,
      ),
      check("room.monitor-alarm", "Pressure monitor alarm tested", "major", practice),
      check(
        "room.pressure-log",
        "Pressure checked and logged every day the room is occupied",
        "major",
        practice,
      ),
      {
        key: "room.airflow",
        text: "Exhaust airflow",
        severity: "critical",
        response: "reading",
        quantity: "airflow",
        reference: practice,
        photoOnFail: false,
      },
      {
        key: "room.air-changes",
        text: "Air changes per hour at or above the threshold for the room's construction class",
        severity: "critical",
        response: "reading",
        quantity: "air_changes",
        reference: `${cdcTb} (≥12 new or renovated, ≥6 existing)`,
        photoOnFail: false,
      },
      check(
        "room.door-closed",
        "Door kept closed while the room is occupied",
        "critical",
        practice,
      ),
      check("room.self-closer", "Door's self-closing device closes it fully", "major", practice),
      check(
        "room.clearance-time",
        "After a discharge, the room stayed closed for its clearance time before reuse (99.9 %: 35 min at 12 air changes, 69 min at 6)",
        "major",
        `${cdcEnvironmental}, Appendix B, Table B.1`,
        false,
      ),
      check(
        "room.respirators-at-door",
        "Respirators at the door in the models and sizes staff were fit-tested for",
        "critical",
        `${osha} (f)(2)`,
      ),
      check(
        "room.hand-rub-entry-exit",
        "Hand rub at the room's entry and at its exit",
        "major",
        practice,
      ),
      check("room.bin-by-exit", "Hands-free bin by the exit, inside the room", "major", practice),
      check("room.signage", "Precautions signage on the door", "major", practice),
    ],
  },
  anteroom: {
    title: "Anteroom checks",
    items: [
      {
        key: "ante.pressure",
        text: "Pressure differential, anteroom to corridor (negative)",
        severity: "critical",
        response: "reading",
        quantity: "pressure",
        threshold: { op: "<=", value: -minimumNegativePressurePascals },
        reference: practice,
        photoOnFail: true,
      },
      check(
        "ante.room-direction",
        "Air moves from the anteroom into the room (smoke or tissue at the inner door)",
        "critical",
        practice,
      ),
      check(
        "ante.doors-not-both-open",
        "Anteroom doors not both open at once",
        "critical",
        practice,
      ),
      check("ante.door-closers", "Door closers working on both doors", "major", practice),
      check("ante.signage", "Signage on the corridor door", "minor", practice),
      check("ante.hand-rub", "Hand rub available", "major", practice),
    ],
  },
};

/** Keys whose "not applicable" needs a note, in any version of the defaults. */
const naNeedsNoteKeys = new Set(
  Object.values(defaultChecklists).flatMap((list) =>
    list.items.filter((item) => item.naNeedsNote).map((item) => item.key),
  ),
);

export function notApplicableNeedsNote(key: string): boolean {
  return naNeedsNoteKeys.has(key);
}
