import { Component, lazy, type ReactNode, Suspense } from "react";

// The panel and its data load only when an isolation room's pressure item is on screen, never
// with the audit screen's own code (a QR code's first page).
const Pressure24hPanel = lazy(() =>
  import("./pressure-24h-panel").then((module) => ({ default: module.Pressure24hPanel })),
);

const unavailable = (
  <p className="rounded-lg border border-surface-line bg-surface-sunken p-3 text-sm text-ink-muted">
    The monitor's last 24 hours cannot be shown on this phone now (offline, or not yet kept here).
    Answer the item as usual.
  </p>
);

/** A failed download of the panel's code (offline before it was kept) shows words, not an error. */
class PanelBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  override render() {
    return this.state.failed ? unavailable : this.props.children;
  }
}

/** The room's last 24 hours beside its pressure item. */
export function Pressure24hAside({ spaceId }: { spaceId: string }) {
  return (
    <PanelBoundary>
      <Suspense
        fallback={<p className="text-sm text-ink-muted">Loading the monitor's last 24 hours…</p>}
      >
        <Pressure24hPanel spaceId={spaceId} />
      </Suspense>
    </PanelBoundary>
  );
}

/** Whether an item gets the panel: the pressure item of an isolation room. */
export function showsPressureHistory(itemKey: string, zoneType: string): boolean {
  return itemKey === "room.pressure" && zoneType === "isolation_room";
}
