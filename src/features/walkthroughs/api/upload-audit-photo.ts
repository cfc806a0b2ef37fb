import { auditPhotoSchema } from "@shared/schemas/audits";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

const photoReplySchema = z.object({ photo: auditPhotoSchema });

export type AuditPhoto = z.infer<typeof auditPhotoSchema>;

/**
 * Uploads a photo taken for an item, as multipart: the picture in `photo`, with the phone's `id`
 * (the same id again returns the photo already stored) and the `itemId`. Sent by the sync queue.
 */
export async function uploadAuditPhoto(
  auditId: string,
  photo: { id: string; itemId: string; file: Blob; fileName: string },
): Promise<AuditPhoto> {
  const form = new FormData();
  form.append("id", photo.id);
  form.append("itemId", photo.itemId);
  form.append("photo", photo.file, photo.fileName);
  const reply = await apiRequest(`/api/audits/${encodeURIComponent(auditId)}/photos`, {
    method: "POST",
    body: form,
    schema: photoReplySchema,
  });
  return reply.photo;
}

/** Where a stored photo is shown from. */
export function auditImageHref(imageId: string, variant: "thumb" | "display"): string {
  return `/api/images/${encodeURIComponent(imageId)}?variant=${variant}`;
}
