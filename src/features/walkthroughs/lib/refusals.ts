import type { LocalPhoto, QueuedChange } from "./offline-store";

/**
 * Messages per item: answers or photos the server refused (held in the queue), and the items a
 * refused submission named.
 */
export function refusalsByItem(
  changes: readonly QueuedChange[],
  photos: readonly LocalPhoto[],
  submitRefusals: Record<string, string> | null,
): Record<string, string> {
  const refusals: Record<string, string> = { ...submitRefusals };
  for (const change of changes) {
    if (!change.problem) continue;
    if (change.kind === "answer") {
      refusals[change.target] =
        change.problem.fields?.value ??
        change.problem.fields?.count ??
        change.problem.fields?.choice ??
        change.problem.fields?.note ??
        change.problem.message;
    } else if (change.kind === "photo") {
      const photo = photos.find((candidate) => candidate.id === change.target);
      if (photo) refusals[photo.itemId] = `Photo not accepted: ${change.problem.message}`;
    }
  }
  return refusals;
}
