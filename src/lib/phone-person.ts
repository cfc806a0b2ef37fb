/**
 * Who is signed in on this phone, remembered beside the session so the phone can open that
 * person's own stores (audits, kept reference data) when it has no signal to ask Lintel. Only the
 * person's id is kept here; the session itself stays in its httpOnly cookie.
 */
const personKey = "lintel:person";
/** Set when someone signed out with no signal: the server session is ended at the next chance. */
const pendingSignOutKey = "lintel:sign-out-pending";

function storage(): Storage | null {
  try {
    return typeof localStorage === "undefined" ? null : localStorage;
  } catch {
    return null;
  }
}

export function phonePersonId(): string | null {
  return storage()?.getItem(personKey) ?? null;
}

const listeners = new Set<(personId: string | null) => void>();

/** Hears the phone's person change (sign-in, sign-out); returns the way to stop hearing. */
export function onPhonePersonChange(listener: (personId: string | null) => void): () => void {
  listeners.add(listener);
  return () => void listeners.delete(listener);
}

function tell(personId: string | null) {
  for (const listener of [...listeners]) listener(personId);
}

export function rememberPhonePerson(personId: string): void {
  const before = phonePersonId();
  storage()?.setItem(personKey, personId);
  if (before !== personId) tell(personId);
}

export function forgetPhonePerson(): void {
  const before = phonePersonId();
  storage()?.removeItem(personKey);
  if (before !== null) tell(null);
}

export function signOutPending(): boolean {
  return storage()?.getItem(pendingSignOutKey) === "1";
}

export function setSignOutPending(pending: boolean): void {
  if (pending) storage()?.setItem(pendingSignOutKey, "1");
  else storage()?.removeItem(pendingSignOutKey);
}

/** The database names of one person's stores on this phone. */
export const personDatabases = {
  audits: (personId: string) => `lintel-audits:${personId}`,
  kept: (personId: string) => `lintel-kept:${personId}`,
};
