import { describe, expect, it } from "vitest";

import {
  cdcPpeSequence,
  defaultSequences,
  lintelDraft,
  sequenceCommonPractice,
  sequenceFromMemory,
} from "@shared/observations/default-sequences";
import { breachKinds } from "@shared/schemas/observations";

const sequence = (key: string) => {
  const found = defaultSequences.find((candidate) => candidate.key === key);
  if (!found) throw new Error(`No default sequence ${key}`);
  return found;
};
const keysOf = (key: string) => sequence(key).steps.map((step) => step.key);
const handHygieneAt = (key: string) =>
  sequence(key).steps.flatMap((step, index) => (step.handHygiene ? [index + 1] : []));

describe("Lintel's default sequences", () => {
  it("when putting on, then the items go on gown → mask or respirator → goggles or face shield → gloves (CDC CS250672, confirmed), after hand hygiene first (common practice)", () => {
    const putting = sequence("standard-putting-on");
    expect(putting.kind).toBe("putting_on");
    // CDC CS250672, "Sequence for Putting On PPE": gown, mask or respirator, goggles or face shield, gloves.
    expect(keysOf("standard-putting-on").slice(1)).toEqual([
      "gown",
      "mask-or-respirator",
      "eye-protection",
      "gloves",
    ]);
    for (const step of putting.steps.slice(1)) expect(step.reference).toBe(cdcPpeSequence);
    // Common practice: hand hygiene before anything goes on (no published order cited for it).
    expect(putting.steps[0]).toMatchObject({ key: "hand-hygiene", handHygiene: true });
    expect(putting.steps[0]!.reference).toBe(sequenceCommonPractice);
    expect(handHygieneAt("standard-putting-on")).toEqual([1]);
  });

  it("when removing by example 1, then gloves → goggles or face shield → gown → mask or respirator, and hand hygiene at once after all PPE is off (CDC CS250672, confirmed)", () => {
    const removal = sequence("standard-removal-1");
    expect(removal.kind).toBe("removal");
    // CDC CS250672, "How to Safely Remove PPE", example 1.
    expect(keysOf("standard-removal-1")).toEqual([
      "gloves",
      "eye-protection",
      "gown",
      "mask-or-respirator",
      "hand-hygiene",
    ]);
    // CDC CS250672: hand hygiene immediately after removing all PPE — the only moment, and last.
    expect(handHygieneAt("standard-removal-1")).toEqual([5]);
    for (const step of removal.steps) expect(step.reference).toBe(cdcPpeSequence);
  });

  it("when removing by example 2, then gown and gloves together → goggles or face shield → mask or respirator → hand hygiene, marked as from memory (CDC CS250672 example 2, from memory)", () => {
    const removal = sequence("standard-removal-2");
    // CDC CS250672 example 2 — from memory in the handbook, so every step says so.
    expect(keysOf("standard-removal-2")).toEqual([
      "gown-and-gloves",
      "eye-protection",
      "mask-or-respirator",
      "hand-hygiene",
    ]);
    expect(handHygieneAt("standard-removal-2")).toEqual([4]);
    for (const step of removal.steps) {
      expect(step.reference).toBe(sequenceFromMemory);
      expect(step.reference).toContain("from memory");
    }
    expect(removal.note).toContain("from memory");
  });

  it("when removing an enhanced ensemble, then hand hygiene on gloves comes between items and on bare hands last, shipped as Lintel's draft (common practice, from memory)", () => {
    const enhanced = sequence("enhanced-removal");
    expect(enhanced.note).toContain(lintelDraft);
    for (const step of enhanced.steps) expect(step.reference).toBe(lintelDraft);
    const itemSteps = ["outer-gloves", "face-shield", "gown", "respirator", "inner-gloves"];
    const keys = keysOf("enhanced-removal");
    // Between each two items taken off, a hand-hygiene moment on gloved hands.
    for (let index = 0; index < itemSteps.length - 1; index += 1) {
      const between = keys.slice(
        keys.indexOf(itemSteps[index]!) + 1,
        keys.indexOf(itemSteps[index + 1]!),
      );
      expect(between.length, `between ${itemSteps[index]} and ${itemSteps[index + 1]}`).toBe(1);
      expect(enhanced.steps.find((step) => step.key === between[0])!.handHygiene).toBe(true);
    }
    // The respirator comes off after the face shield and gown, the inner gloves last of all.
    expect(keys.indexOf("respirator")).toBeGreaterThan(keys.indexOf("gown"));
    expect(keys.at(-1)).toBe("hand-hygiene");
    expect(keys.at(-2)).toBe("inner-gloves");
    expect(enhanced.steps.length).toBe(12);
  });

  it("when any default step is read, then its key is unique in its sequence, its text is short enough to read aloud and store, and it watches for known breaches", () => {
    expect(defaultSequences.map((s) => s.key)).toEqual([
      "standard-putting-on",
      "standard-removal-1",
      "standard-removal-2",
      "enhanced-removal",
    ]);
    for (const each of defaultSequences) {
      const keys = each.steps.map((step) => step.key);
      expect(new Set(keys).size).toBe(keys.length);
      expect(each.title.length).toBeLessThanOrEqual(120);
      for (const step of each.steps) {
        expect(step.text.length).toBeLessThanOrEqual(300);
        expect(step.reference.length).toBeLessThanOrEqual(300);
        expect(step.watchFor.length).toBeGreaterThan(0);
        for (const kind of step.watchFor) expect(breachKinds).toContain(kind);
        // A hand-hygiene moment is watched for a missed hand hygiene.
        if (step.handHygiene) expect(step.watchFor).toContain("hand_hygiene_missed");
      }
    }
  });
});
