import type { ReactNode } from "react";
import { Link } from "react-router-dom";

import { BrandName } from "@/components/ui/brand-mark";

import { Navigation, type NavigationItem } from "./navigation";

export interface AppShellProps {
  navigationItems: readonly NavigationItem[];
  /** Where the brand leads: the signed-in home page. */
  homeHref: string;
  /** Who is signed in, shown under the navigation from tablet width up. */
  personName?: string;
  children: ReactNode;
}

/**
 * The signed-in frame. Phones get a top bar with the brand and a fixed bottom bar within thumb
 * reach; from tablet width up the brand and the same entries move to a side rail.
 */
export function AppShell({ navigationItems, homeHref, personName, children }: AppShellProps) {
  return (
    <div className="min-h-dvh bg-surface-sunken text-ink md:flex print:block print:bg-white">
      <a
        href="#main-content"
        className="sr-only z-50 rounded-lg bg-brand-700 print:hidden font-semibold text-white focus:not-sr-only focus:fixed focus:top-3 focus:left-3 focus:px-4 focus:py-3"
      >
        Skip to content
      </a>

      <header className="sticky top-0 z-20 print:hidden border-b border-surface-line bg-surface px-4 py-3 md:top-0 md:flex md:h-dvh md:w-60 md:shrink-0 md:flex-col md:gap-6 md:border-r md:border-b-0 md:px-3 md:py-5 lg:w-64">
        <Link
          to={homeHref}
          className="inline-flex rounded-lg text-brand-800 md:px-3"
          aria-label="Lintel, my sites"
        >
          <BrandName />
        </Link>
        <Navigation items={navigationItems} />
        {personName ? (
          <p className="mt-auto hidden truncate px-3 text-sm text-ink-muted md:block">
            Signed in as <span className="font-semibold text-ink">{personName}</span>
          </p>
        ) : null}
      </header>

      <main
        id="main-content"
        tabIndex={-1}
        className="mx-auto w-full max-w-5xl flex-1 px-4 pt-6 pb-28 outline-none md:px-8 md:pt-10 md:pb-12 print:max-w-none print:p-0"
      >
        {children}
      </main>
    </div>
  );
}
