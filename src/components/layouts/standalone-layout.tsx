import type { ReactNode } from "react";

import { BrandName } from "@/components/ui/brand-mark";

export interface StandaloneLayoutProps {
  children: ReactNode;
}

/** A single centred column for pages outside the signed-in frame: sign-in, not found, errors. */
export function StandaloneLayout({ children }: StandaloneLayoutProps) {
  return (
    <div className="flex min-h-dvh flex-col items-center bg-surface-sunken px-4 py-10 text-ink sm:py-16">
      <header className="mb-8 text-brand-800">
        <BrandName className="text-2xl" />
      </header>
      <main id="main-content" className="w-full max-w-md">
        {children}
      </main>
    </div>
  );
}
