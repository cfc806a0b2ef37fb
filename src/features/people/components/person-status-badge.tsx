import type { PersonStatus } from "@shared/schemas/people";

import { Badge, type BadgeTone } from "@/components/ui/badge";

export const statusLabels: Record<PersonStatus, string> = {
  active: "Active",
  invited: "Invited",
  deactivated: "Deactivated",
};

const statusTones: Record<PersonStatus, BadgeTone> = {
  active: "positive",
  invited: "pending",
  deactivated: "muted",
};

export function PersonStatusBadge({ status }: { status: PersonStatus }) {
  return <Badge tone={statusTones[status]}>{statusLabels[status]}</Badge>;
}
