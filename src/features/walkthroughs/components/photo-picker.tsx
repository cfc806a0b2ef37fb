import { type ChangeEvent, useEffect, useState } from "react";

import { Button } from "@/components/ui/button";
import { CameraIcon } from "@/components/ui/icons";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import { auditImageHref } from "../api/upload-audit-photo";
import type { LocalPhoto } from "../lib/offline-store";

// One object URL per photo for the life of the page: the store hands out a fresh copy of the
// bytes on every read, and a new URL each time would make the pictures flicker.
const objectUrls = new Map<string, string>();

function objectUrlFor(photo: LocalPhoto & { bytes: ArrayBuffer }): string | null {
  let url = objectUrls.get(photo.id);
  if (!url) {
    if (typeof URL.createObjectURL !== "function") return null;
    url = URL.createObjectURL(new Blob([photo.bytes], { type: photo.type || "image/jpeg" }));
    objectUrls.set(photo.id, url);
  }
  return url;
}

/** The phone's own copy while it has one (no network needed), else the server's thumbnail. */
function usePhotoSource(photo: LocalPhoto): string | null {
  const onPhone = photo.bytes !== null;
  useEffect(() => {
    const url = objectUrls.get(photo.id);
    if (!onPhone && url) {
      URL.revokeObjectURL(url);
      objectUrls.delete(photo.id);
    }
  }, [onPhone, photo.id]);
  if (photo.bytes) return objectUrlFor({ ...photo, bytes: photo.bytes });
  return photo.imageId ? auditImageHref(photo.imageId, "thumb") : null;
}

export function PhotoThumb({
  photo,
  alt,
  className,
}: {
  photo: LocalPhoto;
  alt: string;
  className?: string;
}) {
  const src = usePhotoSource(photo);
  return (
    <span
      className={cn(
        "block size-20 overflow-hidden rounded-lg border border-surface-line bg-surface-sunken",
        className,
      )}
    >
      {src ? <img src={src} alt={alt} className="size-full object-cover" /> : null}
    </span>
  );
}

export interface PhotoPickerProps {
  itemText: string;
  photos: readonly LocalPhoto[];
  /** Photos waiting to upload, which may still be taken back. */
  removable: ReadonlySet<string>;
  needsPhoto: boolean;
  disabled?: boolean;
  onAdd: (file: File) => Promise<void>;
  onRemove: (photoId: string) => Promise<boolean>;
}

/** "Add photo" opens the camera on a phone; the pictures stay on the phone until they upload. */
export function PhotoPicker({
  itemText,
  photos,
  removable,
  needsPhoto,
  disabled = false,
  onAdd,
  onRemove,
}: PhotoPickerProps) {
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  const chosen = async (event: ChangeEvent<HTMLInputElement>) => {
    const input = event.currentTarget;
    const file = input.files?.[0];
    if (!file) return;
    setBusy(true);
    setProblem(null);
    try {
      await onAdd(file);
    } catch {
      setProblem("The photo could not be kept on this phone. Try again, or free some space.");
    } finally {
      setBusy(false);
      // Choosing the same picture again should still count.
      input.value = "";
    }
  };

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-3">
        <label
          className={cn(
            "inline-flex min-h-tap cursor-pointer items-center justify-center gap-2 rounded-lg border border-surface-line bg-surface px-4 py-2 font-semibold text-brand-800",
            "hover:bg-brand-50 has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-brand-600",
            disabled && "cursor-not-allowed opacity-60",
          )}
        >
          {busy ? <SpinnerGlyph className="size-5" /> : <CameraIcon />}
          Add photo
          <input
            type="file"
            accept="image/*"
            capture="environment"
            className="sr-only"
            disabled={disabled || busy}
            onChange={(event) => void chosen(event)}
          />
        </label>
        {needsPhoto ? (
          <p className="text-sm font-semibold text-verdict-not-ready">
            A failed item like this needs a photo.
          </p>
        ) : null}
      </div>
      {problem ? (
        <p role="alert" className="text-sm font-semibold text-verdict-not-ready">
          {problem}
        </p>
      ) : null}
      {photos.length > 0 ? (
        <ul aria-label="Photos of this item" className="flex flex-wrap gap-3">
          {photos.map((photo, index) => (
            <li key={photo.id} className="flex flex-col items-start gap-1">
              <PhotoThumb photo={photo} alt={`Photo ${index + 1} of: ${itemText}`} />
              {removable.has(photo.id) && !disabled ? (
                <Button
                  variant="quiet"
                  className="min-h-tap px-2 text-sm"
                  onClick={() => void onRemove(photo.id)}
                >
                  Remove <span className="sr-only">photo {index + 1}</span>
                </Button>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
