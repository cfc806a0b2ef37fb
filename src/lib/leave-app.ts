/**
 * Hands the whole browser tab to another address (the identity provider's pages), leaving the app.
 * In one place so the screens that do it stay testable.
 */
export function leaveAppFor(url: string): void {
  window.location.assign(url);
}
