import type { MeResponse } from "@shared/schemas/auth";
import { useOutletContext } from "react-router-dom";

/** The signed-in person inside the audit frame; null when it cannot be checked (offline). */
export function usePersonIfKnown(): MeResponse | null {
  return useOutletContext<MeResponse | null>();
}
