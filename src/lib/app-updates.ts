/**
 * Whether a new version of the app is waiting on this phone, for the banner that offers to load
 * it. The service worker's registration (service-worker.ts) announces it; nothing else does.
 */
type ApplyUpdate = () => Promise<void>;

let waiting: ApplyUpdate | null = null;
const listeners = new Set<() => void>();

export function announceUpdateWaiting(apply: ApplyUpdate): void {
  waiting = apply;
  for (const listener of listeners) listener();
}

export function subscribeToUpdates(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The step that swaps in the waiting version and reloads the page, or null when none waits. */
export function waitingUpdate(): ApplyUpdate | null {
  return waiting;
}
