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
  /** Published source, or "Common practice" for a rule of thumb with none. */
  reference: string | null;
  photoOnFail: boolean;
}

const cdcPpe = "CDC, Sequence for Putting On / How to Safely Remove PPE (CS250672)";
const whoHandHygiene = "WHO, Guidelines on Hand Hygiene in Health Care (2009)";
const cdcHandHygiene =
  "CDC, Guideline for Hand Hygiene in Health-Care Settings, MMWR 2002;51(RR-16)";
const osha = "OSHA 29 CFR 1910.134";
const cdcTb =
  "CDC, Guidelines for Preventing the Transmission of M. tuberculosis in Health-Care Settings, MMWR 2005;54(RR-17)";
const nfpa = "NFPA 101 Life Safety Code (2012) 18.3.2.6 / 19.3.2.6";
const practice = "Common practice";

export const defaultChecklists: Record<ZoneType, { title: string; items: DefaultItem[] }> = {
  donning_zone: {
    title: "Donning zone readiness",
    items: [
      {
        key: "don.ppe-stock",
        text: "Every kind of PPE in use is stocked in every size staff use",
        severity: "critical",
        response: "check",
        reference: cdcPpe,
        photoOnFail: true,
      },
      {
        key: "don.respirator-sizes",
        text: "Respirators match the models and sizes staff were fit-tested for",
        severity: "critical",
        response: "check",
        reference: `${osha} (f)(2)`,
        photoOnFail: true,
      },
      {
        key: "don.hand-rub-present",
        text: "Hand-rub station present and not empty",
        severity: "critical",
        response: "check",
        reference: whoHandHygiene,
        photoOnFail: true,
      },
      {
        key: "don.hand-rub-expiry",
        text: "Hand rub within its expiry date",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "don.hand-rub-alcohol",
        text: "Hand rub alcohol content (percent, from the label)",
        severity: "major",
        response: "reading",
        quantity: "percent",
        threshold: { op: ">=", value: 60 },
        reference: `${cdcHandHygiene} (60–95%)`,
        photoOnFail: true,
      },
      {
        key: "don.clean-chair",
        text: "Clean chair present and labelled as clean",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
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
      {
        key: "don.order-poster",
        text: "Putting-on order displayed at eye level",
        severity: "minor",
        response: "check",
        reference: cdcPpe,
        photoOnFail: true,
      },
      {
        key: "don.integrity-check",
        text: "A place to check PPE for damage before use",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: false,
      },
      {
        key: "don.no-used-items",
        text: "No used PPE or waste in the donning zone",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "don.clear-floor",
        text: "Floor clear; nothing stored on the floor",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "don.seal-check-guide",
        text: "User seal check instructions displayed beside the respirators",
        severity: "minor",
        response: "check",
        reference: `${osha} (g)(1)(iii), Appendix B-1`,
        photoOnFail: false,
      },
    ],
  },
  doffing_area: {
    title: "Doffing area readiness",
    items: [
      {
        key: "doff.separate",
        text: "Physically separate from the donning zone",
        severity: "critical",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.dirty-chair",
        text: "Dirty chair present and labelled as dirty",
        severity: "critical",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.no-clean-chair-mixed",
        text: "No clean chair mixed in with the dirty side",
        severity: "critical",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.clean-chair-clean-side",
        text: "Clean chair for the last steps labelled and on the clean side",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.hand-rub-reach",
        text: "Hand rub within reach of every removal step without walking back",
        severity: "critical",
        response: "check",
        reference: `${cdcPpe}; ${whoHandHygiene}`,
        photoOnFail: true,
      },
      {
        key: "doff.hand-rub-stations",
        text: "Number of working hand-rub stations",
        severity: "major",
        response: "count",
        threshold: { op: ">=", value: 2 },
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.dispenser-spacing",
        text: "Hand-rub dispensers at least 48 in (1.22 m) apart",
        severity: "minor",
        response: "check",
        reference: nfpa,
        photoOnFail: true,
      },
      {
        key: "doff.bins-hands-free",
        text: "Waste bins hands-free and lidded",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.bins-fill",
        text: "Bins not filled past three-quarters",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.spare-gloves",
        text: "Spare clean gloves in several sizes",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.wipes",
        text: "Disinfectant wipes available",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.order-poster",
        text: "Removal order displayed at eye level",
        severity: "minor",
        response: "check",
        reference: cdcPpe,
        photoOnFail: true,
      },
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
      {
        key: "doff.no-clean-supplies",
        text: "No clean supplies stored in the doffing area",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "doff.hand-hygiene-after",
        text: "Prompt for hand hygiene after all PPE is removed",
        severity: "minor",
        response: "check",
        reference: cdcPpe,
        photoOnFail: false,
      },
      {
        key: "doff.respirator-last",
        text: "Respirator removed outside the room, after the door is closed (signage shows it)",
        severity: "minor",
        response: "check",
        reference: `${cdcPpe} (from memory)`,
        photoOnFail: false,
      },
      {
        key: "doff.floor-clear",
        text: "Floor clear and dry; no trip hazards around the dirty chair",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
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
      {
        key: "room.airflow",
        text: "Exhaust airflow",
        severity: "critical",
        response: "reading",
        quantity: "airflow",
        reference: cdcTb,
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
      {
        key: "room.door-closed",
        text: "Door closed and self-closing",
        severity: "major",
        response: "check",
        reference: cdcTb,
        photoOnFail: true,
      },
      {
        key: "room.signage",
        text: "Precautions signage on the door",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "room.monitor-alarm",
        text: "Pressure monitor alarm tested",
        severity: "major",
        response: "check",
        reference: cdcTb,
        photoOnFail: true,
      },
      {
        key: "room.smoke-test",
        text: "Visual (smoke) test shows air moving into the room",
        severity: "major",
        response: "check",
        reference: cdcTb,
        photoOnFail: false,
      },
    ],
  },
  anteroom: {
    title: "Anteroom checks",
    items: [
      {
        key: "ante.pressure",
        text: "Pressure differential to the corridor",
        severity: "critical",
        response: "reading",
        quantity: "pressure",
        threshold: { op: "<=", value: -2.5 },
        reference: cdcTb,
        photoOnFail: true,
      },
      {
        key: "ante.doors-not-both-open",
        text: "Anteroom doors not both open at once",
        severity: "critical",
        response: "check",
        reference: cdcTb,
        photoOnFail: true,
      },
      {
        key: "ante.door-closers",
        text: "Door closers working on both doors",
        severity: "major",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "ante.signage",
        text: "Signage on the corridor door",
        severity: "minor",
        response: "check",
        reference: practice,
        photoOnFail: true,
      },
      {
        key: "ante.hand-rub",
        text: "Hand rub available",
        severity: "major",
        response: "check",
        reference: whoHandHygiene,
        photoOnFail: true,
      },
    ],
  },
};
