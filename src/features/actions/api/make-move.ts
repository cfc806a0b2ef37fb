import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { actionMoves } from "@shared/workflow/action-workflow";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** The moves made with a POST and, at most, a few words (see the workflow table). */
export type WordMove = "start" | "ask_check" | "confirm" | "send_back" | "reopen";

/** One move of the workflow table, with the note or reason the table says it needs. */
export function makeMove(actionId: string, move: WordMove, words?: string): Promise<ActionDetail> {
  const rule = actionMoves[move];
  const body =
    rule.needs === "note"
      ? { note: words }
      : rule.needs === "reason"
        ? { reason: words }
        : undefined;
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/${rule.path}`, {
    method: "POST",
    ...(body ? { body } : {}),
    schema: actionDetailSchema,
  });
}

export function useMakeMove(actionId: string, move: WordMove) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (words?: string) => makeMove(actionId, move, words),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
