import type { ProviderProblemReason } from "@shared/schemas/identity-provider";

export interface ProviderProblemText {
  title: string;
  /** What happened, in words. */
  explanation: string;
  /** What the person can do about it. */
  nextStep: string;
}

/** Each reason a sign-in through the network's provider can end without a session, in words. */
export const providerProblemTexts: Record<ProviderProblemReason, ProviderProblemText> = {
  unknown: {
    title: "Lintel does not know you yet",
    explanation:
      "Your organisation confirmed who you are, but nobody in your network has invited you to Lintel with this e-mail address. Nothing was created.",
    nextStep: "Ask your administrator to invite you, then sign in again.",
  },
  deactivated: {
    title: "Your Lintel account is deactivated",
    explanation:
      "Your organisation confirmed who you are, but an administrator has deactivated your account in Lintel.",
    nextStep: "If you need Lintel again, ask your administrator to reactivate your account.",
  },
  unverified: {
    title: "Your e-mail address is not confirmed",
    explanation:
      "Your organisation's sign-in did not say that your e-mail address is confirmed, so Lintel cannot be sure the account is yours.",
    nextStep:
      "Ask your IT help desk to confirm the e-mail address on your account, and give them the reference below.",
  },
  cancelled: {
    title: "Signing in was cancelled",
    explanation: "Signing in was stopped at your organisation's page, so you are not signed in.",
    nextStep: "Sign in again whenever you are ready.",
  },
  unavailable: {
    title: "Your organisation's sign-in is not answering",
    explanation:
      "Lintel could not reach your organisation's sign-in, or it answered with an error, so you are not signed in.",
    nextStep:
      "Try again in a few minutes. If it keeps happening, tell your IT help desk and give them the reference below.",
  },
  state: {
    title: "This sign-in was not started here",
    explanation:
      "The answer from your organisation's sign-in does not belong to a sign-in started in this browser, or it was used already. For your safety you are not signed in.",
    nextStep: "Start again from the sign-in page.",
  },
  code: {
    title: "Signing in could not be finished",
    explanation:
      "Your organisation's sign-in refused to finish this sign-in: it may have taken too long, or the same answer was used twice.",
    nextStep: "Start again from the sign-in page.",
  },
  token: {
    title: "Lintel could not check the answer",
    explanation:
      "The answer from your organisation's sign-in did not pass Lintel's checks, so you are not signed in.",
    nextStep:
      "Try again. If it keeps happening, tell your IT help desk and give them the reference below.",
  },
};

/** Shown when the address carries no reason Lintel knows. */
export const unknownProblemText: ProviderProblemText = {
  title: "Signing in did not finish",
  explanation: "Signing in through your organisation did not finish, so you are not signed in.",
  nextStep: "Start again from the sign-in page.",
};

/** The server's request ids: its own UUIDs, or a proxy's id of the same plain characters. */
const requestIdPattern = /^[A-Za-z0-9._-]{8,64}$/;

/**
 * What the problem page may show from its address: a reason Lintel knows and a request id shaped
 * like one. Anything else in the address is never put on the page.
 */
export function readProviderProblem(search: URLSearchParams): {
  text: ProviderProblemText;
  requestId: string | null;
} {
  const reason = search.get("reason");
  const text =
    reason !== null && Object.hasOwn(providerProblemTexts, reason)
      ? providerProblemTexts[reason as ProviderProblemReason]
      : unknownProblemText;
  const request = search.get("request");
  return { text, requestId: request !== null && requestIdPattern.test(request) ? request : null };
}
