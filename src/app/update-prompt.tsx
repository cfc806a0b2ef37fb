import { useState, useSyncExternalStore } from "react";

import { UpdateBanner } from "@/components/ui/update-banner";
import { subscribeToUpdates, waitingUpdate } from "@/lib/app-updates";

/** Offers a waiting new version of the app; the page reloads once it has taken over. */
export function UpdatePrompt() {
  const apply = useSyncExternalStore(subscribeToUpdates, waitingUpdate, () => null);
  const [reloading, setReloading] = useState(false);
  if (!apply) return null;
  return (
    <UpdateBanner
      reloading={reloading}
      onReload={() => {
        setReloading(true);
        void apply().catch(() => setReloading(false));
      }}
    />
  );
}
