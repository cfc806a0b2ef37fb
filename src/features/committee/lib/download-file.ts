import { fetchFromApi, readApiError } from "@/lib/api-client";

export interface DownloadProgress {
  received: number;
  /** From Content-Length; null when the server streams without announcing a size. */
  total: number | null;
  /** Line breaks seen so far, for counting CSV rows as they arrive. */
  lines: number;
}

export interface DownloadedFile {
  blob: Blob;
  name: string;
  bytes: number;
  lines: number;
}

export interface DownloadOptions {
  onProgress?: (progress: DownloadProgress) => void;
  signal?: AbortSignal;
}

const newline = 10;

/** The file name the server gave in Content-Disposition, or the fallback. */
export function fileNameOf(disposition: string | null, fallback: string): string {
  if (!disposition) return fallback;
  const encoded = /filename\*\s*=\s*(?:UTF-8'[^']*')?([^;]+)/i.exec(disposition);
  if (encoded?.[1]) {
    try {
      return decodeURIComponent(encoded[1].trim().replace(/^"|"$/g, ""));
    } catch {
      // A malformed encoded name: the plain one below is the next best.
    }
  }
  const plain = /filename\s*=\s*("([^"]*)"|[^;]+)/i.exec(disposition);
  const name = (plain?.[2] ?? plain?.[1])?.trim();
  return name || fallback;
}

function announcedSize(response: Response): number | null {
  const length = Number(response.headers.get("Content-Length"));
  return Number.isFinite(length) && length > 0 ? length : null;
}

/**
 * Fetches a file from the API and reads its body chunk by chunk, reporting how much has arrived,
 * so a large export shows progress instead of a frozen button.
 */
export async function downloadFile(
  path: string,
  fallbackName: string,
  { onProgress, signal }: DownloadOptions = {},
): Promise<DownloadedFile> {
  const response = await fetchFromApi(path, { signal });
  if (!response.ok) throw await readApiError(response);

  const name = fileNameOf(response.headers.get("Content-Disposition"), fallbackName);
  const type = response.headers.get("Content-Type") ?? "application/octet-stream";
  let total = announcedSize(response);
  const chunks: Uint8Array<ArrayBuffer>[] = [];
  let received = 0;
  let lines = 0;
  onProgress?.({ received, total, lines });

  const reader = response.body?.getReader();
  if (reader) {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks.push(value);
      received += value.byteLength;
      for (const byte of value) if (byte === newline) lines += 1;
      // A compressed reply announces fewer bytes than it unpacks to; the size then means nothing.
      if (total !== null && received > total) total = null;
      onProgress?.({ received, total, lines });
    }
  }
  return { blob: new Blob(chunks, { type }), name, bytes: received, lines };
}

/** Hands a downloaded file to the browser to save, under the given name. */
export function saveFile(blob: Blob, name: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement("a");
  link.href = url;
  link.download = name;
  link.hidden = true;
  document.body.append(link);
  link.click();
  link.remove();
  // Some browsers start reading the file only after the click returns.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}
