import { createHash } from "node:crypto";

/** A small seeded generator, so every fresh demo database tells the same story. */
export function mulberry32(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A stable 32-bit seed from words, so one story does not depend on how many others there are. */
export function seedOf(words: string): number {
  return createHash("sha256").update(words).digest().readUInt32LE(0);
}

export function pick<T>(list: readonly T[], random: () => number): T {
  return list[Math.floor(random() * list.length)]!;
}
