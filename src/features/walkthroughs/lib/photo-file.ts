/** What the phone keeps of a photo until it is uploaded. */
export interface PreparedPhoto {
  bytes: ArrayBuffer;
  type: string;
  name: string;
}

// Camera pictures are often 4–8 MB; a ward audit needs far less, and every byte waits in the
// phone's storage and then goes over a weak signal.
const shrinkAboveBytes = 1_500_000;
const longestSide = 2048;

async function shrink(file: File): Promise<PreparedPhoto | null> {
  if (typeof createImageBitmap !== "function" || typeof OffscreenCanvas !== "function") return null;
  const bitmap = await createImageBitmap(file);
  try {
    const scale = Math.min(1, longestSide / Math.max(bitmap.width, bitmap.height));
    const width = Math.round(bitmap.width * scale);
    const height = Math.round(bitmap.height * scale);
    const canvas = new OffscreenCanvas(width, height);
    const context = canvas.getContext("2d");
    if (!context) return null;
    context.drawImage(bitmap, 0, 0, width, height);
    const blob = await canvas.convertToBlob({ type: "image/jpeg", quality: 0.85 });
    if (blob.size >= file.size) return null;
    const base = file.name.replace(/\.[^.]*$/, "") || "photo";
    return { bytes: await blob.arrayBuffer(), type: "image/jpeg", name: `${base}.jpg` };
  } finally {
    bitmap.close();
  }
}

/**
 * The picture's bytes, made smaller first when it is large and the browser can redraw it;
 * otherwise exactly as taken.
 */
export async function preparePhoto(file: File): Promise<PreparedPhoto> {
  if (file.size > shrinkAboveBytes) {
    const smaller = await shrink(file).catch(() => null);
    if (smaller) return smaller;
  }
  return {
    bytes: await file.arrayBuffer(),
    type: file.type || "image/jpeg",
    name: file.name || "photo.jpg",
  };
}
