import { isApiError } from "@/lib/api-client";
import { newDeviceId } from "@/lib/device-ids";

/**
 * The ids proof photos are sent under. Each photo gets its id on the phone when it is chosen and
 * keeps it until the server has settled it, so the same photo sent again after a lost reply — a
 * retry, or the same picture chosen again — is stored once.
 */
export interface ProofIds {
  idFor(file: File): string;
  /** Stored, or refused for good: choosing that picture again later makes a new proof. */
  settle(file: File): void;
}

export function createProofIds(newId: () => string = newDeviceId): ProofIds {
  const unsettled = new Map<string, string>();
  const keyOf = (file: File) => [file.name, file.size, file.lastModified, file.type].join("\n");
  return {
    idFor(file) {
      const key = keyOf(file);
      const id = unsettled.get(key) ?? newId();
      unsettled.set(key, id);
      return id;
    },
    settle(file) {
      unsettled.delete(keyOf(file));
    },
  };
}

/** Whether the same upload sent again may still succeed: no reply, or the server failed or was busy. */
export function mayResendUpload(error: unknown): boolean {
  if (!isApiError(error)) return true;
  return error.status === 0 || error.status >= 500 || error.status === 408 || error.status === 429;
}
