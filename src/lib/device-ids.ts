/**
 * A new random (version 4) id for something made on this phone: an audit, an answer, a photo, a
 * proof of a fix.
 * `crypto.randomUUID` exists only on secure origins; a phone reaching Lintel over plain http on the
 * ward network still has `getRandomValues`.
 */
export function newDeviceId(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = (bytes[6]! & 0x0f) | 0x40;
  bytes[8] = (bytes[8]! & 0x3f) | 0x80;
  const hex = Array.from(bytes, (byte) => byte.toString(16).padStart(2, "0")).join("");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}
