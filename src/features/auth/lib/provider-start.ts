import { paths } from "@/config/paths";

/** The longest page to come back to that the start address accepts; a longer one comes home. */
const nextLimit = 500;

/**
 * The address the "Sign in with …" link opens: the server's start path, with the page to come back
 * to once signed in. Only a path of this app is followed (never another origin, whatever the reply
 * said), and `next` is added only when it is somewhere other than home and short enough.
 */
export function providerStartHref(startUrl: string, next: string, origin: string): string | null {
  if (!startUrl.startsWith("/") || startUrl.startsWith("//")) return null;
  let url: URL;
  try {
    url = new URL(startUrl, origin);
  } catch {
    return null;
  }
  if (url.origin !== new URL(origin).origin) return null;
  if (next !== paths.home.path && next.length <= nextLimit) url.searchParams.set("next", next);
  return `${url.pathname}${url.search}`;
}

/** The part after "@", shown in words beside the choice ("addresses at example.org"). */
export function domainOf(email: string): string {
  return email.slice(email.lastIndexOf("@") + 1);
}
