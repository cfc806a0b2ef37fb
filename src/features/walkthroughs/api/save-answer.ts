import { type Answer, type AnswerBody, answerSchema } from "@shared/schemas/audits";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

const answerReplySchema = z.object({ answer: answerSchema });

/**
 * Stores one item's answer. Readings go as entered (value and unit); the server keeps SI and,
 * where the item has a limit, decides pass or fail itself: the reply carries its outcome.
 * Sent by the sync queue.
 */
export async function saveAnswer(
  auditId: string,
  itemId: string,
  body: AnswerBody,
): Promise<Answer> {
  const { answer } = await apiRequest(
    `/api/audits/${encodeURIComponent(auditId)}/answers/${encodeURIComponent(itemId)}`,
    { method: "PUT", body, schema: answerReplySchema },
  );
  return answer;
}
