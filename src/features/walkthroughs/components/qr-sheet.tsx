import type { ScheduleEntry } from "@shared/schemas/audits";
import { zoneTypeLabels } from "@shared/zones";
import QRCode from "qrcode";
import { useEffect, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";

import { useSiteSchedule } from "../api/get-site-schedule";

/** SVG data URLs for each address: crisp on paper at any size, drawn in the browser. */
function useQrImages(addresses: readonly string[]): ReadonlyMap<string, string> | null {
  const [images, setImages] = useState<ReadonlyMap<string, string> | null>(null);
  const key = addresses.join("\n");
  useEffect(() => {
    let live = true;
    const list = key === "" ? [] : key.split("\n");
    void Promise.all(
      list.map(async (address) => {
        const svg = await QRCode.toString(address, {
          type: "svg",
          errorCorrectionLevel: "M",
          margin: 2,
          color: { dark: "#102b2dff", light: "#ffffffff" },
        });
        return [address, `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`] as const;
      }),
    ).then((pairs) => {
      if (live) setImages(new Map(pairs));
    });
    return () => {
      live = false;
    };
  }, [key]);
  return images;
}

function bySpace(a: ScheduleEntry, b: ScheduleEntry): number {
  return (
    a.floorName.localeCompare(b.floorName, undefined, { numeric: true }) ||
    a.spaceName.localeCompare(b.spaceName, undefined, { numeric: true })
  );
}

export interface QrSheetProps {
  siteId: string;
  /** The full address a code opens, e.g. https://lintel.example/spaces/…/audit. */
  addressFor: (spaceId: string) => string;
}

/** One code per space to print and fix by its door: scanning it opens (or resumes) the audit. */
export function QrSheet({ siteId, addressFor }: QrSheetProps) {
  const schedule = useSiteSchedule(siteId);
  const entries = schedule.data ? [...schedule.data].sort(bySpace) : [];
  const images = useQrImages(entries.map((entry) => addressFor(entry.spaceId)));

  if (schedule.isPending) return <Spinner label="Loading the spaces…" className="py-6" />;
  if (schedule.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the spaces">
        <p>{schedule.error.message}</p>
      </Alert>
    );
  }
  if (entries.length === 0) {
    return (
      <p className="text-ink-muted">This site has no spaces yet, so there is nothing to print.</p>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3 print:hidden">
        <Button onClick={() => window.print()} disabled={!images}>
          Print
        </Button>
        <p className="text-sm text-ink-muted">
          {entries.length} {entries.length === 1 ? "code" : "codes"}. Print on sticky labels or card
          and fix each beside its space&apos;s door at eye level.
        </p>
      </div>
      {!images ? <Spinner label="Drawing the codes…" /> : null}
      <ul
        aria-label="QR codes"
        className="grid grid-cols-2 gap-3 sm:grid-cols-3 print:grid-cols-3 print:gap-4"
      >
        {entries.map((entry) => {
          const address = addressFor(entry.spaceId);
          const image = images?.get(address);
          return (
            <li
              key={entry.spaceId}
              className="flex break-inside-avoid flex-col items-center gap-1 rounded-lg border border-surface-line bg-surface p-3 text-center print:border-ink print:p-4"
            >
              {image ? (
                <img
                  src={image}
                  alt={`QR code to audit ${entry.spaceName}`}
                  className="aspect-square w-full max-w-44"
                />
              ) : (
                <span className="aspect-square w-full max-w-44 bg-surface-sunken" />
              )}
              <span className="font-bold text-ink">{entry.spaceName}</span>
              <span className="text-sm text-ink-muted">
                {zoneTypeLabels[entry.zoneType]} · {entry.floorName}
              </span>
              <span className="text-2xs break-all text-ink-subtle">{address}</span>
            </li>
          );
        })}
      </ul>
    </div>
  );
}
