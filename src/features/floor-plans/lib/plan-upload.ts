import { acceptedImageTypes, maxUploadBytes } from "@shared/schemas/floors";

export const acceptedPlanTypes = acceptedImageTypes.join(",");
const megabyte = 1024 * 1024;

/**
 * What is wrong with a chosen plan file before it is sent, or null. The server decides from the
 * file's content; this only spares a long upload that is bound to be refused.
 */
export function planFileProblem(file: File | null | undefined): string | null {
  if (!file) return "Choose an image of the floor plan first.";
  if (file.type !== "" && !(acceptedImageTypes as readonly string[]).includes(file.type)) {
    return "This file is not a JPEG, PNG or WebP image. Save or export the plan in one of those formats and try again.";
  }
  if (file.size > maxUploadBytes) {
    return `This image is ${(file.size / megabyte).toFixed(1)} MB; a plan can be at most ${maxUploadBytes / megabyte} MB.`;
  }
  if (file.size === 0) return "This file is empty. Choose the plan image again.";
  return null;
}
