/** Where a stored photo (finding or proof) is shown from. */
export function actionImageHref(imageId: string, variant: "thumb" | "display"): string {
  return `/api/images/${encodeURIComponent(imageId)}?variant=${variant}`;
}
