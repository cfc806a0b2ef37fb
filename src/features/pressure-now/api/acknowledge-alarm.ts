import {
  acknowledgeAlarmResponseSchema,
  type PressureOpenAlarm,
} from "@shared/schemas/pressure-site";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function acknowledgeAlarm(alarmId: string, note: string): Promise<PressureOpenAlarm> {
  const { alarm } = await apiRequest(
    `/api/pressure-alarms/${encodeURIComponent(alarmId)}/acknowledge`,
    { method: "POST", body: { note }, schema: acknowledgeAlarmResponseSchema },
  );
  return alarm;
}

/** Acknowledges an alarm; every live view of the site, and the rooms' own pages, then ask again. */
export function useAcknowledgeAlarm(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ alarmId, note }: { alarmId: string; note: string }) =>
      acknowledgeAlarm(alarmId, note),
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.pressureNow.site(siteId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.roomPressures.all }),
      ]),
  });
}
