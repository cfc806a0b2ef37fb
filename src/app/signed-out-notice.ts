/** What the sign-in page tells someone who has just signed out on this phone. */
export interface SignedOutNotice {
  signedOut: { kept: boolean; reachedLintel: boolean };
}

const noticeKey = "lintel:signed-out-notice";

function tabStorage(): Storage | null {
  try {
    return typeof sessionStorage === "undefined" ? null : sessionStorage;
  } catch {
    return null;
  }
}

/**
 * Signing out of the identity provider too leaves the app for the provider's page, which sends the
 * browser back to sign-in: the notice waits in this tab's storage meanwhile.
 */
export function holdSignedOutNotice(notice: SignedOutNotice): void {
  tabStorage()?.setItem(noticeKey, JSON.stringify(notice.signedOut));
}

/** The notice held across the provider's sign-out, once: reading it forgets it. */
export function takeHeldSignedOutNotice(): SignedOutNotice | null {
  const storage = tabStorage();
  const held = storage?.getItem(noticeKey);
  if (!held) return null;
  storage?.removeItem(noticeKey);
  try {
    const value = JSON.parse(held) as unknown;
    if (typeof value !== "object" || value === null) return null;
    const { kept, reachedLintel } = value as Record<string, unknown>;
    if (typeof kept !== "boolean" || typeof reachedLintel !== "boolean") return null;
    return { signedOut: { kept, reachedLintel } };
  } catch {
    return null;
  }
}
