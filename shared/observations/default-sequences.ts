import type { BreachKind, SequenceKind } from "../schemas/observations";

/**
 * Lintel's default putting-on and removal sequences, given to every network as version 1. The
 * observer reads each step aloud; the worker says it back and does it; the observer confirms it or
 * records what went wrong. Each step names its source, or says it is common practice.
 */

export interface DefaultSequenceStep {
  /** Stable across versions: breach rates follow the key even when the wording changes. */
  key: string;
  /** What the observer reads aloud. */
  text: string;
  /** Whether hand hygiene is expected at this step (a moment counted for compliance). */
  handHygiene: boolean;
  watchFor: BreachKind[];
  reference: string;
}

export interface DefaultSequence {
  key: string;
  kind: SequenceKind;
  title: string;
  /** Shown beside the title. */
  note: string | null;
  steps: DefaultSequenceStep[];
}

/** The version of Lintel's default sequences in `defaultSequences`. */
export const defaultSequenceRevision = 1;

export const cdcPpeSequence = "CDC, Sequence for Putting On / How to Safely Remove PPE (CS250672)";
export const sequenceCommonPractice = "Common practice";
export const sequenceFromMemory = `${cdcPpeSequence}, removal example 2 (from memory, not yet confirmed in a published copy)`;
export const lintelDraft = "Lintel's draft, common practice";

const handHygieneWatch: BreachKind[] = ["hand_hygiene_missed", "step_skipped"];
const puttingOnWatch: BreachKind[] = ["out_of_order", "step_skipped", "assistant_needed"];
const removalWatch: BreachKind[] = [
  "out_of_order",
  "step_skipped",
  "touched_face_or_clean_clothing",
  "item_dropped_or_wrong_container",
];

const eyeProtectionOff = (reference: string): DefaultSequenceStep => ({
  key: "eye-protection",
  text: "Take off the goggles or face shield from the back, by the headband or ear pieces, without touching the front. Put them in the container for reprocessing or in the waste.",
  handHygiene: false,
  watchFor: removalWatch,
  reference,
});

const maskOff = (reference: string): DefaultSequenceStep => ({
  key: "mask-or-respirator",
  text: "Take off the mask or respirator by the bottom ties or elastics, then the top ones, without touching the front. Put it in the waste.",
  handHygiene: false,
  watchFor: removalWatch,
  reference,
});

const handHygieneAfter = (reference: string): DefaultSequenceStep => ({
  key: "hand-hygiene",
  text: "Hand hygiene now, at once, with all PPE removed: rub hands with hand rub until dry, or wash them.",
  handHygiene: true,
  watchFor: handHygieneWatch,
  reference,
});

export const defaultSequences: readonly DefaultSequence[] = [
  {
    key: "standard-putting-on",
    kind: "putting_on",
    title: "Putting on PPE (gown, mask or respirator, eye protection, gloves)",
    note: null,
    steps: [
      {
        key: "hand-hygiene",
        text: "Hand hygiene before anything is put on: rub hands with hand rub until dry.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: sequenceCommonPractice,
      },
      {
        key: "gown",
        text: "Put on the gown: body covered from neck to knees and arms to the wrists, fastened at the neck and waist.",
        handHygiene: false,
        watchFor: puttingOnWatch,
        reference: cdcPpeSequence,
      },
      {
        key: "mask-or-respirator",
        text: "Put on the mask or respirator: ties or elastics secured, the band fitted to the nose; with a respirator, check the seal.",
        handHygiene: false,
        watchFor: puttingOnWatch,
        reference: cdcPpeSequence,
      },
      {
        key: "eye-protection",
        text: "Put on the goggles or face shield over the face and eyes, and adjust them to fit.",
        handHygiene: false,
        watchFor: puttingOnWatch,
        reference: cdcPpeSequence,
      },
      {
        key: "gloves",
        text: "Put on the gloves, pulled over the cuffs of the gown.",
        handHygiene: false,
        watchFor: puttingOnWatch,
        reference: cdcPpeSequence,
      },
    ],
  },
  {
    key: "standard-removal-1",
    kind: "removal",
    title: "Removing PPE, example 1 (gloves first)",
    note: null,
    steps: [
      {
        key: "gloves",
        text: "Take off the gloves: peel the first off by the outside, hold it in the gloved hand, slide bare fingers under the second and peel it off over the first. Put them in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: cdcPpeSequence,
      },
      eyeProtectionOff(cdcPpeSequence),
      {
        key: "gown",
        text: "Take off the gown: unfasten it, pull it away from the neck and shoulders touching only the inside, turn it inside out and roll it up. Put it in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: cdcPpeSequence,
      },
      maskOff(cdcPpeSequence),
      handHygieneAfter(cdcPpeSequence),
    ],
  },
  {
    key: "standard-removal-2",
    kind: "removal",
    title: "Removing PPE, example 2 (gown and gloves together)",
    note: "The order of example 2 is from memory: check it against the poster your network uses.",
    steps: [
      {
        key: "gown-and-gloves",
        text: "Take off the gown and gloves together: pull the gown away from the front so the ties break, touching the outside only with gloved hands, roll it inside out and peel the gloves off with it. Put them in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: sequenceFromMemory,
      },
      eyeProtectionOff(sequenceFromMemory),
      maskOff(sequenceFromMemory),
      handHygieneAfter(sequenceFromMemory),
    ],
  },
  {
    key: "enhanced-removal",
    kind: "removal",
    title: "Removing PPE, enhanced ensemble (double gloves, face shield, respirator)",
    note: `${lintelDraft}: adapt it to your network's ensemble before use.`,
    steps: [
      {
        key: "inspect",
        text: "Look over the PPE for visible contamination, cuts or tears; disinfect any contamination you see.",
        handHygiene: false,
        watchFor: ["step_skipped", "assistant_needed"],
        reference: lintelDraft,
      },
      {
        key: "gloved-hand-hygiene-1",
        text: "Hand hygiene on the outer gloves.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
      {
        key: "outer-gloves",
        text: "Take off the outer gloves without touching the inner ones with the outside. Put them in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: lintelDraft,
      },
      {
        key: "gloved-hand-hygiene-2",
        text: "Look at the inner gloves for cuts or tears, then hand hygiene on the inner gloves.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
      {
        key: "face-shield",
        text: "Take off the face shield by the strap at the back, head tilted slightly forward, without touching the front. Put it in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: lintelDraft,
      },
      {
        key: "gloved-hand-hygiene-3",
        text: "Hand hygiene on the inner gloves.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
      {
        key: "gown",
        text: "Take off the gown or coverall, away from the body, rolling it inside out. Put it in the waste. Ask for help if it does not come off cleanly.",
        handHygiene: false,
        watchFor: [...removalWatch, "assistant_needed"],
        reference: lintelDraft,
      },
      {
        key: "gloved-hand-hygiene-4",
        text: "Hand hygiene on the inner gloves.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
      {
        key: "respirator",
        text: "Take off the respirator: bottom strap first, then the top, leaning forward, without touching the front. Put it in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: lintelDraft,
      },
      {
        key: "gloved-hand-hygiene-5",
        text: "Hand hygiene on the inner gloves.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
      {
        key: "inner-gloves",
        text: "Take off the inner gloves without touching the skin with the outside. Put them in the waste.",
        handHygiene: false,
        watchFor: removalWatch,
        reference: lintelDraft,
      },
      {
        key: "hand-hygiene",
        text: "Hand hygiene on bare hands, at once.",
        handHygiene: true,
        watchFor: handHygieneWatch,
        reference: lintelDraft,
      },
    ],
  },
];
