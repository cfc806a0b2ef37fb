import {
  type Observation,
  type ObservationBody,
  observationSchema,
} from "@shared/schemas/observations";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

const replySchema = z.object({ observation: observationSchema });

/**
 * Records a finished observation under the id this phone made; sending the same body again returns
 * the same observation (a reply lost on the way is harmless). Lintel decides the outcome.
 * Sent by the sync queue, never directly from a screen.
 */
export async function putObservation(
  observationId: string,
  body: ObservationBody,
): Promise<Observation> {
  const reply = await apiRequest(`/api/observations/${encodeURIComponent(observationId)}`, {
    method: "PUT",
    body,
    schema: replySchema,
  });
  return reply.observation;
}
