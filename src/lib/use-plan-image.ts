import { useEffect, useState } from "react";

import { hasKeptStorage, readKeptImage } from "./kept-store";
import { phonePersonId } from "./phone-person";

export const planImageUrl = (imageId: string) =>
  `/api/images/${encodeURIComponent(imageId)}?variant=display`;

/**
 * Where to show a floor plan from: the copy the phone keeps for its person (so plans open with no
 * signal; an image never changes under its id), else Lintel. Undefined for the moment it takes to
 * look, so the plan is not fetched twice.
 */
export function usePlanImageUrl(imageId: string): string | undefined {
  const [found, setFound] = useState<{ imageId: string; url: string } | null>(null);
  const personId = hasKeptStorage() ? phonePersonId() : null;

  useEffect(() => {
    if (!personId) return;
    let live = true;
    let objectUrl: string | null = null;
    readKeptImage(personId, imageId)
      .catch(() => undefined)
      .then((kept) => {
        if (!live) return;
        if (kept) objectUrl = URL.createObjectURL(kept.blob);
        setFound({ imageId, url: objectUrl ?? planImageUrl(imageId) });
      });
    return () => {
      live = false;
      if (objectUrl) URL.revokeObjectURL(objectUrl);
    };
  }, [imageId, personId]);

  if (!personId) return planImageUrl(imageId);
  return found?.imageId === imageId ? found.url : undefined;
}
