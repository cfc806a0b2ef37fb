import { Button } from "./button";

export interface UpdateBannerProps {
  onReload: () => void;
  reloading?: boolean;
}

/**
 * Says a new version of the app is ready and offers to load it. It floats over the bottom of the
 * screen, so showing it moves nothing on the page.
 */
export function UpdateBanner({ onReload, reloading = false }: UpdateBannerProps) {
  return (
    <div className="pointer-events-none fixed inset-x-0 bottom-0 z-50 flex justify-center p-3 pb-[max(0.75rem,env(safe-area-inset-bottom))]">
      <div
        role="status"
        aria-live="polite"
        className="pointer-events-auto flex w-full max-w-md items-center justify-between gap-3 rounded-xl bg-brand-900 px-4 py-3 text-white shadow-lg"
      >
        <p className="text-base font-semibold">A new version of Lintel is ready</p>
        <Button variant="secondary" className="shrink-0" onClick={onReload} disabled={reloading}>
          {reloading ? "Reloading…" : "Reload"}
        </Button>
      </div>
    </div>
  );
}
